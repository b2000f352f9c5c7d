using BarrierLedger.Ledger.Storage;
using Microsoft.Data.Sqlite;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Cli.Tests;

/// <summary>
/// <c>barrierledger migrate-store</c> end to end on the demo ledger: the summary, the refusal of a target that holds a ledger,
/// and --force. (The copy's fidelity, every query and file hash, is checked in Ledger.Tests' StoreTransferTests on both stores.)
/// </summary>
public class MigrateStoreCommandTests
{
    [Fact]
    public async Task MigrateStore_IntoANewSqliteFile_CopiesAndSummarises_ThenRefusesASecondCopy_UnlessForced()
    {
        using var temp = new TempDir();
        var source = await ExportCommandTests.DemoDataDirAsync(temp);
        var target = Path.Combine(temp.Path, "copy", "ledger-copy.db");

        var (code, output, err) = CliRunner.Run("migrate-store", "--from", "sqlite:" + source, "--to", "sqlite:" + target);
        Assert.True(code == 0, err);
        Assert.Contains($"SQLite file {Path.Combine(source, "barrierledger.db")} -> SQLite file {target}", output);
        Assert.Matches(@"StoredFiles\s+(\d+)\s+\1\r?\n", output);
        Assert.Matches(@"copied \d+ row\(s\) in \d+ tables, row counts equal; [1-9]\d* stored file\(s\) verified by SHA-256", output);
        Assert.Equal(await CountStoredFilesAsync(source), await CountStoredFilesAsync(Path.GetDirectoryName(target)!, Path.GetFileName(target)));

        (code, output, err) = CliRunner.Run("migrate-store", "--from", "sqlite:" + source, "--to", "sqlite:" + target);
        Assert.Equal(ExitCodes.ChecksFailed, code);
        Assert.Contains("migrate-store refused: the target already holds a ledger (", err);
        Assert.Contains("give --force to replace it", err);
        Assert.DoesNotContain("copied", output);

        (code, output, err) = CliRunner.Run("migrate-store", "--from", "sqlite:" + source, "--to", "sqlite:" + target, "--force");
        Assert.True(code == 0, err);
        Assert.Contains("replacing the target's ledger: ", output);
        Assert.Matches(@"; replaced the ledger that was in the target \([1-9]\d* row\(s\)\)", output);
        SqliteConnection.ClearAllPools();
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

    private static async Task<int> CountStoredFilesAsync(string dataDirectory, string fileName = "barrierledger.db")
    {
        var options = new LedgerOptions { DataDirectory = dataDirectory, DatabaseFileName = fileName };
        await using var db = LedgerDatabase.CreateContext(LedgerDatabase.CreateOptions(options));
        return await db.StoredFiles.CountAsync();
    }
}
