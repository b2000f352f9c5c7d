using BarrierLedger.Ledger.Storage;
using Microsoft.Data.Sqlite;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Infrastructure;

namespace BarrierLedger.Ledger.Tests.Storage;

public sealed class SqliteSetupTests : IDisposable
{
    private readonly string _dir = Path.Combine(Path.GetTempPath(), "bl-ledger-" + Guid.NewGuid().ToString("N")[..10]);

    [Fact]
    public async Task Prepare_CreatesFolder_AppliesEveryMigration_AndSwitchesToWal()
    {
        var options = new LedgerOptions { DataDirectory = Path.Combine(_dir, "nested", "data") };
        var factory = new PooledDbContextFactory<LedgerDbContext>(
            new DbContextOptionsBuilder<LedgerDbContext>().UseSqlite(options.SqliteConnectionString).Options);

        await SqliteSetup.PrepareAsync(options, factory);

        Assert.True(File.Exists(options.DatabasePath));
        await using (var db = await factory.CreateDbContextAsync())
        {
            Assert.Empty(await db.Database.GetPendingMigrationsAsync());
            Assert.NotEmpty(await db.Database.GetAppliedMigrationsAsync());
        }
        await using var connection = new SqliteConnection(options.SqliteConnectionString);
        await connection.OpenAsync();
        await using var cmd = connection.CreateCommand();
        cmd.CommandText = "PRAGMA journal_mode;";
        Assert.Equal("wal", (string?)await cmd.ExecuteScalarAsync());
        cmd.CommandText = "PRAGMA foreign_keys;";
        Assert.Equal(1L, (long?)await cmd.ExecuteScalarAsync());
    }

    [Fact]
    public async Task Prepare_IsIdempotent_OnAnExistingStore()
    {
        var options = new LedgerOptions { DataDirectory = _dir };
        var factory = new PooledDbContextFactory<LedgerDbContext>(
            new DbContextOptionsBuilder<LedgerDbContext>().UseSqlite(options.SqliteConnectionString).Options);
        await SqliteSetup.PrepareAsync(options, factory);
        await SqliteSetup.PrepareAsync(options, factory);
        await using var db = await factory.CreateDbContextAsync();
        Assert.Empty(await db.Database.GetPendingMigrationsAsync());
    }

    public void Dispose()
    {
        SqliteConnection.ClearAllPools();
        try { Directory.Delete(_dir, recursive: true); } catch (IOException) { }
    }
}
