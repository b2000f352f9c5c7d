using System.Diagnostics;
using System.Net;
using System.Net.Sockets;
using System.Text;
using BarrierLedger.Ledger;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Storage;
using Microsoft.AspNetCore.Identity;
using Microsoft.Data.Sqlite;
using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.Cli.Tests;

/// <summary>
/// The real dashboard as its own process on a fixed loopback port and data directory, which can be stopped (killed, as a
/// crash or a node reboot would) and started again on the same port and data. Accounts and tokens are written into the same
/// SQLite store through the ledger's own services.
/// </summary>
internal sealed class PushTestServer : IAsyncDisposable
{
    private Process? _process;
    private readonly StringBuilder _output = new();
    private ServiceProvider? _ledger;

    public PushTestServer()
    {
        Port = FreePort();
        DataDirectory = Path.Combine(Path.GetTempPath(), "bl-push-" + Guid.NewGuid().ToString("N")[..10]);
        Directory.CreateDirectory(DataDirectory);
    }

    public int Port { get; }
    public string BaseUrl => $"http://127.0.0.1:{Port}";
    public string DataDirectory { get; }
    public string Output { get { lock (_output) return _output.ToString(); } }

    /// <param name="settings">Extra command-line settings for the app, e.g. "--BarrierLedger:Uploads:UserQuotaMiB=1".</param>
    public async Task StartAsync(params string[] settings)
    {
        var start = new ProcessStartInfo("dotnet") { WorkingDirectory = DataDirectory, RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        start.ArgumentList.Add(WebDll);
        start.ArgumentList.Add("--urls");
        start.ArgumentList.Add(BaseUrl);
        start.ArgumentList.Add($"--BarrierLedger:DataDirectory={DataDirectory}");
        start.ArgumentList.Add("--no-demo");
        foreach (var setting in settings) start.ArgumentList.Add(setting);
        start.Environment["ASPNETCORE_ENVIRONMENT"] = "Production";
        var listening = new TaskCompletionSource(TaskCreationOptions.RunContinuationsAsynchronously);
        var process = new Process { StartInfo = start };
        void OnLine(string? line)
        {
            if (line is null) return;
            lock (_output) _output.AppendLine(line);
            if (line.Contains("Now listening on", StringComparison.Ordinal)) listening.TrySetResult();
        }
        process.OutputDataReceived += (_, e) => OnLine(e.Data);
        process.ErrorDataReceived += (_, e) => OnLine(e.Data);
        process.Start();
        process.BeginOutputReadLine();
        process.BeginErrorReadLine();
        _process = process;
        if (await Task.WhenAny(listening.Task, Task.Delay(TimeSpan.FromSeconds(120))) != listening.Task)
            throw new InvalidOperationException($"The app did not start on {BaseUrl}. Output:\n{Output}");
    }

    /// <summary>Kills the server process at once (no graceful shutdown), as a crash would.</summary>
    public async Task KillAsync()
    {
        if (_process is null) return;
        if (!_process.HasExited)
        {
            _process.Kill(entireProcessTree: true);
            await _process.WaitForExitAsync().WaitAsync(TimeSpan.FromSeconds(30));
        }
        _process.Dispose();
        _process = null;
    }

    /// <summary>The ledger store the server uses, for making accounts and tokens and for counting what was stored.</summary>
    public IServiceProvider Ledger => _ledger ??= BuildLedger();

    private ServiceProvider BuildLedger()
    {
        var config = new ConfigurationBuilder().AddInMemoryCollection(new Dictionary<string, string?> { ["BarrierLedger:DataDirectory"] = DataDirectory }).Build();
        var services = new ServiceCollection().AddLogging().AddLedger(config);
        services.AddSingleton<AccessTokenService>();
        services.AddIdentityCore<LedgerUser>().AddRoles<IdentityRole>().AddEntityFrameworkStores<LedgerDbContext>();
        return services.BuildServiceProvider();
    }

    public async Task<string> CreateUploadTokenAsync(string userName)
    {
        await using var scope = Ledger.CreateAsyncScope();
        var users = scope.ServiceProvider.GetRequiredService<UserManager<LedgerUser>>();
        var user = new LedgerUser { UserName = userName, DisplayName = userName };
        var created = await users.CreateAsync(user, "Push-Test-Pass-" + Guid.NewGuid().ToString("N")[..6]);
        Assert.True(created.Succeeded, string.Join("; ", created.Errors.Select(e => e.Description)));
        await users.AddToRoleAsync(user, Roles.Member);
        return (await Ledger.GetRequiredService<AccessTokenService>().CreateAsync(user.Id, "push tests", TokenScopes.Upload, TimeSpan.FromDays(1))).Text;
    }

    public async Task<(int Uploads, int Calculations, int Files)> CountsAsync()
    {
        await using var db = await Ledger.GetRequiredService<IDbContextFactory<LedgerDbContext>>().CreateDbContextAsync();
        return (await db.Uploads.CountAsync(), await db.Calculations.CountAsync(), await db.StoredFiles.CountAsync());
    }

    /// <summary>The conformer label of every stored calculation, in the order stored.</summary>
    public async Task<IReadOnlyList<string>> ConformersAsync()
    {
        await using var db = await Ledger.GetRequiredService<IDbContextFactory<LedgerDbContext>>().CreateDbContextAsync();
        return await db.Calculations.OrderBy(c => c.Id).Select(c => c.Conformer).ToListAsync();
    }

    private static string WebDll
    {
        get
        {
            var dir = new DirectoryInfo(AppContext.BaseDirectory);
            while (dir is not null && !File.Exists(Path.Combine(dir.FullName, "BarrierLedger.sln"))) dir = dir.Parent;
            if (dir is null) throw new DirectoryNotFoundException("BarrierLedger.sln not found above " + AppContext.BaseDirectory);
            var configuration = AppContext.BaseDirectory.Contains($"{Path.DirectorySeparatorChar}Release{Path.DirectorySeparatorChar}") ? "Release" : "Debug";
            var path = Path.Combine(dir.FullName, "src", "BarrierLedger.Web", "bin", configuration, "net10.0", "BarrierLedger.Web.dll");
            if (!File.Exists(path)) throw new FileNotFoundException("The web app is not built (this test project builds it through its project reference).", path);
            return path;
        }
    }

    private static int FreePort()
    {
        using var l = new TcpListener(IPAddress.Loopback, 0);
        l.Start();
        return ((IPEndPoint)l.LocalEndpoint).Port;
    }

    public async ValueTask DisposeAsync()
    {
        try { await KillAsync(); } catch (Exception) { /* already gone */ }
        if (_ledger is not null) await _ledger.DisposeAsync();
        SqliteConnection.ClearAllPools();
        try { Directory.Delete(DataDirectory, recursive: true); } catch (IOException) { } catch (UnauthorizedAccessException) { }
    }
}
