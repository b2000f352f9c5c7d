using System.Diagnostics;
using BarrierLedger.Ledger.Backups;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;
using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;
using Npgsql;

namespace BarrierLedger.Ledger.Tests.Storage;

/// <summary>What each engine must do alike (concurrency token, text order, time round trip) and what PostgreSQL does its own way
/// (migration set, retryable errors, pg_dump backup).</summary>
public sealed class StoreProviderTests
{
    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task SavingOverAnotherEdit_IsAConcurrencyConflict_OnEitherStore(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        await using (var db = await ledger.DbAsync())
        {
            db.Studies.Add(new Study { Name = "Shared", CreatedAt = DateTimeOffset.UtcNow });
            await db.SaveChangesAsync();
        }
        await using var first = await ledger.DbAsync();
        await using var second = await ledger.DbAsync();
        var a = await first.Studies.SingleAsync();
        var b = await second.Studies.SingleAsync();
        a.Description = "edited in one tab";
        await first.SaveChangesAsync();
        Assert.Equal(2, a.Version);
        b.Description = "edited in another tab";
        await Assert.ThrowsAsync<DbUpdateConcurrencyException>(() => second.SaveChangesAsync());
        await using var check = await ledger.DbAsync();
        Assert.Equal("edited in one tab", (await check.Studies.SingleAsync()).Description);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Names_SortByteByByte_AndTimesComeBackAsTheSameInstant_OnEitherStore(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        string[] names = ["beta", "Beta", "alpha", "_x", "Zeta", "10", "9", "Äther"];
        var at = new DateTimeOffset(2026, 12, 2, 9, 30, 15, 123, TimeSpan.FromHours(2)); // not UTC: PostgreSQL keeps the instant
        await using (var db = await ledger.DbAsync())
        {
            foreach (var n in names) db.Studies.Add(new Study { Name = n, CreatedAt = at });
            await db.SaveChangesAsync();
        }
        var studies = await ledger.Get<LedgerQueryService>().GetStudiesAsync();
        Assert.Equal(names.Order(StringComparer.Ordinal), studies.Select(s => s.Name)); // UTF-16 ordinal = UTF-8 byte order here
        Assert.All(studies, s => Assert.Equal(at.UtcTicks, s.CreatedAt.UtcTicks));
    }

    [SkippableFact]
    public async Task Prepare_OnPostgreSql_AppliesThePostgreSqlSet_AndIsIdempotent()
    {
        await using var ledger = await TempLedger.CreateAsync(StoreProvider.PostgreSQL);
        await LedgerDatabase.PrepareAsync(ledger.Options, ledger.Factory);
        await using var db = await ledger.DbAsync();
        Assert.IsType<PostgreSqlLedgerDbContext>(db);
        Assert.Empty(await db.Database.GetPendingMigrationsAsync());
        Assert.Equal(db.Database.GetMigrations(), await db.Database.GetAppliedMigrationsAsync());
        Assert.All(await db.Database.GetAppliedMigrationsAsync(), id => Assert.Contains("_", id));
    }

    [Fact]
    public void Retry_CoversPostgreSqlSerializationFailuresAndDeadlocks_NotOtherErrors()
    {
        Assert.True(LedgerRetry.IsBusy(new PostgresException("could not serialize access", "ERROR", "ERROR", PostgresErrorCodes.SerializationFailure)));
        Assert.True(LedgerRetry.IsBusy(new DbUpdateException("save failed", new PostgresException("deadlock detected", "ERROR", "ERROR", PostgresErrorCodes.DeadlockDetected))));
        Assert.False(LedgerRetry.IsBusy(new PostgresException("duplicate key", "ERROR", "ERROR", PostgresErrorCodes.UniqueViolation)));
        Assert.False(LedgerRetry.IsBusy(new PostgresException("syntax error", "ERROR", "ERROR", PostgresErrorCodes.SyntaxError)));
    }

    [SkippableFact]
    public async Task RetryRuns_ASerializableWriteThatLostARace_AgainUntilItCommits()
    {
        await using var ledger = await TempLedger.CreateAsync(StoreProvider.PostgreSQL);
        await using (var db = await ledger.DbAsync())
        {
            db.Studies.Add(new Study { Name = "Counter", Description = "0", CreatedAt = DateTimeOffset.UtcNow });
            await db.SaveChangesAsync();
        }
        // Ten writers read the counter and write it back plus one, all inside serializable transactions: without the retry
        // most would fail with 40001; with it every increment lands exactly once.
        var attempts = 0;
        await Task.WhenAll(Enumerable.Range(0, 10).Select(_ => Task.Run(() => LedgerRetry.RunAsync(async token =>
        {
            Interlocked.Increment(ref attempts);
            await using var db = await ledger.Factory.CreateDbContextAsync(token);
            await using var tx = await LedgerRetry.BeginWriteAsync(db, token);
            var s = await db.Studies.SingleAsync(token);
            await Task.Delay(20, token);
            await db.Studies.Where(x => x.Id == s.Id).ExecuteUpdateAsync(u => u.SetProperty(x => x.Description, (int.Parse(s.Description) + 1).ToString()), token);
            await tx.CommitAsync(token);
            return 0;
        }))));
        await using var check = await ledger.DbAsync();
        Assert.Equal("10", (await check.Studies.SingleAsync()).Description);
        Assert.True(attempts > 10, "no writer had to be run again: the race did not happen");
    }

    [SkippableFact]
    public async Task Backup_OnPostgreSql_IsAPgDumpFile_ThatPgRestoreTurnsIntoTheSameLedger()
    {
        TempLedger.RequirePostgres();
        var server = await PostgresServer.GetAsync();
        var pgRestore = server.FindTool("pg_restore");
        var missing = PgDump.Find() is null || pgRestore is null;
        if (missing && PostgresServer.InCi) throw new InvalidOperationException("CI=true and pg_dump/pg_restore are not installed");
        Skip.If(missing, "pg_dump or pg_restore is not installed (Debian: postgresql-client)");

        await using var ledger = await TempLedger.CreateAsync(StoreProvider.PostgreSQL);
        var stored = await ledger.Get<UploadService>().StoreDraftAsync(H3System.Draft(), new UploadChoices(), "member");
        // The PostgreSQL half of the backup capability (barrierledger backup --postgresql): pg_dump, custom format.
        var folder = Path.Combine(ledger.Directory, "backups");
        Directory.CreateDirectory(folder);
        var dump = PgDump.TimestampedPath(folder, DateTimeOffset.UtcNow);
        await PgDump.RunAsync(ledger.Options.Database.ConnectionString!, dump);
        Assert.StartsWith(Path.Combine(folder, "barrierledger-"), dump);
        Assert.EndsWith(".dump", dump);
        Assert.Equal("PGDMP"u8.ToArray(), File.ReadAllBytes(dump)[..5]); // pg_dump's custom-format signature

        var target = await server.CreateDatabaseAsync();
        try
        {
            var b = new NpgsqlConnectionStringBuilder(target);
            var psi = new ProcessStartInfo(pgRestore!, ["--no-owner", $"--host={b.Host}", $"--port={b.Port}", $"--username={b.Username}", $"--dbname={b.Database}", dump])
                { RedirectStandardError = true, UseShellExecute = false };
            using (var p = Process.Start(psi)!)
            {
                var err = await p.StandardError.ReadToEndAsync();
                await p.WaitForExitAsync();
                Assert.True(p.ExitCode == 0, err);
            }
            var config = new ConfigurationBuilder().AddInMemoryCollection(new Dictionary<string, string?>
            {
                ["BarrierLedger:DataDirectory"] = ledger.Directory, ["BarrierLedger:Database:Provider"] = "PostgreSQL", ["BarrierLedger:Database:ConnectionString"] = target,
            }).Build();
            await using var restored = new ServiceCollection().AddLedger(config).BuildServiceProvider();
            var a = await ledger.Get<LedgerQueryService>().GetLedgerRowsAsync(stored.StudyId!.Value);
            var r = await restored.GetRequiredService<LedgerQueryService>().GetLedgerRowsAsync(stored.StudyId!.Value);
            Assert.NotEmpty(a.Rows);
            Assert.Equal(a.Rows.Select(x => (x.Label, x.BarrierGibbs, x.RateConstantPerSecond, x.Verdict, x.ReviewStatus)),
                         r.Rows.Select(x => (x.Label, x.BarrierGibbs, x.RateConstantPerSecond, x.Verdict, x.ReviewStatus)));
        }
        finally
        {
            await server.DropDatabaseAsync(target);
        }
    }
}
