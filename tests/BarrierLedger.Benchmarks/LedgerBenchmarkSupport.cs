using System.Globalization;
using BenchmarkDotNet.Jobs;
using System.Text;
using BarrierLedger.Ledger;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Support;
using Microsoft.Data.Sqlite;
using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.Benchmarks;

/// <summary>
/// A migrated ledger with the services wired as the app wires them: a SQLite file in a fresh temporary folder, or a fresh
/// database on a throwaway PostgreSQL cluster (started once per run; or the server in BARRIERLEDGER_TEST_POSTGRES).
/// </summary>
internal sealed class LedgerBenchHost : IDisposable
{
    private readonly PostgresServer? _server;
    private readonly string? _postgres;

    public LedgerBenchHost(StoreProvider store = StoreProvider.Sqlite)
    {
        Directory = Path.Combine(Path.GetTempPath(), "bl-bench-" + Guid.NewGuid().ToString("N")[..10]);
        var settings = new Dictionary<string, string?> { ["BarrierLedger:DataDirectory"] = Directory, ["BarrierLedger:Database:Provider"] = store.ToString() };
        if (store == StoreProvider.PostgreSQL)
        {
            if (PostgresServer.Unavailable() is { } why) throw new InvalidOperationException(why);
            _server = PostgresServer.GetAsync().GetAwaiter().GetResult();
            settings["BarrierLedger:Database:ConnectionString"] = _postgres = _server.CreateDatabaseAsync().GetAwaiter().GetResult();
        }
        var config = new ConfigurationBuilder().AddInMemoryCollection(settings).Build();
        Services = new ServiceCollection().AddLedger(config).BuildServiceProvider();
        LedgerDatabase.PrepareAsync(Options, Services.GetRequiredService<IDbContextFactory<LedgerDbContext>>()).GetAwaiter().GetResult();
    }

    public string Directory { get; }
    public ServiceProvider Services { get; }
    public LedgerOptions Options => Services.GetRequiredService<LedgerOptions>();
    public T Get<T>() where T : notnull => Services.GetRequiredService<T>();

    /// <summary>The machine is shared: every figure is printed beside the load average it was measured under.</summary>
    public static void PrintLoadAverage(string when) =>
        Console.WriteLine($"// load average {when}: " + (File.Exists("/proc/loadavg") ? File.ReadAllText("/proc/loadavg").Trim() : "unknown"));

    public void Dispose()
    {
        Services.Dispose();
        SqliteConnection.ClearAllPools();
        if (_server is not null && _postgres is not null) _server.DropDatabaseAsync(_postgres).GetAwaiter().GetResult();
        try { System.IO.Directory.Delete(Directory, recursive: true); } catch (IOException) { }
    }

    /// <summary>A multi-frame XYZ relaxed scan: a chain of alternating C and H, the first C–C distance stretched, invented energies.</summary>
    public static string ScanXyz(int frames, int atoms)
    {
        var sb = new StringBuilder(frames * atoms * 40);
        for (var f = 0; f < frames; f++)
        {
            var r = 1.5 + 1.5 * f / Math.Max(1, frames - 1);
            var e = -100.0 + 0.03 * Math.Sin(Math.PI * (r - 1.5) / 1.5);
            sb.Append(atoms).Append('\n').Append("energy=").Append(e.ToString("R", CultureInfo.InvariantCulture)).Append('\n');
            for (var a = 0; a < atoms; a++)
            {
                var x = a == 0 ? 0.0 : r + 1.1 * (a - 1);
                sb.Append(a % 2 == 0 ? "C" : "H").Append(' ').Append(x.ToString("F6", CultureInfo.InvariantCulture)).Append(' ')
                  .Append((a < 2 ? 0.0 : 0.3 * (a % 3)).ToString("F6", CultureInfo.InvariantCulture)).Append(" 0.000000\n");
            }
        }
        return sb.ToString();
    }
}

/// <summary>
/// In-process runs (no generated project to build: on a shared, loaded machine that build times out), one launch, a few
/// warm-up and measured iterations, one invocation each (every invocation writes to the store).
/// </summary>
internal sealed class LedgerBenchConfig : BenchmarkDotNet.Configs.ManualConfig
{
    public LedgerBenchConfig()
    {
        AddJob(BenchmarkDotNet.Jobs.Job.Default
            .WithToolchain(BenchmarkDotNet.Toolchains.InProcess.Emit.InProcessEmitToolchain.Instance)
            .WithStrategy(BenchmarkDotNet.Engines.RunStrategy.Monitoring)
            .WithLaunchCount(1).WithWarmupCount(2).WithIterationCount(8));
        AddDiagnoser(BenchmarkDotNet.Diagnosers.MemoryDiagnoser.Default);
        AddColumn(BenchmarkDotNet.Columns.StatisticColumn.Median, BenchmarkDotNet.Columns.StatisticColumn.Min);
    }
}
