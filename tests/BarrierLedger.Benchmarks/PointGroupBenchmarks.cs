using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Symmetry;
using BenchmarkDotNet.Attributes;

namespace BarrierLedger.Benchmarks;

/// <summary>
/// Point-group detection (<see cref="PointGroups.Detect"/>, which examines the structure twice: at the tolerance and at ten times
/// it for the "nearly" note) on 200-atom structures. Goal of issue 16: ≤ 5 ms for 200 atoms.
/// <list type="bullet">
/// <item>C1: a random cluster of C, H, N, O atoms about 1.5 Å apart (no symmetry; the common case for a saddle point).</item>
/// <item>D5h: the orbits of ten general points under D5h, 200 atoms (a symmetric top: every candidate axis is searched).</item>
/// <item>D5h with ±0.01 Å noise: the same structure as an optimisation would leave it.</item>
/// </list>
/// Run: dotnet run -c Release --project tests/BarrierLedger.Benchmarks -- --filter '*PointGroup*'
/// </summary>
[SimpleJob(launchCount: 1, warmupCount: 3, iterationCount: 10)]
[MemoryDiagnoser, MinColumn, MedianColumn]
public class PointGroupBenchmarks
{
    private Molecule _molecule = null!;

    [Params("C1", "D5h", "D5h+noise")]
    public string Structure { get; set; } = "C1";

    [GlobalSetup]
    public void Setup()
    {
        _molecule = Structure switch
        {
            "C1" => RandomCluster(200, 16),
            "D5h" => Orbits(0.0),
            _ => Orbits(0.01),
        };
        var r = PointGroups.Detect(_molecule);
        Console.WriteLine($"// {Structure}: {_molecule.AtomCount} atoms, detected {r.Group.Name} (σ = {r.SymmetryNumber}){(r.Note.Length > 0 ? "; " + r.Note : "")}");
        LedgerBenchHost.PrintLoadAverage("point-group set-up");
    }

    [Benchmark(Description = "PointGroups.Detect, 200 atoms")]
    public int Detect() => PointGroups.Detect(_molecule).SymmetryNumber;

    private static Molecule RandomCluster(int atoms, int stream)
    {
        var rng = new Random(stream);
        var symbols = new[] { "C", "H", "N", "O", "H" };
        var side = Math.Cbrt(atoms) * 1.5;
        return new Molecule(Enumerable.Range(0, atoms).Select(i => Elements.Get(symbols[i % symbols.Length])),
            Enumerable.Range(0, atoms).Select(_ => new Vec3(rng.NextDouble() * side, rng.NextDouble() * side, rng.NextDouble() * side)));
    }

    /// <summary>Ten general points (C, H, N, O in turn) and their images under D5h (order 20): 200 atoms.</summary>
    private static Molecule Orbits(double noise)
    {
        var rng = new Random(5);
        var symbols = new[] { "C", "H", "N", "O" };
        var elements = new List<Element>();
        var positions = new List<Vec3>();
        for (var s = 0; s < 10; s++)
        {
            var seed = new Vec3(1 + 4 * rng.NextDouble(), 0.3 + rng.NextDouble(), 0.3 + 3 * rng.NextDouble());
            for (var k = 0; k < 5; k++)
            {
                var a = 2 * Math.PI * k / 5;
                var p = new Vec3(Math.Cos(a) * seed.X - Math.Sin(a) * seed.Y, Math.Sin(a) * seed.X + Math.Cos(a) * seed.Y, seed.Z);
                // C2 about x composed with the rotation, and the horizontal mirror: the 20 images of D5h.
                foreach (var q in new[] { p, new Vec3(p.X, -p.Y, -p.Z), new Vec3(p.X, p.Y, -p.Z), new Vec3(p.X, -p.Y, p.Z) })
                {
                    elements.Add(Elements.Get(symbols[s % symbols.Length]));
                    positions.Add(q + new Vec3(Noise(rng, noise), Noise(rng, noise), Noise(rng, noise)));
                }
            }
        }
        return new Molecule(elements, positions);
    }

    private static double Noise(Random rng, double size) => (2 * rng.NextDouble() - 1) * size;
}
