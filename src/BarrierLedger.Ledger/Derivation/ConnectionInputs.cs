using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Paths;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Derivation;

/// <summary>The connection check's evidence as stored with the frequency check.</summary>
/// <param name="IrcId">The IRC compared (null: only the mode's bond-change prediction was made).</param>
/// <param name="Form">"path" or "endpoint pair".</param>
/// <param name="Connection">BothSides, OneSide, OtherStates or CannotTell.</param>
/// <param name="Headline">One line for the queue and the reaction page.</param>
/// <param name="Ends">Each end and the state it reaches.</param>
public sealed record ConnectionEvidence(int? IrcId, string Form, string Connection, string Headline, IReadOnlyList<EndEvidence> Ends, double? SaddleFrameRmsdAngstrom);

/// <summary>One IRC end: its name, the state it reaches (or null), whether that is a neighbour of the saddle point, RMSD and the sentence.</summary>
public sealed record EndEvidence(string Name, string? Reached, bool Neighbour, double? RmsdAngstrom, string Explanation);

/// <summary>The bond-change prediction from the imaginary mode: outcome and what it predicts.</summary>
public sealed record PredictionEvidence(string Outcome, double AmplitudeAngstrom, string Message);

/// <summary>
/// What the connection check and the mode prediction need for one saddle-point state: the states before and after it as structures
/// (spectators, i.e. species of the saddle-point state besides the saddle point's own, left out), the study's other minimum states
/// named "state (reaction)", and the newest live IRC of the calculation. Each species' structure is its newest live minimum
/// (else any calculation with a geometry).
/// </summary>
internal sealed record ConnectionInputs(StateStructure? Before, StateStructure? After, IReadOnlyList<StateStructure> Others, Irc? Irc, string Fingerprint)
{
    /// <summary>The inputs for one saddle-point state, from the study's minimum states read once per <paramref name="study"/>.</summary>
    public static async Task<ConnectionInputs> LoadAsync(LedgerDbContext db, StudyMinima study, int stateId, int calculationId, CancellationToken ct)
    {
        var state = await db.ReactionStates.AsNoTracking().Include(s => s.Terms).FirstAsync(s => s.Id == stateId, ct);
        var saddleSpecies = await db.Calculations.Where(c => c.Id == calculationId).Select(c => c.SpeciesId).FirstAsync(ct);
        var spectators = state.Terms.Where(t => t.SpeciesId != saddleSpecies).ToDictionary(t => t.SpeciesId, t => t.Coefficient);
        var own = study.States.Where(s => s.ReactionId == state.ReactionId).ToList();
        var neighbours = own.Where(s => s.Position == state.Position - 1 || s.Position == state.Position + 1).ToList();
        var before = neighbours.Where(s => s.Position == state.Position - 1).Select(s => study.Structure(s, s.Label, spectators)).FirstOrDefault();
        var after = neighbours.Where(s => s.Position == state.Position + 1).Select(s => study.Structure(s, s.Label, spectators)).FirstOrDefault();
        var irc = await db.Ircs.AsNoTracking().Include(i => i.Frames).Where(i => i.SaddleCalculationId == calculationId && !i.Retired)
            .OrderByDescending(i => i.Id).FirstOrDefaultAsync(ct);
        // The study's other minima only name where an IRC lands: read and fingerprinted only when there is an IRC.
        var others = irc is null ? [] : study.Others(neighbours.Select(s => s.Id).ToHashSet(), spectators);
        var used = neighbours.SelectMany(s => s.Terms).Select(t => study.CalculationOf(t.SpeciesId)).Order();
        var fingerprint = $"irc:{irc?.Id}/{irc?.Frames.Count}|neighbours:{string.Join(",", neighbours.Select(s => s.Id))}:{string.Join(",", used)}" +
                          (irc is null ? "" : "|study:" + study.Fingerprint);
        return new ConnectionInputs(before, after, others, irc, fingerprint);
    }

    /// <summary>The connection-check input for the stored IRC (path or endpoint pair), in the saddle point's charge and multiplicity.</summary>
    public ConnectionCheckInput? CheckInput(Molecule saddle)
    {
        if (Irc is not { } irc) return null;
        var frames = irc.Frames.OrderBy(f => f.Index).ToList();
        Molecule M(IrcFrameRecord f) => new(saddle.Elements, Blobs.ToPositions(f.PositionsAngstrom), saddle.Charge, saddle.Multiplicity);
        if (irc.Form == IrcForm.Endpoints)
            return new ConnectionCheckInput(saddle, Before, After, Others,
                ForwardEnd: M(frames.First(f => f.Role == IrcFrameRole.Forward)), BackwardEnd: M(frames.First(f => f.Role == IrcFrameRole.Backward)));
        var path = new ReactionPath(PathKind.Irc, "path length from the saddle point", "Å",
            [.. frames.Select(f => new PathFrame(f.PathLengthAngstrom ?? 0, f.EnergyHartree ?? double.NaN, true, M(f)))], irc.SaddleFrame);
        return new ConnectionCheckInput(saddle, Before, After, Others, path);
    }
}

/// <summary>
/// A study's minimum states of live reactions, and for each of their species the structure used (its newest live minimum, else any
/// live calculation with a geometry). Read once per recompute of a study.
/// </summary>
internal sealed class StudyMinima
{
    private readonly Dictionary<int, Species> _species;
    private readonly Dictionary<int, (int Id, Molecule? Geometry)> _calcs;

    private StudyMinima(List<ReactionState> states, Dictionary<int, Species> species, Dictionary<int, (int, Molecule?)> calcs, string fingerprint)
    {
        States = states;
        _species = species;
        _calcs = calcs;
        Fingerprint = fingerprint;
    }

    public List<ReactionState> States { get; }
    public string Fingerprint { get; }

    public static async Task<StudyMinima> LoadAsync(LedgerDbContext db, int studyId, CancellationToken ct)
    {
        var states = await db.ReactionStates.AsNoTracking().Include(s => s.Terms).Include(s => s.Reaction)
            .Where(s => s.Reaction!.StudyId == studyId && !s.Reaction.Retired && s.Kind == StateKind.Minimum).ToListAsync(ct);
        var speciesIds = states.SelectMany(s => s.Terms.Select(t => t.SpeciesId)).Distinct().ToList();
        var species = await db.Species.AsNoTracking().Where(s => speciesIds.Contains(s.Id)).ToDictionaryAsync(s => s.Id, ct);
        var calcs = (await db.Calculations.AsNoTracking().Where(c => speciesIds.Contains(c.SpeciesId) && !c.Retired && c.PositionsAngstrom != null)
                .Select(c => new { c.Id, c.SpeciesId, c.Kind, c.AtomicNumbers, c.PositionsAngstrom }).ToListAsync(ct))
            .GroupBy(c => c.SpeciesId)
            .ToDictionary(g => g.Key, g =>
            {
                var c = g.OrderByDescending(x => x.Kind == CalculationKind.Minimum).ThenByDescending(x => x.Id).First();
                var sp = species[g.Key];
                return (c.Id, Blobs.ToMolecule(c.AtomicNumbers, c.PositionsAngstrom, sp.Charge, sp.Multiplicity));
            });
        var fingerprint = ModelSettings.Hash($"{string.Join(",", states.Select(s => s.Id).Order())}|{string.Join(",", calcs.Values.Select(c => c.Id).Order())}");
        return new StudyMinima(states, species, calcs, fingerprint);
    }

    public int? CalculationOf(int speciesId) => _calcs.TryGetValue(speciesId, out var c) ? c.Id : null;

    /// <summary>A minimum state as structures, spectators left out; null when a species has no geometry.</summary>
    public StateStructure? Structure(ReactionState s, string label, IReadOnlyDictionary<int, int> spectators)
    {
        var list = new List<StateSpecies>();
        foreach (var t in s.Terms)
        {
            var n = t.Coefficient - spectators.GetValueOrDefault(t.SpeciesId);
            if (n <= 0) continue;
            if (!_calcs.TryGetValue(t.SpeciesId, out var c) || c.Geometry is null) return null;
            list.Add(new StateSpecies(_species[t.SpeciesId].Label, c.Geometry, n));
        }
        return list.Count == 0 ? null : new StateStructure(label, list);
    }

    /// <summary>The other minimum states, named "state (reaction)", one per set of species.</summary>
    public IReadOnlyList<StateStructure> Others(IReadOnlySet<int> except, IReadOnlyDictionary<int, int> spectators) =>
        [.. States.Where(s => !except.Contains(s.Id)).Select(s => Structure(s, $"{s.Label} ({s.Reaction!.Label})", spectators)).OfType<StateStructure>()
            .DistinctBy(s => string.Join("+", s.Species.OrderBy(x => x.Label, StringComparer.Ordinal).Select(x => $"{x.Count} {x.Label}")))];
}
