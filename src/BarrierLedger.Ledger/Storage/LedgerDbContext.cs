using BarrierLedger.Ledger.Accounts;
using Microsoft.AspNetCore.Identity.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Storage;

/// <summary>
/// The ledger's database: accounts (ASP.NET Core Identity) and the group's records, in one SQLite file by default.
/// </summary>
public class LedgerDbContext(DbContextOptions<LedgerDbContext> options) : IdentityDbContext<LedgerUser>(options)
{
    protected override void OnModelCreating(ModelBuilder builder)
    {
        base.OnModelCreating(builder);
        builder.ApplyConfigurationsFromAssembly(typeof(LedgerDbContext).Assembly);
    }
}
