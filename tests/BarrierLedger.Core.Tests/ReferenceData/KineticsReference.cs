namespace BarrierLedger.Core.Tests.ReferenceData;

/// <summary>
/// Outside reference values for kinetics, each with its source and tolerance.
/// </summary>
public static class KineticsReference
{
    /// <summary>k_B T/h at 298.15 K = 6.2124×10¹² s⁻¹ (from the exact SI values of k_B and h, CODATA 2018); relative 1e-4 (5 digits given).</summary>
    public const double FrequencyFactor298 = 6.2124e12;
    public const double FrequencyFactorRelativeTolerance = 1e-4;

    /// <summary>
    /// Eyring, ΔG‡ = 20.0 kcal/mol at 298.15 K: k ≈ 1.36×10⁻² s⁻¹, t½ ≈ 51 s (issue 3, from the CODATA 2018 constants; the trade's
    /// rule that ~20 kcal/mol barriers react within minutes at room temperature is common practice, no source). Tolerances: 0.005e-2
    /// on k (3 digits given), 0.5 s on t½ (2 digits given).
    /// </summary>
    public const double Eyring20KcalRateConstant = 1.36e-2;
    public const double Eyring20KcalRateTolerance = 0.005e-2;
    public const double Eyring20KcalHalfLifeSeconds = 51.0;
    public const double Eyring20KcalHalfLifeTolerance = 0.5;

    /// <summary>Wigner κ for ν‡ = 1000i cm⁻¹ at 298.15 K = 1.970 (issue 3; E. Wigner, Z. Phys. Chem. B 19, 203 (1932)); ±0.0005.</summary>
    public const double Wigner1000At298 = 1.970;
    public const double WignerTolerance = 5e-4;

    /// <summary>
    /// ΔG = 1.364 kcal/mol gives a 10 : 1 population ratio at 298 K (RT ln 10; textbook rule, e.g. Anslyn &amp; Dougherty,
    /// Modern Physical Organic Chemistry, 2006, ch. 2, from memory); ±0.001 kcal/mol.
    /// </summary>
    public const double TenToOneKcalPerMol = 1.364;
    public const double TenToOneToleranceKcalPerMol = 1e-3;

    /// <summary>
    /// Robertson's problem at t = 40: y = (0.7158270687193, 9.185534764e-6, 0.2841637457) as usually tabulated (from memory);
    /// an independent SciPy 1.10 computation (Radau, rtol 1e-12) gives 0.715827068719429, 9.18553476455882e-6, 0.284163745745808,
    /// which are the values kept here.
    /// </summary>
    public static readonly double[] RobertsonAt40 = [0.715827068719429, 9.18553476455882e-6, 0.284163745745808];

    /// <summary>
    /// Robertson's problem at t = 10¹¹, reference solution of the Test Set for IVP Solvers (Mazzia and Magherini, University of
    /// Bari, release 2.4, 2008, problem ROBER; from memory): 0.2083340149701255e-7, 0.8333360770334713e-13, 0.9999999791665050.
    /// SciPy 1.10 Radau at rtol 1e-12 agrees to 1e-10 relative.
    /// </summary>
    public static readonly double[] RobertsonAt1e11 = [0.2083340149701255e-7, 0.8333360770334713e-13, 0.9999999791665050];

    /// <summary>
    /// Concentrations of the five-species linear network of MicrokineticsTests.LinearNetworkOverTwentyDecades (levels A 0, B 2, C −1,
    /// D 4, E −3, saddle points AB 3, BC 10, CD 28, DE 20, AE 15, BD 6 kcal/mol; Eyring at 298.15 K with the exact SI k_B, h, N_A;
    /// rate constants spanning 20.5 decades), [A]₀ = 1, at t = 1e-12, 1e-9, 1e-6, 1e-3, 1, 1e3, 1e6, 1e8 s: an independent computation,
    /// the matrix exponential exp(K t) c₀ in 60-digit arithmetic with mpmath 1.2 (a double-precision eigendecomposition cannot resolve
    /// the slow modes next to 10¹² s⁻¹ ones). Rows are times, columns A…E.
    /// </summary>
    public static readonly double[] LinearNetworkTimes = [1e-12, 1e-9, 1e-6, 1e-3, 1, 1e3, 1e6, 1e8];

    public static readonly double[][] LinearNetworkConcentrations =
    [
        [9.7698258663970071e-1, 2.292509527657249e-2, 1.1633131695640951e-7, 9.2201690439218033e-5, 6.1970628300930275e-11],
        [9.6557090579651333e-1, 3.3019530675411445e-2, 2.8032772503735213e-4, 1.1291751098521014e-3, 6.0693185768439487e-8],
        [7.3542051851243142e-1, 2.514911190695319e-2, 2.385172845033805e-1, 8.6002884873411904e-4, 5.3056228500771671e-5],
        [1.536549881887065e-1, 5.2545616381754018e-3, 8.3105651525556167e-1, 1.7969099667590474e-4, 9.8542439208805294e-3],
        [6.0821434637875397e-3, 2.0799193085960158e-4, 3.2889844878016663e-2, 7.1127298394416535e-6, 9.6081290699749675e-1],
        [6.0763185638052099e-3, 2.0779273592062914e-4, 3.2858340158887309e-2, 7.1059179415933736e-6, 9.6085044262344526e-1],
        [6.0763185638052099e-3, 2.0779273592062914e-4, 3.2858340158887309e-2, 7.1059179415933736e-6, 9.6085044262344526e-1],
        [6.0763185638052099e-3, 2.0779273592062914e-4, 3.2858340158887309e-2, 7.1059179415933736e-6, 9.6085044262344526e-1],
    ];
}
