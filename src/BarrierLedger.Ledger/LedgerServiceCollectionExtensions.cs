using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.Ledger;

public static class LedgerServiceCollectionExtensions
{
    /// <summary>Registers the ledger store (a DbContext factory on SQLite) and its workflow services.</summary>
    public static IServiceCollection AddLedger(this IServiceCollection services, IConfiguration configuration)
    {
        var options = new LedgerOptions();
        configuration.GetSection(LedgerOptions.SectionName).Bind(options);
        services.AddSingleton(options);
        services.AddDbContextFactory<LedgerDbContext>(o => o.UseSqlite(options.SqliteConnectionString));
        return services;
    }
}
