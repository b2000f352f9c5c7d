using BarrierLedger.Ledger.Storage;
using Microsoft.Data.Sqlite;
using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.Ledger.Tests.Support;

/// <summary>A real ledger: a SQLite file in a fresh temporary folder, migrated, with the services wired as the app wires them.</summary>
public sealed class TempLedger : IAsyncDisposable
{
    private TempLedger(string dir, ServiceProvider services)
    {
        Directory = dir;
        Services = services;
    }

    public string Directory { get; }
    public ServiceProvider Services { get; }
    public LedgerOptions Options => Services.GetRequiredService<LedgerOptions>();
    public IDbContextFactory<LedgerDbContext> Factory => Services.GetRequiredService<IDbContextFactory<LedgerDbContext>>();
    public T Get<T>() where T : notnull => Services.GetRequiredService<T>();

    public static async Task<TempLedger> CreateAsync(string? dir = null)
    {
        dir ??= Path.Combine(Path.GetTempPath(), "bl-ledger-" + Guid.NewGuid().ToString("N")[..10]);
        var config = new ConfigurationBuilder()
            .AddInMemoryCollection(new Dictionary<string, string?> { ["BarrierLedger:DataDirectory"] = dir })
            .Build();
        var services = new ServiceCollection().AddLedger(config).BuildServiceProvider();
        var ledger = new TempLedger(dir, services);
        await SqliteSetup.PrepareAsync(ledger.Options, ledger.Factory);
        return ledger;
    }

    public async Task<LedgerDbContext> DbAsync() => await Factory.CreateDbContextAsync();

    public async ValueTask DisposeAsync()
    {
        await Services.DisposeAsync();
        SqliteConnection.ClearAllPools();
        try { System.IO.Directory.Delete(Directory, recursive: true); } catch (IOException) { }
    }
}
