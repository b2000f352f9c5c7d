using System.Security.Cryptography;
using System.Text.Json;
using BarrierLedger.Demo;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Export;
using BarrierLedger.Ledger.Tests.Support;
using Microsoft.AspNetCore.DataProtection.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Tests.Storage;

/// <summary>
/// The demo ledger (stored through the upload workflow, derived under its protocol) copied whole into an empty store: the
/// copy must answer every ledger and reaction query exactly as the original does, hold the same files byte for byte, and a
/// second copy into it must be refused unless forced.
/// </summary>
public sealed class StoreTransferTests
{
    /// <summary>From the demo SQLite ledger into an empty store of either kind (PostgreSQL is what migrate-store is for).</summary>
    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task CopyAsync_DemoSqliteLedgerIntoAnEmptyStore_AnswersEveryQueryAlike_AndRefusesToOverwriteUnlessForced(StoreProvider targetStore)
    {
        await using var target = await TempLedger.CreateAsync(targetStore);
        var (source, studyId) = await DemoLedger.CreateAsync(StoreProvider.Sqlite);
        await using var _ = source;
        await PrepareDemoAsync(source, studyId);

        await AssertCopyMatchesAsync(source, target);
    }

    /// <summary>Shared by the SQLite and PostgreSQL runs: copy, compare, refuse, force.</summary>
    internal static async Task AssertCopyMatchesAsync(TempLedger source, TempLedger target)
    {
        TransferReport report;
        await using (var from = await source.DbAsync())
        await using (var to = await target.DbAsync())
            report = await StoreTransfer.CopyAsync(from, to, force: false);
        Assert.False(report.Replaced);
        Assert.All(report.Tables, t => Assert.Equal(t.SourceRows, t.TargetRows));
        foreach (var table in new[] { "AspNetUsers", "AspNetRoles", "AspNetUserRoles", "Studies", "Calculations", "StoredFiles", "Uploads", "AuditEvents", "Reviews", "ReactionDerivations", "FrequencyChecks", "DataProtectionKeys" })
            Assert.True(report.Tables.Single(t => t.Table == table).TargetRows > 0, $"{table} was empty in the demo ledger, so the test proves nothing for it");
        Assert.DoesNotContain(report.Tables, t => t.Table == "WorkLeases");

        Assert.Equal(await SnapshotAsync(source), await SnapshotAsync(target));
        Assert.Equal(await FileHashesAsync(source), await FileHashesAsync(target));
        Assert.Equal(report.FilesVerified, (await FileHashesAsync(target)).Count);
        Assert.Equal(await VersionsAsync(source), await VersionsAsync(target));

        // New rows in the target continue after the copied ids (PostgreSQL's identity sequences were moved on).
        await using (var db = await target.DbAsync())
        {
            var maxId = await db.AuditEvents.MaxAsync(e => e.Id);
            db.AuditEvents.Add(new BarrierLedger.Ledger.Records.AuditEvent { At = DateTimeOffset.UtcNow, UserId = "u", Action = "test.after-copy", EntityType = "Study", EntityId = "1", Summary = "after the copy" });
            await db.SaveChangesAsync();
            Assert.True(await db.AuditEvents.MaxAsync(e => e.Id) > maxId);
        }

        await using (var from = await source.DbAsync())
        await using (var to = await target.DbAsync())
        {
            var refused = await Assert.ThrowsAsync<StoreTransferException>(() => StoreTransfer.CopyAsync(from, to, force: false));
            Assert.Contains("already holds a ledger", refused.Message);
            Assert.Contains("--force", refused.Message);
        }
        var auditAfterRefusal = await CountAuditAsync(target);
        Assert.Equal(report.Tables.Single(t => t.Table == "AuditEvents").TargetRows + 1, auditAfterRefusal);

        var log = new StringWriter();
        await using (var from = await source.DbAsync())
        await using (var to = await target.DbAsync())
            report = await StoreTransfer.CopyAsync(from, to, force: true, log);
        Assert.True(report.Replaced);
        Assert.Contains("replacing the target's ledger", log.ToString());
        Assert.Equal(auditAfterRefusal, report.Tables.Single(t => t.Table == "AuditEvents").ReplacedRows);
        Assert.Equal(await SnapshotAsync(source), await SnapshotAsync(target));
        Assert.Equal(await CountAuditAsync(source), await CountAuditAsync(target));
    }

    /// <summary>The demo under its protocol, with a reviewer's verdict and a data-protection key, so every kind of row exists.</summary>
    internal static async Task PrepareDemoAsync(TempLedger ledger, int studyId)
    {
        // The bundle's study.energy_model made the protocol the study's own model on upload (an EnergyModels row exists).
        var model = await ledger.Get<EnergyModelService>().GetForStudyAsync(studyId);
        Assert.True(model.IsOverride);
        Assert.Equal((DemoScenario.SinglePointLevel, DemoScenario.GeometryLevel), (model.Settings.EnergyLevel, model.Settings.ThermalLevel));
        await ledger.Get<RecomputeService>().WhenIdleAsync();
        var reviewer = await ledger.AddUserAsync("reviewer-1", "Reviewer");
        await using var db = await ledger.DbAsync();
        var saddle = await db.Calculations.Where(c => c.Kind == BarrierLedger.Core.Chemistry.CalculationKind.SaddlePoint).OrderBy(c => c.Id).Select(c => c.Id).FirstAsync();
        await ledger.Get<Ledger.Reviews.ReviewService>().VerifyAsync(saddle, reviewer, "checked the mode by eye");
        db.DataProtectionKeys.Add(new DataProtectionKey { FriendlyName = "key-1", Xml = "<key id=\"1\"/>" });
        await db.SaveChangesAsync();
    }

    /// <summary>Everything the ledger and reaction screens read, as JSON (records with lists compare by content this way).</summary>
    internal static async Task<string> SnapshotAsync(TempLedger ledger)
    {
        var query = ledger.Get<LedgerQueryService>();
        var parts = new List<object>();
        var studies = await query.GetStudiesAsync(includeRetired: true);
        parts.Add(studies);
        foreach (var s in studies)
        {
            var page = await query.GetLedgerRowsAsync(s.Id, new LedgerFilter { IncludeRetired = true });
            parts.Add(page);
            foreach (var row in page.Rows) parts.Add((await ledger.Get<ReactionQueryService>().GetReactionAsync(row.ReactionId))!);
        }
        return JsonSerializer.Serialize(parts, s_snapshotJson);
    }

    // PostgreSQL keeps times to the microsecond, SQLite (as text) to .NET's 100 ns tick: a copy into PostgreSQL keeps every
    // time to the microsecond, so the snapshot compares instants at that resolution. Everything else compares exactly.
    private static readonly JsonSerializerOptions s_snapshotJson = new() { Converters = { new MicrosecondInstants() } };

    private sealed class MicrosecondInstants : System.Text.Json.Serialization.JsonConverter<DateTimeOffset>
    {
        public override DateTimeOffset Read(ref Utf8JsonReader reader, Type typeToConvert, JsonSerializerOptions options) => throw new NotSupportedException();

        public override void Write(Utf8JsonWriter writer, DateTimeOffset value, JsonSerializerOptions options) =>
            writer.WriteNumberValue(value.UtcTicks / 10);
    }

    internal static async Task<SortedDictionary<int, string>> FileHashesAsync(TempLedger ledger)
    {
        await using var db = await ledger.DbAsync();
        var files = await db.StoredFiles.AsNoTracking().ToListAsync();
        return new(files.ToDictionary(f => f.Id, f => Convert.ToHexStringLower(SHA256.HashData(f.Content)) + "/" + f.Sha256));
    }

    private static async Task<string> VersionsAsync(TempLedger ledger)
    {
        await using var db = await ledger.DbAsync();
        var versions = new
        {
            Studies = await db.Studies.OrderBy(s => s.Id).Select(s => new { s.Id, s.Version }).ToListAsync(),
            Reactions = await db.Reactions.OrderBy(r => r.Id).Select(r => new { r.Id, r.Version }).ToListAsync(),
            Models = await db.EnergyModels.OrderBy(m => m.Id).Select(m => new { m.Id, m.Version }).ToListAsync(),
            Users = await db.Users.OrderBy(u => u.Id).Select(u => new { u.Id, u.ConcurrencyStamp, u.SecurityStamp }).ToListAsync(),
        };
        return JsonSerializer.Serialize(versions);
    }

    private static async Task<long> CountAuditAsync(TempLedger ledger)
    {
        await using var db = await ledger.DbAsync();
        return await db.AuditEvents.LongCountAsync();
    }
}
