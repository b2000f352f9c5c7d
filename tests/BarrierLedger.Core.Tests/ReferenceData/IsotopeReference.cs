namespace BarrierLedger.Core.Tests.ReferenceData;

/// <summary>
/// Outside references for isotope masses and kinetic isotope effects, each with its source and tolerance.
/// </summary>
public static class IsotopeReference
{
    /// <summary>CODATA 2018 particle masses in u (Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)), from memory.</summary>
    public const string Codata2018Particles = "CODATA 2018 proton/deuteron/triton and electron masses, from memory";
    public const double ProtonMassU = 1.007276466621;
    public const double DeuteronMassU = 2.013553212745;
    public const double TritonMassU = 3.01550071621;
    public const double ElectronMassU = 5.48579909065e-4;

    /// <summary>Hydrogen-like binding energy 13.598 eV, and 1 u = 931.49410242 MeV (CODATA 2018), from memory.</summary>
    public const double HydrogenBindingEV = 13.598;
    public const double AtomicMassUnitEV = 931.49410242e6;

    /// <summary>Atom mass = nucleus + electron − binding; the AME and CODATA adjustments agree to about 10⁻¹⁰ u (from memory), so 1e-9 u.</summary>
    public const double AtomicMassToleranceU = 1e-9;

    /// <summary>
    /// Harmonic wavenumbers ω_e in cm⁻¹: K. P. Huber and G. Herzberg, Molecular Spectra and Molecular Structure IV: Constants of Diatomic
    /// Molecules (1979), also tabulated in the NIST Chemistry WebBook's diatomic constants; values from memory.
    /// </summary>
    public const string HuberHerzberg = "Huber & Herzberg 1979 (NIST WebBook diatomic constants), from memory";
    public const double H2OmegaE = 4401.21;
    public const double D2OmegaE = 3115.50;
    public const double H35ClOmegaE = 2990.95;
    public const double D35ClOmegaE = 2145.16;

    /// <summary>
    /// The harmonic, Born–Oppenheimer √(reduced mass) rule misses the mass-dependent (adiabatic and non-adiabatic) corrections: about
    /// 7×10⁻⁴ relative for H₂/D₂ and 2×10⁻⁵ for HCl/DCl from the tabulated ω_e (from memory). Tolerances 1e-3 and 1e-4.
    /// </summary>
    public const double H2D2RelativeTolerance = 1e-3;
    public const double HClDClRelativeTolerance = 1e-4;

    /// <summary>
    /// The classical maximum primary H/D KIE at 298 K when a C–H stretch of about 2900 cm⁻¹ (C–D about 2100) is lost at the saddle
    /// point, from the zero-point difference alone: about 1.15 kcal/mol, kH/kD ≈ 7 (E. V. Anslyn and D. A. Dougherty, Modern Physical
    /// Organic Chemistry, University Science Books, 2006, section 8.1; K. B. Wiberg, Chem. Rev. 55, 713 (1955); quoted as 6.5–7 in
    /// physical-organic textbooks; from memory).
    /// </summary>
    public const string ClassicalMaximumSource = "Anslyn & Dougherty 2006 §8.1; Wiberg, Chem. Rev. 1955 (from memory)";
    public const double ClassicalMaximumLow = 6.5;
    public const double ClassicalMaximumHigh = 7.0;

    /// <summary>Relative agreement demanded of the Redlich–Teller product rule for exact harmonic frequencies (issue 23).</summary>
    public const double ProductRuleTolerance = 1e-8;

    /// <summary>Relative agreement demanded of an independent partition-function computation of one KIE (issue 23).</summary>
    public const double IndependentKieTolerance = 1e-6;
}
