using BarrierLedger.Ledger.Storage;
using Microsoft.Data.Sqlite;
using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.Ledger.Tests.Support;

/// <summary>
/// A real ledger, migrated, with the services wired as the app wires them: a SQLite file in a fresh temporary folder, or a fresh
/// database on the test PostgreSQL server (<see cref="PostgresServer"/>). PostgreSQL variants are skipped, with the reason, only
/// when PostgreSQL is not installed and CI is not set; under CI=true a missing PostgreSQL fails the test.
/// </summary>
public sealed class TempLedger : IAsyncDisposable
{
    private readonly PostgresServer? _server;
    private readonly string? _postgresConnectionString;

    private TempLedger(string dir, ServiceProvider services, PostgresServer? server, string? postgresConnectionString)
    {
        Directory = dir;
        Services = services;
        _server = server;
        _postgresConnectionString = postgresConnectionString;
    }

    public StoreProvider Store => Options.Database.Provider;

    public string Directory { get; }
    public ServiceProvider Services { get; }
    public LedgerOptions Options => Services.GetRequiredService<LedgerOptions>();
    public IDbContextFactory<LedgerDbContext> Factory => Services.GetRequiredService<IDbContextFactory<LedgerDbContext>>();
    public T Get<T>() where T : notnull => Services.GetRequiredService<T>();

    public static Task<TempLedger> CreateAsync(string? dir = null) => CreateAsync(StoreProvider.Sqlite, dir);

    public static async Task<TempLedger> CreateAsync(StoreProvider store, string? dir = null)
    {
        dir ??= Path.Combine(Path.GetTempPath(), "bl-ledger-" + Guid.NewGuid().ToString("N")[..10]);
        var settings = new Dictionary<string, string?> { ["BarrierLedger:DataDirectory"] = dir, ["BarrierLedger:Database:Provider"] = store.ToString() };
        PostgresServer? server = null;
        if (store == StoreProvider.PostgreSQL)
        {
            RequirePostgres();
            server = await PostgresServer.GetAsync();
            settings["BarrierLedger:Database:ConnectionString"] = await server.CreateDatabaseAsync();
        }
        var config = new ConfigurationBuilder().AddInMemoryCollection(settings).Build();
        var services = new ServiceCollection().AddLedger(config).BuildServiceProvider();
        var ledger = new TempLedger(dir, services, server, settings.GetValueOrDefault("BarrierLedger:Database:ConnectionString"));
        await LedgerDatabase.PrepareAsync(ledger.Options, ledger.Factory);
        return ledger;
    }

    /// <summary>Skips the calling [SkippableFact]/[SkippableTheory] when PostgreSQL is missing, or fails it under CI=true.</summary>
    public static void RequirePostgres()
    {
        if (PostgresServer.Unavailable() is not { } why) return;
        if (PostgresServer.InCi) throw new InvalidOperationException($"CI=true and the PostgreSQL variant cannot run: {why}");
        Skip.If(true, why);
    }

    public async Task<LedgerDbContext> DbAsync() => await Factory.CreateDbContextAsync();

    /// <summary>
    /// Another app instance on the same store (same SQLite file or PostgreSQL database), with its own singletons; disposing it
    /// leaves the store to this ledger.
    /// </summary>
    public TempLedger SecondInstance()
    {
        var settings = new Dictionary<string, string?>
        {
            ["BarrierLedger:DataDirectory"] = Directory,
            ["BarrierLedger:Database:Provider"] = Store.ToString(),
            ["BarrierLedger:Database:ConnectionString"] = _postgresConnectionString,
        };
        var services = new ServiceCollection().AddLedger(new ConfigurationBuilder().AddInMemoryCollection(settings).Build()).BuildServiceProvider();
        return new TempLedger(Directory, services, null, null) { _shared = true };
    }

    private bool _shared;

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
        if (_shared) return;
        if (_server is not null && _postgresConnectionString is not null) await _server.DropDatabaseAsync(_postgresConnectionString);
        try { System.IO.Directory.Delete(Directory, recursive: true); } catch (IOException) { }
    }
}
