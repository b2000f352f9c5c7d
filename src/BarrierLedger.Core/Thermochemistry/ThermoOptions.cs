namespace BarrierLedger.Core.Thermochemistry;

/// <summary>How vibrations are treated in <see cref="IdealGasThermo.Compute(Geometry.Molecule, IReadOnlyList{double}, ThermoOptions, IReadOnlyList{double})"/>.</summary>
public enum ThermoTreatment
{
    /// <summary>Rigid rotor, harmonic oscillator for every real mode.</summary>
    Rrho,
    /// <summary>Grimme's quasi-RRHO entropy: low modes interpolate to free-rotor entropy (Chem. Eur. J. 2012, 18, 9955).</summary>
    QuasiRrhoEntropy,
    /// <summary>Grimme's entropy plus the analogous enthalpy interpolation of Li, Head-Gordon et al. (J. Phys. Chem. C 2015, 119, 1840).</summary>
    QuasiRrhoEntropyAndEnthalpy,
}

/// <summary>The reference state of the translational partition function.</summary>
public enum StandardState
{
    /// <summary>Ideal gas at <see cref="ThermoOptions.PressurePascal"/> (1 atm = 101325 Pa unless changed).</summary>
    Gas1Atm,
    /// <summary>Ideal gas at 1 bar = 10⁵ Pa (the IUPAC standard pressure, used by NIST-JANAF).</summary>
    Gas1Bar,
    /// <summary>
    /// Ideal solute at 1 mol/L (or <see cref="ThermoOptions.ConcentrationMolPerL"/>): treated as an ideal gas at the pressure
    /// p = c R T at which its concentration is c (Ben-Naim's standard-state argument; at 298.15 K, 1 mol/L ↔ 24.46 atm).
    /// </summary>
    Solution1Molar,
}

/// <summary>
/// The words of a standard state, "1 mol/L", "1 atm" or "1 bar": the one spelling the screens, exports, the bundle's
/// <c>energy_model.standard_state</c> and the command line's printout use.
/// </summary>
public static class StandardStateNames
{
    public static string Text(StandardState s) => s switch
    {
        StandardState.Solution1Molar => "1 mol/L",
        StandardState.Gas1Bar => "1 bar",
        StandardState.Gas1Atm => "1 atm",
        _ => throw new ArgumentOutOfRangeException(nameof(s), s, "Unknown standard state."),
    };

    /// <summary>Reads <see cref="Text"/>'s words back (case and surrounding spaces ignored).</summary>
    public static bool TryParse(string text, out StandardState state)
    {
        ArgumentNullException.ThrowIfNull(text);
        foreach (var s in Enum.GetValues<StandardState>())
            if (string.Equals(Text(s), text.Trim(), StringComparison.OrdinalIgnoreCase)) { state = s; return true; }
        state = StandardState.Gas1Atm;
        return false;
    }
}

/// <summary>
/// Settings for an ideal-gas rigid-rotor harmonic-oscillator thermochemistry.
/// </summary>
/// <param name="TemperatureKelvin">T in K, positive.</param>
/// <param name="PressurePascal">Gas pressure in Pa for <see cref="StandardState.Gas1Atm"/>; leave at 101325 for the other states.</param>
/// <param name="SymmetryNumber">Rotational symmetry number σ (1 for C₁, 2 for H₂O, CO₂ and N₂, 3 for NH₃, 12 for CH₄ and C₆H₆).</param>
/// <param name="Treatment">RRHO or a quasi-RRHO variant.</param>
/// <param name="QuasiRrhoCutoffCm1">ω₀ of the quasi-RRHO damping function w = 1/(1 + (ω₀/ν̃)⁴), cm⁻¹ (Grimme 2012: 100).</param>
/// <param name="StandardState">Reference state of the translational entropy.</param>
/// <param name="ConcentrationMolPerL">Concentration for <see cref="StandardState.Solution1Molar"/>, mol/L (default 1; e.g. 55.34 for neat water).</param>
public sealed record ThermoOptions(
    double TemperatureKelvin = 298.15,
    double PressurePascal = Units.PhysicalConstants.StandardAtmospherePascal,
    int SymmetryNumber = 1,
    ThermoTreatment Treatment = ThermoTreatment.Rrho,
    double QuasiRrhoCutoffCm1 = 100.0,
    StandardState StandardState = StandardState.Gas1Atm,
    double? ConcentrationMolPerL = null)
{
    /// <summary>298.15 K, 1 atm, σ = 1, RRHO.</summary>
    public static ThermoOptions Default { get; } = new();
}

/// <summary>
/// The words the energy model, the bundle's <c>energy_model.low_modes</c> and <c>barrierledger thermo --low-modes</c> use for a
/// <see cref="ThermoTreatment"/>: "harmonic" (RRHO), "entropy" (quasi-RRHO entropy), "entropy-enthalpy" (quasi-RRHO entropy
/// and enthalpy). The stored enum values do not change with these names.
/// </summary>
public static class LowModeNames
{
    public const string Harmonic = "harmonic";
    public const string Entropy = "entropy";
    public const string EntropyEnthalpy = "entropy-enthalpy";

    public static IReadOnlyList<string> All { get; } = [Harmonic, Entropy, EntropyEnthalpy];

    public static string Name(ThermoTreatment treatment) => treatment switch
    {
        ThermoTreatment.Rrho => Harmonic,
        ThermoTreatment.QuasiRrhoEntropy => Entropy,
        ThermoTreatment.QuasiRrhoEntropyAndEnthalpy => EntropyEnthalpy,
        _ => throw new ArgumentOutOfRangeException(nameof(treatment), treatment, "Unknown treatment."),
    };

    public static bool TryParse(string? name, out ThermoTreatment treatment)
    {
        (var ok, treatment) = (name ?? "").Trim().ToLowerInvariant() switch
        {
            Harmonic => (true, ThermoTreatment.Rrho),
            Entropy => (true, ThermoTreatment.QuasiRrhoEntropy),
            EntropyEnthalpy => (true, ThermoTreatment.QuasiRrhoEntropyAndEnthalpy),
            _ => (false, ThermoTreatment.Rrho),
        };
        return ok;
    }

    /// <summary>
    /// What the treatment does, in words of our own, for banners, headers, the supporting information and the command line:
    /// "harmonic (RRHO)", "low-mode entropy interpolated (ω₀ = 100 cm⁻¹)", "low-mode entropy and enthalpy interpolated
    /// (ω₀ = 100 cm⁻¹)". The published methods are named by <see cref="Reference"/>.
    /// </summary>
    public static string Describe(ThermoTreatment treatment, double cutoffCm1) => treatment switch
    {
        ThermoTreatment.Rrho => "harmonic (RRHO)",
        ThermoTreatment.QuasiRrhoEntropy => $"low-mode entropy interpolated (ω₀ = {Cutoff(cutoffCm1)} cm⁻¹)",
        ThermoTreatment.QuasiRrhoEntropyAndEnthalpy => $"low-mode entropy and enthalpy interpolated (ω₀ = {Cutoff(cutoffCm1)} cm⁻¹)",
        _ => throw new ArgumentOutOfRangeException(nameof(treatment), treatment, "Unknown treatment."),
    };

    /// <summary>Short citation for a tooltip or a column note: "", "Grimme 2012", "Grimme 2012; Li et al. 2015".</summary>
    public static string ShortReference(ThermoTreatment treatment) => treatment switch
    {
        ThermoTreatment.Rrho => "",
        ThermoTreatment.QuasiRrhoEntropy => "Grimme 2012",
        _ => "Grimme 2012; Li et al. 2015",
    };

    /// <summary>The published method with all authors, for an export footnote; empty for the harmonic treatment.</summary>
    public static string Reference(ThermoTreatment treatment) => treatment switch
    {
        ThermoTreatment.Rrho => "",
        ThermoTreatment.QuasiRrhoEntropy => "Low-mode entropy: S. Grimme, Chem. Eur. J. 2012, 18, 9955.",
        _ => "Low-mode entropy: S. Grimme, Chem. Eur. J. 2012, 18, 9955. Low-mode enthalpy: Y.-P. Li, J. Gomes, S. M. Sharada, " +
             "A. T. Bell and M. Head-Gordon, J. Phys. Chem. C 2015, 119, 1840 (Li et al. 2015).",
    };

    private static string Cutoff(double cm1) => cm1.ToString("0.#", System.Globalization.CultureInfo.InvariantCulture);

    /// <summary>As <see cref="TryParse"/>; throws <see cref="ArgumentException"/> naming the accepted words.</summary>
    public static ThermoTreatment Parse(string name) => TryParse(name, out var t)
        ? t : throw new ArgumentException($"'{name}' is not a low-mode treatment; use {string.Join(", ", All)}.", nameof(name));
}
