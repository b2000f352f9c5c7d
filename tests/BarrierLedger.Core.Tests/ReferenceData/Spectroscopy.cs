namespace BarrierLedger.Core.Tests.ReferenceData;

/// <summary>
/// Spectroscopic constants and experimental structures used as outside references.
/// Diatomics: K. P. Huber and G. Herzberg, Molecular Spectra and Molecular Structure IV: Constants of Diatomic Molecules
/// (Van Nostrand Reinhold, 1979), values from memory. Triatomics: experimental equilibrium structures and gas-phase fundamentals
/// as tabulated in the NIST Computational Chemistry Comparison and Benchmark Database (CCCBDB) and in Herzberg, Molecular
/// Spectra and Molecular Structure II (1945), values from memory.
/// </summary>
public static class Spectroscopy
{
    public const string HuberHerzberg = "Huber & Herzberg 1979, from memory";
    public const string ExperimentalStructures = "experimental r_e / fundamentals, CCCBDB & Herzberg II, from memory";

    /// <summary>H³⁵Cl harmonic force constant 516.3 N/m and ω_e = 2990.95 cm⁻¹ ("≈ 2991", handbook value, from memory).</summary>
    public const double HClForceConstantNewtonPerMetre = 516.3;
    public const double HClHarmonicWavenumberCm1 = 2990.95;
    /// <summary>±0.5 cm⁻¹: the force constant is given to 4 significant figures (relative 1e-4, i.e. 0.15 cm⁻¹ in ν).</summary>
    public const double HClWavenumberToleranceCm1 = 0.5;
    public const double HClBondLengthAngstrom = 1.27455;
    public const double HClRotationalConstantCm1 = 10.5934;

    public const double N2BondLengthAngstrom = 1.09768;
    public const double N2RotationalConstantCm1 = 1.99824;
    /// <summary>N₂ fundamental (v = 0 → 1), 2329.9 cm⁻¹ (ω_e = 2358.6).</summary>
    public const double N2FundamentalCm1 = 2329.9;

    /// <summary>Relative tolerance for rotational constants from the isotope masses: 5e-4 (digits from memory).</summary>
    public const double RotationalConstantRelativeTolerance = 5e-4;

    /// <summary>H₂O: r(OH) = 0.9572 Å, ∠HOH = 104.52°; fundamentals ν₁ 3657, ν₂ 1595, ν₃ 3756 cm⁻¹; σ = 2.</summary>
    public const double H2OBondLengthAngstrom = 0.9572;
    public const double H2OAngleDegrees = 104.52;
    public static readonly double[] H2OFundamentalsCm1 = [3657.0, 1595.0, 3756.0];

    /// <summary>CO₂: r(CO) = 1.1600 Å, linear; fundamentals ν₁ 1333 (unperturbed by the Fermi dyad 1285/1388), ν₂ 667 (×2), ν₃ 2349 cm⁻¹; σ = 2.</summary>
    public const double CO2BondLengthAngstrom = 1.1600;
    public static readonly double[] CO2FundamentalsCm1 = [667.0, 667.0, 1333.0, 2349.0];

    /// <summary>
    /// Gas-phase fundamentals (cm⁻¹; degenerate modes repeated), from memory (Herzberg II; Shimanouchi, Tables of Molecular
    /// Vibrational Frequencies, NSRDS-NBS 39, 1972). NH₃: ν₁ 3336.2, ν₂ 950.3 (mean of the inversion doublet 932.4/968.1),
    /// ν₃ 3443.6 (e), ν₄ 1626.1 (e). CH₄: ν₁ 2917 (a₁), ν₂ 1534 (e), ν₃ 3019 (f₂), ν₄ 1306 (f₂). C₂H₄: 3026, 1623, 1342, 1023, 3103,
    /// 1236, 949, 943, 3106, 826, 2989, 1444. Geometries are those of <see cref="SymmetryReference"/>.
    /// </summary>
    public static readonly double[] NH3FundamentalsCm1 = [3336.2, 950.3, 3443.6, 3443.6, 1626.1, 1626.1];
    public static readonly double[] CH4FundamentalsCm1 = [2917, 1534, 1534, 3019, 3019, 3019, 1306, 1306, 1306];
    public static readonly double[] C2H4FundamentalsCm1 = [3026, 1623, 1342, 1023, 3103, 1236, 949, 943, 3106, 826, 2989, 1444];
}
