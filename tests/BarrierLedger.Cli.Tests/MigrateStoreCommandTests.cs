using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Support;
using Microsoft.Data.Sqlite;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Cli.Tests;

/// <summary>
/// <c>barrierledger migrate-store</c> end to end on the demo ledger: the summary, the refusal of a target that holds a ledger,
/// and --force, into SQLite and PostgreSQL. (The copy's fidelity, every query and file hash, is checked in Ledger.Tests'
/// StoreTransferTests.)
/// </summary>
public class MigrateStoreCommandTests
{
    [SkippableTheory]
    [InlineData(StoreProvider.Sqlite)]
    [InlineData(StoreProvider.PostgreSQL)]
    public async Task MigrateStore_FromTheDemoSqliteLedger_CopiesAndSummarises_ThenRefusesASecondCopy_UnlessForced(StoreProvider targetStore)
    {
        using var temp = new TempDir();
        PostgresServer? server = null;
        string targetSpec, describedTarget;
        if (targetStore == StoreProvider.PostgreSQL)
        {
            if (PostgresServer.Unavailable() is { } why)
            {
                if (PostgresServer.InCi) throw new InvalidOperationException("CI=true and the PostgreSQL variant cannot run: " + why);
                Skip.If(true, why);
            }
            server = await PostgresServer.GetAsync();
            var cs = await server.CreateDatabaseAsync();
            targetSpec = "postgresql:" + cs;
            describedTarget = LedgerDatabase.Describe(new LedgerOptions { Database = new DatabaseOptions { Provider = StoreProvider.PostgreSQL, ConnectionString = cs } });
        }
        else
        {
            var file = Path.Combine(temp.Path, "copy", "ledger-copy.db");
            targetSpec = "sqlite:" + file;
            describedTarget = "SQLite file " + file;
        }
        var source = await ExportCommandTests.DemoDataDirAsync(temp);
        try
        {
            var (code, output, err) = CliRunner.Run("migrate-store", "--from", "sqlite:" + source, "--to", targetSpec);
            Assert.True(code == 0, err);
            Assert.Contains($"SQLite file {Path.Combine(source, "barrierledger.db")} -> {describedTarget}", output);
            var files = await CountStoredFilesAsync(new LedgerOptions { DataDirectory = source });
            Assert.True(files > 0);
            Assert.Matches($@"StoredFiles\s+{files}\s+{files}\r?\n", output);
            Assert.Contains($"row counts equal; {files} stored file(s) verified by SHA-256", output);

            (code, output, err) = CliRunner.Run("migrate-store", "--from", "sqlite:" + source, "--to", targetSpec);
            Assert.Equal(ExitCodes.ChecksFailed, code);
            Assert.Contains($"migrate-store refused: the target already holds a ledger (", err);
            Assert.Contains($"StoredFiles {files}", err);
            Assert.Contains("give --force to replace it", err);
            Assert.DoesNotContain("copied", output);

            (code, output, err) = CliRunner.Run("migrate-store", "--from", "sqlite:" + source, "--to", targetSpec, "--force");
            Assert.True(code == 0, err);
            Assert.Contains("replacing the target's ledger: ", output);
            Assert.Matches(@"; replaced the ledger that was in the target \([1-9]\d* row\(s\)\)", output);
        }
        finally
        {
            SqliteConnection.ClearAllPools();
            if (server is not null) await server.DropDatabaseAsync(targetSpec["postgresql:".Length..]);
        }
    }

    [Theory]
    [InlineData("mysql:Server=x", "is neither sqlite:PATH nor postgresql:CONNSTRING")]
    [InlineData("postgresql:", "names no connection string")]
    public void MigrateStore_WithAStoreItDoesNotKnow_IsAUsageError(string to, string expected)
    {
        var (code, _, err) = CliRunner.Run("migrate-store", "--from", "sqlite:/nowhere/ledger.db", "--to", to);
        Assert.Equal(ExitCodes.UsageError, code);
        Assert.Contains(expected, err);
    }

    [Fact]
    public void MigrateStore_FromAMissingSqliteFile_SaysWhereItLooked()
    {
        using var temp = new TempDir();
        var missing = Path.Combine(temp.Path, "absent.db");
        var (code, _, err) = CliRunner.Run("migrate-store", "--from", "sqlite:" + missing, "--to", "sqlite:" + Path.Combine(temp.Path, "t.db"));
        Assert.Equal(ExitCodes.Unreadable, code);
        Assert.Contains($"there is no ledger at {missing}", err);
        Assert.False(File.Exists(Path.Combine(temp.Path, "t.db")));
    }

    private static async Task<int> CountStoredFilesAsync(LedgerOptions options)
    {
        await using var db = LedgerDatabase.CreateContext(LedgerDatabase.CreateOptions(options));
        return await db.StoredFiles.CountAsync();
    }
}
