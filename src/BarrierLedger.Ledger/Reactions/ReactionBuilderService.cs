using BarrierLedger.Core.Checks;
using System.Globalization;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Ledger.Auditing;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Reviews;
using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Reactions;

/// <summary>
/// Reactions built in the browser or through the API from results already stored: a live preview (the shape rules, each state's
/// balance, and the derivation, saddle-point checks and consistency reasons through the very path a stored reaction takes),
/// then create or edit in one transaction, audited with the whole definition before and after. An edit names the version it
/// was made on; a saddle point whose check evidence (its bonds or scan) changed goes back to the review queue. A scan attached
/// to a saddle-point state becomes a scan of that saddle point's species (the frequency check compares with the species'
/// newest scan).
/// </summary>
public sealed class ReactionBuilderService(IDbContextFactory<LedgerDbContext> factory, DerivationService derivation, AuditService audit, TimeProvider time)
{
    /// <summary>A stored reaction as a definition the builder can open (scans: those of each saddle point's species), or null.</summary>
    public async Task<StoredDefinition?> GetDefinitionAsync(int reactionId, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        var r = await db.Reactions.AsNoTracking().Where(x => x.Id == reactionId)
            .Select(x => new { x.Id, x.StudyId, x.Label, x.Description, x.Version, x.Retired, x.Kinetics }).FirstOrDefaultAsync(ct);
        if (r is null) return null;
        var states = await db.ReactionStates.AsNoTracking().Where(s => s.ReactionId == reactionId).OrderBy(s => s.Position)
            .Include(s => s.Terms).Include(s => s.CoordinatePairs).AsSplitQuery().ToListAsync(ct);
        var saddleIds = states.Where(s => s.SaddleCalculationId is not null).Select(s => s.SaddleCalculationId!.Value).ToList();
        var saddleSpecies = await db.Calculations.AsNoTracking().Where(c => saddleIds.Contains(c.Id)).ToDictionaryAsync(c => c.Id, c => c.SpeciesId, ct);
        var speciesIds = saddleSpecies.Values.Distinct().ToList();
        var scans = (await db.Scans.AsNoTracking().Where(s => speciesIds.Contains(s.SpeciesId) && !s.Retired).OrderBy(s => s.Id)
            .Select(s => new { s.Id, s.SpeciesId }).ToListAsync(ct)).ToLookup(s => s.SpeciesId, s => s.Id);
        var definition = new ReactionDefinition(r.Label, r.Description, [.. states.Select(s => new StateDefinition(s.Label, s.Kind,
            [.. s.Terms.OrderBy(t => t.Id).Select(t => new TermDefinition(t.SpeciesId, t.Coefficient))], s.SaddleCalculationId,
            [.. s.CoordinatePairs.OrderBy(p => p.Id).Select(p => new AtomPair(p.AtomA, p.AtomB))],
            s.SaddleCalculationId is { } c && saddleSpecies.TryGetValue(c, out var sp) ? [.. scans[sp]] : []))], ReactionDefinition.ReadKinetics(r.Kinetics));
        return new StoredDefinition(r.Id, r.StudyId, r.Version, r.Retired, definition);
    }

    /// <summary>What saving this definition would give, computed now and written nowhere.</summary>
    public async Task<ReactionPreview> PreviewAsync(int studyId, ReactionDefinition definition, int? reactionId = null, CancellationToken ct = default)
    {
        ArgumentNullException.ThrowIfNull(definition);
        await using var db = await factory.CreateDbContextAsync(ct);
        var r = await ResolveAsync(db, studyId, definition, reactionId, ct);
        var balance = definition.States.Select((s, i) => Balance(i, s, r)).ToList();
        DerivedPreview? derived = null;
        var derivable = definition.States.Count >= 2 && definition.States.All(s => s.Terms.Count > 0 && s.Terms.All(t => r.Species.ContainsKey(t.SpeciesId)));
        if (derivable)
            derived = await derivation.PreviewAsync(db, studyId, [.. definition.States.Select(s => new PreviewState(s.Label, s.Kind,
                s.Kind == StateKind.SaddlePoint ? s.SaddleCalculationId : null, [.. s.Terms.Select(t => (t.SpeciesId, t.Coefficient))],
                [.. s.Pairs.Select(p => (p.A, p.B))]))], ct);

        var saddles = new List<SaddlePreview>();
        var (model, _) = await DerivationService.EffectiveModelAsync(db, studyId, ct);
        for (var i = 0; i < definition.States.Count; i++)
        {
            var s = definition.States[i];
            if (s.Kind != StateKind.SaddlePoint || s.SaddleCalculationId is not { } cid || !r.Calculations.TryGetValue(cid, out var calc)
                || calc.Kind != CalculationKind.SaddlePoint || s.Pairs.Any(p => p.A < 1 || p.B < 1 || p.A > calc.AtomCount || p.B > calc.AtomCount)) continue;
            // The check compares with the newest live scan the saddle point's species will have once this is saved.
            var scanId = r.SpeciesScans[calc.SpeciesId].Concat(s.Scans.Where(r.Scans.ContainsKey)).DefaultIfEmpty().Max();
            var full = await db.Calculations.AsNoTracking().Include(c => c.Species).FirstAsync(c => c.Id == cid, ct);
            Scan? scan = scanId == 0 ? null : await db.Scans.AsNoTracking().FirstAsync(x => x.Id == scanId, ct);
            var points = scan is null ? null : await db.ScanPoints.AsNoTracking().Where(p => p.ScanId == scan.Id)
                .Select(p => new ScanPointRecord { Index = p.Index, Coordinate = p.Coordinate, EnergyHartree = p.EnergyHartree, Converged = p.Converged }).ToListAsync(ct);
            var (verdict, reasons, _) = CheckRunner.Run(CheckRunner.FromStored(full, full.Species!, [.. s.Pairs.Select(p => (p.A, p.B))], scan, points), model);
            saddles.Add(new SaddlePreview(i, s.Label, cid, verdict, DerivedJson.Read<List<CheckReason>>(reasons), scan?.Id));
        }
        return new ReactionPreview(r.Problems, balance, derived, saddles);
    }

    /// <summary>Stores a new reaction in the study and derives it like an uploaded one (one transaction).</summary>
    public Task<ReactionSaveResult> CreateAsync(int studyId, ReactionDefinition definition, string userId, CancellationToken ct = default)
    {
        ArgumentNullException.ThrowIfNull(definition);
        ArgumentException.ThrowIfNullOrWhiteSpace(userId);
        return LedgerRetry.RunAsync(async token =>
        {
            await using var db = await factory.CreateDbContextAsync(token);
            await using var tx = await LedgerRetry.BeginWriteAsync(db, token);
            var r = await ResolveAsync(db, studyId, definition, null, token);
            if (r.Problems.Count > 0) return ReactionSaveResult.Invalid(r.Problems);
            var before = await CheckFingerprintsAsync(db, r.Calculations.Keys, token);
            var reaction = new Reaction { StudyId = studyId, Label = definition.Label.Trim(), Description = definition.Description.Trim(), OwnerUserId = userId,
                Kinetics = ReactionDefinition.KineticsJson(definition.Kinetics) };
            for (var i = 0; i < definition.States.Count; i++)
            {
                var state = new ReactionState { Position = i };
                Apply(state, definition.States[i]);
                reaction.States.Add(state);
            }
            db.Reactions.Add(reaction);
            await db.SaveChangesAsync(token);
            audit.Record(db, userId, "reaction.created", nameof(Reaction), reaction.Id,
                $"Reaction '{reaction.Label}' built with {reaction.States.Count} states: {string.Join(" → ", reaction.States.Select(s => s.Label))}.",
                after: definition.ToJson());
            await FinishAsync(db, r, definition, reaction, before, userId, token);
            await tx.CommitAsync(token);
            return ReactionSaveResult.Ok(reaction.Id, reaction.Version);
        }, ct);
    }

    /// <summary>
    /// Replaces a reaction's definition, if nobody saved it since <paramref name="expectedVersion"/>; the states keep their rows
    /// where positions remain. The audit keeps the whole definition before and after.
    /// </summary>
    public Task<ReactionSaveResult> UpdateAsync(int reactionId, ReactionDefinition definition, long expectedVersion, string userId, CancellationToken ct = default)
    {
        ArgumentNullException.ThrowIfNull(definition);
        ArgumentException.ThrowIfNullOrWhiteSpace(userId);
        return LedgerRetry.RunAsync(async token =>
        {
            var old = await GetDefinitionAsync(reactionId, token);
            if (old is null) return ReactionSaveResult.Invalid([new DefinitionProblem(null, $"there is no reaction {reactionId}")]);
            await using var db = await factory.CreateDbContextAsync(token);
            await using var tx = await LedgerRetry.BeginWriteAsync(db, token);
            var reaction = await db.Reactions.Include(x => x.States).ThenInclude(s => s.Terms).Include(x => x.States).ThenInclude(s => s.CoordinatePairs)
                .AsSplitQuery().FirstAsync(x => x.Id == reactionId, token);
            if (reaction.Version != expectedVersion)
                return ReactionSaveResult.Conflicted(ConflictText(reaction.Label, expectedVersion, reaction.Version));
            if (reaction.Retired)
                return ReactionSaveResult.Invalid([new DefinitionProblem(null, $"reaction '{reaction.Label}' is retired; restore it before editing it")]);
            var r = await ResolveAsync(db, reaction.StudyId, definition, reactionId, token);
            if (r.Problems.Count > 0) return ReactionSaveResult.Invalid(r.Problems);
            var oldSaddles = reaction.States.Where(s => s.SaddleCalculationId is not null).Select(s => s.SaddleCalculationId!.Value);
            var before = await CheckFingerprintsAsync(db, [.. r.Calculations.Keys, .. oldSaddles], token);

            db.Entry(reaction).Property(x => x.Version).OriginalValue = expectedVersion;
            db.Entry(reaction).State = EntityState.Modified; // a new version even when only its states change
            reaction.Label = definition.Label.Trim();
            reaction.Description = definition.Description.Trim();
            reaction.Kinetics = ReactionDefinition.KineticsJson(definition.Kinetics);
            var states = reaction.States.OrderBy(s => s.Position).ToList();
            for (var i = 0; i < definition.States.Count; i++)
            {
                var state = i < states.Count ? states[i] : new ReactionState { Position = i };
                if (i >= states.Count) reaction.States.Add(state);
                db.ReactionStateTerms.RemoveRange(state.Terms);
                db.ReactionCoordinatePairs.RemoveRange(state.CoordinatePairs);
                state.Terms = [];
                state.CoordinatePairs = [];
                Apply(state, definition.States[i]);
            }
            foreach (var gone in states.Skip(definition.States.Count)) db.ReactionStates.Remove(gone);
            audit.Record(db, userId, "reaction.edited", nameof(Reaction), reaction.Id,
                $"Reaction '{reaction.Label}' edited: {string.Join(" → ", definition.States.Select(s => s.Label))}.",
                before: old.Definition.ToJson(), after: definition.ToJson());
            try
            {
                await db.SaveChangesAsync(token);
            }
            catch (DbUpdateConcurrencyException)
            {
                return ReactionSaveResult.Conflicted(ConflictText(reaction.Label, expectedVersion, null));
            }
            await FinishAsync(db, r, definition, reaction, before, userId, token);
            await tx.CommitAsync(token);
            return ReactionSaveResult.Ok(reaction.Id, reaction.Version);
        }, ct);
    }

    private static void Apply(ReactionState state, StateDefinition s)
    {
        state.Label = s.Label.Trim();
        state.Kind = s.Kind;
        state.SaddleCalculationId = s.Kind == StateKind.SaddlePoint ? s.SaddleCalculationId : null;
        state.Terms.AddRange(s.Terms.Select(t => new ReactionStateTerm { SpeciesId = t.SpeciesId, Coefficient = t.Coefficient }));
        if (s.Kind == StateKind.SaddlePoint)
            state.CoordinatePairs.AddRange(s.Pairs.Select(p => new ReactionCoordinatePair { AtomA = p.A, AtomB = p.B }));
    }

    /// <summary>Moves attached scans to their saddle point's species, derives like an upload, and reopens reviews whose evidence changed.</summary>
    private async Task FinishAsync(LedgerDbContext db, Resolved r, ReactionDefinition definition, Reaction reaction, Dictionary<int, string> before,
        string userId, CancellationToken ct)
    {
        var touched = new HashSet<int>();
        foreach (var s in definition.States.Where(s => s.Kind == StateKind.SaddlePoint && s.SaddleCalculationId is not null))
        {
            var target = r.Calculations[s.SaddleCalculationId!.Value].SpeciesId;
            foreach (var scanId in s.Scans)
            {
                var scan = await db.Scans.FirstAsync(x => x.Id == scanId, ct);
                if (scan.SpeciesId == target) continue;
                touched.Add(scan.SpeciesId);
                audit.Record(db, userId, "scan.attached", nameof(Scan), scan.Id,
                    $"Scan '{scan.Label}' attached to state '{s.Label}' of reaction '{reaction.Label}': now a scan of species '{r.Species[target].Label}'.",
                    before: $"species {scan.SpeciesId}", after: $"species {target}");
                scan.SpeciesId = target;
                touched.Add(target);
            }
        }
        await db.SaveChangesAsync(ct);
        db.ChangeTracker.Clear();
        await derivation.AfterInputsChangedAsync(db, reaction.StudyId, [.. touched], [reaction.Id], ct);

        // Evidence changed where a saddle point's check now rests on other inputs (bonds or scan) than when it was reviewed.
        var saddles = definition.States.Where(s => s.Kind == StateKind.SaddlePoint && s.SaddleCalculationId is not null)
            .Select(s => (s.Label, Id: s.SaddleCalculationId!.Value)).DistinctBy(s => s.Id).ToList();
        var after = await CheckFingerprintsAsync(db, [.. saddles.Select(s => s.Id)], ct);
        var reopened = new List<int>();
        foreach (var (label, id) in saddles)
        {
            if (!before.TryGetValue(id, out var was) || !after.TryGetValue(id, out var now) || was == now) continue;
            if (await ReviewStates.ReopenIfDecidedAsync(db, id, userId, time.GetUtcNow(),
                    $"Reaction '{reaction.Label}' was edited: the bonds or scan of state '{label}' changed, so its check changed; it awaits review again.", ct)
                is not { } last) continue;
            audit.Record(db, userId, "review.reopened", nameof(Calculation), id,
                $"Saddle point '{r.Calculations[id].Label}' in state '{label}' of reaction '{reaction.Label}': its check evidence changed after it was {last.ToString().ToLowerInvariant()}; it awaits review again.",
                before: last.ToString(), after: "awaiting review");
            reopened.Add(id);
        }
        if (reopened.Count == 0) return;
        await db.SaveChangesAsync(ct);
        await ReactionStatusSummary.RefreshForCalculationsAsync(db, reopened, ct);
    }

    private static async Task<Dictionary<int, string>> CheckFingerprintsAsync(LedgerDbContext db, IReadOnlyCollection<int> calculationIds, CancellationToken ct)
    {
        var ids = calculationIds.Distinct().ToList();
        return await db.FrequencyChecks.AsNoTracking().Where(c => EF.Parameter(ids).Contains(c.CalculationId))
            .ToDictionaryAsync(c => c.CalculationId, c => c.InputFingerprint, ct);
    }

    private static string ConflictText(string label, long seen, long? now) =>
        $"Reaction '{label}' was saved by someone else after you opened it (you had version {seen}" + (now is { } n ? $", it is now version {n}" : "") +
        "). Your change was not saved: reopen the reaction to see theirs, then make yours again.";

    private sealed record SpeciesRow(int Id, string Label, int Charge, int Multiplicity, string Formula, bool Retired);
    private sealed record CalcRow(int Id, int SpeciesId, string SpeciesLabel, string Label, CalculationKind Kind, int AtomCount, byte[]? AtomicNumbers, bool Retired);
    private sealed record ScanRow(int Id, int SpeciesId, string Label, string CoordinateAtoms, byte[]? AtomicNumbers);

    private sealed record Resolved(List<DefinitionProblem> Problems, Dictionary<int, SpeciesRow> Species, Dictionary<int, CalcRow> Calculations,
        Dictionary<int, ScanRow> Scans, ILookup<int, int> SpeciesScans);

    /// <summary>Looks up what the definition names in the study and lists every problem with it (the shared shape rules included).</summary>
    private static async Task<Resolved> ResolveAsync(LedgerDbContext db, int studyId, ReactionDefinition d, int? reactionId, CancellationToken ct)
    {
        var problems = new List<DefinitionProblem>();
        var study = await db.Studies.AsNoTracking().Where(s => s.Id == studyId).Select(s => new { s.Name, s.Retired }).FirstOrDefaultAsync(ct);
        if (study is null) problems.Add(new(null, $"there is no study {studyId}"));
        else if (study.Retired) problems.Add(new(null, $"study '{study.Name}' is retired; restore it before adding to it"));
        if (Core.Text.TextRules.LabelProblem(d.Label, "reaction label") is { } lp) problems.Add(new(null, lp));
        else if (await db.Reactions.AnyAsync(x => x.StudyId == studyId && !x.Retired && x.Label == d.Label.Trim() && x.Id != (reactionId ?? 0), ct))
            problems.Add(new(null, $"the study already has a reaction labelled '{d.Label.Trim()}'; give this one another label"));
        for (var i = 0; i < d.States.Count; i++)
            if (!string.IsNullOrWhiteSpace(d.States[i].Label) && Core.Text.TextRules.LabelProblem(d.States[i].Label, "state label") is { } sp) problems.Add(new(i, sp));
        foreach (var (key, message) in d.Kinetics?.Problems([.. d.States.Select(s => (s.Label, s.Kind == StateKind.SaddlePoint))]) ?? [])
            problems.Add(new(null, $"kinetics, {key.Replace('_', ' ')} {message}"));

        var speciesIds = d.States.SelectMany(s => s.Terms).Select(t => t.SpeciesId).Distinct().ToList();
        var species = await db.Species.AsNoTracking().Where(s => EF.Parameter(speciesIds).Contains(s.Id) && s.StudyId == studyId)
            .Select(s => new SpeciesRow(s.Id, s.Label, s.Charge, s.Multiplicity, s.Formula, s.Retired)).ToDictionaryAsync(s => s.Id, ct);
        var calcIds = d.States.Where(s => s.SaddleCalculationId is not null).Select(s => s.SaddleCalculationId!.Value).Distinct().ToList();
        var calcs = await db.Calculations.AsNoTracking().Where(c => EF.Parameter(calcIds).Contains(c.Id) && c.Species!.StudyId == studyId)
            .Select(c => new CalcRow(c.Id, c.SpeciesId, c.Species!.Label, c.Label, c.Kind, c.AtomCount, c.AtomicNumbers, c.Retired)).ToDictionaryAsync(c => c.Id, ct);
        var scanIds = d.States.SelectMany(s => s.Scans).Distinct().ToList();
        var scans = await db.Scans.AsNoTracking().Where(s => EF.Parameter(scanIds).Contains(s.Id) && s.Species!.StudyId == studyId && !s.Retired)
            .Select(s => new ScanRow(s.Id, s.SpeciesId, s.Label, s.CoordinateAtoms, s.AtomicNumbers)).ToDictionaryAsync(s => s.Id, ct);
        var saddleSpecies = calcs.Values.Select(c => c.SpeciesId).Distinct().ToList();
        var speciesScans = (await db.Scans.AsNoTracking().Where(s => EF.Parameter(saddleSpecies).Contains(s.SpeciesId) && !s.Retired)
            .Select(s => new { s.Id, s.SpeciesId }).ToListAsync(ct)).ToLookup(s => s.SpeciesId, s => s.Id);

        string SpeciesLabel(int id) => species.TryGetValue(id, out var s) ? s.Label : $"species {id}";
        var where = $"reaction '{d.Label.Trim()}'";
        for (var i = 0; i < d.States.Count; i++)
        {
            var s = d.States[i];
            foreach (var t in s.Terms)
            {
                if (!species.TryGetValue(t.SpeciesId, out var sp)) problems.Add(new(i, $"{where}, state '{s.Label}': species {t.SpeciesId} is not in this study"));
                else if (sp.Retired) problems.Add(new(i, $"{where}, state '{s.Label}': species '{sp.Label}' is retired; restore it or choose another"));
            }
            if (s.Terms.GroupBy(t => t.SpeciesId).Any(g => g.Count() > 1))
                problems.Add(new(i, $"{where}, state '{s.Label}' names a species twice; raise its coefficient instead"));
            if (s.SaddleCalculationId is { } cid && calcs.TryGetValue(cid, out var c) && c.Retired && s.Kind == StateKind.SaddlePoint)
                problems.Add(new(i, $"{where}, state '{s.Label}': calculation '{c.Label}' is retired; restore it or choose another"));
            if (s.Scans.Count > 0 && s.Kind != StateKind.SaddlePoint)
                problems.Add(new(i, $"{where}, state '{s.Label}' is a minimum; a relaxed scan belongs to the step of a saddle point"));
            foreach (var scanId in s.Scans)
            {
                if (!scans.TryGetValue(scanId, out var scan)) { problems.Add(new(i, $"{where}, state '{s.Label}': scan {scanId} is not a live scan of this study")); continue; }
                if (s.SaddleCalculationId is not { } sid || !calcs.TryGetValue(sid, out var saddle)) continue;
                var atoms = scan.CoordinateAtoms.Split(',', StringSplitOptions.RemoveEmptyEntries).Select(a => int.Parse(a, CultureInfo.InvariantCulture)).ToList();
                if (atoms.Any(a => a > saddle.AtomCount))
                    problems.Add(new(i, $"{where}, state '{s.Label}': scan '{scan.Label}' runs along atom {atoms.Max()}, but saddle point '{saddle.Label}' has {saddle.AtomCount} atoms"));
                else if (scan.AtomicNumbers is { } z && saddle.AtomicNumbers is { } zs && !z.AsSpan().SequenceEqual(zs))
                    problems.Add(new(i, $"{where}, state '{s.Label}': scan '{scan.Label}' has other atoms (or another order) than saddle point '{saddle.Label}'"));
            }
        }
        foreach (var dup in d.States.SelectMany(s => s.Scans).GroupBy(x => x).Where(g => g.Count() > 1))
            problems.Add(new(null, $"{where}: scan {(scans.TryGetValue(dup.Key, out var sc) ? $"'{sc.Label}'" : dup.Key.ToString(CultureInfo.InvariantCulture))} is attached to two states"));

        var shape = d.States.Select(s => new RuleState(s.Label, s.Kind, [.. s.Terms.Select(t => (SpeciesLabel(t.SpeciesId), t.Coefficient))],
            s.SaddleCalculationId?.ToString(CultureInfo.InvariantCulture),
            s.SaddleCalculationId is { } cid && calcs.TryGetValue(cid, out var c) ? new RuleCalculation(c.Label, c.Kind, c.SpeciesLabel, c.AtomCount) : null,
            [.. s.Pairs.Select(p => (p.A, p.B))])).ToList();
        problems.AddRange(ReactionRules.Check(where, shape, "which is not a calculation of this study", builder: true).Select(p => new DefinitionProblem(p.State, p.Message)));
        return new Resolved(problems, species, calcs, scans, speciesScans);
    }

    private static StateBalance Balance(int i, StateDefinition s, Resolved r)
    {
        var terms = s.Terms.Where(t => r.Species.ContainsKey(t.SpeciesId)).Select(t => (Species: r.Species[t.SpeciesId], t.Coefficient)).ToList();
        var known = terms.Count == s.Terms.Count && terms.Count > 0 && terms.All(t => t.Species.Formula.Length > 0);
        var formula = Formula.Sum(terms.Where(t => t.Species.Formula.Length > 0).Select(t => (Formula.Parse(t.Species.Formula), t.Coefficient)));
        var charge = terms.Sum(t => t.Coefficient * t.Species.Charge);
        return new StateBalance(i, s.Label, formula.ToString(), charge, formula.NuclearCharge - charge, known);
    }
}
