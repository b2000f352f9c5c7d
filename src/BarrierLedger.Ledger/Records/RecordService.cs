using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Ledger.Auditing;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Records;

/// <summary>The kinds of record that can be retired and restored.</summary>
public enum RecordKind
{
    Study,
    Species,
    Calculation,
    Reaction,
    Scan,
}

/// <summary>
/// Edits people make to records: rename and describe, retire and restore (nothing is deleted outright). Every edit names the
/// version the editor saw; if someone saved in between, nothing is written and the conflict is explained. Retiring or
/// restoring an input re-derives the reactions that use it in the same transaction.
/// </summary>
public sealed class RecordService(IDbContextFactory<LedgerDbContext> factory, DerivationService derivation, AuditService audit, TimeProvider time)
{
    public async Task<int> CreateStudyAsync(string name, string description, string userId, CancellationToken ct = default)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(name);
        return await LedgerRetry.RunAsync(async token =>
        {
            await using var db = await factory.CreateDbContextAsync(token);
            if (await db.Studies.AnyAsync(s => s.Name == name.Trim() && !s.Retired, token))
                throw new ArgumentException($"A study named '{name.Trim()}' already exists.", nameof(name));
            var s = new Study { Name = name.Trim(), Description = description.Trim(), OwnerUserId = userId, CreatedAt = time.GetUtcNow() };
            db.Studies.Add(s);
            await db.SaveChangesAsync(token);
            audit.Record(db, userId, "study.created", nameof(Study), s.Id, $"Study '{s.Name}' created.");
            await db.SaveChangesAsync(token);
            return s.Id;
        }, ct);
    }

    public Task<EditResult> EditStudyAsync(int id, string name, string description, long expectedVersion, string userId, CancellationToken ct = default) =>
        EditAsync<Study>(id, expectedVersion, userId, s =>
        {
            if (string.IsNullOrWhiteSpace(name)) return ["the study name is empty"];
            s.Name = name.Trim();
            s.Description = description.Trim();
            return [];
        }, s => ("study.edited", $"Study renamed or described: '{s.Name}'."), ct);

    public Task<EditResult> EditReactionAsync(int id, string label, string description, long expectedVersion, string userId, CancellationToken ct = default) =>
        EditAsync<Reaction>(id, expectedVersion, userId, r =>
        {
            if (string.IsNullOrWhiteSpace(label)) return ["the reaction label is empty"];
            r.Label = label.Trim();
            r.Description = description.Trim();
            return [];
        }, r => ("reaction.edited", $"Reaction now '{r.Label}': {r.Description}"), ct);

    /// <summary>
    /// Corrects what a species is for its thermochemistry: the rotational symmetry number σ (<paramref name="symmetryNumberOverride"/>;
    /// null goes back to the σ detected from its geometry), its charge and its spin multiplicity (which must suit the electron count
    /// of its formula). Audited with the values before and after; every reaction using the species is re-derived in the same
    /// transaction.
    /// </summary>
    public Task<EditResult> EditSpeciesAsync(int id, int? symmetryNumberOverride, int charge, int multiplicity, long expectedVersion, string userId,
        CancellationToken ct = default)
    {
        var before = "";
        return EditAsync<Species>(id, expectedVersion, userId, s =>
        {
            var errors = new List<string>();
            if (symmetryNumberOverride is < 1) errors.Add($"the symmetry number must be 1 or more (got {symmetryNumberOverride})");
            if (multiplicity < 1) errors.Add($"the multiplicity (2S+1) must be 1 or more (got {multiplicity})");
            if (s.Formula.Length > 0 && multiplicity >= 1)
            {
                var electrons = Formula.Parse(s.Formula).NuclearCharge - charge;
                if (electrons < 0) errors.Add($"charge {charge} leaves {s.Formula} with {electrons} electrons");
                else if (electrons % 2 == multiplicity % 2)
                    errors.Add($"{s.Formula} with charge {charge} has {electrons} electrons, which cannot have spin multiplicity {multiplicity}");
            }
            if (errors.Count > 0) return errors;
            before = Describe(s);
            s.SymmetryNumberOverride = symmetryNumberOverride;
            s.SymmetryNumber = SpeciesSymmetry.Effective(symmetryNumberOverride, s.DetectedSymmetryNumber);
            s.Charge = charge;
            s.Multiplicity = multiplicity;
            return [];
        }, s => ("species.corrected", $"Species '{s.Label}': {before} → {Describe(s)}."), ct, rederiveSpecies: true);

        static string Describe(Species s) =>
            $"σ = {s.SymmetryNumber} ({(s.SymmetryNumberOverride is null ? $"detected, {(s.PointGroup.Length > 0 ? s.PointGroup : "no geometry")}" : "set by hand")}), " +
            $"charge {s.Charge}, multiplicity {s.Multiplicity}";
    }

    /// <summary>
    /// Creates a species in a study before any result names it (label unique in the study, retired ones included; charge;
    /// multiplicity 2S+1 of 1 or more). Its formula is set by the first geometry stored for it. Throws <see cref="ArgumentException"/>
    /// with the reason when a value is not acceptable.
    /// </summary>
    public async Task<int> CreateSpeciesAsync(int studyId, string label, int charge, int multiplicity, string description, string userId, CancellationToken ct = default)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(userId);
        if (Core.Text.TextRules.LabelProblem(label, "species label") is { } problem) throw new ArgumentException(problem, nameof(label));
        if (multiplicity < 1) throw new ArgumentException($"the multiplicity (2S+1) must be 1 or more (got {multiplicity})", nameof(multiplicity));
        return await LedgerRetry.RunAsync(async token =>
        {
            await using var db = await factory.CreateDbContextAsync(token);
            await using var tx = await LedgerRetry.BeginWriteAsync(db, token);
            var study = await db.Studies.FirstOrDefaultAsync(s => s.Id == studyId, token)
                ?? throw new ArgumentException($"study {studyId} does not exist", nameof(studyId));
            if (study.Retired) throw new ArgumentException($"study '{study.Name}' is retired; restore it before adding to it", nameof(studyId));
            var trimmed = label.Trim();
            if (await db.Species.AnyAsync(s => s.StudyId == studyId && s.Label == trimmed, token))
                throw new ArgumentException($"the study already has a species labelled '{trimmed}' (perhaps retired: restore it instead)", nameof(label));
            var species = new Species { StudyId = studyId, Label = trimmed, Charge = charge, Multiplicity = multiplicity, Description = (description ?? "").Trim() };
            db.Species.Add(species);
            await db.SaveChangesAsync(token);
            audit.Record(db, userId, "species.created", nameof(Species), species.Id,
                $"Species '{species.Label}' created in study '{study.Name}' (charge {charge}, multiplicity {multiplicity}).");
            await db.SaveChangesAsync(token);
            await tx.CommitAsync(token);
            return species.Id;
        }, ct);
    }

    /// <summary>Renames or describes a species (the label stays unique in its study); the reactions using it are re-derived so their messages name it.</summary>
    public Task<EditResult> EditSpeciesDetailsAsync(int id, string label, string description, long expectedVersion, string userId, CancellationToken ct = default) =>
        EditAsync<Species>(id, expectedVersion, userId, async (db, s, token) =>
        {
            if (Core.Text.TextRules.LabelProblem(label, "species label") is { } problem) return [problem];
            var trimmed = label.Trim();
            if (trimmed != s.Label && await db.Species.AnyAsync(x => x.StudyId == s.StudyId && x.Label == trimmed && x.Id != s.Id, token))
                return [$"the study already has a species labelled '{trimmed}'"];
            s.Label = trimmed;
            s.Description = (description ?? "").Trim();
            return [];
        }, s => ("species.edited", $"Species now '{s.Label}'" + (s.Description.Length > 0 ? $": {s.Description}" : ".")), ct, _ => true);

    /// <summary>
    /// Corrects what a calculation is: its label, note, kind and level of theory. A calculation that is the saddle point of a live
    /// reaction's state stays a saddle point (choose another one there first). Changing the kind or level re-derives the reactions
    /// that use its species.
    /// </summary>
    public Task<EditResult> EditCalculationAsync(int id, string label, string note, CalculationKind kind, string levelOfTheory, long expectedVersion, string userId,
        CancellationToken ct = default)
    {
        var inputsChanged = false;
        return EditAsync<Calculation>(id, expectedVersion, userId, async (db, c, token) =>
        {
            var errors = new List<string>();
            if (Core.Text.TextRules.LabelProblem(label, "calculation label") is { } problem) errors.Add(problem);
            if (!Enum.IsDefined(kind)) errors.Add($"'{kind}' is not a kind of calculation");
            if (!Core.Chemistry.LevelOfTheory.TryParse(levelOfTheory, out var level, out var why)) errors.Add($"level of theory: {why}");
            if (kind != CalculationKind.SaddlePoint && c.Kind == CalculationKind.SaddlePoint)
            {
                var uses = await db.ReactionStates.Where(st => st.SaddleCalculationId == c.Id && !st.Reaction!.Retired)
                    .Select(st => new { st.Label, Reaction = st.Reaction!.Label }).ToListAsync(token);
                if (uses.Count > 0)
                    errors.Add($"it is the saddle point of {string.Join(", ", uses.Select(u => $"state '{u.Label}' of reaction '{u.Reaction}'"))}; " +
                               "choose another calculation there before calling it something else");
            }
            if (errors.Count > 0) return errors;
            inputsChanged = c.Kind != kind || c.LevelOfTheory != level.ToString();
            c.Label = label.Trim();
            c.Note = (note ?? "").Trim();
            c.Kind = kind;
            c.SetLevel(level);
            return [];
        }, c => ("calculation.edited", $"Calculation now '{c.Label}': {c.Kind.Words()} at {c.LevelOfTheory}" + (c.Note.Length > 0 ? $"; note: {c.Note}" : ".")), ct,
        _ => inputsChanged);
    }

    public Task<EditResult> RetireAsync(RecordKind kind, int id, long expectedVersion, string userId, string reason, CancellationToken ct = default) =>
        SetRetiredAsync(kind, id, expectedVersion, userId, true, reason, ct);

    public Task<EditResult> RestoreAsync(RecordKind kind, int id, long expectedVersion, string userId, CancellationToken ct = default) =>
        SetRetiredAsync(kind, id, expectedVersion, userId, false, "", ct);

    /// <summary>The current version of a record (what an editor passes back), or null when it does not exist.</summary>
    public async Task<long?> GetVersionAsync(RecordKind kind, int id, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        return kind switch
        {
            RecordKind.Study => await db.Studies.Where(x => x.Id == id).Select(x => (long?)x.Version).FirstOrDefaultAsync(ct),
            RecordKind.Species => await db.Species.Where(x => x.Id == id).Select(x => (long?)x.Version).FirstOrDefaultAsync(ct),
            RecordKind.Calculation => await db.Calculations.Where(x => x.Id == id).Select(x => (long?)x.Version).FirstOrDefaultAsync(ct),
            RecordKind.Reaction => await db.Reactions.Where(x => x.Id == id).Select(x => (long?)x.Version).FirstOrDefaultAsync(ct),
            _ => await db.Scans.Where(x => x.Id == id).Select(x => (long?)x.Version).FirstOrDefaultAsync(ct),
        };
    }

    private Task<EditResult> SetRetiredAsync(RecordKind kind, int id, long expectedVersion, string userId, bool retire, string reason, CancellationToken ct)
    {
        var verb = retire ? "retired" : "restored";
        Func<IRetirable, IReadOnlyList<string>> apply = e =>
        {
            if (e.Retired == retire) return [$"it is already {verb}"];
            e.Retired = retire;
            e.RetiredAt = retire ? time.GetUtcNow() : null;
            e.RetiredByUserId = retire ? userId : null;
            return [];
        };
        (string, string) Describe(object e) => ($"record.{verb}", $"{kind} {id} {verb}" + (reason.Length > 0 ? $": {reason}" : "."));
        var rederive = kind is RecordKind.Species or RecordKind.Calculation or RecordKind.Scan;
        return kind switch
        {
            RecordKind.Study => EditAsync<Study>(id, expectedVersion, userId, apply, Describe, ct),
            RecordKind.Species => EditAsync<Species>(id, expectedVersion, userId, apply, Describe, ct, rederiveSpecies: rederive),
            RecordKind.Calculation => EditAsync<Calculation>(id, expectedVersion, userId, apply, Describe, ct, rederiveSpecies: rederive),
            RecordKind.Reaction => EditAsync<Reaction>(id, expectedVersion, userId, apply, Describe, ct),
            _ => EditAsync<Scan>(id, expectedVersion, userId, apply, Describe, ct, rederiveSpecies: rederive),
        };
    }

    private Task<EditResult> EditAsync<T>(int id, long expectedVersion, string userId, Func<T, IReadOnlyList<string>> apply, Func<T, (string Action, string Summary)> describe,
        CancellationToken ct, bool rederiveSpecies = false) where T : class, IVersioned =>
        EditAsync<T>(id, expectedVersion, userId, (_, e, _) => Task.FromResult(apply(e)), describe, ct, _ => rederiveSpecies);

    private async Task<EditResult> EditAsync<T>(int id, long expectedVersion, string userId, Func<LedgerDbContext, T, CancellationToken, Task<IReadOnlyList<string>>> apply,
        Func<T, (string Action, string Summary)> describe, CancellationToken ct, Func<T, bool> rederiveSpecies) where T : class, IVersioned
    {
        return await LedgerRetry.RunAsync(async token =>
        {
            await using var db = await factory.CreateDbContextAsync(token);
            await using var tx = await LedgerRetry.BeginWriteAsync(db, token);
            var entity = await db.Set<T>().FindAsync([id], token);
            if (entity is null) return EditResult.Invalid([$"{typeof(T).Name} {id} does not exist"]);
            if (entity.Version != expectedVersion)
                return EditResult.Conflicted(ConflictText(typeof(T).Name, id, expectedVersion, entity.Version));
            db.Entry(entity).Property(e => e.Version).OriginalValue = expectedVersion;
            var errors = await apply(db, entity, token);
            if (errors.Count > 0) return EditResult.Invalid(errors);
            var rederive = rederiveSpecies(entity);
            var (action, summary) = describe(entity);
            audit.Record(db, userId, action, typeof(T).Name, id, summary, before: $"version {expectedVersion}", after: $"version {expectedVersion + 1}");
            try
            {
                await db.SaveChangesAsync(token);
            }
            catch (DbUpdateConcurrencyException)
            {
                return EditResult.Conflicted(ConflictText(typeof(T).Name, id, expectedVersion, null));
            }
            if (rederive)
            {
                var speciesId = entity switch
                {
                    Species s => s.Id,
                    Calculation c => c.SpeciesId,
                    Scan sc => sc.SpeciesId,
                    _ => 0,
                };
                var studyId = await db.Species.Where(s => s.Id == speciesId).Select(s => s.StudyId).FirstAsync(token);
                await derivation.AfterInputsChangedAsync(db, studyId, [speciesId], [], token);
            }
            await tx.CommitAsync(token);
            return EditResult.Ok(entity.Version);
        }, ct);
    }

    private static string ConflictText(string type, int id, long seen, long? now) =>
        $"This {type.ToLowerInvariant()} ({id}) was changed by someone else after you opened it (you had version {seen}" +
        (now is { } n ? $", it is now version {n}" : "") + "). Your change was not saved: reload to see theirs, then make yours again.";
}
