using System.Net.Http.Headers;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Storage;
using Microsoft.AspNetCore.Hosting;
using Microsoft.AspNetCore.Hosting.Server;
using Microsoft.AspNetCore.Hosting.Server.Features;
using Microsoft.AspNetCore.Identity;
using Microsoft.AspNetCore.Mvc.Testing;
using Microsoft.AspNetCore.TestHost;
using Microsoft.Data.Sqlite;
using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.DependencyInjection.Extensions;

namespace BarrierLedger.Web.Tests.Endpoints;

/// <summary>
/// The real app (same Program, same pipeline) on Kestrel at a free loopback port, with a fresh temporary data directory.
/// Accounts and tokens are made through the app's own services, since the first admin must change a one-time password in
/// the browser before signing in.
/// </summary>
public sealed class ApiTestHost : WebApplicationFactory<Program>
{
    private readonly IReadOnlyDictionary<string, string?> _settings;
    private readonly bool _ownsDataDirectory;

    /// <param name="settings">Configuration over the test defaults; a null value leaves the setting to the app (e.g. LoadDemo unset).</param>
    /// <param name="dataDirectory">An existing data folder to start on (kept at the end); by default a fresh one, deleted at the end.</param>
    public ApiTestHost(IReadOnlyDictionary<string, string?>? settings = null, string? dataDirectory = null)
    {
        _settings = settings ?? new Dictionary<string, string?>();
        _ownsDataDirectory = dataDirectory is null;
        DataDirectory = dataDirectory ?? Path.Combine(Path.GetTempPath(), "bl-api-" + Guid.NewGuid().ToString("N")[..10]);
        Directory.CreateDirectory(DataDirectory);
        UseKestrel();
        StartServer();
        var addresses = Services.GetRequiredService<IServer>().Features.Get<IServerAddressesFeature>()!.Addresses;
        BaseAddress = new Uri(addresses.First(a => a.StartsWith("http://127.0.0.1", StringComparison.Ordinal)));
    }

    public string DataDirectory { get; }
    public Uri BaseAddress { get; }

    /// <summary>Moves the app's clock (token expiry) without waiting.</summary>
    public ShiftedClock Clock { get; } = new();

    protected override void ConfigureWebHost(IWebHostBuilder builder)
    {
        builder.UseEnvironment("Production");
        builder.UseSetting("urls", "http://127.0.0.1:0");
        builder.UseSetting("BarrierLedger:DataDirectory", DataDirectory);
        // An empty store, so counts show exactly what a test stored (unless a test names the setting, or leaves it to the app with null).
        if (!_settings.ContainsKey("BarrierLedger:LoadDemo")) builder.UseSetting("BarrierLedger:LoadDemo", "false");
        foreach (var (k, v) in _settings)
            if (v is not null) builder.UseSetting(k, v);
        builder.ConfigureTestServices(s =>
        {
            s.RemoveAll<TimeProvider>();
            s.AddSingleton<TimeProvider>(Clock);
        });
    }

    public T Get<T>() where T : notnull => Services.GetRequiredService<T>();

    public async Task<LedgerDbContext> DbAsync() => await Get<IDbContextFactory<LedgerDbContext>>().CreateDbContextAsync();

    public async Task<LedgerUser> CreateUserAsync(string userName, params string[] roles)
    {
        await using var scope = Services.CreateAsyncScope();
        var users = scope.ServiceProvider.GetRequiredService<UserManager<LedgerUser>>();
        var user = new LedgerUser { UserName = userName, DisplayName = userName };
        var created = await users.CreateAsync(user, "Correct-Horse-7" + Guid.NewGuid().ToString("N")[..8]);
        Assert.True(created.Succeeded, string.Join("; ", created.Errors.Select(e => e.Description)));
        await users.AddToRolesAsync(user, roles);
        return user;
    }

    public async Task<string> CreateTokenAsync(LedgerUser user, string scope, int days = 30) =>
        (await Get<AccessTokenService>().CreateAsync(user.Id, $"{scope} token for tests", scope, TimeSpan.FromDays(days))).Text;

    /// <summary>A client of the loopback server; with a token when one is given. Redirects are not followed, so a redirect shows.</summary>
    public HttpClient Client(string? token = null)
    {
        var client = new HttpClient(new SocketsHttpHandler { AllowAutoRedirect = false }) { BaseAddress = BaseAddress };
        if (token is not null) client.DefaultRequestHeaders.Authorization = new AuthenticationHeaderValue("Bearer", token);
        return client;
    }

    /// <summary>How many of each stored record there are (to show that nothing, or nothing new, was stored).</summary>
    public async Task<(int Studies, int Uploads, int Calculations, int Files)> CountsAsync()
    {
        await using var db = await DbAsync();
        return (await db.Studies.CountAsync(), await db.Uploads.CountAsync(), await db.Calculations.CountAsync(), await db.StoredFiles.CountAsync());
    }

    public override async ValueTask DisposeAsync()
    {
        await base.DisposeAsync();
        SqliteConnection.ClearAllPools();
        if (!_ownsDataDirectory) return;
        try { Directory.Delete(DataDirectory, recursive: true); } catch (IOException) { } catch (UnauthorizedAccessException) { }
    }
}

/// <summary>The system clock plus an offset the test sets.</summary>
public sealed class ShiftedClock : TimeProvider
{
    public TimeSpan Offset { get; set; }
    public override DateTimeOffset GetUtcNow() => System.GetUtcNow() + Offset;
}
