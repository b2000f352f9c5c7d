using BarrierLedger.Core.Conformers;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Tests.Conformers;
using BarrierLedger.Core.Units;
using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Configs;
using BenchmarkDotNet.Jobs;
using BenchmarkDotNet.Toolchains.InProcess.Emit;

namespace BarrierLedger.Benchmarks;

/// <summary>
/// Permutation-aware conformer comparison (issue 21: 100 conformers × 60 atoms, all pairs, ≤ 1 s). The ensemble: 100 random
/// conformers of F3C–C6H4–(CH2)12–CH(CH3)2 (60 atoms, 25 heavy; ring flip × isopropyl methyls = 4 skeleton self-mappings, the CF3
/// fluorines ordered by geometry), every other one in a shuffled atom order and moved rigidly, so each is numbered through the
/// graph-isomorphism mapping. "All pairs" prepares the ensemble and fills the 4,950-pair heavy-atom RMSD matrix; "Duplicates and
/// mirror images" is the full check with every energy equal (the worst case: each pair is also compared after inversion).
/// In process (the separate build of a benchmark process times out on a busy shared machine).
/// Run: dotnet run -c Release --project tests/BarrierLedger.Benchmarks -- --filter '*ConformerBenchmarks*'
/// </summary>
[Config(typeof(InProcessConfig))]
[MemoryDiagnoser, MinColumn, MedianColumn]
public class ConformerBenchmarks
{
    private sealed class InProcessConfig : ManualConfig
    {
        public InProcessConfig() =>
            AddJob(Job.Default.WithToolchain(InProcessEmitToolchain.Instance).WithLaunchCount(1).WithWarmupCount(2).WithIterationCount(10));
    }

    private List<Molecule> _conformers = [];
    private List<Energy?> _energies = [];

    [GlobalSetup]
    public void Setup()
    {
        var rng = new Random(21);
        for (var k = 0; k < 100; k++)
        {
            var m = FlexibleMolecules.RandomArylalkane(rng, 12);
            if (k % 2 == 1)
                m = FlexibleMolecules.Moved(m, FlexibleMolecules.Shuffle(rng, m.AtomCount), new Vec3(rng.NextDouble(), rng.NextDouble(), rng.NextDouble()), rng.NextDouble() * 6, new Vec3(3, -2, 1));
            _conformers.Add(m);
            _energies.Add(Energy.FromHartree(-1000.0));
        }
        var a = ConformerAlignment.Prepare(_conformers);
        var comparable = Enumerable.Range(0, a.Count).Count(a.IsComparable);
        Console.WriteLine($"// {_conformers.Count} conformers × {_conformers[0].AtomCount} atoms ({a.ComparedAtomCount} compared), {a.Symmetry.SkeletonMappings.Length} self-mappings, {comparable} comparable");
        if (comparable != _conformers.Count) throw new InvalidOperationException("Every conformer of the benchmark must be comparable.");
    }

    [Benchmark(Description = "Prepare only: number 100 conformers, list self-mappings")]
    public ConformerAlignment PrepareOnly() => ConformerAlignment.Prepare(_conformers);

    [Benchmark(Description = "All pairs: prepare + 4,950 RMSDs")]
    public double[,] AllPairs() => ConformerAlignment.Prepare(_conformers).RmsdMatrix();

    [Benchmark(Description = "Duplicates and mirror images, equal energies")]
    public ConformerComparison DuplicatesAndMirrorImages() => ConformerEnsemble.Compare(_conformers, _energies);
}
