using BarrierLedger.Ledger;
using BarrierLedger.Ledger.Storage;
using Microsoft.Data.Sqlite;
using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.Web.Tests.Support;

/// <summary>A bUnit context wired to a real SQLite ledger in a temporary folder, signed in as one user with the given policies.</summary>
public sealed class BunitLedger : IDisposable
{
    private readonly string _dataDirectory = Path.Combine(Path.GetTempPath(), "bl-bunit-" + Guid.NewGuid().ToString("N")[..10]);

    public BunitContext Context { get; } = new();
    public string UserId { get; } = "member-" + Guid.NewGuid().ToString("N")[..6];

    public static async Task<BunitLedger> CreateAsync(params string[] policies)
    {
        var l = new BunitLedger();
        var config = new ConfigurationBuilder()
            .AddInMemoryCollection(new Dictionary<string, string?> { ["BarrierLedger:DataDirectory"] = l._dataDirectory }).Build();
        l.Context.Services.AddLedger(config);
        l.Context.JSInterop.Mode = JSRuntimeMode.Loose;
        l.Context.AddAuthorization().SetAuthorized(l.UserId).SetClaims(new System.Security.Claims.Claim(System.Security.Claims.ClaimTypes.NameIdentifier, l.UserId)).SetPolicies(policies);
        await LedgerDatabase.PrepareAsync(l.Get<LedgerOptions>(), l.Get<IDbContextFactory<LedgerDbContext>>());
        return l;
    }

    public T Get<T>() where T : notnull => Context.Services.GetRequiredService<T>();

    public void Dispose()
    {
        Context.Dispose();
        SqliteConnection.ClearAllPools();
        try { Directory.Delete(_dataDirectory, recursive: true); } catch (IOException) { }
    }
}
