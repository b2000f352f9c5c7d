using System.Numerics;
using System.Runtime.InteropServices;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Vibrations;

/// <summary>
/// Translations and rotations: the molecule's shape (atom, linear, non-linear), the orthonormal basis D of mass-weighted
/// rigid-body motions, the projection of D out of the mass-weighted Hessian as a rank-2k update with a shift that places the
/// rigid-body eigenvalues above the vibrational spectrum (Miller, Handy and Adams, J. Chem. Phys. 72, 99 (1980)), and the
/// removal of rigid-body modes from a list of modes given directly.
/// </summary>
internal static class RigidBodyProjection
{
    internal static MolecularShape ShapeOf(Molecule molecule, double[] masses, double linearTolerance)
    {
        if (molecule.AtomCount == 1) return MolecularShape.Atom;
        var (moments, _) = Inertia.PrincipalAxes(molecule, masses);
        return moments[0] <= linearTolerance ? MolecularShape.Linear : MolecularShape.NonLinear;
    }

    /// <summary>
    /// Rows of the orthonormal k×3N basis of mass-weighted translations and rotations, row-major in one array.
    /// </summary>
    internal static double[] RigidBodyBasis(Molecule molecule, double[] masses, MolecularShape shape)
    {
        var atoms = molecule.AtomCount;
        var n = 3 * atoms;
        var vectors = new List<double[]>();
        for (var alpha = 0; alpha < 3; alpha++)
        {
            var t = new double[n];
            for (var a = 0; a < atoms; a++) t[3 * a + alpha] = Math.Sqrt(masses[a]);
            vectors.Add(t);
        }
        if (shape != MolecularShape.Atom)
        {
            var com = Inertia.CentreOfMass(molecule, masses);
            var (_, axes) = Inertia.PrincipalAxes(molecule, masses);
            // For a linear molecule the axis with the smallest moment is the molecular axis: no rotation about it.
            for (var p = shape == MolecularShape.Linear ? 1 : 0; p < 3; p++)
            {
                var r = new double[n];
                for (var a = 0; a < atoms; a++)
                {
                    var v = axes[p].Cross(molecule.PositionsAngstrom[a] - com) * Math.Sqrt(masses[a]);
                    r[3 * a] = v.X;
                    r[3 * a + 1] = v.Y;
                    r[3 * a + 2] = v.Z;
                }
                vectors.Add(r);
            }
        }
        // Modified Gram–Schmidt, twice (the vectors are orthogonal in exact arithmetic; this removes round-off).
        for (var pass = 0; pass < 2; pass++)
            for (var c = 0; c < vectors.Count; c++)
            {
                var v = vectors[c];
                for (var b = 0; b < c; b++)
                {
                    var dot = Dot(v, vectors[b]);
                    for (var i = 0; i < n; i++) v[i] -= dot * vectors[b][i];
                }
                var norm = Math.Sqrt(Dot(v, v));
                if (norm < 1e-8)
                    throw new InvalidOperationException($"Rigid-body motion {c + 1} vanishes for a {shape} structure; the geometry may have coincident atoms.");
                for (var i = 0; i < n; i++) v[i] /= norm;
            }
        var d = new double[vectors.Count * n];
        for (var c = 0; c < vectors.Count; c++) vectors[c].CopyTo(d, c * n);
        return d;
    }

    /// <summary>In place: F ← F − Dᵀ Wᵀ − W D with G = F Dᵀ, M = D G + s·1, W = G − ½ Dᵀ M (a rank-2k update, O(n²k)).</summary>
    internal static void ProjectAndShift(double[] f, int n, double[] d, int k, double shift)
    {
        // G (n×k), row-major: G[i,c] = Σ_j F[i,j] D[c,j]
        var g = new double[n * k];
        for (var i = 0; i < n; i++)
        {
            var row = f.AsSpan(i * n, n);
            for (var c = 0; c < k; c++) g[i * k + c] = Dot(row, d.AsSpan(c * n, n));
        }
        // M (k×k) = D G + s·1
        var m = new double[k * k];
        for (var c = 0; c < k; c++)
            for (var e = 0; e < k; e++)
            {
                var sum = 0.0;
                for (var i = 0; i < n; i++) sum += d[c * n + i] * g[i * k + e];
                m[c * k + e] = sum + (c == e ? shift : 0.0);
            }
        // Symmetrise M against round-off.
        for (var c = 0; c < k; c++)
            for (var e = c + 1; e < k; e++)
                m[c * k + e] = m[e * k + c] = 0.5 * (m[c * k + e] + m[e * k + c]);
        // W (n×k) = G − ½ Dᵀ M, stored transposed (k×n) so the update loop reads rows contiguously.
        var wt = new double[k * n];
        for (var i = 0; i < n; i++)
            for (var c = 0; c < k; c++)
            {
                var sum = 0.0;
                for (var e = 0; e < k; e++) sum += d[e * n + i] * m[e * k + c];
                wt[c * n + i] = g[i * k + c] - 0.5 * sum;
            }
        // F[i,j] −= Σ_c D[c,i] W[j,c] + W[i,c] D[c,j]
        Span<double> di = stackalloc double[k];
        Span<double> wi = stackalloc double[k];
        for (var i = 0; i < n; i++)
        {
            for (var c = 0; c < k; c++) { di[c] = d[c * n + i]; wi[c] = wt[c * n + i]; }
            var row = f.AsSpan(i * n, n);
            for (var c = 0; c < k; c++)
            {
                SubtractTwo(row, di[c], wt.AsSpan(c * n, n), wi[c], d.AsSpan(c * n, n));
            }
        }
    }

    internal static (MolecularShape Shape, IReadOnlyList<NormalMode> Kept, int Removed) DropRigidBodyModes(
        Molecule molecule, IReadOnlyList<NormalMode> modes, string paramName)
    {
        if (molecule.AtomCount == 0) throw new ArgumentException("The molecule has no atoms.", nameof(molecule));
        var shape = Inertia.Shape(molecule);
        var external = Inertia.ExternalDegreesOfFreedom(shape);
        var n = 3 * molecule.AtomCount;
        if (modes.Count == n)
        {
            var byMagnitude = modes.OrderBy(m => Math.Abs(m.FrequencyCm1)).ToArray();
            return (shape, byMagnitude[external..], external);
        }
        if (modes.Count > n - external)
            throw new ArgumentException(
                $"{modes.Count} modes given for a {shape} structure of {molecule.AtomCount} atoms: expected at most 3N − {external} = {n - external} " +
                $"vibrations, or all 3N = {n} including translations and rotations.", paramName);
        return (shape, modes, 0);
    }

    private static double Dot(ReadOnlySpan<double> a, ReadOnlySpan<double> b)
    {
        var i = 0;
        var sum = 0.0;
        if (Vector.IsHardwareAccelerated && a.Length >= 2 * Vector<double>.Count)
        {
            var acc = Vector<double>.Zero;
            var va = MemoryMarshal.Cast<double, Vector<double>>(a);
            var vb = MemoryMarshal.Cast<double, Vector<double>>(b);
            for (var v = 0; v < va.Length; v++) acc += va[v] * vb[v];
            sum = Vector.Sum(acc);
            i = va.Length * Vector<double>.Count;
        }
        for (; i < a.Length; i++) sum += a[i] * b[i];
        return sum;
    }

    /// <summary>row[j] −= a·x[j] + b·y[j].</summary>
    private static void SubtractTwo(Span<double> row, double a, ReadOnlySpan<double> x, double b, ReadOnlySpan<double> y)
    {
        var j = 0;
        if (Vector.IsHardwareAccelerated && row.Length >= 2 * Vector<double>.Count)
        {
            var vr = MemoryMarshal.Cast<double, Vector<double>>(row);
            var vx = MemoryMarshal.Cast<double, Vector<double>>(x);
            var vy = MemoryMarshal.Cast<double, Vector<double>>(y);
            var va = new Vector<double>(a);
            var vbb = new Vector<double>(b);
            for (var v = 0; v < vr.Length; v++) vr[v] -= va * vx[v] + vbb * vy[v];
            j = vr.Length * Vector<double>.Count;
        }
        for (; j < row.Length; j++) row[j] -= a * x[j] + b * y[j];
    }
}
