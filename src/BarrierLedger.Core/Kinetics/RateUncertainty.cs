using MathNet.Numerics.Distributions;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Kinetics;

/// <summary>
/// A value with a central interval at <see cref="ConfidenceLevel"/> (e.g. 0.95) from an energy uncertainty σ; an interval with
/// σ = 0 is "no uncertainty set" and equals the value.
/// </summary>
public sealed record UncertainValue(double Value, double Lower, double Upper, double ConfidenceLevel, double SigmaKcalPerMol)
{
    /// <summary>Whether an uncertainty was set (σ &gt; 0).</summary>
    public bool IsSet => SigmaKcalPerMol > 0;

    /// <summary>Words to show when no uncertainty is set.</summary>
    public const string NotSet = "no uncertainty set";
}

/// <summary>
/// Analytic intervals for single steps. An energy difference ΔG with a normal error of standard deviation σ makes
/// ln k = ln k₀ − ΔG/RT normal with standard deviation σ/RT (Eyring equation; propagation of a normal error through exp), so
/// k lies in [k₀ e^{−zσ/RT}, k₀ e^{zσ/RT}] with probability equal to the confidence level, z = Φ⁻¹((1 + level)/2) (1.960 for 95 %).
/// The same factor applies to t½ = ln 2/k (inverted), and to a product ratio exp(−ΔΔG‡/RT) with σ of ΔΔG‡. Levels combine
/// as in <see cref="EnergyLevel.UncertaintyKcalPerMol"/>: a difference between levels of σ_a and σ_b has σ = √((σ_a² + σ_b²)/2).
/// </summary>
public static class RateUncertainty
{
    private const double R = PhysicalConstants.GasConstantJoulePerMoleKelvin;

    /// <summary>z = Φ⁻¹((1 + level)/2) of the standard normal distribution (1.959964 for 0.95).</summary>
    public static double Z(double confidenceLevel)
    {
        if (!(confidenceLevel > 0 && confidenceLevel < 1))
            throw new ArgumentException($"Confidence level must lie between 0 and 1, got {confidenceLevel}.", nameof(confidenceLevel));
        return Normal.InvCDF(0.0, 1.0, 0.5 + confidenceLevel / 2.0);
    }

    /// <summary>σ of a difference between two levels of σ_a and σ_b: √((σ_a² + σ_b²)/2).</summary>
    public static double DifferenceSigma(double sigmaAKcalPerMol, double sigmaBKcalPerMol)
    {
        if (!(sigmaAKcalPerMol >= 0) || !(sigmaBKcalPerMol >= 0))
            throw new ArgumentException("Uncertainties must be zero or positive.", nameof(sigmaAKcalPerMol));
        return Math.Sqrt((sigmaAKcalPerMol * sigmaAKcalPerMol + sigmaBKcalPerMol * sigmaBKcalPerMol) / 2.0);
    }

    /// <summary>Multiplicative half-width e^{zσ/RT} of the interval of a rate constant or ratio.</summary>
    public static double Factor(double sigmaKcalPerMol, double temperatureKelvin, double confidenceLevel = 0.95)
    {
        if (!(sigmaKcalPerMol >= 0) || !double.IsFinite(sigmaKcalPerMol))
            throw new ArgumentException($"Uncertainty must be zero or positive, got {sigmaKcalPerMol} kcal/mol.", nameof(sigmaKcalPerMol));
        if (!(temperatureKelvin > 0) || !double.IsFinite(temperatureKelvin))
            throw new ArgumentException($"Temperature must be positive, got {temperatureKelvin} K.", nameof(temperatureKelvin));
        var rtKcal = R * temperatureKelvin / (PhysicalConstants.ThermochemicalCalorieJoule * 1000.0);
        return Math.Exp(Z(confidenceLevel) * sigmaKcalPerMol / rtKcal);
    }

    /// <summary>Interval of a rate constant k (any unit) whose barrier has uncertainty σ.</summary>
    public static UncertainValue RateConstant(double rateConstant, double sigmaKcalPerMol, double temperatureKelvin, double confidenceLevel = 0.95)
    {
        var f = Factor(sigmaKcalPerMol, temperatureKelvin, confidenceLevel);
        return new UncertainValue(rateConstant, rateConstant / f, rateConstant * f, confidenceLevel, sigmaKcalPerMol);
    }

    /// <summary>Interval of a time inversely proportional to k (t½, time to a conversion of a first-order step).</summary>
    public static UncertainValue Time(double seconds, double sigmaKcalPerMol, double temperatureKelvin, double confidenceLevel = 0.95)
    {
        var f = Factor(sigmaKcalPerMol, temperatureKelvin, confidenceLevel);
        return new UncertainValue(seconds, seconds / f, seconds * f, confidenceLevel, sigmaKcalPerMol);
    }

    /// <summary>Interval of a ratio exp(−ΔΔG/RT) whose ΔΔG has uncertainty σ.</summary>
    public static UncertainValue Ratio(double ratio, double sigmaKcalPerMol, double temperatureKelvin, double confidenceLevel = 0.95) =>
        RateConstant(ratio, sigmaKcalPerMol, temperatureKelvin, confidenceLevel);
}
