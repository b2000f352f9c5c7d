using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Design;

namespace BarrierLedger.Ledger.Storage;

/// <summary>Lets `dotnet ef migrations add` build the model without starting the web app.</summary>
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
