using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.Ledger.Export;

public static class ExportServiceCollectionExtensions
{
    /// <summary>Registers the export services (queries for tables, figures and supporting information; backup and restore).</summary>
    public static IServiceCollection AddLedgerExports(this IServiceCollection services)
    {
        services.AddSingleton<ExportQueryService>();
        services.AddSingleton<ExportService>();
        return services;
    }
}
