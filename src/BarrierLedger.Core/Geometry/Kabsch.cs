using System.Collections.Immutable;
using MathNet.Numerics.LinearAlgebra;

namespace BarrierLedger.Core.Geometry;

/// <summary>
/// The result of a Kabsch superposition.
/// </summary>
/// <param name="RmsdAngstrom">√(Σ |R(p_i − p̄) + q̄ − q_i|² / N) in Å after the best proper rotation.</param>
/// <param name="RotationRowMajor">The 3×3 proper rotation R (det +1), row-major, applied to the centred mobile positions.</param>
/// <param name="AlignedAngstrom">The mobile positions after centring, rotating and moving onto the reference centroid.</param>
public sealed record KabschResult(double RmsdAngstrom, ImmutableArray<double> RotationRowMajor, ImmutableArray<Vec3> AlignedAngstrom);

/// <summary>
/// Least-squares superposition of two point sets with the same atom order (Kabsch, Acta Cryst. A 1976, 32, 922;
/// correction for improper rotations, Acta Cryst. A 1978, 34, 827). Both sets are centred on their (unweighted) centroids;
/// with H = Σ p_i q_iᵀ = U S Vᵀ (SVD) the rotation is R = V diag(1, 1, d) Uᵀ with d = sign det(V Uᵀ), so a mirror image is
/// never returned as a rotation.
/// </summary>
public static class Kabsch
{
    /// <summary>Superposes <paramref name="mobile"/> onto <paramref name="reference"/> (same length, same atom order).</summary>
    public static KabschResult Superpose(IReadOnlyList<Vec3> mobile, IReadOnlyList<Vec3> reference)
    {
        ArgumentNullException.ThrowIfNull(mobile);
        ArgumentNullException.ThrowIfNull(reference);
        if (mobile.Count != reference.Count)
            throw new ArgumentException($"Cannot superpose {mobile.Count} positions onto {reference.Count}; atom counts differ.", nameof(mobile));
        if (mobile.Count == 0) throw new ArgumentException("Cannot superpose empty structures.", nameof(mobile));
        var n = mobile.Count;
        var pc = Centroid(mobile);
        var qc = Centroid(reference);
        var h = Matrix<double>.Build.Dense(3, 3);
        for (var i = 0; i < n; i++)
        {
            var p = mobile[i] - pc;
            var q = reference[i] - qc;
            for (var r = 0; r < 3; r++)
                for (var c = 0; c < 3; c++)
                    h[r, c] += p[r] * q[c];
        }
        var svd = h.Svd(computeVectors: true);
        var u = svd.U;
        var v = svd.VT.Transpose();
        var d = Math.Sign((v * u.Transpose()).Determinant());
        if (d == 0) d = 1;
        var rot = v * Matrix<double>.Build.DenseOfDiagonalArray([1.0, 1.0, d]) * u.Transpose();
        var aligned = new Vec3[n];
        var sum = 0.0;
        for (var i = 0; i < n; i++)
        {
            var p = mobile[i] - pc;
            var x = new Vec3(
                rot[0, 0] * p.X + rot[0, 1] * p.Y + rot[0, 2] * p.Z,
                rot[1, 0] * p.X + rot[1, 1] * p.Y + rot[1, 2] * p.Z,
                rot[2, 0] * p.X + rot[2, 1] * p.Y + rot[2, 2] * p.Z) + qc;
            aligned[i] = x;
            sum += (x - reference[i]).LengthSquared;
        }
        var rowMajor = new double[9];
        for (var r = 0; r < 3; r++) for (var c = 0; c < 3; c++) rowMajor[3 * r + c] = rot[r, c];
        return new KabschResult(Math.Sqrt(sum / n), [.. rowMajor], [.. aligned]);
    }

    /// <summary>The RMSD in Å after superposition of <paramref name="mobile"/> onto <paramref name="reference"/>.</summary>
    public static double Rmsd(Molecule mobile, Molecule reference) =>
        Superpose(mobile.PositionsAngstrom, reference.PositionsAngstrom).RmsdAngstrom;

    private static Vec3 Centroid(IReadOnlyList<Vec3> points)
    {
        var s = Vec3.Zero;
        foreach (var p in points) s += p;
        return s / points.Count;
    }
}
