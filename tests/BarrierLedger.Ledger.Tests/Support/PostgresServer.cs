using System.Diagnostics;
using System.Net;
using System.Net.Sockets;
using Npgsql;

namespace BarrierLedger.Ledger.Tests.Support;

/// <summary>
/// A PostgreSQL server for tests and benchmarks: the one named by BARRIERLEDGER_TEST_POSTGRES (an Npgsql connection string to
/// an account that may create databases), or else a throwaway cluster started once per process with Debian's binaries
/// (initdb + pg_ctl in a temporary folder, loopback only, on a free port; as the postgres user when running as root) and
/// stopped when the process exits. Each ledger gets a database of its own (<see cref="CreateDatabaseAsync"/>).
/// </summary>
public sealed class PostgresServer
{
    public const string ServerVariable = "BARRIERLEDGER_TEST_POSTGRES";
    private static readonly Lazy<Task<PostgresServer>> Shared = new(StartAsync, LazyThreadSafetyMode.ExecutionAndPublication);
    private readonly string _adminConnectionString;
    private readonly string? _clusterDirectory;
    private readonly string? _binDirectory;

    private PostgresServer(string adminConnectionString, string? clusterDirectory, string? binDirectory)
    {
        _adminConnectionString = adminConnectionString;
        _clusterDirectory = clusterDirectory;
        _binDirectory = binDirectory;
    }

    /// <summary>Where the server comes from, for test output.</summary>
    public string Description => _clusterDirectory is null ? $"{ServerVariable}" : $"throwaway cluster in {_clusterDirectory}";

    /// <summary>The folder with initdb, pg_ctl, pg_dump of the newest installed PostgreSQL, or null when none is installed.</summary>
    public static string? FindBinaries()
    {
        foreach (var dir in (Environment.GetEnvironmentVariable("PATH") ?? "").Split(':', StringSplitOptions.RemoveEmptyEntries))
            if (File.Exists(Path.Combine(dir, "initdb")) && File.Exists(Path.Combine(dir, "pg_ctl"))) return dir;
        const string debian = "/usr/lib/postgresql";
        return Directory.Exists(debian)
            ? Directory.GetDirectories(debian).Select(d => Path.Combine(d, "bin"))
                .Where(d => File.Exists(Path.Combine(d, "initdb"))).OrderByDescending(d => d, StringComparer.Ordinal).FirstOrDefault()
            : null;
    }

    /// <summary>Why PostgreSQL tests cannot run here, or null when they can (a server is named or binaries are installed).</summary>
    public static string? Unavailable() =>
        Environment.GetEnvironmentVariable(ServerVariable) is { Length: > 0 } || FindBinaries() is not null ? null
            : $"PostgreSQL is not installed (no initdb/pg_ctl on PATH or under /usr/lib/postgresql) and {ServerVariable} is not set: "
              + "install Debian's postgresql (sudo apt-get install -y postgresql) to run the PostgreSQL variants";

    /// <summary>True under CI=true, where a missing PostgreSQL is a failure, not a skip.</summary>
    public static bool InCi => string.Equals(Environment.GetEnvironmentVariable("CI"), "true", StringComparison.OrdinalIgnoreCase);

    /// <summary>The shared server, started on first use.</summary>
    public static Task<PostgresServer> GetAsync() => Shared.Value;

    /// <summary>Creates an empty database and returns a connection string to it.</summary>
    public async Task<string> CreateDatabaseAsync()
    {
        var name = "bl_" + Guid.NewGuid().ToString("N")[..16];
        await using (var connection = new NpgsqlConnection(_adminConnectionString))
        {
            await connection.OpenAsync();
            await using var cmd = connection.CreateCommand();
            cmd.CommandText = $"CREATE DATABASE \"{name}\"";
            await cmd.ExecuteNonQueryAsync();
        }
        return new NpgsqlConnectionStringBuilder(_adminConnectionString) { Database = name, Pooling = true }.ConnectionString;
    }

    /// <summary>Drops a database made by <see cref="CreateDatabaseAsync"/>, closing its pooled connections first.</summary>
    public async Task DropDatabaseAsync(string connectionString)
    {
        var name = new NpgsqlConnectionStringBuilder(connectionString).Database;
        NpgsqlConnection.ClearAllPools();
        await using var connection = new NpgsqlConnection(_adminConnectionString);
        await connection.OpenAsync();
        await using var cmd = connection.CreateCommand();
        cmd.CommandText = $"DROP DATABASE IF EXISTS \"{name}\" WITH (FORCE)";
        await cmd.ExecuteNonQueryAsync();
    }

    /// <summary>A PostgreSQL program (pg_restore, pg_dump, ...): beside this server's initdb, on PATH, or under /usr/lib/postgresql; null when absent.</summary>
    public string? FindTool(string name)
    {
        IEnumerable<string> dirs = [.. _binDirectory is null ? [] : new[] { _binDirectory },
            .. (Environment.GetEnvironmentVariable("PATH") ?? "").Split(':', StringSplitOptions.RemoveEmptyEntries),
            .. Directory.Exists("/usr/lib/postgresql") ? Directory.GetDirectories("/usr/lib/postgresql").OrderDescending(StringComparer.Ordinal).Select(d => Path.Combine(d, "bin")) : []];
        return dirs.Select(d => Path.Combine(d, name)).FirstOrDefault(File.Exists);
    }

    private static async Task<PostgresServer> StartAsync()
    {
        if (Environment.GetEnvironmentVariable(ServerVariable) is { Length: > 0 } named)
            return new PostgresServer(new NpgsqlConnectionStringBuilder(named) { Pooling = false }.ConnectionString, null, FindBinaries());
        var bin = FindBinaries() ?? throw new InvalidOperationException(Unavailable());
        var root = Directory.CreateTempSubdirectory("bl-pg-").FullName;
        var data = Path.Combine(root, "data");
        var asRoot = Environment.UserName == "root";
        if (asRoot) await RunAsync("chown", ["postgres:postgres", root], null);
        var port = FreePort();
        await RunAsync(Path.Combine(bin, "initdb"), ["-D", data, "-U", "postgres", "-A", "trust", "-E", "UTF8", "--locale=C.UTF-8", "--no-sync"], asRoot ? "postgres" : null);
        string[] settings = ["-c listen_addresses=127.0.0.1", $"-p {port}", $"-k {root}", "-c fsync=off", "-c synchronous_commit=off", "-c full_page_writes=off", "-c max_connections=200"];
        await RunAsync(Path.Combine(bin, "pg_ctl"), ["-D", data, "-l", Path.Combine(root, "server.log"), "-w", "-t", "60", "-o", string.Join(' ', settings), "start"], asRoot ? "postgres" : null);
        AppDomain.CurrentDomain.ProcessExit += (_, _) =>
        {
            try { RunAsync(Path.Combine(bin, "pg_ctl"), ["-D", data, "-m", "immediate", "stop"], asRoot ? "postgres" : null).GetAwaiter().GetResult(); }
            catch (InvalidOperationException) { }
            try { Directory.Delete(root, recursive: true); } catch (IOException) { } catch (UnauthorizedAccessException) { }
        };
        var admin = $"Host=127.0.0.1;Port={port};Username=postgres;Database=postgres;Pooling=false";
        return new PostgresServer(admin, root, bin);
    }

    private static int FreePort()
    {
        using var listener = new TcpListener(IPAddress.Loopback, 0);
        listener.Start();
        return ((IPEndPoint)listener.LocalEndpoint).Port;
    }

    private static async Task RunAsync(string file, IReadOnlyList<string> args, string? asUser)
    {
        var psi = asUser is null ? new ProcessStartInfo(file) : new ProcessStartInfo("runuser", ["-u", asUser, "--", file]);
        foreach (var a in args) psi.ArgumentList.Add(a);
        psi.RedirectStandardOutput = psi.RedirectStandardError = true;
        psi.UseShellExecute = false;
        using var process = Process.Start(psi) ?? throw new InvalidOperationException($"could not start {file}");
        var stdout = process.StandardOutput.ReadToEndAsync();
        var stderr = process.StandardError.ReadToEndAsync();
        await process.WaitForExitAsync();
        if (process.ExitCode != 0)
            throw new InvalidOperationException($"{Path.GetFileName(file)} {string.Join(' ', args)} failed ({process.ExitCode}): {await stderr}{await stdout}");
    }
}
