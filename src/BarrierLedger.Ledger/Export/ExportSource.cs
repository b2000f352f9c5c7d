using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Reviews;

namespace BarrierLedger.Ledger.Export;

/// <summary>
/// The energy model behind exported numbers, stated in every table and figure.
/// </summary>
/// <param name="LevelOfTheory">As the trade writes it: "single point // geometry"; several joined by "; " when mixed.</param>
/// <param name="TemperatureKelvin">Temperature of the thermal corrections and rate constants.</param>
/// <param name="StandardState">Reference state of the translational entropy.</param>
/// <param name="Treatment">RRHO or quasi-RRHO.</param>
/// <param name="QuasiRrhoCutoffCm1">ω₀ of the quasi-RRHO damping, cm⁻¹.</param>
/// <param name="Tunnelling">"none" or the correction applied to k (e.g. "Wigner").</param>
/// <param name="Uncertainty">The energy uncertainties the group set (null: none), carried to every k and t½ as a 95 % interval.</param>
public sealed record ExportModel(
    string LevelOfTheory,
    double TemperatureKelvin,
    StandardState StandardState,
    ThermoTreatment Treatment,
    double QuasiRrhoCutoffCm1 = 100,
    string Tunnelling = "none",
    Kinetics.EnergyUncertainty? Uncertainty = null)
{
    /// <summary>How species with several conformers entered the numbers (the energy model's choice).</summary>
    public Core.Conformers.ConformerChoice Conformers { get; init; } = Core.Conformers.ConformerChoice.Lowest;

    /// <summary>"Conformers: lowest conformer of each species (by G)" or the ensemble with its formula.</summary>
    public string ConformerLine => "Conformers: " + Core.Conformers.ConformerChoiceText.Sentence(Conformers)["conformers: ".Length..];

    /// <summary>"1 mol/L", "1 atm", "1 bar".</summary>
    public string StandardStateText => StandardStateNames.Text(StandardState);

    /// <summary>What the low-mode treatment does (<see cref="LowModeNames.Describe"/>); its published source is <see cref="TreatmentReference"/>.</summary>
    public string TreatmentText => LowModeNames.Describe(Treatment, QuasiRrhoCutoffCm1);

    /// <summary>The published low-mode method with all authors, or empty for the harmonic treatment.</summary>
    public string TreatmentReference => LowModeNames.Reference(Treatment);

    /// <summary>Lines stating the model, in the order every format prints them.</summary>
    public IReadOnlyList<string> Lines(EnergyUnit unit) =>
    [
        $"Level of theory (single point // geometry): {LevelOfTheory}",
        $"Temperature: {TemperatureKelvin:0.##} K; standard state: {StandardStateText}",
        $"Thermochemistry: {TreatmentText}; tunnelling: {Tunnelling}" + (TreatmentReference.Length == 0 ? "" : $" ({TreatmentReference})"),
        ConformerLine,
        $"Energies in {Energy.Symbol(unit)}; k in s⁻¹ (first order; a second-order k is marked); t½ in s; imaginary frequency in cm⁻¹",
        $"Rate intervals: central 95 % from the energy uncertainty; {UncertaintyText}",
    ];

    /// <summary>Where the σ behind the intervals comes from, for the levels of <see cref="LevelOfTheory"/>.</summary>
    public string UncertaintyText
    {
        get
        {
            var u = Uncertainty ?? Kinetics.EnergyUncertainty.None;
            var parts = LevelOfTheory.Split("; ", StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
            if (parts.Length == 0) return u.Describe(null);
            // One statement when every level has the same σ from the same source; else one per level.
            var described = parts.Select(u.Describe).ToList();
            return described.Distinct().Count() == 1 ? described[0] : string.Join("; ", parts.Select((p, i) => $"{p}: {described[i]}"));
        }
    }
}

/// <summary>
/// One elementary step of one reaction, in full precision (hartree for energies). Rounding happens only when a table is
/// formatted, never here.
/// </summary>
/// <param name="Reaction">Reaction label.</param>
/// <param name="Step">Step label, e.g. "A + B → INT1 (TS1)".</param>
/// <param name="SaddleLabel">The saddle-point state, e.g. "TS1".</param>
/// <param name="BarrierElectronic">ΔE‡ from the preceding minimum.</param>
/// <param name="BarrierEnthalpy">ΔH‡.</param>
/// <param name="BarrierGibbs">ΔG‡.</param>
/// <param name="ReactionGibbs">ΔG_r of the step (following minimum − preceding minimum).</param>
/// <param name="RateConstant">Eyring k at the model temperature, in <paramref name="RateConstantUnit"/>.</param>
/// <param name="HalfLifeSeconds">ln 2 / k.</param>
/// <param name="ImaginaryFrequencyCm1">The significant imaginary mode, as a negative wavenumber (cm⁻¹).</param>
/// <param name="Check">Automatic saddle-point check, null when none ran.</param>
/// <param name="CheckReasons">Its reasons (messages a reader understands).</param>
/// <param name="Review">Reviewer status.</param>
/// <param name="LevelOfTheory">Level(s) of theory of this step's energies.</param>
/// <param name="ConsistencyProblems">Every consistency rule the barrier breaks, as sentences; empty when consistent.</param>
/// <param name="RateConstantUnit">"s⁻¹" for a unimolecular step, "M⁻¹ s⁻¹" for a bimolecular one.</param>
public sealed record BarrierRow(
    string Reaction,
    string Step,
    string SaddleLabel,
    Energy? BarrierElectronic,
    Energy? BarrierEnthalpy,
    Energy? BarrierGibbs,
    Energy? ReactionGibbs,
    double? RateConstant,
    double? HalfLifeSeconds,
    double? ImaginaryFrequencyCm1,
    Verdict? Check,
    IReadOnlyList<string> CheckReasons,
    ReviewState Review,
    string LevelOfTheory,
    IReadOnlyList<string> ConsistencyProblems,
    string RateConstantUnit = "s⁻¹")
{
    public bool IsVerified => Review == ReviewState.Verified;
    public bool IsConsistent => ConsistencyProblems.Count == 0;
    /// <summary>False for a reaction's placeholder row (<see cref="Without"/>): there is no step and no saddle point to review.</summary>
    public bool HasSaddle => SaddleLabel != NoStep;

    private const string NoStep = "—";

    /// <summary>The row of a reaction that has no barrier to show, saying why (never a silent gap in the table).</summary>
    public static BarrierRow Without(string reaction, string levelOfTheory, IReadOnlyList<string> why) =>
        new(reaction, NoStep, NoStep, null, null, null, null, null, null, null, null, [], ReviewState.AwaitingReview, levelOfTheory, why);

    /// <summary>
    /// Reasons that do not make the barrier inconsistent but can mislead a reader, each footnoted (the conformer checks: a lower
    /// conformer than the one used, an unchecked saddle-point conformer nearby, duplicates counted twice in a Boltzmann sum).
    /// </summary>
    public IReadOnlyList<string> Cautions { get; init; } = [];
}

/// <summary>What a barrier table is made from: a study, its energy model and its rows.</summary>
public sealed record BarrierTableSource(string StudyName, ExportModel Model, IReadOnlyList<BarrierRow> Rows);

/// <summary>The columns a user can choose for a barrier table.</summary>
public enum ExportColumn
{
    Reaction,
    Step,
    BarrierElectronic,
    BarrierEnthalpy,
    BarrierGibbs,
    ReactionGibbs,
    RateConstant,
    HalfLife,
    ImaginaryFrequency,
    Verdict,
    ReviewStatus,
    LevelOfTheory,
}

/// <summary>How a table is formatted: which columns, which unit, how many decimals for energies.</summary>
public sealed record TableOptions(IReadOnlyList<ExportColumn> Columns, EnergyUnit Unit = EnergyUnit.KcalPerMol, int Decimals = 1)
{
    public static IReadOnlyList<ExportColumn> DefaultColumns { get; } =
    [
        ExportColumn.Reaction, ExportColumn.Step, ExportColumn.BarrierElectronic, ExportColumn.BarrierGibbs,
        ExportColumn.ReactionGibbs, ExportColumn.RateConstant, ExportColumn.ImaginaryFrequency, ExportColumn.Verdict,
        ExportColumn.ReviewStatus,
    ];

    public static TableOptions Default { get; } = new(DefaultColumns);
}
