using System.Text.Json;
using System.Text.Json.Serialization;
using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Records;

namespace BarrierLedger.Ledger.Reactions;

/// <summary>A species in a state with its whole positive coefficient.</summary>
public sealed record TermDefinition(int SpeciesId, int Coefficient = 1);

/// <summary>Two atoms (1-based, as in the saddle point's file) that form or break at a saddle point.</summary>
public sealed record AtomPair(int A, int B);

/// <summary>
/// One state as a person builds it: label, minimum or saddle point, species with coefficients; for a saddle point the calculation
/// that governs it, the bonds that form or break there, and the relaxed scans that belong to its step.
/// </summary>
public sealed record StateDefinition(string Label, StateKind Kind, IReadOnlyList<TermDefinition> Terms, int? SaddleCalculationId = null,
    IReadOnlyList<AtomPair>? ReactionCoordinate = null, IReadOnlyList<int>? ScanIds = null)
{
    [JsonIgnore] public IReadOnlyList<AtomPair> Pairs => ReactionCoordinate ?? [];
    [JsonIgnore] public IReadOnlyList<int> Scans => ScanIds ?? [];
}

/// <summary>
/// A reaction as built in the browser or sent to the API: its label, description and ordered states, and what it says about its
/// kinetics (competing channels, the conditions of a run; null for nothing).
/// </summary>
public sealed record ReactionDefinition(string Label, string Description, IReadOnlyList<StateDefinition> States, Core.Kinetics.KineticsSetup? Kinetics = null)
{
    /// <summary>The kinetics setup as stored (null when nothing is set).</summary>
    public static string? KineticsJson(Core.Kinetics.KineticsSetup? setup) => setup is null || setup.IsEmpty ? null : JsonSerializer.Serialize(setup, DerivedJson.Options);

    /// <summary>The stored kinetics setup, or null.</summary>
    public static Core.Kinetics.KineticsSetup? ReadKinetics(string? json) =>
        string.IsNullOrWhiteSpace(json) ? null : JsonSerializer.Deserialize<Core.Kinetics.KineticsSetup>(json, DerivedJson.Options);

    /// <summary>The definition as JSON, as the audit trail keeps each version.</summary>
    public string ToJson() => JsonSerializer.Serialize(this, DerivedJson.Options);
}

/// <summary>A stored reaction's definition, the version an editor must name to save over it, and its study.</summary>
public sealed record StoredDefinition(int ReactionId, int StudyId, long Version, bool Retired, ReactionDefinition Definition);

/// <summary>A problem with a definition: the state it is in (0-based) or null for the whole reaction, and what is wrong.</summary>
public sealed record DefinitionProblem(int? State, string Message);

/// <summary>One state's atom, charge and electron totals (Core formula sums of its species); <see cref="Known"/> false while a species has no geometry.</summary>
public sealed record StateBalance(int Position, string Label, string Formula, int Charge, int Electrons, bool Known);

/// <summary>What the frequency check would say about a saddle-point state with these bonds and this scan, before anything is stored.</summary>
public sealed record SaddlePreview(int Position, string StateLabel, int CalculationId, Verdict Verdict, IReadOnlyList<CheckReason> Reasons, int? ScanId);

/// <summary>
/// The builder's live view of a definition: its shape problems (nothing can be saved while there are any), each state's balance,
/// the derivation's numbers and consistency reasons (the same path a stored reaction takes; null until every state has species),
/// and each saddle point's check.
/// </summary>
public sealed record ReactionPreview(IReadOnlyList<DefinitionProblem> Problems, IReadOnlyList<StateBalance> Balance, DerivedPreview? Derived,
    IReadOnlyList<SaddlePreview> Saddles)
{
    public bool CanSave => Problems.Count == 0;
}

/// <summary>A save of the builder: the reaction and its new version, or nothing written with the problems or the conflict explained.</summary>
public sealed record ReactionSaveResult(bool Saved, int? ReactionId, long Version, string? Conflict, IReadOnlyList<DefinitionProblem> Problems)
{
    public static ReactionSaveResult Ok(int id, long version) => new(true, id, version, null, []);
    public static ReactionSaveResult Invalid(IEnumerable<DefinitionProblem> problems) => new(false, null, 0, null, [.. problems]);
    public static ReactionSaveResult Conflicted(string message) => new(false, null, 0, message, []);
}
