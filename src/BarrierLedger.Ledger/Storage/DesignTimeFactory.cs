using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Design;

namespace BarrierLedger.Ledger.Storage;

/// <summary>Lets `dotnet ef migrations add` build the SQLite model without starting the web app (scripts/add-migration).</summary>
public sealed class DesignTimeFactory : IDesignTimeDbContextFactory<LedgerDbContext>
{
    public LedgerDbContext CreateDbContext(string[] args)
    {
        var options = new DbContextOptionsBuilder<LedgerDbContext>()
            .UseSqlite("Data Source=design-time.db")
            .Options;
        return new LedgerDbContext(options);
    }
}

/// <summary>The same for the PostgreSQL model (`--context PostgreSqlLedgerDbContext`); adding a migration never connects.</summary>
public sealed class PostgreSqlDesignTimeFactory : IDesignTimeDbContextFactory<PostgreSqlLedgerDbContext>
{
    public PostgreSqlLedgerDbContext CreateDbContext(string[] args)
    {
        var options = new DbContextOptionsBuilder<LedgerDbContext>()
            .UseNpgsql("Host=127.0.0.1;Database=barrierledger_design;Username=barrierledger")
            .Options;
        return new PostgreSqlLedgerDbContext(options);
    }
}
