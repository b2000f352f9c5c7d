using BarrierLedger.Cli;
using BarrierLedger.Ledger;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Support;
using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.Cli.Tests;

public sealed class BackupCommandTests
{
    [SkippableFact]
    public async Task Backup_WithPostgreSql_WritesATimestampedPgDumpFile()
    {
        if (PostgresServer.Unavailable() is { } why)
        {
            if (PostgresServer.InCi) throw new InvalidOperationException($"CI=true and PostgreSQL is missing: {why}");
            Skip.If(true, why);
        }
        var pgDumpMissing = Ledger.Backups.PgDump.Find() is null;
        if (pgDumpMissing && PostgresServer.InCi) throw new InvalidOperationException("CI=true and pg_dump is not on PATH");
        Skip.If(pgDumpMissing, "pg_dump is not on PATH (Debian: postgresql-client)");

        var server = await PostgresServer.GetAsync();
        var connection = await server.CreateDatabaseAsync();
        var folder = Directory.CreateTempSubdirectory("bl-cli-pgdump-").FullName;
        try
        {
            var config = new ConfigurationBuilder().AddInMemoryCollection(new Dictionary<string, string?>
            {
                ["BarrierLedger:DataDirectory"] = folder, ["BarrierLedger:Database:Provider"] = "PostgreSQL", ["BarrierLedger:Database:ConnectionString"] = connection,
            }).Build();
            await using (var services = new ServiceCollection().AddLedger(config).BuildServiceProvider())
                await LedgerDatabase.PrepareAsync(services.GetRequiredService<LedgerOptions>(), services.GetRequiredService<IDbContextFactory<LedgerDbContext>>());

            var (code, output, err) = CliRunner.Run("backup", "--postgresql", connection, "--out", Path.Combine(folder, "dumps"));
            Assert.True(code == ExitCodes.Ok, err);
            var dump = Assert.Single(Directory.GetFiles(Path.Combine(folder, "dumps")));
            Assert.Matches(@"barrierledger-\d{8}-\d{6}\.dump$", dump);
            Assert.Equal("PGDMP"u8.ToArray(), File.ReadAllBytes(dump)[..5]); // pg_dump's custom-format signature
            Assert.Contains("pg_restore", output);

            (code, _, err) = CliRunner.Run("backup", "--postgresql", connection, "--data-dir", folder);
            Assert.Equal(ExitCodes.UsageError, code);
            Assert.Contains("not both", err);
        }
        finally
        {
            await server.DropDatabaseAsync(connection);
            Directory.Delete(folder, recursive: true);
        }
    }

    [Fact]
    public void Backup_OfSqlite_WithoutOut_SaysOutIsRequired()
    {
        var folder = Directory.CreateTempSubdirectory("bl-cli-sqlite-").FullName;
        try
        {
            File.WriteAllBytes(Path.Combine(folder, "barrierledger.db"), []);
            var (code, _, err) = CliRunner.Run("backup", "--data-dir", folder);
            Assert.Equal(ExitCodes.UsageError, code);
            Assert.Contains("--out is required", err);
        }
        finally
        {
            Directory.Delete(folder, recursive: true);
        }
    }
}
