using System.Globalization;
using BenchmarkDotNet.Jobs;
using System.Text;
using BarrierLedger.Ledger;
using BarrierLedger.Ledger.Storage;
using Microsoft.Data.Sqlite;
using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.Benchmarks;

/// <summary>A migrated ledger in a fresh temporary folder with the services wired as the app wires them.</summary>
internal sealed class LedgerBenchHost : IDisposable
{
    public LedgerBenchHost()
    {
        Directory = Path.Combine(Path.GetTempPath(), "bl-bench-" + Guid.NewGuid().ToString("N")[..10]);
        var config = new ConfigurationBuilder()
            .AddInMemoryCollection(new Dictionary<string, string?> { ["BarrierLedger:DataDirectory"] = Directory })
            .Build();
        Services = new ServiceCollection().AddLedger(config).BuildServiceProvider();
        SqliteSetup.PrepareAsync(Options, Services.GetRequiredService<IDbContextFactory<LedgerDbContext>>()).GetAwaiter().GetResult();
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
