using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Derivation;

internal sealed record StateInput(int Id, int Position, string Label, StateKind Kind, int? SaddleCalculationId, (int SpeciesId, int Coefficient)[] Terms, (int A, int B)[] Pairs);

internal sealed record ReactionInput(int Id, int StudyId, long InputsRevision, StateInput[] States);

/// <summary>A species as the derivation reads it; <see cref="SymmetryNumber"/> is the σ in use (override, else detected, else 1).</summary>
internal sealed record SpeciesInput(int Id, string Label, int Charge, int Multiplicity, string Formula, int SymmetryNumber, int? SymmetryNumberOverride,
    int? SymmetryCalculationId, string? PointGroup = null);

internal sealed record CalcInput(int Id, int SpeciesId, CalculationKind Kind, string LevelOfTheory, string EnergyKey, string GeometryKey, double? EnergyHartree,
    byte[]? AtomicNumbers, byte[]? Positions, byte[]? Frequencies, double? ThermalTemperatureKelvin, double? ZeroPointHartree,
    double? EnthalpyCorrectionHartree, double? GibbsCorrectionHartree, string Conformer = "");

/// <summary>What the derivation of a set of reactions reads, loaded in a fixed number of queries.</summary>
internal sealed class DerivationInputs
{
    public required List<ReactionInput> Reactions { get; init; }
    /// <summary>Species by id; <see cref="SpeciesSymmetry.Refresh"/> replaces entries whose point group it found anew.</summary>
    public required Dictionary<int, SpeciesInput> Species { get; init; }
    public required ILookup<int, CalcInput> CalculationsBySpecies { get; init; }
    public required Dictionary<int, CalcInput> Calculations { get; init; }
    /// <summary>Saddle-point calculations whose stored frequency check passed.</summary>
    public HashSet<int> PassedChecks { get; init; } = [];

    /// <summary>
    /// Live reactions of the studies, or of the given reactions when <paramref name="reactionIds"/> is not null. Id lists go to the
    /// store as one array parameter each (<c>EF.Parameter</c>): EF 10 otherwise sends one SQL parameter per id, and a query over
    /// 10,000 species ids then spends most of its time being prepared.
    /// </summary>
    public static async Task<DerivationInputs> LoadAsync(LedgerDbContext db, IReadOnlyCollection<int>? studyIds, IReadOnlyCollection<int>? reactionIds, CancellationToken ct,
        IEnumerable<int>? moreSpeciesIds = null)
    {
        var rq = db.Reactions.AsNoTracking().Where(r => !r.Retired);
        if (studyIds is not null) rq = rq.Where(r => studyIds.Contains(r.StudyId));
        if (reactionIds is not null) rq = rq.Where(r => EF.Parameter(reactionIds).Contains(r.Id));
        var reactions = await rq.Select(r => new { r.Id, r.StudyId, r.InputsRevision }).ToListAsync(ct);
        var ids = reactions.Select(r => r.Id).ToList();

        var stateQuery = studyIds is not null && reactionIds is null
            ? db.ReactionStates.AsNoTracking().Where(s => !s.Reaction!.Retired && studyIds.Contains(s.Reaction.StudyId))
            : db.ReactionStates.AsNoTracking().Where(s => EF.Parameter(ids).Contains(s.ReactionId));
        var states = await stateQuery.Select(s => new { s.Id, s.ReactionId, s.Position, s.Label, s.Kind, s.SaddleCalculationId }).ToListAsync(ct);
        var termQuery = studyIds is not null && reactionIds is null
            ? db.ReactionStateTerms.AsNoTracking().Where(t => db.ReactionStates.Any(s => s.Id == t.ReactionStateId && !s.Reaction!.Retired && studyIds.Contains(s.Reaction.StudyId)))
            : db.ReactionStateTerms.AsNoTracking().Where(t => db.ReactionStates.Any(s => s.Id == t.ReactionStateId && EF.Parameter(ids).Contains(s.ReactionId)));
        var terms = (await termQuery.Select(t => new { t.ReactionStateId, t.SpeciesId, t.Coefficient }).ToListAsync(ct)).ToLookup(t => t.ReactionStateId);
        var stateIds = states.Select(s => s.Id).ToList();
        var pairs = (await db.ReactionCoordinatePairs.AsNoTracking().Where(p => EF.Parameter(stateIds).Contains(p.ReactionStateId))
            .Select(p => new { p.ReactionStateId, p.AtomA, p.AtomB }).ToListAsync(ct)).ToLookup(p => p.ReactionStateId);
        var statesByReaction = states.ToLookup(s => s.ReactionId);

        var reactionInputs = reactions.Select(r => new ReactionInput(r.Id, r.StudyId, r.InputsRevision,
            [.. statesByReaction[r.Id].OrderBy(s => s.Position).Select(s => new StateInput(s.Id, s.Position, s.Label, s.Kind, s.SaddleCalculationId,
                [.. terms[s.Id].Select(t => (t.SpeciesId, t.Coefficient))], [.. pairs[s.Id].Select(p => (p.AtomA, p.AtomB))]))])).ToList();

        return await ForReactionsAsync(db, reactionInputs, ct, moreSpeciesIds);
    }

    /// <summary>The species and live calculations the given reactions (stored or not) read, and those of <paramref name="moreSpeciesIds"/>, in two queries.</summary>
    public static async Task<DerivationInputs> ForReactionsAsync(LedgerDbContext db, List<ReactionInput> reactionInputs, CancellationToken ct,
        IEnumerable<int>? moreSpeciesIds = null)
    {
        var speciesIds = reactionInputs.SelectMany(r => r.States).SelectMany(s => s.Terms).Select(t => t.SpeciesId).Concat(moreSpeciesIds ?? []).Distinct().ToList();
        var species = await db.Species.AsNoTracking().Where(s => EF.Parameter(speciesIds).Contains(s.Id))
            .Select(s => new SpeciesInput(s.Id, s.Label, s.Charge, s.Multiplicity, s.Formula, s.SymmetryNumber, s.SymmetryNumberOverride,
                s.SymmetryCalculationId, s.PointGroup)).ToListAsync(ct);
        var calcs = await db.Calculations.AsNoTracking().Where(c => EF.Parameter(speciesIds).Contains(c.SpeciesId) && !c.Retired)
            .OrderBy(c => c.Id)
            .Select(c => new CalcInput(c.Id, c.SpeciesId, c.Kind, c.LevelOfTheory, c.EnergyLevelKey, c.GeometryLevel, c.EnergyHartree,
                c.AtomicNumbers, c.PositionsAngstrom, c.FrequenciesCm1, c.ThermalTemperatureKelvin, c.ZeroPointHartree,
                c.EnthalpyCorrectionHartree, c.GibbsCorrectionHartree, c.Conformer))
            .ToListAsync(ct);
        // Saddle-point calculations whose stored frequency check passed: a saddle-point conformer without one is "not checked".
        var saddleIds = calcs.Where(c => c.Kind == CalculationKind.SaddlePoint).Select(c => c.Id).ToList();
        var passed = saddleIds.Count == 0 ? [] : await db.FrequencyChecks.AsNoTracking()
            .Where(f => EF.Parameter(saddleIds).Contains(f.CalculationId) && f.Verdict == Core.Checks.Verdict.Passed).Select(f => f.CalculationId).ToListAsync(ct);
        return new DerivationInputs
        {
            Reactions = reactionInputs,
            Species = species.ToDictionary(s => s.Id),
            CalculationsBySpecies = calcs.ToLookup(c => c.SpeciesId),
            Calculations = calcs.ToDictionary(c => c.Id),
            PassedChecks = [.. passed],
        };
    }
}
