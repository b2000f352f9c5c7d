using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Infrastructure;
using Microsoft.EntityFrameworkCore.Migrations;

namespace BarrierLedger.Ledger.Tests.Storage;

/// <summary>
/// The ledger keeps one migration set per engine (Migrations/Sqlite, Migrations/PostgreSQL). Both must describe the current model,
/// so a model change that was migrated for one engine only fails here: add migrations with scripts/add-migration NAME.
/// No database is opened: EF compares each set's snapshot with the model built for that engine.
/// </summary>
public sealed class MigrationSetsTests
{
    // SQLite ledgers created before the PostgreSQL set existed carry these IDs in __EFMigrationsHistory; they must never change.
    private static readonly string[] SqliteIdsBeforeTheSplit = ["20261202040642_InitialIdentity", "20261202042815_Ledger", "20261202070101_ReactionLedgerStatus", "20261202071212_MultiInstance"];
    private const string PostgreSqlInitial = "InitialPostgreSQL";

    private static LedgerDbContext Sqlite() => LedgerDatabase.CreateContext(LedgerDatabase.CreateOptions(new LedgerOptions { DataDirectory = Path.GetTempPath() }));

    private static LedgerDbContext PostgreSql() => LedgerDatabase.CreateContext(LedgerDatabase.CreateOptions(new LedgerOptions
    {
        Database = new DatabaseOptions { Provider = StoreProvider.PostgreSQL, ConnectionString = "Host=127.0.0.1;Database=unused;Username=unused" },
    }));

    [Fact]
    public void SqliteSet_IsNotBehindTheModel()
    {
        using var db = Sqlite();
        Assert.IsType<LedgerDbContext>(db);
        Assert.False(db.Database.HasPendingModelChanges(), "The SQLite migrations lag the model: run scripts/add-migration NAME.");
    }

    [Fact]
    public void PostgreSqlSet_IsNotBehindTheModel()
    {
        using var db = PostgreSql();
        Assert.IsType<PostgreSqlLedgerDbContext>(db);
        Assert.False(db.Database.HasPendingModelChanges(), "The PostgreSQL migrations lag the model: run scripts/add-migration NAME.");
    }

    [Fact]
    public void SqliteSet_KeepsTheIdsThatExistingLedgersRecorded()
    {
        using var db = Sqlite();
        var ids = db.Database.GetMigrations().ToList();
        Assert.Equal(SqliteIdsBeforeTheSplit, ids.Take(SqliteIdsBeforeTheSplit.Length));
    }

    [Fact]
    public void BothSets_HaveTheSameMigrationsAfterTheirInitialOnes()
    {
        using var sqlite = Sqlite();
        using var pg = PostgreSql();
        var sqliteNames = sqlite.Database.GetMigrations().Skip(SqliteIdsBeforeTheSplit.Length).Select(NameOf).ToList();
        var pgIds = pg.Database.GetMigrations().ToList();
        Assert.Equal(PostgreSqlInitial, NameOf(pgIds[0]));
        Assert.Equal(sqliteNames, pgIds.Skip(1).Select(NameOf).ToList());
        Assert.All(pg.Database.GetMigrations(), id => Assert.DoesNotContain(id, sqlite.Database.GetMigrations()));
    }

    [Fact]
    public void SqliteContext_OnNpgsql_IsRefused_SoSqliteMigrationsNeverReachPostgreSql()
    {
        var options = new DbContextOptionsBuilder<LedgerDbContext>().UseNpgsql("Host=127.0.0.1;Database=unused;Username=unused").Options;
        using var db = new LedgerDbContext(options);
        var ex = Assert.Throws<InvalidOperationException>(() => db.Model);
        Assert.Contains("PostgreSqlLedgerDbContext", ex.Message);
    }

    [Fact]
    public void Factory_GivesEachEngineItsOwnContextType_AndMigrationsAssembly()
    {
        using var sqlite = Sqlite();
        using var pg = PostgreSql();
        var sqliteSet = sqlite.GetService<IMigrationsAssembly>().Migrations.Values.Select(t => t.Namespace).Distinct().ToList();
        var pgSet = pg.GetService<IMigrationsAssembly>().Migrations.Values.Select(t => t.Namespace).Distinct().ToList();
        Assert.Equal(["BarrierLedger.Ledger.Migrations.Sqlite"], sqliteSet);
        Assert.Equal(["BarrierLedger.Ledger.Migrations.PostgreSQL"], pgSet);
    }

    private static string NameOf(string id) => id[(id.IndexOf('_') + 1)..];
}
