using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Thermochemistry;

/// <summary>
/// Quasi-RRHO treatment of low-frequency modes.
/// Entropy (S. Grimme, Chem. Eur. J. 2012, 18, 9955): S = w S_HO + (1 − w) S_R with the damping function
/// w(ν̃) = 1 / (1 + (ω₀/ν̃)^α), α = 4, ω₀ = 100 cm⁻¹ by default; the free-rotor entropy S_R = R [½ + ln √(8π³ μ′ k_B T / h²)] with the
/// moment of inertia of a rotor of the same frequency μ = h / (8π² c ν̃) and μ′ = μ B_av / (μ + B_av), B_av = 10⁻⁴⁴ kg m².
/// Energy (Y.-P. Li, J. Gomes, S. M. Sharada, A. T. Bell, M. Head-Gordon, J. Phys. Chem. C 2015, 119, 1840):
/// U = w U_HO + (1 − w) ½ R T, the free-rotor average energy for one rotational degree of freedom; U_HO includes the zero-point
/// energy (our reading of the paper's interpolation of the full vibrational energy).
/// </summary>
public static class QuasiRrho
{
    /// <summary>Exponent α of the damping function (Grimme 2012).</summary>
    public const double DampingExponent = 4.0;

    /// <summary>Average molecular moment of inertia B_av in kg m² that caps the free-rotor moment (Grimme 2012).</summary>
    public const double AverageMomentOfInertiaKgM2 = 1e-44;

    /// <summary>Default cut-off ω₀ in cm⁻¹ (Grimme 2012).</summary>
    public const double DefaultCutoffCm1 = 100.0;

    private const double R = PhysicalConstants.GasConstantJoulePerMoleKelvin;

    /// <summary>Damping weight w = 1 / (1 + (ω₀/ν̃)^α); 0.5 at ν̃ = ω₀, → 1 above, → 0 below.</summary>
    public static double DampingWeight(double wavenumberCm1, double cutoffCm1 = DefaultCutoffCm1, double exponent = DampingExponent)
    {
        if (!(wavenumberCm1 > 0)) throw new ArgumentException($"Wavenumber must be positive, got {wavenumberCm1} cm⁻¹.", nameof(wavenumberCm1));
        if (!(cutoffCm1 > 0)) throw new ArgumentException($"Cut-off must be positive, got {cutoffCm1} cm⁻¹.", nameof(cutoffCm1));
        return 1.0 / (1.0 + Math.Pow(cutoffCm1 / wavenumberCm1, exponent));
    }

    /// <summary>Moment of inertia μ = h / (8π² c ν̃) in kg m² of a free rotor with the mode's frequency.</summary>
    public static double RotorMomentKgM2(double wavenumberCm1) =>
        PhysicalConstants.PlanckJouleSecond / (8.0 * Math.PI * Math.PI * PhysicalConstants.SpeedOfLightMetrePerSecond * 100.0 * wavenumberCm1);

    /// <summary>Free-rotor entropy S_R = R [½ + ln √(8π³ μ′ k_B T / h²)] in J/(mol K), μ′ = μ B_av/(μ + B_av).</summary>
    public static double FreeRotorEntropyJoulePerMoleKelvin(double wavenumberCm1, double temperatureKelvin)
    {
        if (!(wavenumberCm1 > 0)) throw new ArgumentException($"Wavenumber must be positive, got {wavenumberCm1} cm⁻¹.", nameof(wavenumberCm1));
        var mu = RotorMomentKgM2(wavenumberCm1);
        var muPrime = mu * AverageMomentOfInertiaKgM2 / (mu + AverageMomentOfInertiaKgM2);
        var h = PhysicalConstants.PlanckJouleSecond;
        var arg = 8.0 * Math.PI * Math.PI * Math.PI * muPrime * PhysicalConstants.BoltzmannJoulePerKelvin * temperatureKelvin / (h * h);
        return R * (0.5 + 0.5 * Math.Log(arg));
    }

    /// <summary>Interpolated entropy w S_HO + (1 − w) S_R in J/(mol K).</summary>
    public static double EntropyJoulePerMoleKelvin(double wavenumberCm1, double temperatureKelvin, double cutoffCm1 = DefaultCutoffCm1)
    {
        var w = DampingWeight(wavenumberCm1, cutoffCm1);
        return w * HarmonicOscillator.EntropyJoulePerMoleKelvin(wavenumberCm1, temperatureKelvin)
               + (1.0 - w) * FreeRotorEntropyJoulePerMoleKelvin(wavenumberCm1, temperatureKelvin);
    }

    /// <summary>Interpolated energy w U_HO + (1 − w) ½ R T in J/mol (U_HO with zero-point energy).</summary>
    public static double ThermalEnergyJoulePerMole(double wavenumberCm1, double temperatureKelvin, double cutoffCm1 = DefaultCutoffCm1)
    {
        var w = DampingWeight(wavenumberCm1, cutoffCm1);
        return w * HarmonicOscillator.ThermalEnergyJoulePerMole(wavenumberCm1, temperatureKelvin) + (1.0 - w) * 0.5 * R * temperatureKelvin;
    }

    /// <summary>Interpolated heat capacity w C_V,HO + (1 − w) ½ R in J/(mol K) (the interpolation applied to C_V, weight held fixed).</summary>
    public static double HeatCapacityJoulePerMoleKelvin(double wavenumberCm1, double temperatureKelvin, double cutoffCm1 = DefaultCutoffCm1)
    {
        var w = DampingWeight(wavenumberCm1, cutoffCm1);
        return w * HarmonicOscillator.HeatCapacityJoulePerMoleKelvin(wavenumberCm1, temperatureKelvin) + (1.0 - w) * 0.5 * R;
    }
}
