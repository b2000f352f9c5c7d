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

    /// <summary>Adds an account with one role directly in the store (what the web app's account pages do through Identity).</summary>
    public async Task<string> AddUserAsync(string name, string role)
    {
        await using var db = await DbAsync();
        var roleRow = await db.Roles.FirstOrDefaultAsync(r => r.Name == role);
        if (roleRow is null)
        {
            roleRow = new Microsoft.AspNetCore.Identity.IdentityRole(role) { NormalizedName = role.ToUpperInvariant() };
            db.Roles.Add(roleRow);
        }
        var user = new Accounts.LedgerUser { UserName = name, NormalizedUserName = name.ToUpperInvariant(), DisplayName = name };
        db.Users.Add(user);
        db.UserRoles.Add(new Microsoft.AspNetCore.Identity.IdentityUserRole<string> { UserId = user.Id, RoleId = roleRow.Id });
        await db.SaveChangesAsync();
        return user.Id;
    }

    public async ValueTask DisposeAsync()
    {
        await Services.DisposeAsync();
        SqliteConnection.ClearAllPools();
        try { System.IO.Directory.Delete(Directory, recursive: true); } catch (IOException) { }
    }
}
