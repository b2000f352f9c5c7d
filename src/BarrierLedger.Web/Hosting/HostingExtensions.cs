using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Web.Components.Account;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Web.Hosting;

public static class HostingExtensions
{
    /// <summary>
    /// Demo settings: "BarrierLedger:LoadDemo" (true, false or auto: see <see cref="DemoPolicy"/>), "BarrierLedger:Production",
    /// "BarrierLedger:DemoDirectory", and the --no-demo switch.
    /// </summary>
    public static IServiceCollection AddBarrierLedgerDemo(this IServiceCollection services, IConfiguration configuration, string[] args)
    {
        var raw = configuration["BarrierLedger:LoadDemo"];
        bool? loadDemo = string.IsNullOrWhiteSpace(raw) || raw.Equals("auto", StringComparison.OrdinalIgnoreCase) ? null
            : bool.TryParse(raw, out var b) ? b
            : throw new InvalidOperationException($"BarrierLedger:LoadDemo is '{raw}'; use true, false or auto.");
        if (args.Contains("--no-demo")) loadDemo = false;
        var ledger = new LedgerOptions();
        configuration.GetSection(LedgerOptions.SectionName).Bind(ledger);
        var options = new DemoOptions
        {
            DemoDirectory = configuration["BarrierLedger:DemoDirectory"],
            Policy = DemoPolicy.Decide(loadDemo, ledger.Database.Provider, DemoPolicy.ListenUrls(configuration),
                configuration.GetValue<bool>("BarrierLedger:Production")),
        };
        services.AddSingleton(options);
        services.AddScoped<DemoSetup>();
        return services;
    }

    public const string DefaultAddress = "http://127.0.0.1:5080";

    /// <summary>The dashboard listens on http://127.0.0.1:5080 unless --urls (or ASPNETCORE_URLS) says otherwise.</summary>
    public static IWebHostBuilder UseBarrierLedgerDefaultAddress(this IWebHostBuilder web, IConfiguration configuration)
    {
        if (string.IsNullOrEmpty(configuration["urls"]) && string.IsNullOrEmpty(configuration["ASPNETCORE_URLS"]))
            web.UseUrls(DefaultAddress);
        return web;
    }

    /// <summary>Creates the data folder, applies migrations, and makes sure the roles and a first admin exist.</summary>
    public static async Task PrepareStoreAsync(this WebApplication app)
    {
        var options = app.Services.GetRequiredService<LedgerOptions>();
        var factory = app.Services.GetRequiredService<IDbContextFactory<LedgerDbContext>>();
        await LedgerDatabase.PrepareAsync(options, factory);
        TransportSecurity.MakeDataOwnerOnly(options);
        await KeyRingProtection.RemoveUnencryptedKeysAsync(factory, app.Services.GetRequiredService<KeyEncryptionKey>(), app.Logger);
        app.Logger.LogInformation("Ledger store: {Store}; web root: {WebRoot}", LedgerDatabase.Describe(options), app.Environment.WebRootPath);

        await using var scope = app.Services.CreateAsyncScope();
        var bootstrap = scope.ServiceProvider.GetRequiredService<AccountBootstrap>();
        var storeWasEmpty = await bootstrap.EnsureRolesAndFirstAdminAsync(Console.Out);
        await scope.ServiceProvider.GetRequiredService<DemoSetup>().LoadIfEmptyAsync(storeWasEmpty);
        // Values derived by an earlier version (or under a model changed while no instance ran) are derived again in the background.
        await app.Services.GetRequiredService<RecomputeService>().RequestOutdatedAsync();
    }
}
