using System.Data;
using System.Globalization;
using System.Security.Cryptography;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Vibrations;
using BarrierLedger.Ledger.Auditing;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Reviews;
using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Storage;

namespace BarrierLedger.Ledger.Uploads;

/// <summary>
/// The upload workflow: read files (Core readers) into a draft, match it against the store, show a preview, and store it
/// as one transaction with its original files. Any error: nothing is written and every error is returned at once. A
/// calculation already stored from the same file for the same species is reported and not stored twice. An upload that would take
/// its uploader past the storage quota (<see cref="StorageQuota"/>) is refused whole.
/// </summary>
public sealed class UploadService(
    IDbContextFactory<LedgerDbContext> factory, DerivationService derivation, AuditService audit, TimeProvider time, UploadGate gate, StorageQuota quota)
{
    /// <summary>Reads and checks the files against the store; writes nothing.</summary>
    public async Task<UploadPreview> PreviewAsync(IReadOnlyList<UploadFile> files, UploadChoices choices, CancellationToken ct = default)
    {
        using var turn = await gate.EnterAsync(files.Sum(f => f.Content.LongLength), ct);
        var draft = UploadReader.Read(files, choices);
        await using var db = await factory.CreateDbContextAsync(ct);
        var plan = await UploadPlan.ResolveAsync(db, draft, choices, ct);
        return plan.ToPreview();
    }

    /// <summary>Reads, checks and stores the files in one transaction.</summary>
    public async Task<UploadOutcome> StoreAsync(IReadOnlyList<UploadFile> files, UploadChoices choices, string uploaderUserId, CancellationToken ct = default)
    {
        using var turn = await gate.EnterAsync(files.Sum(f => f.Content.LongLength), ct);
        var draft = UploadReader.Read(files, choices);
        return await StoreDraftAsync(draft, choices, uploaderUserId, ct);
    }

    /// <summary>
    /// Imports one bundle file (manifest .json or .zip) from a stream, e.g. the demo scenario on first start. The study is the
    /// bundle's own (created when no live study has its name).
    /// </summary>
    public async Task<UploadOutcome> ImportBundleAsync(Stream stream, string fileName, string uploaderUserId, CancellationToken ct = default)
    {
        ArgumentNullException.ThrowIfNull(stream);
        using var buffer = new MemoryStream();
        await stream.CopyToAsync(buffer, ct);
        return await StoreAsync([new UploadFile(fileName, buffer.ToArray())], new UploadChoices(), uploaderUserId, ct);
    }

    /// <summary>Stores an already-read draft (the step after reading; also what the benchmarks time).</summary>
    public async Task<UploadOutcome> StoreDraftAsync(UploadDraft draft, UploadChoices choices, string uploaderUserId, CancellationToken ct = default)
    {
        ArgumentNullException.ThrowIfNull(draft);
        ArgumentException.ThrowIfNullOrWhiteSpace(uploaderUserId);
        if (draft.Issues.Any(i => i.IsError)) return UploadOutcome.Failed(draft.Issues);
        var key = choices.UploadKey ?? Guid.NewGuid().ToString("N");
        var content = UploadFingerprint.Of(draft.Files, choices);
        return await LedgerRetry.RunAsync(async token =>
        {
            await using var db = await factory.CreateDbContextAsync(token);
            await using var tx = await LedgerRetry.BeginWriteAsync(db, token);
            // A key is the uploader's own: another user's upload under the same key is no concern of this one.
            if (await db.Uploads.AsNoTracking().FirstOrDefaultAsync(u => u.UploaderUserId == uploaderUserId && u.Key == key, token) is { } earlier)
            {
                if (earlier.ContentSha256 is { } was && was != content)
                    return UploadOutcome.Failed([]) with
                    {
                        KeyConflict = $"Upload key '{key}' was used by you on {earlier.At:u} for other files or choices (upload {earlier.Id}); " +
                            "nothing was stored. Send a new key for new content; the same key only repeats the same upload.",
                    };
                return new UploadOutcome(true, earlier.Id, earlier.StudyId, [], [], [], [$"upload {key} was already stored"], draft.Issues) { AlreadyStored = true };
            }
            var plan = await UploadPlan.ResolveAsync(db, draft, choices, token);
            if (plan.Issues.Any(i => i.IsError)) return UploadOutcome.Failed(plan.Issues);
            if (await quota.CheckAsync(db, uploaderUserId, plan.FileSha, draft.Files, token) is { } refusal)
                return UploadOutcome.Failed(plan.Issues) with { QuotaRefusal = refusal };
            var outcome = await WriteAsync(db, plan, key, content, uploaderUserId, token);
            await tx.CommitAsync(token);
            return outcome;
        }, ct);
    }

    /// <summary>
    /// The bundle's energy model becomes the new study's own model: the group default with every key the bundle gives, in the
    /// upload's transaction and before anything is derived, so the web's demo loader, an upload, the API and the command line
    /// all derive the study under the model it was written for. A study that exists already keeps its own model.
    /// </summary>
    private async Task SetStudyModelAsync(LedgerDbContext db, int studyId, Core.Formats.BundleEnergyModel b, string user, DateTimeOffset now, CancellationToken ct)
    {
        var (current, _) = await DerivationService.EffectiveModelAsync(db, studyId, ct);
        var settings = current.With(b);
        var row = new EnergyModel { StudyId = studyId, UpdatedAt = now, UpdatedByUserId = user };
        settings.CopyTo(row);
        db.EnergyModels.Add(row);
        await db.SaveChangesAsync(ct);
        audit.Record(db, user, "energy-model.override-saved", nameof(EnergyModel), studyId, $"The study's energy model as its bundle states it: {settings.Describe()}.");
    }

    private async Task<UploadOutcome> WriteAsync(LedgerDbContext db, UploadPlan plan, string key, string content, string user, CancellationToken ct)
    {
        var now = time.GetUtcNow();
        var draft = plan.Draft;

        var study = plan.Study ?? new Study { Name = plan.StudyName!, Description = draft.StudyDescription, OwnerUserId = user, CreatedAt = now };
        if (plan.Study is null)
        {
            db.Studies.Add(study);
            await db.SaveChangesAsync(ct);
            audit.Record(db, user, "study.created", nameof(Study), study.Id, $"Study '{study.Name}' created by an upload.");
            if (draft.StudyEnergyModel is { } bundleModel) await SetStudyModelAsync(db, study.Id, bundleModel, user, now, ct);
        }

        foreach (var s in plan.NewSpecies)
        {
            s.StudyId = study.Id;
            db.Species.Add(s);
        }
        foreach (var (species, formula) in plan.FormulaUpdates) species.Formula = formula;
        foreach (var (species, sigma) in plan.SymmetryOverrides)
        {
            audit.Record(db, user, "species.symmetry", nameof(Species), species.Id,
                $"Species '{species.Label}': symmetry number set to {sigma} by an upload (was {species.SymmetryNumber}{(species.SymmetryNumberOverride is null ? ", detected" : "")}).");
            (species.SymmetryNumberOverride, species.SymmetryNumber) = (sigma, sigma);
        }

        // Original files, content-addressed: bytes stored once however often they are named.
        var fileIds = new Dictionary<string, int>(StringComparer.Ordinal);
        var known = await db.StoredFiles.Where(f => plan.FileSha.Values.Contains(f.Sha256)).Select(f => new { f.Sha256, f.Id }).ToListAsync(ct);
        var bySha = known.ToDictionary(k => k.Sha256, k => k.Id);
        var newFiles = new Dictionary<string, StoredFile>(StringComparer.Ordinal);
        foreach (var (name, sha) in plan.FileSha)
        {
            if (bySha.ContainsKey(sha) || newFiles.ContainsKey(sha)) continue;
            var bytes = draft.Files[name];
            var f = new StoredFile { Sha256 = sha, FileName = name, SizeBytes = bytes.Length, Content = bytes, UploadedByUserId = user, UploadedAt = now };
            newFiles[sha] = f;
            db.StoredFiles.Add(f);
        }
        var upload = new Upload { Key = key, ContentSha256 = content, StudyId = study.Id, UploaderUserId = user, At = now, Summary = plan.Summary() };
        db.Uploads.Add(upload);
        await db.SaveChangesAsync(ct);
        foreach (var f in newFiles.Values) bySha[f.Sha256] = f.Id;
        foreach (var (name, sha) in plan.FileSha) fileIds[name] = bySha[sha];

        var speciesByLabel = plan.SpeciesByLabel;
        var calcByLabel = new Dictionary<string, Calculation>(StringComparer.Ordinal);
        foreach (var c in plan.NewCalculations)
        {
            var species = speciesByLabel[c.Draft.Species];
            var sourceFile = c.Draft.File ?? draft.PrimaryFile;
            var level = c.Draft.LevelOfTheory;
            var rec = new Calculation
            {
                Species = species, UploadId = upload.Id, Label = c.Draft.Label, Kind = c.Draft.Kind, Conformer = c.Draft.Conformer,
                EnergyHartree = c.Draft.EnergyHartree,
                AtomCount = c.Draft.Geometry?.AtomCount ?? 0,
                AtomicNumbers = c.Draft.Geometry is { } g ? Blobs.FromElements(g.Elements) : null,
                PositionsAngstrom = c.Draft.Geometry is { } g2 ? Blobs.FromPositions(g2.PositionsAngstrom) : null,
                FrequenciesCm1 = c.Frequencies.Count > 0 ? Blobs.FromDoubles([.. c.Frequencies]) : null,
                Modes = c.Modes.Count > 0 ? Blobs.FromModes(c.Modes) : null,
                HessianHartreePerBohr2 = c.Draft.HessianHartreePerBohr2.Count > 0 ? Blobs.FromDoubles([.. c.Draft.HessianHartreePerBohr2]) : null,
                ThermalTemperatureKelvin = c.Draft.ThermalTemperatureKelvin, ZeroPointHartree = c.Draft.ZeroPointHartree,
                EnthalpyCorrectionHartree = c.Draft.EnthalpyCorrectionHartree, GibbsCorrectionHartree = c.Draft.GibbsCorrectionHartree,
                StoredFileId = sourceFile is not null && fileIds.TryGetValue(sourceFile, out var fid) ? fid : null,
                SourceSha256 = c.SourceSha, Note = c.Draft.Note, UploadedByUserId = user, UploadedAt = now,
            };
            rec.SetLevel(level);
            db.Calculations.Add(rec);
            calcByLabel[c.Draft.Label] = rec;
        }
        await db.SaveChangesAsync(ct);
        foreach (var (label, id) in plan.DuplicateCalculationIds) calcByLabel[label] = await db.Calculations.FindAsync([id], ct) ?? throw new InvalidOperationException($"calculation {id} vanished");

        // Scans: points go through one prepared statement in the same transaction (a scan may have thousands of points).
        var scanIds = new List<int>();
        foreach (var s in plan.NewScans)
        {
            var first = s.Points.Select(p => p.Geometry).FirstOrDefault(m => m is not null);
            var scan = new Scan
            {
                Species = speciesByLabel[s.Species], UploadId = upload.Id, Label = s.Label, LevelOfTheory = s.LevelOfTheory,
                CoordinateKind = s.Coordinate.Kind, CoordinateAtoms = string.Join(",", s.Coordinate.Atoms.Select(a => a + 1)),
                AtomicNumbers = first is null ? null : Blobs.FromElements(first.Elements),
                StoredFileId = (s.File ?? draft.PrimaryFile) is { } sf && fileIds.TryGetValue(sf, out var sid) ? sid : null,
                SourceSha256 = plan.ShaOf(s.File), UploadedByUserId = user, UploadedAt = now,
            };
            db.Scans.Add(scan);
            await db.SaveChangesAsync(ct);
            await InsertScanPointsAsync(db, scan.Id, s.Points, ct);
            scanIds.Add(scan.Id);
        }

        // IRCs: attached to their saddle-point calculation (of this upload or stored); frames through one prepared statement.
        var ircIds = new List<int>();
        var ircSpecies = new List<int>();
        var reopened = new List<int>();
        foreach (var i in plan.NewIrcs)
        {
            var saddle = i.SaddleInUpload is { } l ? calcByLabel[l] : await db.Calculations.FirstAsync(c => c.Id == i.StoredSaddleId, ct);
            var structures = i.Draft.Structures.Structures;
            var irc = new Irc
            {
                SaddleCalculationId = saddle.Id, UploadId = upload.Id, Label = i.Draft.Label, LevelOfTheory = i.LevelOfTheory, Form = i.Draft.Structures.Form,
                AtomCount = structures[0].Geometry.AtomCount, AtomicNumbers = Blobs.FromElements(structures[0].Geometry.Elements), SaddleFrame = i.Path?.SaddleFrame,
                StoredFileId = (i.Draft.File ?? draft.PrimaryFile) is { } pf && fileIds.TryGetValue(pf, out var pid) ? pid : null,
                BackwardStoredFileId = i.Draft.BackwardFile is { } bf && fileIds.TryGetValue(bf, out var bid) ? bid : null,
                SourceSha256 = i.SourceSha, UploadedByUserId = user, UploadedAt = now,
            };
            db.Ircs.Add(irc);
            await db.SaveChangesAsync(ct);
            await InsertIrcFramesAsync(db, irc.Id, i, ct);
            ircIds.Add(irc.Id);
            ircSpecies.Add(saddle.SpeciesId);
            // New connection evidence for a reviewed saddle point: its check changes, so it awaits review again (the old review stays).
            if (await ReviewStates.ReopenIfDecidedAsync(db, saddle.Id, user, now,
                    $"IRC '{irc.Label}' was added (upload {upload.Id}); its connection check joins the evidence, so the saddle point awaits review again.", ct) is { } last)
            {
                audit.Record(db, user, "review.reopened", nameof(Calculation), saddle.Id,
                    $"Saddle point '{saddle.Label}': IRC '{irc.Label}' added after it was {last.ToString().ToLowerInvariant()}; it awaits review again.",
                    before: last.ToString(), after: "awaiting review");
                reopened.Add(saddle.Id);
            }
        }

        // Reactions: new ones with their states; existing ones get their saddle points re-linked (which reopens reviews).
        var reactionIds = new List<int>();
        var newReactions = new List<Reaction>(plan.NewReactions.Count);
        foreach (var r in plan.NewReactions)
        {
            var reaction = new Reaction { StudyId = study.Id, Label = r.Label, Description = r.Description, OwnerUserId = user,
                Kinetics = Reactions.ReactionDefinition.KineticsJson(r.Kinetics) };
            var position = 0;
            foreach (var s in r.States)
            {
                reaction.States.Add(new ReactionState
                {
                    Position = position++, Label = s.Label, Kind = s.Kind,
                    SaddleCalculation = s.Calculation is null ? null : calcByLabel[s.Calculation],
                    Terms = [.. s.Terms.Select(t => new ReactionStateTerm { Species = speciesByLabel[t.Species], Coefficient = t.Coefficient })],
                    CoordinatePairs = [.. s.ReactionCoordinate.Select(p => new ReactionCoordinatePair { AtomA = p.A, AtomB = p.B })],
                });
            }
            db.Reactions.Add(reaction);
            newReactions.Add(reaction);
        }
        if (newReactions.Count > 0) await db.SaveChangesAsync(ct);
        foreach (var reaction in newReactions)
        {
            audit.Record(db, user, "reaction.created", nameof(Reaction), reaction.Id, $"Reaction '{reaction.Label}' with {reaction.States.Count} states.");
            reactionIds.Add(reaction.Id);
        }
        foreach (var (state, calcLabel) in plan.StateRelinks)
        {
            var calc = calcByLabel[calcLabel];
            if (state.SaddleCalculationId == calc.Id) continue;
            if (state.SaddleCalculationId is { } oldId)
            {
                if (await ReviewStates.ReopenIfDecidedAsync(db, oldId, user, now,
                        $"Replaced by calculation '{calc.Label}' (upload {upload.Id}); the new saddle point awaits review.", ct) is { } last)
                {
                    audit.Record(db, user, "review.reopened", nameof(ReactionState), state.Id,
                        $"State '{state.Label}': a new saddle-point calculation replaced one that was {last.ToString().ToLowerInvariant()}; it awaits review again.",
                        before: $"calculation {oldId} ({last})", after: $"calculation {calc.Id} (awaiting review)");
                    reopened.Add(oldId);
                }
            }
            audit.Record(db, user, "state.saddle-replaced", nameof(ReactionState), state.Id,
                $"State '{state.Label}' now uses calculation '{calc.Label}'.", before: state.SaddleCalculationId?.ToString(CultureInfo.InvariantCulture),
                after: calc.Id.ToString(CultureInfo.InvariantCulture));
            state.SaddleCalculationId = calc.Id;
            if (!reactionIds.Contains(state.ReactionId)) reactionIds.Add(state.ReactionId);
        }

        audit.Record(db, user, "upload.stored", nameof(Upload), upload.Id, upload.Summary);
        await db.SaveChangesAsync(ct);

        // Derived values follow the stored inputs in the same transaction (with an empty change tracker: a large upload
        // would otherwise make every later save scan all it wrote).
        var newCalcIds = plan.NewCalculations.Select(c => calcByLabel[c.Draft.Label].Id).ToList();
        var touchedSpecies = plan.NewCalculations.Select(c => speciesByLabel[c.Draft.Species].Id)
            .Concat(plan.NewScans.Select(s => speciesByLabel[s.Species].Id)).Concat(ircSpecies).Concat(plan.SymmetryOverrides.Select(o => o.Species.Id)).Distinct().ToList();
        db.ChangeTracker.Clear();
        await derivation.AfterInputsChangedAsync(db, study.Id, touchedSpecies, reactionIds, ct);

        // Conformers compared on store: duplicates and mirror images among each touched species' conformers are reported now.
        var conformerSpecies = plan.NewCalculations.Where(c => c.Draft.Conformer.Length > 0).Select(c => speciesByLabel[c.Draft.Species].Id).Distinct().ToList();
        var conformerNotes = new List<string>();
        if (conformerSpecies.Count > 0)
        {
            var sets = await Conformers.ConformerSet.LoadAsync(db, conformerSpecies, ct);
            foreach (var s in speciesByLabel.Values.Where(s => sets.ContainsKey(s.Id)).OrderBy(s => s.Label, StringComparer.Ordinal))
            {
                var set = sets[s.Id];
                conformerNotes.Add($"species {s.Label}: {set.Conformers.Length} conformer(s)" + (set.Comparison is { } cmp ? $"; {cmp.Summary}" : ""));
                conformerNotes.AddRange(set.Notes(s.Label));
            }
        }

        return new UploadOutcome(true, upload.Id, study.Id, newCalcIds, reactionIds, scanIds,
            [.. plan.DuplicateCalculationIds.Select(d => $"calculation '{d.Label}' of species '{plan.Draft.Calculations.First(c => c.Label == d.Label).Species}' is already stored (same file); not stored again"),
             .. plan.DuplicateScans.Select(s => $"scan '{s}' is already stored (same file); not stored again"),
             .. plan.DuplicateIrcs.Select(i => $"IRC '{i}' is already stored for its saddle point (same file); not stored again")],
            plan.Issues) { IrcIds = ircIds, ConformerNotes = conformerNotes };
    }

    internal static async Task InsertScanPointsAsync(LedgerDbContext db, int scanId, IReadOnlyList<Core.Scans.ScanPoint> points, CancellationToken ct)
    {
        // One prepared statement, plain SQL that SQLite and PostgreSQL both read (quoted names, @-parameters with their types).
        var connection = db.Database.GetDbConnection();
        await using var cmd = connection.CreateCommand();
        cmd.Transaction = db.Database.CurrentTransaction?.GetDbTransaction();
        cmd.CommandText = "INSERT INTO \"ScanPoints\" (\"ScanId\", \"Index\", \"Coordinate\", \"EnergyHartree\", \"Converged\", \"PositionsAngstrom\") VALUES (@s, @i, @c, @e, @v, @p)";
        var ps = StoreSql.Parameter(cmd, "@s", DbType.Int32);
        var pi = StoreSql.Parameter(cmd, "@i", DbType.Int32);
        var pc = StoreSql.Parameter(cmd, "@c", DbType.Double);
        var pe = StoreSql.Parameter(cmd, "@e", DbType.Double);
        var pv = StoreSql.Parameter(cmd, "@v", DbType.Boolean);
        var pp = StoreSql.Parameter(cmd, "@p", DbType.Binary);
        ps.Value = scanId;
        for (var i = 0; i < points.Count; i++)
        {
            var p = points[i];
            pi.Value = i;
            pc.Value = p.Coordinate;
            pe.Value = p.EnergyHartree;
            pv.Value = p.Converged;
            pp.Value = p.Geometry is { } g ? Blobs.FromPositions(g.PositionsAngstrom) : DBNull.Value;
            if (i == 0) await cmd.PrepareAsync(ct);
            await cmd.ExecuteNonQueryAsync(ct);
        }
    }

    private static async Task InsertIrcFramesAsync(LedgerDbContext db, int ircId, PlannedIrc irc, CancellationToken ct)
    {
        var connection = db.Database.GetDbConnection();
        await using var cmd = connection.CreateCommand();
        cmd.Transaction = db.Database.CurrentTransaction?.GetDbTransaction();
        cmd.CommandText = "INSERT INTO \"IrcFrames\" (\"IrcId\", \"Index\", \"Role\", \"PathLengthAngstrom\", \"EnergyHartree\", \"PositionsAngstrom\") VALUES (@i, @k, @r, @l, @e, @p)";
        var pi = StoreSql.Parameter(cmd, "@i", DbType.Int32);
        var pk = StoreSql.Parameter(cmd, "@k", DbType.Int32);
        var pr = StoreSql.Parameter(cmd, "@r", DbType.String);
        var pl = StoreSql.Parameter(cmd, "@l", DbType.Double);
        var pe = StoreSql.Parameter(cmd, "@e", DbType.Double);
        var pp = StoreSql.Parameter(cmd, "@p", DbType.Binary);
        pi.Value = ircId;
        var structures = irc.Draft.Structures.Structures;
        for (var k = 0; k < structures.Length; k++)
        {
            pk.Value = k;
            pr.Value = (irc.Draft.Structures.Form == IrcForm.Path ? IrcFrameRole.Path : k == 0 ? IrcFrameRole.Forward : IrcFrameRole.Backward).ToString();
            pl.Value = irc.Path is { } path ? path.Frames[k].Coordinate : DBNull.Value;
            pe.Value = structures[k].EnergyHartree is { } e ? e : DBNull.Value;
            pp.Value = Blobs.FromPositions(structures[k].Geometry.PositionsAngstrom);
            if (k == 0) await cmd.PrepareAsync(ct);
            await cmd.ExecuteNonQueryAsync(ct);
        }
    }

    internal static string Sha256Hex(byte[] bytes) => Convert.ToHexStringLower(SHA256.HashData(bytes));
}
