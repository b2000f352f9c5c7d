using BarrierLedger.Core.Units;
using MathNet.Numerics.RootFinding;

namespace BarrierLedger.Core.Kinetics;

/// <summary>
/// Transition-state theory rate constants (H. Eyring, J. Chem. Phys. 3, 107 (1935); IUPAC Gold Book "Eyring equation"):
/// k = κ (k_B T / h) (c°)^{1−m} exp(−ΔG‡ / RT), with ΔG‡ the standard Gibbs energy of activation for the standard state
/// c° (mol/L) and m the molecularity. Units: s⁻¹ for m = 1, M⁻¹ s⁻¹ for m = 2, M⁻² s⁻¹ for m = 3. Constants CODATA 2018.
/// </summary>
public static class Eyring
{
    private const double R = PhysicalConstants.GasConstantJoulePerMoleKelvin;

    /// <summary>Universal frequency factor k_B T / h in s⁻¹ (6.2124×10¹² s⁻¹ at 298.15 K).</summary>
    public static double FrequencyFactorPerSecond(double temperatureKelvin)
    {
        RequireTemperature(temperatureKelvin);
        return PhysicalConstants.BoltzmannJoulePerKelvin * temperatureKelvin / PhysicalConstants.PlanckJouleSecond;
    }

    /// <summary>
    /// k = κ (k_B T/h) (c°)^{1−m} exp(−ΔG‡/RT). <paramref name="gibbsBarrier"/> per molecule (any unit; molar via N_A),
    /// <paramref name="standardConcentrationMolPerL"/> the standard state the barrier refers to (1 mol/L by default).
    /// </summary>
    public static double RateConstant(
        Energy gibbsBarrier, double temperatureKelvin, double transmissionCoefficient = 1.0, int molecularity = 1, double standardConcentrationMolPerL = 1.0)
    {
        RequireTemperature(temperatureKelvin);
        if (!(transmissionCoefficient > 0) || !double.IsFinite(transmissionCoefficient))
            throw new ArgumentException($"Transmission coefficient must be positive and finite, got {transmissionCoefficient}.", nameof(transmissionCoefficient));
        if (molecularity is < 1 or > 3)
            throw new ArgumentException($"Molecularity must be 1, 2 or 3, got {molecularity}.", nameof(molecularity));
        if (!(standardConcentrationMolPerL > 0) || !double.IsFinite(standardConcentrationMolPerL))
            throw new ArgumentException($"Standard concentration must be positive, got {standardConcentrationMolPerL} mol/L.", nameof(standardConcentrationMolPerL));
        if (!double.IsFinite(gibbsBarrier.Hartree))
            throw new ArgumentException($"Barrier must be finite, got {gibbsBarrier}.", nameof(gibbsBarrier));
        var exponent = -gibbsBarrier.KJPerMol * 1000.0 / (R * temperatureKelvin);
        return transmissionCoefficient * FrequencyFactorPerSecond(temperatureKelvin)
               * Math.Pow(standardConcentrationMolPerL, 1 - molecularity) * Math.Exp(exponent);
    }

    /// <summary>Gibbs barrier that gives first-order rate constant k at T: ΔG‡ = −RT ln(k h / (κ k_B T)).</summary>
    public static Energy BarrierForRateConstant(double rateConstantPerSecond, double temperatureKelvin, double transmissionCoefficient = 1.0)
    {
        if (!(rateConstantPerSecond > 0)) throw new ArgumentException($"Rate constant must be positive, got {rateConstantPerSecond}.", nameof(rateConstantPerSecond));
        var ratio = rateConstantPerSecond / (transmissionCoefficient * FrequencyFactorPerSecond(temperatureKelvin));
        return Energy.FromKJPerMol(-R * temperatureKelvin * Math.Log(ratio) / 1000.0);
    }

    /// <summary>First-order half-life t½ = ln 2 / k in s.</summary>
    public static double HalfLifeSeconds(double rateConstantPerSecond)
    {
        if (!(rateConstantPerSecond > 0) || double.IsNaN(rateConstantPerSecond))
            throw new ArgumentException($"Rate constant must be positive, got {rateConstantPerSecond} s⁻¹.", nameof(rateConstantPerSecond));
        return Math.Log(2.0) / rateConstantPerSecond;
    }

    /// <summary>
    /// The temperature (K) at which a first-order step with Gibbs barrier ΔG‡ (held fixed, i.e. its own temperature dependence
    /// ignored) has half-life <paramref name="halfLifeSeconds"/>: the root of ln κ + ln(k_B T/h) − ΔG‡/RT = ln(ln 2 / t½),
    /// found with Brent's method in ln T between 10⁻³ and 10⁷ K. Throws <see cref="ArgumentException"/> for a barrier ≤ 0
    /// (the rate is then not monotonic in T) and <see cref="InvalidOperationException"/> if no temperature in that range works.
    /// </summary>
    public static double TemperatureForHalfLife(Energy gibbsBarrier, double halfLifeSeconds, double transmissionCoefficient = 1.0) =>
        TryTemperatureForHalfLife(gibbsBarrier, halfLifeSeconds, out var t, out var error, transmissionCoefficient)
            ? t
            : throw new InvalidOperationException(error);

    /// <summary>As <see cref="TemperatureForHalfLife"/>; returns false with the reason instead of throwing for an unreachable half-life.</summary>
    public static bool TryTemperatureForHalfLife(
        Energy gibbsBarrier, double halfLifeSeconds, out double temperatureKelvin, out string error, double transmissionCoefficient = 1.0)
    {
        if (!(gibbsBarrier.Hartree > 0) || !double.IsFinite(gibbsBarrier.Hartree))
            throw new ArgumentException($"Barrier must be positive and finite to solve for a temperature, got {gibbsBarrier.KcalPerMol:G6} kcal/mol.", nameof(gibbsBarrier));
        if (!(halfLifeSeconds > 0) || !double.IsFinite(halfLifeSeconds))
            throw new ArgumentException($"Half-life must be positive and finite, got {halfLifeSeconds} s.", nameof(halfLifeSeconds));
        if (!(transmissionCoefficient > 0) || !double.IsFinite(transmissionCoefficient))
            throw new ArgumentException($"Transmission coefficient must be positive and finite, got {transmissionCoefficient}.", nameof(transmissionCoefficient));
        var target = Math.Log(Math.Log(2.0) / halfLifeSeconds);
        var barrierJoulePerMole = gibbsBarrier.KJPerMol * 1000.0;
        double F(double lnT)
        {
            var t = Math.Exp(lnT);
            return Math.Log(transmissionCoefficient)
                   + Math.Log(PhysicalConstants.BoltzmannJoulePerKelvin * t / PhysicalConstants.PlanckJouleSecond)
                   - barrierJoulePerMole / (R * t) - target;
        }
        double lo = Math.Log(1e-3), hi = Math.Log(1e7);
        if (F(lo) > 0 || F(hi) < 0)
        {
            temperatureKelvin = double.NaN;
            error = $"No temperature between 1e-3 K and 1e7 K gives a half-life of {halfLifeSeconds:G4} s for a barrier of {gibbsBarrier.KcalPerMol:F2} kcal/mol.";
            return false;
        }
        if (!Brent.TryFindRoot(F, lo, hi, 1e-13, 200, out var root))
        {
            temperatureKelvin = double.NaN;
            error = "Brent's method did not converge.";
            return false;
        }
        temperatureKelvin = Math.Exp(root);
        error = "";
        return true;
    }

    private static void RequireTemperature(double temperatureKelvin)
    {
        if (!(temperatureKelvin > 0) || !double.IsFinite(temperatureKelvin))
            throw new ArgumentException($"Temperature must be positive and finite, got {temperatureKelvin} K.", nameof(temperatureKelvin));
    }
}
