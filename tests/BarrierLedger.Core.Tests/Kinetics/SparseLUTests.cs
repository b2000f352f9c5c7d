using BarrierLedger.Core.Kinetics;
using BarrierLedger.Core.Tests.Support;
using MathNet.Numerics.LinearAlgebra;
using static BarrierLedger.Core.Tests.Kinetics.NetworkBuilder;

namespace BarrierLedger.Core.Tests.Kinetics;

public class SparseLUTests
{
    // An arrowhead matrix (full first row and column, diagonal elsewhere): eliminated in the given order the first pivot fills the
    // whole matrix; eliminated last it creates no fill at all — the standard first example of ordering in I. S. Duff, A. M. Erisman
    // and J. K. Reid, Direct Methods for Sparse Matrices (Oxford 1986), ch. 1 (from memory). Markowitz's cost of the hub is
    // (n − 1)², of every other diagonal entry 1, so the hub must come last (or next to last: with one
    // leaf left both cost the same).
    [Fact]
    public void Analyze_Arrowhead_EliminatesTheHubLastWithoutFill()
    {
        const int n = 12;
        var entries = Enumerable.Range(1, n - 1).SelectMany(i => new[] { (0, i), (i, 0) }).ToList();
        var pattern = SparsePattern.Analyze(n, entries);
        Assert.True(Array.IndexOf(pattern.Order, 0) >= n - 2, $"hub eliminated at position {Array.IndexOf(pattern.Order, 0)}");
        Assert.Equal(n + 2 * (n - 1), pattern.FactorEntries);
    }

    // Solution of A x = b for a random sparse, diagonally dominant A against MathNet's dense LU with partial pivoting (an
    // independent general-purpose computation), and b = A x reproduced (residual).
    [Fact]
    public void Solve_RandomSparseMatrix_AgreesWithDenseLU()
    {
        const int n = 40;
        var rng = new Random(7);
        var entries = new List<(int, int)>();
        var values = new List<double>();
        for (var e = 0; e < 160; e++)
        {
            var (r, c) = (rng.Next(n), rng.Next(n));
            if (r == c || entries.Contains((r, c))) continue;
            entries.Add((r, c));
            values.Add(rng.NextDouble() - 0.5);
        }
        var pattern = SparsePattern.Analyze(n, entries);
        var lu = new SparseLU(pattern);
        const double shift = 4.0;
        Assert.True(lu.FactorShiftedNegative(shift, values.ToArray()));
        var dense = Matrix<double>.Build.DenseIdentity(n) * shift;
        for (var e = 0; e < entries.Count; e++) dense[entries[e].Item1, entries[e].Item2] -= values[e];
        var b = Vector<double>.Build.Dense(n, i => Math.Sin(i + 1.0));
        var expected = dense.LU().Solve(b);
        var x = b.ToArray();
        lu.Solve(x);
        for (var i = 0; i < n; i++) Close.Relative(expected[i], x[i], 1e-12, $"x[{i}]", "MathNet dense LU with partial pivoting");
        var residual = dense * Vector<double>.Build.DenseOfArray(x) - b;
        Assert.True(residual.InfinityNorm() < 1e-13, $"residual {residual.InfinityNorm():G3}");
    }

    // [[ε, 1], [1, ε]] without row exchange needs the multiplier 1/ε: threshold pivoting (Duff, Erisman and Reid §5.4) refuses
    // it, so the integrator falls back to partial pivoting rather than lose digits to growth; [[2, 1], [1, 2]] is accepted.
    [Fact]
    public void Factor_SmallPivot_IsRefused()
    {
        var pattern = SparsePattern.Analyze(2, [(0, 1), (1, 0)]);
        var lu = new SparseLU(pattern);
        double[] values = [-1.0, -1.0]; // J = [[0, −1], [−1, 0]], so diagonal·I − J = [[d, 1], [1, d]]
        Assert.True(lu.FactorShiftedNegative(2.0, values));
        Assert.False(lu.FactorShiftedNegative(1e-12, values));
    }

    // The integrator's sparse elimination and its dense LU with partial pivoting give the same solution of a stiff 30-species
    // network with uni-, bi- and termolecular steps (rate constants over 12 decades): the same steps are taken, and the
    // concentrations agree to rounding (10⁻¹⁰ relative; the steps do not conserve molecules, so
    // some concentrations grow far above the initial ones). The dense run is the same system seen without its pattern.
    [Fact]
    public void Rodas4_SparseAndDenseElimination_GiveTheSameSolution()
    {
        var (network, y0) = RandomNetwork(30, 70, 11);
        var system = new MassActionSystem(new CompiledNetwork(network), TemperatureProgram.Isothermal(Room));
        var options = new StiffOptions(1e-8, 1e-14, NonNegative: true);
        double[] reports = [1e-6, 1e-3, 1.0, 1e3];
        var (sparseOutcome, sparseAt) = Integrate(new Rodas4(system, options), y0, reports);
        var (denseOutcome, denseAt) = Integrate(new Rodas4(new WithoutPattern(system), options), y0, reports);
        Assert.True(sparseOutcome.Completed, sparseOutcome.FailureReason);
        Assert.True(denseOutcome.Completed, denseOutcome.FailureReason);
        Assert.Equal(denseOutcome.Statistics.AcceptedSteps, sparseOutcome.Statistics.AcceptedSteps);
        Assert.Equal(denseOutcome.Statistics.RejectedSteps, sparseOutcome.Statistics.RejectedSteps);
        Assert.True(sparseOutcome.Statistics.DenseDecompositions < sparseOutcome.Statistics.Decompositions);
        Assert.Equal(denseOutcome.Statistics.Decompositions, denseOutcome.Statistics.DenseDecompositions);
        var largest = y0.Max();
        foreach (var t in reports)
            for (var i = 0; i < y0.Length; i++)
                Close.Absolute(denseAt[t][i], sparseAt[t][i], 1e-10 * Math.Max(largest, Math.Abs(denseAt[t][i])), $"[{network.Species[i]}]({t} s)", "same system, dense LU with partial pivoting (MathNet)");
    }

    // A pivot refused by the threshold test falls back to partial pivoting for that factorisation, and the step is the one the
    // dense factorisation gives. y′ = J y with J = [[c, 1], [1, 0]]: with h = 1 (1/(hγ) = 4, γ = 1/4) and c = 4 − 10⁻³ the first
    // pivot of 4 I − J is 10⁻³ against an off-diagonal 1.
    [Fact]
    public void Rodas4_RefusedPivot_FallsBackToPartialPivoting()
    {
        var system = new Linear2(4.0 - 1e-3);
        var sparse = new Rodas4(system, new StiffOptions(1e-6, 1e-12));
        var dense = new Rodas4(new Linear2Dense(system), new StiffOptions(1e-6, 1e-12));
        double[] y = [1.0, 0.5];
        var a = new double[2];
        var b = new double[2];
        sparse.TryStep(0, y, 1.0, a, out var errorSparse);
        dense.TryStep(0, y, 1.0, b, out var errorDense);
        Assert.Equal(1, sparse.Statistics.Decompositions);
        Assert.Equal(1, sparse.Statistics.DenseDecompositions);
        for (var i = 0; i < 2; i++) Close.Relative(b[i], a[i], 1e-14, $"y{i} after one step", "dense LU with partial pivoting (MathNet)");
        Close.Relative(errorDense, errorSparse, 1e-12, "error estimate", "dense LU with partial pivoting (MathNet)");
        // A step whose pivots pass goes the sparse way.
        sparse.TryStep(0, y, 1e-3, a, out _);
        Assert.Equal(1, sparse.Statistics.DenseDecompositions);
        Assert.Equal(2, sparse.Statistics.Decompositions);
    }

    private sealed class Linear2(double c) : ISparseStiffSystem
    {
        public int Dimension => 2;
        public SparsePattern JacobianPattern { get; } = SparsePattern.Analyze(2, [(0, 0), (0, 1), (1, 0)]);
        public void Derivative(double t, ReadOnlySpan<double> y, Span<double> dydt) { dydt[0] = c * y[0] + y[1]; dydt[1] = y[0]; }
        public void Jacobian(double t, ReadOnlySpan<double> y, double[] jacobian) { jacobian[0] = c; jacobian[1] = 1; jacobian[2] = 1; jacobian[3] = 0; }
        public bool TimeDerivative(double t, ReadOnlySpan<double> y, Span<double> dfdt) { dfdt.Clear(); return false; }
        public void JacobianValues(double t, ReadOnlySpan<double> y, Span<double> values) { values[0] = c; values[1] = 1; values[2] = 1; }
    }

    private sealed class Linear2Dense(Linear2 inner) : IStiffSystem
    {
        public int Dimension => 2;
        public void Derivative(double t, ReadOnlySpan<double> y, Span<double> dydt) => inner.Derivative(t, y, dydt);
        public void Jacobian(double t, ReadOnlySpan<double> y, double[] jacobian) => inner.Jacobian(t, y, jacobian);
        public bool TimeDerivative(double t, ReadOnlySpan<double> y, Span<double> dfdt) => inner.TimeDerivative(t, y, dfdt);
    }

    /// <summary>A mass-action system seen as a plain <see cref="IStiffSystem"/>, so <see cref="Rodas4"/> factors it densely.</summary>
    private sealed class WithoutPattern(MassActionSystem inner) : IStiffSystem
    {
        public int Dimension => inner.Dimension;
        public void Derivative(double t, ReadOnlySpan<double> y, Span<double> dydt) => inner.Derivative(t, y, dydt);
        public void Jacobian(double t, ReadOnlySpan<double> y, double[] jacobian) => inner.Jacobian(t, y, jacobian);
        public bool TimeDerivative(double t, ReadOnlySpan<double> y, Span<double> dfdt) => inner.TimeDerivative(t, y, dfdt);
    }

    private static (StiffOutcome, Dictionary<double, double[]>) Integrate(Rodas4 integrator, double[] y0, double[] reports)
    {
        var at = new Dictionary<double, double[]>();
        var outcome = integrator.Integrate(0, (double[])y0.Clone(), reports[^1], reports, (t0, ya, t1, yb) =>
        {
            if (reports.Contains(t1)) at[t1] = (double[])yb.Clone();
        });
        return (outcome, at);
    }

    // Random reversible steps X ⇌ Y, X + Y ⇌ Z and 2 X + Y ⇌ Z with Eyring rates from invented free energies (species within
    // ±8 kcal/mol, barriers 3–25 kcal/mol), so detailed balance holds and the network relaxes to equilibrium.
    private static (ReactionNetwork, double[]) RandomNetwork(int species, int steps, int key)
    {
        var rng = new Random(key);
        var names = Enumerable.Range(0, species).Select(i => $"X{i}").ToArray();
        var g = names.ToDictionary(x => x, _ => 16 * (rng.NextDouble() - 0.5));
        var levels = names.Select(x => Level(x, g[x])).ToList();
        string Pick() => names[rng.Next(species)];
        var list = new List<ElementaryStep>();
        while (list.Count < steps)
        {
            var (a, b, c) = (Pick(), Pick(), Pick());
            if (a == b || b == c || a == c) continue;
            var label = $"s{list.Count}";
            var (reactants, from, gFrom) = (list.Count % 3) switch
            {
                0 => (a, a, g[a]),
                1 => ($"{a} + {b}", $"{a}+{b}", g[a] + g[b]),
                _ => ($"2 {a} + {b}", $"2{a}+{b}", 2 * g[a] + g[b]),
            };
            if (levels.All(l => l.Key != from)) levels.Add(Level(from, gFrom));
            var product = list.Count % 3 == 0 ? b : c;
            levels.Add(Level($"TS{label}", Math.Max(gFrom, g[product]) + 3 + 22 * rng.NextDouble()));
            list.Add(Eyring(label, reactants, product, from, $"TS{label}", product));
        }
        var y0 = Enumerable.Range(0, species).Select(i => i < 5 ? 0.2 : 0.0).ToArray();
        return (new ReactionNetwork(names, list, levels, Room), y0);
    }
}
