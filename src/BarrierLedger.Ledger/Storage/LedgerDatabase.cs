using Microsoft.EntityFrameworkCore;
using Npgsql;

namespace BarrierLedger.Ledger.Storage;

/// <summary>
/// The one place that knows which engine holds the ledger: configures EF for it, creates the matching context type and prepares
/// the store at start-up. Web app, command line, tests and benchmarks all go through here.
/// </summary>
public static class LedgerDatabase
{
    /// <summary>Points EF at the configured store: the SQLite file in the data directory, or the PostgreSQL connection string.</summary>
    public static DbContextOptionsBuilder Configure(DbContextOptionsBuilder builder, LedgerOptions options) =>
        options.Database.Provider switch
        {
            StoreProvider.Sqlite => builder.UseSqlite(options.SqliteConnectionString),
            StoreProvider.PostgreSQL => builder.UseNpgsql(RequireConnectionString(options)),
            var p => throw new ArgumentException($"BarrierLedger:Database:Provider '{p}' is not a store this version knows (Sqlite or PostgreSQL).", nameof(options)),
        };

    public static DbContextOptions<LedgerDbContext> CreateOptions(LedgerOptions options) =>
        (DbContextOptions<LedgerDbContext>)Configure(new DbContextOptionsBuilder<LedgerDbContext>(), options).Options;

    /// <summary>A context of the type whose migrations match the provider in <paramref name="options"/>.</summary>
    public static LedgerDbContext CreateContext(DbContextOptions<LedgerDbContext> options) =>
        options.Extensions.Any(e => e.GetType().Namespace?.StartsWith("Npgsql", StringComparison.Ordinal) == true)
            ? new PostgreSqlLedgerDbContext(options)
            : new LedgerDbContext(options);

    /// <summary>
    /// Start-up: on SQLite creates the data folder, turns on WAL and migrates (<see cref="SqliteSetup"/>); on PostgreSQL applies
    /// the PostgreSQL migrations to the database named by the connection string (creating the database when the account may).
    /// Both then fill in the reaction status summaries a migrated (or restored) ledger lacks.
    /// </summary>
    public static async Task PrepareAsync(LedgerOptions options, IDbContextFactory<LedgerDbContext> factory, CancellationToken ct = default)
    {
        if (!options.IsPostgreSql)
        {
            await SqliteSetup.PrepareAsync(options, factory, ct);
            return;
        }
        await using var db = await factory.CreateDbContextAsync(ct);
        try
        {
            await db.Database.MigrateAsync(ct);
            await Derivation.ReactionStatusSummary.FillMissingAsync(db, null, ct);
        }
        catch (NpgsqlException ex)
        {
            throw new InvalidOperationException($"Cannot prepare the PostgreSQL ledger at {Describe(options)}: {ex.Message}", ex);
        }
    }

    /// <summary>Where the ledger is, for logs and messages (the PostgreSQL password is left out).</summary>
    public static string Describe(LedgerOptions options)
    {
        if (!options.IsPostgreSql) return $"SQLite file {options.DatabasePath}";
        var b = new NpgsqlConnectionStringBuilder(RequireConnectionString(options));
        return $"PostgreSQL database '{b.Database}' on {b.Host}:{b.Port} as '{b.Username}'";
    }

    private static string RequireConnectionString(LedgerOptions options) =>
        string.IsNullOrWhiteSpace(options.Database.ConnectionString)
            ? throw new InvalidOperationException("BarrierLedger:Database:Provider is PostgreSQL but BarrierLedger:Database:ConnectionString is empty; "
                + "give an Npgsql connection string such as Host=127.0.0.1;Port=5432;Database=barrierledger;Username=barrierledger;Password=...")
            : options.Database.ConnectionString;
}

/// <summary>
/// <see cref="IDbContextFactory{TContext}"/> for the ledger: hands out a <see cref="PostgreSqlLedgerDbContext"/> when the options
/// name Npgsql and a <see cref="LedgerDbContext"/> (SQLite) otherwise, so each engine finds its own migration set.
/// </summary>
public sealed class LedgerDbContextFactory(DbContextOptions<LedgerDbContext> options) : IDbContextFactory<LedgerDbContext>
{
    public LedgerDbContext CreateDbContext() => LedgerDatabase.CreateContext(options);
}
