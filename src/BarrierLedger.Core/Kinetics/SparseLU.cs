using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;

namespace BarrierLedger.Core.Kinetics;

/// <summary>
/// The nonzero pattern of a square matrix (the diagonal always included) with an elimination order chosen once, and the fill
/// that Gaussian elimination in that order creates. Used by <see cref="Rodas4"/> for the matrices (1/(hγ) I − J) of a system whose
/// Jacobian J keeps one pattern (a mass-action network: species i and j are coupled only through the steps they share).
/// The order is Markowitz's on the diagonal: at each stage the remaining diagonal entry with the smallest (rᵢ − 1)(cᵢ − 1), rᵢ and
/// cᵢ the nonzeros of its row and column in the remaining matrix, ties to the smaller rᵢ + cᵢ, then the lower index
/// (H. M. Markowitz, Management Sci. 3 (1957) 255; I. S. Duff, A. M. Erisman and J. K. Reid, Direct Methods for Sparse Matrices,
/// Oxford 1986, §7.2). Eliminating in a fixed order without row exchanges is how sparse Rosenbrock solvers for atmospheric
/// chemistry factor these matrices (A. Sandu, J. G. Verwer, M. van Loon et al., Atmos. Environ. 31 (1997) 3459); here each
/// factorisation also checks every multiplier against a threshold and reports failure, so the caller can fall back to partial
/// pivoting.
/// </summary>
public sealed class SparsePattern
{
    /// <summary>Size n of the matrix.</summary>
    public int Dimension { get; }

    /// <summary>Nonzero entries (row, column) as given (0-based), without repeats.</summary>
    public IReadOnlyList<(int Row, int Column)> Entries { get; }

    /// <summary>Entries of the L and U factors (fill included), a measure of the work per factorisation.</summary>
    public int FactorEntries { get; }

    // Elimination position of each original index, and the original index at each position.
    internal readonly int[] Position, Order;
    // Row p of the permuted, filled matrix: strictly lower columns (ascending) and strictly upper columns (ascending), as positions.
    internal readonly int[][] Lower, Upper;
    // Filled entries as offsets p·n + q in the permuted dense storage, and each given entry's offset.
    internal readonly int[] Filled, EntryOffset;

    private SparsePattern(int n, (int, int)[] entries, int[] order)
    {
        Dimension = n;
        Entries = entries;
        Order = order;
        Position = new int[n];
        for (var p = 0; p < n; p++) Position[order[p]] = p;
        // Symbolic elimination in the chosen order.
        var filled = new bool[n, n];
        for (var i = 0; i < n; i++) filled[Position[i], Position[i]] = true;
        foreach (var (r, c) in entries) filled[Position[r], Position[c]] = true;
        for (var k = 0; k < n; k++)
            for (var i = k + 1; i < n; i++)
            {
                if (!filled[i, k]) continue;
                for (var j = k + 1; j < n; j++)
                    if (filled[k, j]) filled[i, j] = true;
            }
        Lower = new int[n][];
        Upper = new int[n][];
        var offsets = new List<int>();
        for (var p = 0; p < n; p++)
        {
            var lower = new List<int>();
            var upper = new List<int>();
            for (var q = 0; q < n; q++)
            {
                if (!filled[p, q]) continue;
                offsets.Add(p * n + q);
                if (q < p) lower.Add(q);
                else if (q > p) upper.Add(q);
            }
            Lower[p] = [.. lower];
            Upper[p] = [.. upper];
        }
        Filled = [.. offsets];
        FactorEntries = Filled.Length;
        EntryOffset = [.. entries.Select(e => Position[e.Item1] * n + Position[e.Item2])];
    }

    /// <summary>
    /// Chooses the elimination order for an n×n pattern (Markowitz on the diagonal, see the class summary) and computes its fill.
    /// Throws <see cref="ArgumentException"/> for an entry outside the matrix.
    /// </summary>
    public static SparsePattern Analyze(int dimension, IEnumerable<(int Row, int Column)> entries)
    {
        if (dimension < 1) throw new ArgumentException($"The matrix must have at least one row, got {dimension}.", nameof(dimension));
        ArgumentNullException.ThrowIfNull(entries);
        var n = dimension;
        var list = new List<(int, int)>();
        var seen = new HashSet<(int, int)>();
        foreach (var (r, c) in entries)
        {
            if (r < 0 || r >= n || c < 0 || c >= n)
                throw new ArgumentException($"Entry ({r}, {c}) lies outside a {n}×{n} matrix.", nameof(entries));
            if (seen.Add((r, c))) list.Add((r, c));
        }
        var a = new bool[n, n];
        for (var i = 0; i < n; i++) a[i, i] = true;
        foreach (var (r, c) in list) a[r, c] = true;
        var remaining = new List<int>(Enumerable.Range(0, n));
        var order = new int[n];
        for (var stage = 0; stage < n; stage++)
        {
            var best = -1;
            long bestCost = long.MaxValue;
            var bestSum = int.MaxValue;
            foreach (var p in remaining)
            {
                int rows = 0, cols = 0;
                foreach (var q in remaining)
                {
                    if (a[p, q]) rows++;
                    if (a[q, p]) cols++;
                }
                var cost = (long)(rows - 1) * (cols - 1);
                if (cost < bestCost || (cost == bestCost && rows + cols < bestSum))
                {
                    (best, bestCost, bestSum) = (p, cost, rows + cols);
                }
            }
            order[stage] = best;
            remaining.Remove(best);
            foreach (var i in remaining)
            {
                if (!a[i, best]) continue;
                foreach (var j in remaining)
                    if (a[best, j]) a[i, j] = true;
            }
        }
        return new SparsePattern(n, [.. list], order);
    }
}

/// <summary>
/// LU factors of one matrix with a <see cref="SparsePattern"/>, eliminated in the pattern's order without row exchanges (row-wise
/// Doolittle: for each row, each multiplier lᵢₖ = aᵢₖ/aₖₖ in increasing k, then aᵢⱼ −= lᵢₖ aₖⱼ over row k's upper pattern). The
/// factorisation is refused when a multiplier exceeds 1/u in size, u = 0.1 — the threshold test of threshold partial pivoting,
/// which keeps the growth of the entries bounded (Duff, Erisman and Reid, Direct Methods for Sparse Matrices, §5.4 and §7.8) — or
/// when a pivot is zero or not finite; the caller then factors with partial pivoting instead.
/// </summary>
internal sealed class SparseLU
{
    /// <summary>Threshold u of the pivot test |aₖₖ| ≥ u |aᵢₖ|.</summary>
    public const double Threshold = 0.1;

    private readonly SparsePattern _pattern;
    private readonly int _n;
    private readonly double[] _a, _pivotInverse, _work;

    public SparseLU(SparsePattern pattern)
    {
        _pattern = pattern;
        _n = pattern.Dimension;
        _a = new double[_n * _n];
        _pivotInverse = new double[_n];
        _work = new double[_n];
    }

    public SparsePattern Pattern => _pattern;

    /// <summary>
    /// Loads diagonal·I − (matrix with the pattern's entries <paramref name="values"/>, in <see cref="SparsePattern.Entries"/> order)
    /// and factors it. Returns false when the threshold test or a pivot fails (the factors are then unusable).
    /// </summary>
    public bool FactorShiftedNegative(double diagonal, ReadOnlySpan<double> values)
    {
        var a = _a;
        var n = _n;
        foreach (var o in _pattern.Filled) a[o] = 0.0;
        var offsets = _pattern.EntryOffset;
        for (var e = 0; e < offsets.Length; e++) a[offsets[e]] -= values[e];
        for (var p = 0; p < n; p++) a[p * n + p] += diagonal;
        return Factor();
    }

    private bool Factor()
    {
        var a = _a;
        var n = _n;
        var lower = _pattern.Lower;
        var upper = _pattern.Upper;
        var limit = 1.0 / Threshold;
        for (var i = 0; i < n; i++)
        {
            var row = i * n;
            foreach (var k in lower[i])
            {
                var l = a[row + k] * _pivotInverse[k];
                if (!(Math.Abs(l) <= limit)) return false;
                a[row + k] = l;
                if (l == 0.0) continue;
                // Every offset comes from the pattern (row and column below n), so the inner loop skips bounds checks.
                ref var target = ref Unsafe.Add(ref MemoryMarshal.GetArrayDataReference(a), row);
                ref var source = ref Unsafe.Add(ref MemoryMarshal.GetArrayDataReference(a), k * n);
                foreach (var j in upper[k]) Unsafe.Add(ref target, j) -= l * Unsafe.Add(ref source, j);
            }
            var pivot = a[row + i];
            if (pivot == 0.0 || !double.IsFinite(pivot)) return false;
            _pivotInverse[i] = 1.0 / pivot;
        }
        return true;
    }

    /// <summary>Solves A x = b in place (b in the original order).</summary>
    public void Solve(Span<double> b)
    {
        var a = _a;
        var n = _n;
        var x = _work;
        var order = _pattern.Order;
        for (var p = 0; p < n; p++) x[p] = b[order[p]];
        var lower = _pattern.Lower;
        for (var i = 0; i < n; i++)
        {
            var row = i * n;
            var s = x[i];
            foreach (var k in lower[i]) s -= a[row + k] * x[k];
            x[i] = s;
        }
        var upper = _pattern.Upper;
        for (var i = n - 1; i >= 0; i--)
        {
            var row = i * n;
            var s = x[i];
            foreach (var j in upper[i]) s -= a[row + j] * x[j];
            x[i] = s * _pivotInverse[i];
        }
        for (var p = 0; p < n; p++) b[order[p]] = x[p];
    }
}
