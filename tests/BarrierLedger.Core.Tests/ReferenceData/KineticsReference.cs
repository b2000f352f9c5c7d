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
}
