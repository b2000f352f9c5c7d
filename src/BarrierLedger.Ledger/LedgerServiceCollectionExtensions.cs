using BarrierLedger.Ledger.Auditing;
using BarrierLedger.Ledger.Backups;
using BarrierLedger.Ledger.Coordination;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Reviews;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Uploads;
using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.DependencyInjection.Extensions;

namespace BarrierLedger.Ledger;

public static class LedgerServiceCollectionExtensions
{
    /// <summary>Registers the ledger store (a DbContext factory on SQLite or PostgreSQL, as "BarrierLedger:Database:Provider" says)
    /// and its workflow services.</summary>
    public static IServiceCollection AddLedger(this IServiceCollection services, IConfiguration configuration)
    {
        var options = new LedgerOptions();
        configuration.GetSection(LedgerOptions.SectionName).Bind(options);
        services.AddSingleton(options);
        services.AddDbContextFactory<LedgerDbContext, LedgerDbContextFactory>(o => LedgerDatabase.Configure(o, options));
        return services.AddLedgerServices();
    }

    /// <summary>The workflow services alone (for hosts that register the DbContext factory themselves, e.g. tests and benchmarks).</summary>
    public static IServiceCollection AddLedgerServices(this IServiceCollection services)
    {
        services.TryAddSingleton(TimeProvider.System);
        services.TryAddSingleton(new WorkLeaseOptions());
        services.AddSingleton<WorkLeaseStore>();
        services.AddSingleton<AuditService>();
        services.AddSingleton<Accounts.AccountAccess>();
        services.AddSingleton<DerivationService>();
        services.TryAddSingleton(sp => sp.GetService<LedgerOptions>()?.Uploads ?? new UploadReadOptions());
        services.TryAddSingleton(sp => new UploadGate(sp.GetRequiredService<UploadReadOptions>()));
        services.AddSingleton<StorageQuota>();
        services.AddSingleton<UploadService>();
        services.AddSingleton<RecomputeService>();
        services.AddSingleton<EnergyModelService>();
        services.AddSingleton<ReviewService>();
        services.AddSingleton<LedgerQueryService>();
        services.AddSingleton<ReactionQueryService>();
        services.AddSingleton<IrcQueryService>();
        services.AddSingleton<WorkspaceQueryService>();
        services.AddSingleton<Conformers.ConformerQueryService>();
        services.AddSingleton<IsotopeEffects.IsotopeEffectService>();
        services.AddSingleton<RecordService>();
        services.AddSingleton<Reactions.ReactionBuilderService>();
        services.AddSingleton<Reactions.ReactionBundleService>();
        services.AddSingleton<BackupService>();
        return services;
    }
}
