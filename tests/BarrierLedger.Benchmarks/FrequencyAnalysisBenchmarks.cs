using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Vibrations;
using BenchmarkDotNet.Attributes;

namespace BarrierLedger.Benchmarks;

/// <summary>
/// Frequency analysis (mass-weighting, rank-2k projection of translations/rotations, diagonalisation, modes) for 3N = 90, 300, 900,
/// 1800, with the native LAPACK path (OpenBLAS dsyevd, one thread) and the managed MathNet path, plus the bare dsyevd call on the
/// same matrix for reference. OpenBLAS is set to one thread in the benchmark process (openblas_set_num_threads(1)).
/// Run: dotnet run -c Release --project tests/BarrierLedger.Benchmarks -- --filter '*FrequencyAnalysis*'
/// </summary>
[SimpleJob(launchCount: 1, warmupCount: 2, iterationCount: 5)]
[MemoryDiagnoser, MinColumn, MedianColumn]
public class FrequencyAnalysisBenchmarks
{
    private Molecule _molecule = null!;
    private double[] _hessian = [];
    private double[] _matrix = [];
    private double[] _work = [];
    private double[] _eigenvalues = [];

    [Params(90, 300, 900, 1800)]
    public int CartesianDimension { get; set; }

    [GlobalSetup]
    public void Setup()
    {
        if (!SymmetricEigensolver.TrySetNativeThreadCount(1))
            Console.WriteLine("// OpenBLAS not loadable: the native benchmarks will fail and the managed path is all there is.");
        Console.WriteLine($"// Eigensolver (Auto): {SymmetricEigensolver.Describe()}; OpenBLAS threads: {SymmetricEigensolver.NativeThreadCount?.ToString() ?? "n/a"}");
        (_molecule, _hessian) = SpringCluster(CartesianDimension / 3, 7);
        var n = CartesianDimension;
        var masses = Inertia.MassesAmu(_molecule);
        _matrix = new double[n * n];
        for (var i = 0; i < n; i++)
            for (var j = 0; j < n; j++)
                _matrix[i * n + j] = _hessian[i * n + j] / Math.Sqrt(masses[i / 3] * masses[j / 3]);
        _work = new double[n * n];
        _eigenvalues = new double[n];
    }

    [Benchmark(Baseline = true, Description = "FrequencyAnalysis, native dsyevd")]
    public VibrationalAnalysis Native() =>
        FrequencyAnalysis.FromHessian(_molecule, _hessian, new HessianOptions(Solver: EigenSolverChoice.Native));

    [Benchmark(Description = "FrequencyAnalysis, managed MathNet")]
    public VibrationalAnalysis Managed() =>
        FrequencyAnalysis.FromHessian(_molecule, _hessian, new HessianOptions(Solver: EigenSolverChoice.Managed));

    [Benchmark(Description = "dsyevd alone (plus an n² copy)")]
    public double DsyevdOnly()
    {
        Array.Copy(_matrix, _work, _matrix.Length);
        SymmetricEigensolver.Solve(_work, CartesianDimension, _eigenvalues, EigenSolverChoice.Native);
        return _eigenvalues[0];
    }

    /// <summary>A random cluster of atoms ~1.5 Å apart with harmonic springs between all pairs (stiff near, soft far).</summary>
    internal static (Molecule, double[]) SpringCluster(int atoms, int stream)
    {
        var rng = new Random(stream);
        var symbols = new[] { "C", "H", "N", "O", "H" };
        var side = Math.Cbrt(atoms) * 1.5;
        var positions = Enumerable.Range(0, atoms)
            .Select(_ => new Vec3(rng.NextDouble() * side, rng.NextDouble() * side, rng.NextDouble() * side)).ToArray();
        var m = new Molecule(Enumerable.Range(0, atoms).Select(i => Elements.Get(symbols[i % symbols.Length])), positions);
        var n = 3 * atoms;
        var h = new double[n * n];
        for (var a = 0; a < atoms; a++)
            for (var b = a + 1; b < atoms; b++)
            {
                var d = positions[b] - positions[a];
                var r = d.Length;
                var k = 0.3 * Math.Exp(-(r - 1.0)) * (0.5 + rng.NextDouble());
                var u = d / r;
                for (var x = 0; x < 3; x++)
                    for (var y = 0; y < 3; y++)
                    {
                        var v = k * u[x] * u[y];
                        h[(3 * a + x) * n + 3 * a + y] += v;
                        h[(3 * b + x) * n + 3 * b + y] += v;
                        h[(3 * a + x) * n + 3 * b + y] -= v;
                        h[(3 * b + x) * n + 3 * a + y] -= v;
                    }
            }
        return (m, h);
    }
}
