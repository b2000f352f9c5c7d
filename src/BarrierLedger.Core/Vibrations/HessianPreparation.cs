using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Vibrations;

/// <summary>
/// The input side of a frequency analysis: atomic masses (standard or given), the size of the Hessian, and one tiled pass that
/// finds non-finite elements and the worst asymmetry while it symmetrises and mass-weights (F_ij = ½(H_ij + H_ji)/√(m_i m_j)).
/// </summary>
internal static class HessianPreparation
{
    internal static double[] ResolveMasses(Molecule molecule, HessianOptions options)
    {
        if (options.MassesAmu is null) return Inertia.MassesAmu(molecule);
        if (options.MassesAmu.Count != molecule.AtomCount)
            throw new HessianException(HessianProblem.BadMasses, $"{options.MassesAmu.Count} masses given for {molecule.AtomCount} atoms.", nameof(options));
        for (var i = 0; i < molecule.AtomCount; i++)
            if (!(options.MassesAmu[i] > 0) || !double.IsFinite(options.MassesAmu[i]))
                throw new HessianException(HessianProblem.BadMasses,
                    $"Mass of atom {molecule.AtomLabel(i)} must be positive and finite, got {options.MassesAmu[i]}.", nameof(options));
        return [.. options.MassesAmu];
    }

    internal static void CheckSize(Molecule molecule, double[] h)
    {
        var n = 3 * molecule.AtomCount;
        if (h.Length == n * n) return;
        var side = Math.Sqrt(h.Length);
        var hint = side == Math.Floor(side) ? $" (a {side}×{side} matrix, which fits {side / 3:0.##} atoms)" : "";
        throw new HessianException(HessianProblem.SizeMismatch,
            $"Hessian has {h.Length} elements{hint}, but {molecule.AtomCount} atoms need 3N×3N = {n}×{n} = {n * n}.");
    }

    internal readonly record struct HessianScan(double WorstAsymmetry, int WorstRow, int WorstColumn, int NonFiniteIndex, double NormInf);

    /// <summary>
    /// F_ij = F_ji = ½(H_ij + H_ji)/√(m_i m_j) into <paramref name="f"/>, and in the same pass the largest |H_ij − H_ji| with its
    /// position, the first non-finite element and the ∞-norm of F. Works on 32×32 tiles of the upper triangle: reading H column-wise
    /// element by element would miss the cache on every access for large n.
    /// </summary>
    internal static HessianScan SymmetriseAndMassWeight(double[] h, int n, double[] invSqrtMass, double[] f)
    {
        const int tile = 32;
        var worst = 0.0;
        var (worstRow, worstColumn) = (0, 0);
        var nonFinite = -1;
        var rowSums = new double[n];
        for (var bi = 0; bi < n; bi += tile)
        {
            var iEnd = Math.Min(bi + tile, n);
            for (var bj = bi; bj < n; bj += tile)
            {
                var jEnd = Math.Min(bj + tile, n);
                for (var i = bi; i < iEnd; i++)
                {
                    var rowI = i * n;
                    var wI = 0.5 * invSqrtMass[i];
                    var sumI = 0.0;
                    for (var j = bj == bi ? i : bj; j < jEnd; j++)
                    {
                        var a = h[rowI + j];
                        var b = h[j * n + i];
                        if (!double.IsFinite(a) || !double.IsFinite(b))
                        {
                            var index = double.IsFinite(a) ? j * n + i : rowI + j;
                            if (nonFinite < 0 || index < nonFinite) nonFinite = index;
                            continue;
                        }
                        var diff = Math.Abs(a - b);
                        if (diff > worst) { worst = diff; worstRow = i; worstColumn = j; }
                        var v = (a + b) * wI * invSqrtMass[j];
                        f[rowI + j] = v;
                        f[j * n + i] = v;
                        var abs = Math.Abs(v);
                        sumI += abs;
                        if (j != i) rowSums[j] += abs;
                    }
                    rowSums[i] += sumI;
                }
            }
        }
        return new HessianScan(worst, worstRow, worstColumn, nonFinite, rowSums.Length == 0 ? 0.0 : rowSums.Max());
    }

    internal static string Coordinate(Molecule m, int index) => $"{m.AtomLabel(index / 3)} {"xyz"[index % 3]}";
}
