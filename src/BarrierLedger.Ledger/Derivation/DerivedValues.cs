using System.Text.Json;
using System.Text.Json.Serialization;

namespace BarrierLedger.Ledger.Derivation;

/// <summary>
/// One state's energies relative to the pathway's first state, per molecule in hartree (null when not available).
/// <see cref="EnergyCalculationIds"/> and <see cref="ThermalCalculationIds"/> name the calculations used; <see cref="Terms"/>
/// gives each species' own values as the derivation used them (null in values stored before they were kept).
/// </summary>
public sealed record DerivedState(int Position, string Label, string Kind, double? DeltaEHartree, double? DeltaHHartree, double? DeltaGHartree,
    IReadOnlyList<int> EnergyCalculationIds, IReadOnlyList<int> ThermalCalculationIds, string LevelOfTheory, IReadOnlyList<DerivedTerm>? Terms = null);

/// <summary>
/// One species of a state as the derivation used it (hartree per molecule): its electronic energy and the calculation it came
/// from; the thermal correction applied (zero-point, enthalpy and Gibbs corrections, where it came from: "computed (…)" or
/// "reported") and its calculation, or nulls when there is none; the point group and σ used; for a species with several
/// conformers, which made its energies ("conformer c2 (lowest of 3)", "ensemble of 3 conformers (…)"; the calculations named
/// are those of its lowest conformer), else null.
/// </summary>
public sealed record DerivedTerm(int SpeciesId, string Label, int Coefficient, int EnergyCalculationId, double ElectronicHartree, string LevelOfTheory,
    int? ThermalCalculationId, double? ZeroPointHartree, double? EnthalpyCorrectionHartree, double? GibbsCorrectionHartree, string? ThermalSource,
    string? PointGroup, int SymmetryNumber, string? Conformer = null);

/// <summary>
/// One elementary step minimum → saddle point → minimum (Core <c>PathwayEnergies</c>): barriers from the minimum before, reaction
/// energies to the minimum after (hartree), molecularity, the Eyring rate constant in <see cref="RateConstantUnit"/> with κ, and
/// the half-life (s) for a unimolecular step, at the model temperature.
/// </summary>
public sealed record DerivedStep(int SaddlePosition, string Label, string From, string To, double BarrierEHartree, double? BarrierGHartree,
    double ReactionEHartree, double? ReactionGHartree, int Molecularity, double? RateConstant, string RateConstantUnit, double? HalfLifeSeconds,
    double? ImaginaryCm1, double TransmissionCoefficient, double? BarrierHHartree = null);

/// <summary>One state of a pathway that is not stored yet, as the builder holds it: species ids with coefficients, the saddle point's calculation and its atom pairs (1-based).</summary>
public sealed record PreviewState(string Label, Records.StateKind Kind, int? SaddleCalculationId, IReadOnlyList<(int SpeciesId, int Coefficient)> Terms,
    IReadOnlyList<(int A, int B)> Pairs);

/// <summary>What the derivation gives for a pathway that is not stored yet (the same numbers and reasons a stored one gets), and the model used.</summary>
public sealed record DerivedPreview(double? BarrierGibbsHartree, double? ReactionGibbsHartree, double? BarrierElectronicHartree, double? RateConstantPerSecond,
    double? HalfLifeSeconds, double TemperatureKelvin, string LevelOfTheory, bool Consistent, IReadOnlyList<ConsistencyReason> Consistency,
    IReadOnlyList<DerivedState> States, IReadOnlyList<DerivedStep> Steps, ModelSettings Model);

/// <summary>Why a barrier or reaction energy may mislead: a stable code, "Failure" / "Attention" / "Info", and a sentence.
/// A failure makes the reaction inconsistent (its barrier is shown and exported with the reason).</summary>
public sealed record ConsistencyReason(string Code, string Severity, string Message)
{
    public bool Blocking => Severity == "Failure";
}

/// <summary>Stable codes of reasons the ledger adds to Core's consistency and pathway reasons.</summary>
public static class LedgerReasonCodes
{
    public const string MissingEnergy = "ledger.missing-energy";
    public const string FormulaUnknown = "ledger.formula-unknown";
    public const string PathwayShape = "ledger.pathway-shape";
    public const string MissingSpecies = "ledger.missing-species";
    public const string ConformerLeftOut = "ledger.conformer-left-out";
}

internal static class DerivedJson
{
    public static readonly JsonSerializerOptions Options = new(JsonSerializerDefaults.Web)
    {
        DefaultIgnoreCondition = JsonIgnoreCondition.Never,
        NumberHandling = JsonNumberHandling.AllowNamedFloatingPointLiterals,
    };

    public static string Write<T>(T value) => JsonSerializer.Serialize(value, Options);

    public static T Read<T>(string json) => JsonSerializer.Deserialize<T>(json, Options)
        ?? throw new InvalidDataException("Stored derived values are empty.");
}
