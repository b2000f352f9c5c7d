using System.Data;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Storage;

namespace BarrierLedger.Ledger.Derivation;

/// <summary>
/// Computes and stores derived values (frequency checks and pathway energies) inside the caller's transaction: on upload for
/// what the upload touched, and in the recompute pass for whole studies. Used by <see cref="Uploads.UploadService"/> and
/// <see cref="RecomputeService"/>.
/// </summary>
public sealed class DerivationService(TimeProvider time)
{
    /// <summary>The model in force for a study: its override, else the group default, else the built-in default.</summary>
    public static async Task<(ModelSettings Settings, EnergyModel? Row)> EffectiveModelAsync(LedgerDbContext db, int studyId, CancellationToken ct)
    {
        var rows = await db.EnergyModels.AsNoTracking().Where(m => m.StudyId == studyId || m.StudyId == null).ToListAsync(ct);
        var row = rows.FirstOrDefault(m => m.StudyId == studyId) ?? rows.FirstOrDefault(m => m.StudyId == null);
        return (row is null ? ModelSettings.Default : ModelSettings.From(row), row);
    }

    /// <summary>
    /// After an upload: every live reaction of the study that uses a touched species (or is listed) gets a new inputs revision,
    /// its saddle points are checked and its values derived, all in the caller's transaction.
    /// </summary>
    public async Task AfterInputsChangedAsync(LedgerDbContext db, int studyId, IReadOnlyCollection<int> touchedSpeciesIds, IReadOnlyCollection<int> reactionIds, CancellationToken ct)
    {
        var affected = await db.Reactions.Where(r => r.StudyId == studyId && !r.Retired &&
                (EF.Parameter(reactionIds).Contains(r.Id) || r.States.Any(s => s.Terms.Any(t => EF.Parameter(touchedSpeciesIds).Contains(t.SpeciesId)))))
            .Select(r => r.Id).ToListAsync(ct);
        var (model, _) = await EffectiveModelAsync(db, studyId, ct);
        if (affected.Count == 0)
        {
            // A species in no reaction yet still gets its point group.
            var alone = await DerivationInputs.ForReactionsAsync(db, [], ct, touchedSpeciesIds);
            await SpeciesSymmetry.WriteAsync(db, SpeciesSymmetry.Refresh(model, alone), ct);
            return;
        }
        await BumpRevisionsAsync(db, affected, ct);
        await RefreshChecksAsync(db, model, [studyId], affected, force: false, ct);
        var inputs = await DerivationInputs.LoadAsync(db, null, affected, ct, touchedSpeciesIds);
        await SpeciesSymmetry.WriteAsync(db, SpeciesSymmetry.Refresh(model, inputs), ct);
        await WriteAsync(db, DeriveAll(model, inputs, null, ct), ct);
        // New reactions and re-linked saddle points (with their reopened reviews) change the ledger status.
        await ReactionStatusSummary.RefreshAsync(db, affected, ct);
    }

    /// <summary>
    /// Derives a pathway that is not stored (the reaction builder's live preview) through exactly the path a stored reaction takes:
    /// the same inputs loader, the same <see cref="ReactionDeriver"/> and model. Writes nothing.
    /// </summary>
    public async Task<DerivedPreview> PreviewAsync(LedgerDbContext db, int studyId, IReadOnlyList<PreviewState> states, CancellationToken ct)
    {
        var (model, _) = await EffectiveModelAsync(db, studyId, ct);
        var input = new ReactionInput(0, studyId, 0, [.. states.Select((s, i) => new StateInput(0, i, s.Label, s.Kind, s.SaddleCalculationId,
            [.. s.Terms], [.. s.Pairs]))]);
        var inputs = await DerivationInputs.ForReactionsAsync(db, [input], ct);
        var d = new ReactionDeriver(model, inputs).Derive(input);
        return new DerivedPreview(d.BarrierGibbsHartree, d.ReactionGibbsHartree, d.BarrierElectronicHartree, d.RateConstantPerSecond, d.HalfLifeSeconds,
            d.TemperatureKelvin, d.LevelOfTheory, d.Consistent, d.Consistency, d.States, d.Steps, model);
    }

    /// <summary>Marks reactions' derived values out of date (their inputs changed).</summary>
    public static Task BumpRevisionsAsync(LedgerDbContext db, IReadOnlyCollection<int> reactionIds, CancellationToken ct) =>
        db.Reactions.Where(r => EF.Parameter(reactionIds).Contains(r.Id)).ExecuteUpdateAsync(u => u.SetProperty(r => r.InputsRevision, r => r.InputsRevision + 1), ct);

    /// <summary>Every reaction whose states use one of these species (for retire/restore of inputs).</summary>
    public static Task<List<int>> ReactionsUsingSpeciesAsync(LedgerDbContext db, IReadOnlyCollection<int> speciesIds, CancellationToken ct) =>
        db.Reactions.Where(r => r.States.Any(s => s.Terms.Any(t => EF.Parameter(speciesIds).Contains(t.SpeciesId)))).Select(r => r.Id).ToListAsync(ct);

    /// <summary>
    /// Runs the saddle-point check for each saddle-point state's calculation whose stored fingerprint differs from its
    /// current inputs (or all of them when <paramref name="force"/>). Returns how many were run.
    /// </summary>
    internal async Task<int> RefreshChecksAsync(LedgerDbContext db, ModelSettings model, IReadOnlyCollection<int> studyIds, IReadOnlyCollection<int>? reactionIds, bool force, CancellationToken ct)
    {
        var q = db.ReactionStates.AsNoTracking().Where(s => s.Kind == Core.Pathways.StateKind.SaddlePoint && s.SaddleCalculationId != null && !s.Reaction!.Retired
                                                             && studyIds.Contains(s.Reaction.StudyId));
        if (reactionIds is not null) q = q.Where(s => EF.Parameter(reactionIds).Contains(s.ReactionId));
        var states = await q.OrderBy(s => s.Id).Select(s => new
        {
            StateId = s.Id,
            s.Reaction!.StudyId,
            CalcId = s.SaddleCalculationId!.Value,
            SpeciesId = s.SaddleCalculation!.SpeciesId,
            Pairs = s.CoordinatePairs.OrderBy(p => p.Id).Select(p => new { p.AtomA, p.AtomB }).ToList(),
        }).ToListAsync(ct);
        if (states.Count == 0) return 0;
        var byCalc = states.GroupBy(s => s.CalcId).Select(g => g.First()).ToList();
        var calcIds = byCalc.Select(s => s.CalcId).ToList();
        var speciesIds = byCalc.Select(s => s.SpeciesId).Distinct().ToList();
        var scans = (await db.Scans.AsNoTracking().Where(s => EF.Parameter(speciesIds).Contains(s.SpeciesId) && !s.Retired)
                .Select(s => new { s.Id, s.SpeciesId, Count = db.ScanPoints.Count(p => p.ScanId == s.Id) }).ToListAsync(ct))
            .GroupBy(s => s.SpeciesId).ToDictionary(g => g.Key, g => g.OrderByDescending(s => s.Id).First());
        // Only what decides whether a check is current; its reasons and evidence are rewritten, never read, here.
        var stored = await db.FrequencyChecks.AsNoTracking().Where(c => EF.Parameter(calcIds).Contains(c.CalculationId))
            .Select(c => new { c.Id, c.CalculationId, c.InputFingerprint }).ToDictionaryAsync(c => c.CalculationId, ct);

        var rerun = new List<int>();
        var minima = new Dictionary<int, StudyMinima>();
        foreach (var s in byCalc)
        {
            var pairs = s.Pairs.Select(p => (p.AtomA, p.AtomB)).ToArray();
            scans.TryGetValue(s.SpeciesId, out var scanInfo);
            if (!minima.TryGetValue(s.StudyId, out var study)) minima[s.StudyId] = study = await StudyMinima.LoadAsync(db, s.StudyId, ct);
            var connection = await ConnectionInputs.LoadAsync(db, study, s.StateId, s.CalcId, ct);
            var fingerprint = CheckRunner.Fingerprint(s.CalcId, pairs, scanInfo?.Id, scanInfo?.Count, model, connection.Fingerprint);
            stored.TryGetValue(s.CalcId, out var current);
            if (!force && current is not null && current.InputFingerprint == fingerprint) continue;

            var calc = await db.Calculations.AsNoTracking().Include(c => c.Species).FirstAsync(c => c.Id == s.CalcId, ct);
            Scan? scan = null;
            List<ScanPointRecord>? points = null;
            if (scanInfo is not null)
            {
                scan = await db.Scans.AsNoTracking().FirstAsync(x => x.Id == scanInfo.Id, ct);
                points = await db.ScanPoints.AsNoTracking().Where(p => p.ScanId == scanInfo.Id)
                    .Select(p => new ScanPointRecord { Index = p.Index, Coordinate = p.Coordinate, EnergyHartree = p.EnergyHartree, Converged = p.Converged })
                    .ToListAsync(ct);
            }
            var input = CheckRunner.FromStored(calc, calc.Species!, pairs, scan, points) with { Connection = connection };
            var (verdict, reasons, evidence) = CheckRunner.Run(input, model);
            var check = new FrequencyCheck
            {
                CalculationId = s.CalcId, Verdict = verdict, ReasonsJson = reasons, EvidenceJson = evidence, InputFingerprint = fingerprint,
                ComputedAt = time.GetUtcNow(),
            };
            if (current is null) db.FrequencyChecks.Add(check);
            else
            {
                // Written over the stored row by its key, every field marked (attaching takes the values set as the stored ones).
                check.Id = current.Id;
                var entry = db.FrequencyChecks.Attach(check);
                foreach (var property in entry.Properties)
                    if (!property.Metadata.IsPrimaryKey()) property.IsModified = true;
            }
            rerun.Add(s.CalcId);
        }
        await db.SaveChangesAsync(ct);
        await ReactionStatusSummary.RefreshForCalculationsAsync(db, rerun, ct);
        return rerun.Count;
    }

    /// <summary>Derives the given reactions (or every live reaction of the studies) and stores the results.</summary>
    internal async Task<int> DeriveAsync(LedgerDbContext db, ModelSettings model, IReadOnlyCollection<int> studyIds, IReadOnlyCollection<int>? reactionIds,
        Action<int, int>? progress, CancellationToken ct)
    {
        var inputs = await DerivationInputs.LoadAsync(db, studyIds, reactionIds, ct);
        await SpeciesSymmetry.WriteAsync(db, SpeciesSymmetry.Refresh(model, inputs), ct);
        var results = DeriveAll(model, inputs, progress, ct);
        await WriteAsync(db, results, ct);
        return results.Length;
    }

    /// <summary>
    /// Derives every reaction of <paramref name="inputs"/>, the reactions split into one contiguous slice per core, each slice with
    /// its own <see cref="ReactionDeriver"/> (its caches are not shared between threads; a species used in two slices is computed
    /// twice, which costs less than locking). The result keeps the input order.
    /// </summary>
    internal static DerivedReaction[] DeriveAll(ModelSettings model, DerivationInputs inputs, Action<int, int>? progress, CancellationToken ct, int? slices = null)
    {
        var n = inputs.Reactions.Count;
        var results = new DerivedReaction[n];
        // A slice of fewer than ~64 reactions is not worth a thread.
        var parts = Math.Clamp(slices ?? Math.Min(Environment.ProcessorCount, n / 64), 1, Math.Max(1, n));
        var done = 0;
        var reported = 0;
        var gate = new Lock();
        Parallel.For(0, parts, new ParallelOptions { MaxDegreeOfParallelism = parts, CancellationToken = ct }, slice =>
        {
            var deriver = new ReactionDeriver(model, inputs);
            var (from, to) = ((int)((long)n * slice / parts), (int)((long)n * (slice + 1) / parts));
            for (var i = from; i < to; i++)
            {
                ct.ThrowIfCancellationRequested();
                results[i] = deriver.Derive(inputs.Reactions[i]);
                if (progress is not null && Interlocked.Increment(ref done) is var d && d % 250 == 0)
                    lock (gate)
                        if (d > reported) progress(reported = d, n); // never backwards, whichever thread gets here first
            }
        });
        progress?.Invoke(n, n);
        return results;
    }

    /// <summary>
    /// Upserts derivations with one prepared statement. A reaction whose inputs revision moved on since it was read (a concurrent
    /// upload derived it afresh) is left alone.
    /// </summary>
    internal async Task WriteAsync(LedgerDbContext db, IReadOnlyList<DerivedReaction> results, CancellationToken ct)
    {
        if (results.Count == 0) return;
        // Plain SQL that SQLite and PostgreSQL both read: quoted names, @-parameters with their types, ON CONFLICT ... excluded.
        var connection = db.Database.GetDbConnection();
        if (connection.State != ConnectionState.Open) await connection.OpenAsync(ct);
        await using var cmd = connection.CreateCommand();
        cmd.Transaction = db.Database.CurrentTransaction?.GetDbTransaction();
        cmd.CommandText = """
            INSERT INTO "ReactionDerivations" ("ReactionId", "BarrierGibbsHartree", "ReactionGibbsHartree", "BarrierElectronicHartree", "RateConstantPerSecond",
                "HalfLifeSeconds", "TemperatureKelvin", "LevelOfTheory", "Consistent", "ConsistencyJson", "StatesJson", "StepsJson", "ModelFingerprint",
                "InputFingerprint", "InputsRevision", "ComputedAt")
            SELECT @r, @bg, @rg, @be, @k, @t, @temp, @lot, @ok, @cj, @sj, @tj, @mf, @if, @rev, @at
            WHERE (SELECT "InputsRevision" FROM "Reactions" WHERE "Id" = @r) = @rev
            ON CONFLICT ("ReactionId") DO UPDATE SET "BarrierGibbsHartree" = excluded."BarrierGibbsHartree", "ReactionGibbsHartree" = excluded."ReactionGibbsHartree",
                "BarrierElectronicHartree" = excluded."BarrierElectronicHartree", "RateConstantPerSecond" = excluded."RateConstantPerSecond",
                "HalfLifeSeconds" = excluded."HalfLifeSeconds", "TemperatureKelvin" = excluded."TemperatureKelvin", "LevelOfTheory" = excluded."LevelOfTheory",
                "Consistent" = excluded."Consistent", "ConsistencyJson" = excluded."ConsistencyJson", "StatesJson" = excluded."StatesJson", "StepsJson" = excluded."StepsJson",
                "ModelFingerprint" = excluded."ModelFingerprint", "InputFingerprint" = excluded."InputFingerprint", "InputsRevision" = excluded."InputsRevision",
                "ComputedAt" = excluded."ComputedAt"
            """;
        (string Name, DbType Type)[] columns =
        [
            ("@r", DbType.Int32), ("@bg", DbType.Double), ("@rg", DbType.Double), ("@be", DbType.Double), ("@k", DbType.Double), ("@t", DbType.Double),
            ("@temp", DbType.Double), ("@lot", DbType.String), ("@ok", DbType.Boolean), ("@cj", DbType.String), ("@sj", DbType.String), ("@tj", DbType.String),
            ("@mf", DbType.String), ("@if", DbType.String), ("@rev", DbType.Int64), ("@at", DbType.DateTimeOffset),
        ];
        var p = columns.Select(c => StoreSql.Parameter(cmd, c.Name, c.Type)).ToArray();
        var at = time.GetUtcNow();
        static object N(double? x) => x is { } v && double.IsFinite(v) ? v : DBNull.Value;
        var first = true;
        foreach (var d in results)
        {
            p[0].Value = d.ReactionId; p[1].Value = N(d.BarrierGibbsHartree); p[2].Value = N(d.ReactionGibbsHartree);
            p[3].Value = N(d.BarrierElectronicHartree); p[4].Value = N(d.RateConstantPerSecond); p[5].Value = N(d.HalfLifeSeconds);
            p[6].Value = d.TemperatureKelvin; p[7].Value = d.LevelOfTheory; p[8].Value = d.Consistent;
            p[9].Value = d.ConsistencyJson; p[10].Value = d.StatesJson; p[11].Value = d.StepsJson;
            p[12].Value = d.ModelFingerprint; p[13].Value = d.InputFingerprint; p[14].Value = d.InputsRevision; p[15].Value = at;
            if (first) { await cmd.PrepareAsync(ct); first = false; }
            await cmd.ExecuteNonQueryAsync(ct);
        }
    }
}
