using System.Diagnostics;
using BarrierLedger.Core.Kinetics;
using BarrierLedger.Core.Units;
using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Configs;
using BenchmarkDotNet.Engines;
using BenchmarkDotNet.Jobs;
using BenchmarkDotNet.Toolchains.InProcess.Emit;

namespace BarrierLedger.Benchmarks;

/// <summary>
/// Issue 22's performance goals: a 50-species, 100-step network (25 unimolecular and 75 bimolecular reversible steps, rate constants
/// spanning about 20 decades) integrated over ten decades of time (report times 10⁻⁶ … 10⁴ s) in ≤ 50 ms, and a 1,000-sample Monte
/// Carlo of it (σ = 2 kcal/mol on every level) in ≤ 5 s on 2 cores.
/// Run: dotnet run -c Release --project tests/BarrierLedger.Benchmarks -- --filter '*KineticsBenchmarks*'
/// </summary>
[Config(typeof(Settings))]
[MemoryDiagnoser, MinColumn, MedianColumn, MaxColumn]
public class KineticsBenchmarks
{
    // In-process: on the shared two-core machine the generated benchmark project did not build within BenchmarkDotNet's 120 s limit.
    private sealed class Settings : ManualConfig
    {
        public Settings() => AddJob(Job.Default.WithStrategy(RunStrategy.Monitoring).WithLaunchCount(1).WithWarmupCount(1).WithIterationCount(3)
            .WithToolchain(InProcessEmitToolchain.Instance));
    }

    private ReactionNetwork _network = null!;
    private SimulationConditions _conditions = null!;
    private readonly KineticsQuestion _question = new("S1a", ["S2a", "S3a"]);

    [GlobalSetup]
    public void Setup()
    {
        (_network, _conditions) = LargeNetwork();
        var r = Microkinetics.Simulate(_network, _conditions, _question);
        var ks = r.RateConstantsAtStart.SelectMany(k => new[] { k.Forward, k.Reverse }).Where(k => k > 0).ToArray();
        Console.WriteLine($"// network: {_network.Species.Count} species, {_network.Steps.Count} steps; k from {ks.Min():G2} to {ks.Max():G2} " +
                          $"({Math.Log10(ks.Max() / ks.Min()):0.0} decades); {r.Outcome.Statistics}; completed {r.Outcome.Completed}");
        Console.WriteLine($"// answer: {r.Answers!.Sentence}");
        Console.WriteLine($"// processors: {Environment.ProcessorCount}; load average: {LoadAverage()}");
    }

    /// <summary>The 1-minute load average (Linux), printed beside the figures on a shared machine.</summary>
    public static string LoadAverage() => File.Exists("/proc/loadavg") ? File.ReadAllText("/proc/loadavg").Split(' ')[0] : "n/a";

    [GlobalCleanup]
    public void Cleanup() => Console.WriteLine($"// load average at the end: {LoadAverage()}");

    // On a shared machine the wall time mostly measures the other users; the process's CPU time per iteration (all threads; one
    // invocation per iteration under RunStrategy.Monitoring) is printed beside it. For the two-thread Monte Carlo, CPU time / 2 is
    // the wall time two free cores would need.
    private TimeSpan _cpuBefore;
    private Stopwatch _wall = new();

    [IterationSetup]
    public void BeforeIteration()
    {
        _cpuBefore = Process.GetCurrentProcess().TotalProcessorTime;
        _wall = Stopwatch.StartNew();
    }

    [IterationCleanup]
    public void AfterIteration()
    {
        var cpu = Process.GetCurrentProcess().TotalProcessorTime - _cpuBefore;
        Console.WriteLine($"// iteration: CPU {cpu.TotalMilliseconds:0.0} ms, wall {_wall.Elapsed.TotalMilliseconds:0.0} ms, load average {LoadAverage()}");
    }

    [Benchmark(Description = "Simulate 50 species / 100 steps, 1e-6..1e4 s (rtol 1e-6)")]
    public SimulationResult Simulate() => Microkinetics.Simulate(_network, _conditions, _question);

    [Benchmark(Description = "Monte Carlo, 1,000 samples, 2 threads")]
    public MonteCarloResult MonteCarlo() =>
        Microkinetics.Sample(_network, _conditions, _question, new MonteCarloOptions(Samples: 1000, RandomKey: 5, MaxParallelism: 2));

    /// <summary>
    /// The benchmark network: 25 sizes × 2 isomers (S1a, S1b … S25a, S25b); 25 isomerisations Sna ⇌ Snb and 75 associations
    /// Si + Sj ⇌ S(i+j) (a growth chain Sn + S1 first), so Σ n [Sn] is conserved; energies and barriers (4–24 kcal/mol above the higher minimum) from a fixed random stream.
    /// </summary>
    public static (ReactionNetwork, SimulationConditions) LargeNetwork()
    {
        var rng = new Random(22);
        const int sizes = 25;
        string Name(int n, int isomer) => $"S{n}{(isomer == 0 ? 'a' : 'b')}";
        var names = Enumerable.Range(1, sizes).SelectMany(n => new[] { Name(n, 0), Name(n, 1) }).ToArray();
        var g = new Dictionary<string, double>();
        for (var n = 1; n <= sizes; n++)
            for (var iso = 0; iso < 2; iso++)
                g[Name(n, iso)] = -4.0 * (n - 1) + 4 * (rng.NextDouble() - 0.5);
        var levels = names.Select(x => new EnergyLevel(x, Energy.FromKcalPerMol(g[x]), UncertaintyKcalPerMol: 2.0)).ToList();
        var steps = new List<ElementaryStep>();
        double Barrier() => 4 + 20 * rng.NextDouble();
        for (var n = 1; n <= sizes; n++)
        {
            var (a, b) = (Name(n, 0), Name(n, 1));
            levels.Add(new EnergyLevel($"T{a}{b}", Energy.FromKcalPerMol(Math.Max(g[a], g[b]) + Barrier()), UncertaintyKcalPerMol: 2.0));
            steps.Add(new ElementaryStep($"{a}→{b}", [new(a)], [new(b)], new EyringRates(a, $"T{a}{b}", b)));
        }
        var pairs = new HashSet<(string, string, string)>();
        while (steps.Count < 100)
        {
            // First a growth chain Sn + S1 → S(n+1), then random associations.
            var chain = steps.Count - sizes + 1;
            var i = chain < sizes ? chain : 1 + rng.Next(sizes - 1);
            var j = chain < sizes ? 1 : 1 + rng.Next(sizes - i);
            var (x, y, z) = (Name(i, rng.Next(2)), Name(j, rng.Next(2)), Name(i + j, rng.Next(2)));
            if (string.CompareOrdinal(x, y) > 0) (x, y) = (y, x);
            if (!pairs.Add((x, y, z))) continue;
            var from = $"{x}+{y}";
            if (levels.All(l => l.Key != from)) levels.Add(new EnergyLevel(from, Energy.FromKcalPerMol(g[x] + g[y]), UncertaintyKcalPerMol: 2.0));
            var ts = $"T{x}+{y}→{z}";
            levels.Add(new EnergyLevel(ts, Energy.FromKcalPerMol(Math.Max(g[x] + g[y], g[z]) + Barrier()), UncertaintyKcalPerMol: 2.0));
            var reactants = x == y ? new List<StepTerm> { new(x, 2) } : [new(x), new(y)];
            steps.Add(new ElementaryStep($"{x}+{y}→{z}", reactants, [new(z)], new EyringRates(from, ts, z)));
        }
        var network = new ReactionNetwork(names, steps, levels, 298.15);
        var reports = Enumerable.Range(0, 11).Select(e => Math.Pow(10, e - 6)).ToArray();
        var conditions = new SimulationConditions(
            new Dictionary<string, double> { ["S1a"] = 0.5, ["S1b"] = 0.1 }, TemperatureProgram.Isothermal(298.15), 1e4, reports);
        return (network, conditions);
    }
}
