using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.IsotopeEffects;
using BarrierLedger.Core.Vibrations;
using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Configs;
using BenchmarkDotNet.Jobs;
using BenchmarkDotNet.Toolchains.InProcess.Emit;

namespace BarrierLedger.Benchmarks;

/// <summary>
/// One kinetic isotope effect (issue 23's goal: ≤ 50 ms with the native eigensolver): a 50-atom reactant and a 50-atom saddle point,
/// each analysed with the parent and the deuterated masses (four frequency analyses of 150×150 Hessians), plus thermochemistry,
/// factors and tunnelling. OpenBLAS runs one thread. The job runs in the benchmark process (no generated project to build, which
/// times out on a busy shared machine).
/// Run: dotnet run -c Release --project tests/BarrierLedger.Benchmarks -- --filter '*KineticIsotopeEffect*'
/// </summary>
[Config(typeof(InProcessConfig))]
[MemoryDiagnoser, MinColumn, MedianColumn]
public class KineticIsotopeEffectBenchmarks
{
    private sealed class InProcessConfig : ManualConfig
    {
        public InProcessConfig() =>
            AddJob(Job.Default.WithToolchain(InProcessEmitToolchain.Instance).WithLaunchCount(1).WithWarmupCount(3).WithIterationCount(15));
    }

    private KieStructure _saddlePoint = null!;
    private KieStructure _reactant = null!;

    [GlobalSetup]
    public void Setup()
    {
        if (!SymmetricEigensolver.TrySetNativeThreadCount(1))
            Console.WriteLine("// OpenBLAS not loadable: the native benchmark will fail.");
        Console.WriteLine($"// Eigensolver (Auto): {SymmetricEigensolver.Describe()}");
        var (m, h) = FrequencyAnalysisBenchmarks.SpringCluster(50, 7);
        var n = 3 * m.AtomCount;
        var saddle = (double[])h.Clone();
        // A strongly negative spring between atoms 1 and 2 (C1–H2): one imaginary mode along it.
        var d = m.PositionsAngstrom[1] - m.PositionsAngstrom[0];
        var u = d / d.Length;
        const double k = -0.35;
        for (var x = 0; x < 3; x++)
            for (var y = 0; y < 3; y++)
            {
                var v = k * u[x] * u[y];
                saddle[x * n + y] += v;
                saddle[(3 + x) * n + 3 + y] += v;
                saddle[x * n + 3 + y] -= v;
                saddle[(3 + x) * n + y] -= v;
            }
        var subs = IsotopeSubstitution.ParseList("H2=D");
        _saddlePoint = new KieStructure("TS", m, saddle, subs);
        _reactant = new KieStructure("R", m, h, subs);
        var check = KineticIsotopeEffect.Compute(_saddlePoint, [_reactant], new KieOptions(Solver: EigenSolverChoice.Native));
        Console.WriteLine($"// KIE = {check.Kie:F4}, ν‡ {check.ImaginaryParentCm1:F0}i / {check.ImaginarySubstitutedCm1:F0}i cm⁻¹, product rule {check.ProductRuleWorstDeviation:G2}");
    }

    [Benchmark(Baseline = true, Description = "KIE, 50-atom reactant + saddle point, native dsyevd")]
    public double Native() =>
        KineticIsotopeEffect.Compute(_saddlePoint, [_reactant], new KieOptions(Tunnelling: KieTunnelling.Wigner, Solver: EigenSolverChoice.Native)).Kie;

    [Benchmark(Description = "KIE, 50-atom reactant + saddle point, managed MathNet")]
    public double Managed() =>
        KineticIsotopeEffect.Compute(_saddlePoint, [_reactant], new KieOptions(Tunnelling: KieTunnelling.Wigner, Solver: EigenSolverChoice.Managed)).Kie;
}
