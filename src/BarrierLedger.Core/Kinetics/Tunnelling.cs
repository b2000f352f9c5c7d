using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Kinetics;

/// <summary>
/// Tunnelling transmission coefficients κ for a rate constant (multiply the Eyring k by κ). Wavenumbers in cm⁻¹ (the magnitude
/// of the imaginary frequency; the sign is ignored), temperatures in K, barriers per molecule as <see cref="Energy"/>.
/// </summary>
public static class Tunnelling
{
    /// <summary>
    /// Wigner's correction (E. Wigner, Z. Phys. Chem. B 19, 203 (1932)): κ = 1 + (1/24) (h c |ν̃‡| / k_B T)².
    /// κ(1000i cm⁻¹, 298.15 K) = 1.970.
    /// </summary>
    public static double Wigner(double imaginaryFrequencyCm1, double temperatureKelvin)
    {
        var u = ReducedFrequency(imaginaryFrequencyCm1, temperatureKelvin);
        return 1.0 + u * u / 24.0;
    }

    /// <summary>
    /// Skodje–Truhlar κ for a truncated parabolic barrier (R. T. Skodje and D. G. Truhlar, J. Phys. Chem. 85, 624 (1981), eqs. 14–15):
    /// α = 2π/(h c |ν̃‡|), β = 1/(k_B T), ΔV‡ the forward barrier, V = 0 for an exoergic step and V = ΔV‡ − ΔV‡_reverse for an
    /// endoergic one;
    /// β ≤ α: κ = (βπ/α)/sin(βπ/α) − β/(α − β) · exp[(β − α)(ΔV‡ − V)];
    /// β &gt; α: κ = β/(β − α) · (exp[(β − α)(ΔV‡ − V)] − 1);
    /// at β = α both tend to β (ΔV‡ − V). The barriers are normally zero-point-corrected electronic barriers (vibrationally
    /// adiabatic), which is what Skodje and Truhlar use.
    /// </summary>
    public static double SkodjeTruhlar(double imaginaryFrequencyCm1, Energy forwardBarrier, Energy reverseBarrier, double temperatureKelvin)
    {
        RequireFrequencyAndTemperature(imaginaryFrequencyCm1, temperatureKelvin);
        if (!(forwardBarrier.Hartree > 0) || !double.IsFinite(forwardBarrier.Hartree))
            throw new ArgumentException($"Forward barrier must be positive, got {forwardBarrier.KcalPerMol:G6} kcal/mol.", nameof(forwardBarrier));
        if (!(reverseBarrier.Hartree > 0) || !double.IsFinite(reverseBarrier.Hartree))
            throw new ArgumentException($"Reverse barrier must be positive, got {reverseBarrier.KcalPerMol:G6} kcal/mol.", nameof(reverseBarrier));
        var quantum = PhysicalConstants.PlanckJouleSecond * PhysicalConstants.SpeedOfLightMetrePerSecond * 100.0 * Math.Abs(imaginaryFrequencyCm1);
        var alpha = 2.0 * Math.PI / quantum;
        var beta = 1.0 / (PhysicalConstants.BoltzmannJoulePerKelvin * temperatureKelvin);
        var forward = forwardBarrier.Hartree * PhysicalConstants.HartreeJoule;
        var reactionEnergy = (forwardBarrier - reverseBarrier).Hartree * PhysicalConstants.HartreeJoule;
        var v = reactionEnergy > 0 ? reactionEnergy : 0.0;
        var span = forward - v;
        var ratio = beta / alpha;
        if (Math.Abs(1.0 - ratio) < 1e-6) return beta * span;
        if (beta < alpha)
        {
            var x = Math.PI * ratio;
            return x / Math.Sin(x) - beta / (alpha - beta) * Math.Exp((beta - alpha) * span);
        }
        return beta / (beta - alpha) * ExpM1((beta - alpha) * span);
    }

    /// <summary>
    /// Bell's correction for a one-dimensional parabolic barrier (R. P. Bell, The Tunnel Effect in Chemistry, Chapman and Hall,
    /// 1980, ch. 2; Trans. Faraday Soc. 55, 1 (1959)). With u = h c |ν̃‡| / k_B T and the barrier height V₀ (the zero-point-corrected
    /// barrier, as in <see cref="SkodjeTruhlar"/>), the thermally averaged transmission of the parabola cut off at the reactant energy is
    /// <code>Q = (u/2)/sin(u/2) − Σ_{n=1}^{N} (−1)^{n−1} u/(2πn − u) · exp[(u − 2πn) V₀/(u k_B T)]</code>
    /// The first term alone (<paramref name="terms"/> = 0, or no barrier given) is the infinite parabola; the series is alternating with
    /// falling terms, so the error of stopping after N terms is below the first term left out. N = 1 is Skodje and Truhlar's expression
    /// for an exoergic step. Defined above the crossover temperature only (u &lt; 2π): below it the parabolic model fails and this
    /// throws <see cref="ArgumentException"/>.
    /// </summary>
    /// <param name="imaginaryFrequencyCm1">|ν̃‡| in cm⁻¹ (sign ignored).</param>
    /// <param name="temperatureKelvin">T in K.</param>
    /// <param name="barrier">V₀ per molecule; null for the infinite parabola.</param>
    /// <param name="terms">N, the number of terms of the sum kept (0 to 50).</param>
    public static double Bell(double imaginaryFrequencyCm1, double temperatureKelvin, Energy? barrier = null, int terms = BellDefaultTerms)
    {
        var u = ReducedFrequency(imaginaryFrequencyCm1, temperatureKelvin);
        if (terms is < 0 or > 50) throw new ArgumentException($"Bell's series is kept to 0–50 terms, got {terms}.", nameof(terms));
        if (u >= 2.0 * Math.PI)
            throw new ArgumentException(
                $"Bell's parabolic correction needs T above the crossover temperature {CrossoverTemperatureKelvin(imaginaryFrequencyCm1):F1} K " +
                $"(|ν̃‡| = {Math.Abs(imaginaryFrequencyCm1):F1} cm⁻¹, T = {temperatureKelvin} K).", nameof(temperatureKelvin));
        var q = 0.5 * u / Math.Sin(0.5 * u);
        if (barrier is not { } v) return q;
        if (!(v.Hartree > 0) || !double.IsFinite(v.Hartree))
            throw new ArgumentException($"Barrier must be positive, got {v.KcalPerMol:G6} kcal/mol.", nameof(barrier));
        var heightOverKT = v.Hartree * PhysicalConstants.HartreeJoule / (PhysicalConstants.BoltzmannJoulePerKelvin * temperatureKelvin);
        for (var n = 1; n <= terms; n++)
        {
            var sign = n % 2 == 1 ? 1.0 : -1.0;
            q -= sign * u / (2.0 * Math.PI * n - u) * Math.Exp((u - 2.0 * Math.PI * n) * heightOverKT / u);
        }
        return q;
    }

    /// <summary>The number of terms of Bell's series kept by default: 1, the first correction for the finite barrier. Each further term is
    /// smaller than the one before by about exp(−2π V₀ / (h c |ν̃‡|)): 4×10⁻⁷ for V₀ = 10 kcal/mol and |ν̃‡| = 1500 cm⁻¹.</summary>
    public const int BellDefaultTerms = 1;

    /// <summary>
    /// Crossover temperature T_c = h c |ν̃‡| / (2π k_B) in K below which tunnelling dominates (β &gt; α in Skodje–Truhlar).
    /// </summary>
    public static double CrossoverTemperatureKelvin(double imaginaryFrequencyCm1) =>
        PhysicalConstants.PlanckJouleSecond * PhysicalConstants.SpeedOfLightMetrePerSecond * 100.0 * Math.Abs(imaginaryFrequencyCm1)
        / (2.0 * Math.PI * PhysicalConstants.BoltzmannJoulePerKelvin);

    /// <summary>u = h c |ν̃| / (k_B T), dimensionless.</summary>
    private static double ReducedFrequency(double imaginaryFrequencyCm1, double temperatureKelvin)
    {
        RequireFrequencyAndTemperature(imaginaryFrequencyCm1, temperatureKelvin);
        return PhysicalConstants.PlanckJouleSecond * PhysicalConstants.SpeedOfLightMetrePerSecond * 100.0 * Math.Abs(imaginaryFrequencyCm1)
               / (PhysicalConstants.BoltzmannJoulePerKelvin * temperatureKelvin);
    }

    private static void RequireFrequencyAndTemperature(double imaginaryFrequencyCm1, double temperatureKelvin)
    {
        if (!double.IsFinite(imaginaryFrequencyCm1) || imaginaryFrequencyCm1 == 0)
            throw new ArgumentException($"Imaginary frequency must be non-zero and finite, got {imaginaryFrequencyCm1} cm⁻¹.", nameof(imaginaryFrequencyCm1));
        if (!(temperatureKelvin > 0) || !double.IsFinite(temperatureKelvin))
            throw new ArgumentException($"Temperature must be positive and finite, got {temperatureKelvin} K.", nameof(temperatureKelvin));
    }

    private static double ExpM1(double x) => Math.Abs(x) < 1e-5 ? x + 0.5 * x * x : Math.Exp(x) - 1.0;
}
