using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Thermochemistry;

/// <summary>
/// Molar thermodynamic functions of one harmonic oscillator of wavenumber ν̃ (cm⁻¹) at temperature T (K), energies measured from the
/// bottom of the well (McQuarrie, Statistical Mechanics, 1976, ch. 8). With θ = h c ν̃ / k_B and x = θ/T:
/// ZPE = ½ R θ; U = R θ (½ + 1/(eˣ − 1)); S = R [x/(eˣ − 1) − ln(1 − e⁻ˣ)]; C_V = R x² eˣ/(eˣ − 1)². Units: J/mol, J/(mol K).
/// Constants CODATA 2018.
/// </summary>
public static class HarmonicOscillator
{
    /// <summary>Second radiation constant h c / k_B in cm·K (1.438776877 cm K, CODATA 2018).</summary>
    public const double SecondRadiationConstantCmKelvin =
        PhysicalConstants.PlanckJouleSecond * PhysicalConstants.SpeedOfLightMetrePerSecond * 100.0 / PhysicalConstants.BoltzmannJoulePerKelvin;

    private const double R = PhysicalConstants.GasConstantJoulePerMoleKelvin;

    /// <summary>Vibrational temperature θ = h c ν̃ / k_B in K.</summary>
    public static double VibrationalTemperatureKelvin(double wavenumberCm1) => SecondRadiationConstantCmKelvin * wavenumberCm1;

    /// <summary>Zero-point energy ½ N_A h c ν̃ in J/mol.</summary>
    public static double ZeroPointEnergyJoulePerMole(double wavenumberCm1)
    {
        RequirePositive(wavenumberCm1);
        return 0.5 * R * VibrationalTemperatureKelvin(wavenumberCm1);
    }

    /// <summary>U(T) − U_bottom = R θ (½ + 1/(eˣ − 1)) in J/mol (zero-point energy included).</summary>
    public static double ThermalEnergyJoulePerMole(double wavenumberCm1, double temperatureKelvin)
    {
        RequirePositive(wavenumberCm1);
        var theta = VibrationalTemperatureKelvin(wavenumberCm1);
        return R * theta * (0.5 + 1.0 / ExpM1(theta / temperatureKelvin));
    }

    /// <summary>S = R [x/(eˣ − 1) − ln(1 − e⁻ˣ)] in J/(mol K).</summary>
    public static double EntropyJoulePerMoleKelvin(double wavenumberCm1, double temperatureKelvin)
    {
        RequirePositive(wavenumberCm1);
        var x = VibrationalTemperatureKelvin(wavenumberCm1) / temperatureKelvin;
        return R * (x / ExpM1(x) - Math.Log(-ExpM1(-x)));
    }

    /// <summary>C_V = R x² eˣ/(eˣ − 1)² in J/(mol K).</summary>
    public static double HeatCapacityJoulePerMoleKelvin(double wavenumberCm1, double temperatureKelvin)
    {
        RequirePositive(wavenumberCm1);
        var x = VibrationalTemperatureKelvin(wavenumberCm1) / temperatureKelvin;
        if (x > 700) return 0.0;
        var em1 = ExpM1(x);
        return R * x * x * Math.Exp(x) / (em1 * em1);
    }

    /// <summary>eˣ − 1, accurate for small |x| (series below 1e-5, where Exp(x) − 1 would lose digits).</summary>
    private static double ExpM1(double x) => Math.Abs(x) < 1e-5 ? x + 0.5 * x * x + x * x * x / 6.0 : Math.Exp(x) - 1.0;

    private static void RequirePositive(double wavenumberCm1)
    {
        if (!(wavenumberCm1 > 0) || !double.IsFinite(wavenumberCm1))
            throw new ArgumentException($"A harmonic oscillator needs a positive, finite wavenumber; got {wavenumberCm1} cm⁻¹.", nameof(wavenumberCm1));
    }
}
