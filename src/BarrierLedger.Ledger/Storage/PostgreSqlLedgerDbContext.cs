using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Storage.ValueConversion;

namespace BarrierLedger.Ledger.Storage;

/// <summary>
/// The ledger on PostgreSQL. Same entities and services as <see cref="LedgerDbContext"/> (which is the SQLite context); the
/// separate type only keeps the PostgreSQL migrations (Migrations/PostgreSQL) apart from the SQLite ones (Migrations/Sqlite), as
/// EF Core's "migrations with multiple providers, one context type per provider" pattern does. Created by
/// <see cref="LedgerDbContextFactory"/> whenever the options name Npgsql.
/// </summary>
public sealed class PostgreSqlLedgerDbContext(DbContextOptions<LedgerDbContext> options) : LedgerDbContext(options)
{
    protected override void ConfigureConventions(ModelConfigurationBuilder configurationBuilder)
    {
        base.ConfigureConventions(configurationBuilder);
        // Text compares and sorts byte by byte, as SQLite's default BINARY collation does, so a ledger lists its reactions in the
        // same order on either store whatever locale the PostgreSQL cluster was created with.
        configurationBuilder.Properties<string>().UseCollation("C");
        // timestamptz keeps the instant, not the offset, and Npgsql refuses a non-UTC DateTimeOffset: store every time as UTC.
        configurationBuilder.Properties<DateTimeOffset>().HaveConversion<UtcDateTimeOffsetConverter>();
    }

    private sealed class UtcDateTimeOffsetConverter() : ValueConverter<DateTimeOffset, DateTimeOffset>(v => v.ToUniversalTime(), v => v);
}
