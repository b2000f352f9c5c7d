using System.Globalization;
using System.Security.Cryptography;
using System.Text;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Records;

namespace BarrierLedger.Ledger.Derivation;

/// <summary>
/// The energy model in force for a study, as values. <see cref="Fingerprint"/> covers everything that changes a derived
/// number (not the display unit); <see cref="CheckFingerprint"/> covers what changes a frequency check.
/// </summary>
public sealed record ModelSettings(
    string EnergyLevel,
    string ThermalLevel,
    double TemperatureKelvin,
    StandardState StandardState,
    ThermoTreatment Treatment,
    double QuasiRrhoCutoffCm1,
    TunnellingCorrection Tunnelling,
    EnergyUnit DisplayUnit,
    double SignificantImaginaryCm1,
    double ScanJumpKcalPerMol)
{
    public static ModelSettings Default { get; } = From(new EnergyModel());

    /// <summary>
    /// σ (kcal/mol) of a barrier at any level not listed in <see cref="UncertaintyByLevel"/>; null: no uncertainty set. Intervals are
    /// computed when shown, so this is not part of <see cref="Fingerprint"/> (changing it recomputes nothing).
    /// </summary>
    public double? UncertaintyKcalPerMol { get; init; } = Kinetics.EnergyUncertainty.CommonPracticeKcalPerMol;

    /// <summary>σ per level of theory, one "level = σ" per line (see <see cref="Kinetics.EnergyUncertainty"/>).</summary>
    public string UncertaintyByLevel { get; init; } = "";

    /// <summary>How a species with several conformers enters the energies (issue 21); part of <see cref="Fingerprint"/>.</summary>
    public Core.Conformers.ConformerChoice Conformers { get; init; } = Core.Conformers.ConformerChoice.Lowest;

    /// <summary>The uncertainties these settings set (none when they cannot be read).</summary>
    public Kinetics.EnergyUncertainty Uncertainty =>
        Kinetics.EnergyUncertainty.Problems(UncertaintyKcalPerMol, UncertaintyByLevel, out var levels).Count == 0
            ? new Kinetics.EnergyUncertainty(UncertaintyKcalPerMol, levels)
            : Kinetics.EnergyUncertainty.None;

    public static ModelSettings From(EnergyModel m) => new(m.EnergyLevel.Trim(), m.ThermalLevel.Trim(), m.TemperatureKelvin, m.StandardState,
        m.Treatment, m.QuasiRrhoCutoffCm1, m.Tunnelling, m.DisplayUnit, m.SignificantImaginaryCm1, m.ScanJumpKcalPerMol)
    {
        UncertaintyKcalPerMol = m.UncertaintyKcalPerMol,
        UncertaintyByLevel = m.UncertaintyByLevel,
        Conformers = m.Conformers,
    };

    public void CopyTo(EnergyModel m)
    {
        m.EnergyLevel = EnergyLevel.Trim();
        m.ThermalLevel = ThermalLevel.Trim();
        m.TemperatureKelvin = TemperatureKelvin;
        m.StandardState = StandardState;
        m.Treatment = Treatment;
        m.QuasiRrhoCutoffCm1 = QuasiRrhoCutoffCm1;
        m.Tunnelling = Tunnelling;
        m.DisplayUnit = DisplayUnit;
        m.SignificantImaginaryCm1 = SignificantImaginaryCm1;
        m.ScanJumpKcalPerMol = ScanJumpKcalPerMol;
        m.UncertaintyKcalPerMol = UncertaintyKcalPerMol;
        m.UncertaintyByLevel = UncertaintyByLevel.Trim();
        m.Conformers = Conformers;
    }

    /// <summary>These settings as a bundle states them (<c>study.energy_model</c>): every key the numbers depend on.</summary>
    public Core.Formats.BundleEnergyModel ToBundle() => new(EnergyLevel, ThermalLevel, TemperatureKelvin, StandardState, Treatment,
        QuasiRrhoCutoffCm1, Tunnelling == TunnellingCorrection.Wigner, Conformers);

    /// <summary>These settings with every key a bundle's <c>study.energy_model</c> gives (a key left out keeps its value here).</summary>
    public ModelSettings With(Core.Formats.BundleEnergyModel b) => this with
    {
        EnergyLevel = b.EnergiesFrom ?? EnergyLevel,
        ThermalLevel = b.ThermalFrom ?? ThermalLevel,
        TemperatureKelvin = b.TemperatureKelvin ?? TemperatureKelvin,
        StandardState = b.StandardState ?? StandardState,
        Treatment = b.LowModes ?? Treatment,
        QuasiRrhoCutoffCm1 = b.LowModeCutoffCm1 ?? QuasiRrhoCutoffCm1,
        Tunnelling = b.WignerTunnelling is { } w ? (w ? TunnellingCorrection.Wigner : TunnellingCorrection.None) : Tunnelling,
        Conformers = b.Conformers ?? Conformers,
    };

    /// <summary>Every problem with these settings, in words; empty when they can be used.</summary>
    public IReadOnlyList<string> Validate()
    {
        var e = new List<string>();
        if (!(TemperatureKelvin > 0) || !double.IsFinite(TemperatureKelvin)) e.Add($"temperature must be above 0 K (got {TemperatureKelvin})");
        if (!(QuasiRrhoCutoffCm1 > 0) || !double.IsFinite(QuasiRrhoCutoffCm1)) e.Add($"quasi-RRHO cut-off must be positive (got {QuasiRrhoCutoffCm1} cm⁻¹)");
        if (!(SignificantImaginaryCm1 > 0) || !double.IsFinite(SignificantImaginaryCm1)) e.Add($"imaginary-frequency threshold must be positive (got {SignificantImaginaryCm1} cm⁻¹)");
        if (!(ScanJumpKcalPerMol > 0) || !double.IsFinite(ScanJumpKcalPerMol)) e.Add($"scan jump threshold must be positive (got {ScanJumpKcalPerMol} kcal/mol)");
        e.AddRange(Kinetics.EnergyUncertainty.Problems(UncertaintyKcalPerMol, UncertaintyByLevel, out _));
        return e;
    }

    public string Fingerprint => Hash(string.Join("|", "v2", EnergyLevels.Key(EnergyLevel), EnergyLevels.Key(ThermalLevel), Num(TemperatureKelvin),
        StandardState, Treatment, Num(QuasiRrhoCutoffCm1), Tunnelling, CheckFingerprint)
        // Only the ensemble adds a part, so a model that keeps the lowest conformer keeps the fingerprint it had.
        + (Conformers == Core.Conformers.ConformerChoice.Lowest ? "" : "|conformers=" + Conformers));

    public string CheckFingerprint => Hash(string.Join("|", "c1", Num(SignificantImaginaryCm1), Num(ScanJumpKcalPerMol)));

    public ThermoOptions ThermoOptions(int symmetryNumber) => new(TemperatureKelvin, SymmetryNumber: Math.Max(1, symmetryNumber),
        Treatment: Treatment, QuasiRrhoCutoffCm1: QuasiRrhoCutoffCm1, StandardState: StandardState);

    /// <summary>"Energies: …; 298.15 K; standard state 1 mol/L; low-mode entropy interpolated (ω₀ = 100 cm⁻¹)" for banners and captions.</summary>
    public string Describe()
    {
        var level = EnergyLevel.Length == 0 ? "each state's own calculation" : EnergyLevel;
        var thermal = ThermalLevel.Length == 0 ? "" : $", thermal corrections from {ThermalLevel}";
        var state = StandardStateNames.Text(StandardState);
        var treatment = LowModeNames.Describe(Treatment, QuasiRrhoCutoffCm1);
        var tunnelling = Tunnelling == TunnellingCorrection.Wigner ? ", Wigner tunnelling" : "";
        return $"Energies: {level}{thermal}; {Num(TemperatureKelvin)} K; standard state {state}; {treatment}{tunnelling}; {ConformerText}";
    }

    /// <summary>"conformers: lowest conformer of each species" or "conformers: Boltzmann-weighted ensemble G = −RT ln Σ exp(−G_i/RT)".</summary>
    public string ConformerText => Core.Conformers.ConformerChoiceText.Sentence(Conformers);

    /// <summary>"Uncertainty: σ = 2 kcal/mol per barrier for every level (common practice, no source); 1 kcal/mol for X" or "no uncertainty set".</summary>
    public string DescribeUncertainty()
    {
        var u = Uncertainty;
        var parts = new List<string>();
        if (u.DefaultKcalPerMol is { } d && d > 0)
            parts.Add($"σ = {d.ToString("0.0##", CultureInfo.InvariantCulture)} kcal/mol per barrier for every level" +
                      (d == Kinetics.EnergyUncertainty.CommonPracticeKcalPerMol ? $" ({Kinetics.EnergyUncertainty.CommonPracticeNote})" : ""));
        parts.AddRange(u.PerLevel.Select(l => l.SigmaKcalPerMol > 0
            ? $"{l.SigmaKcalPerMol.ToString("0.0##", CultureInfo.InvariantCulture)} kcal/mol for {l.Level}" : $"none for {l.Level}"));
        return parts.Count == 0 || (u.DefaultKcalPerMol is not > 0 && u.PerLevel.All(l => l.SigmaKcalPerMol == 0))
            ? "Uncertainty: " + Core.Kinetics.UncertainValue.NotSet
            : "Uncertainty: " + string.Join("; ", parts);
    }

    internal static string Num(double x) => x.ToString("R", CultureInfo.InvariantCulture);

    internal static string Hash(string text) => Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(text)))[..16];
}
