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

    /// <summary>
    /// The same least-squares superposition without allocation, for inner loops that compare many pairs (conformer ensembles,
    /// atom mappings): the optimal proper rotation as the unit quaternion of the largest eigenvalue of Horn's symmetric 4×4 matrix
    /// built from H = Σ p_i q_iᵀ (Horn, J. Opt. Soc. Am. A 1987, 4, 629), which is the rotation <see cref="Superpose"/> returns
    /// (a quaternion is always a proper rotation, as the determinant correction ensures there). The 4×4 eigenproblem is solved by
    /// cyclic Jacobi rotations; the RMSD is summed from the rotated positions (not from the eigenvalue, which would lose digits
    /// near zero).
    /// </summary>
    /// <param name="mobile">Positions to move, Å.</param>
    /// <param name="reference">Positions to move onto (same count and order), Å.</param>
    /// <param name="rotationRowMajor">Receives R (9 values, row-major), applied as R(x − <paramref name="mobileCentroid"/>) + <paramref name="referenceCentroid"/>.</param>
    /// <param name="mobileCentroid">Centroid of <paramref name="mobile"/>.</param>
    /// <param name="referenceCentroid">Centroid of <paramref name="reference"/>.</param>
    /// <returns>The RMSD after superposition, Å.</returns>
    public static double Fit(ReadOnlySpan<Vec3> mobile, ReadOnlySpan<Vec3> reference, Span<double> rotationRowMajor, out Vec3 mobileCentroid, out Vec3 referenceCentroid)
    {
        if (mobile.Length != reference.Length)
            throw new ArgumentException($"Cannot superpose {mobile.Length} positions onto {reference.Length}; atom counts differ.", nameof(mobile));
        if (mobile.Length == 0) throw new ArgumentException("Cannot superpose empty structures.", nameof(mobile));
        if (rotationRowMajor.Length < 9) throw new ArgumentException("The rotation needs 9 values.", nameof(rotationRowMajor));
        var n = mobile.Length;
        Vec3 pc = Vec3.Zero, qc = Vec3.Zero;
        for (var i = 0; i < n; i++) { pc += mobile[i]; qc += reference[i]; }
        pc /= n;
        qc /= n;
        double sxx = 0, sxy = 0, sxz = 0, syx = 0, syy = 0, syz = 0, szx = 0, szy = 0, szz = 0;
        for (var i = 0; i < n; i++)
        {
            var p = mobile[i] - pc;
            var q = reference[i] - qc;
            sxx += p.X * q.X; sxy += p.X * q.Y; sxz += p.X * q.Z;
            syx += p.Y * q.X; syy += p.Y * q.Y; syz += p.Y * q.Z;
            szx += p.Z * q.X; szy += p.Z * q.Y; szz += p.Z * q.Z;
        }
        Span<double> k = stackalloc double[16];
        k[0] = sxx + syy + szz; k[1] = syz - szy; k[2] = szx - sxz; k[3] = sxy - syx;
        k[5] = sxx - syy - szz; k[6] = sxy + syx; k[7] = szx + sxz;
        k[10] = -sxx + syy - szz; k[11] = syz + szy;
        k[15] = -sxx - syy + szz;
        k[4] = k[1]; k[8] = k[2]; k[12] = k[3]; k[9] = k[6]; k[13] = k[7]; k[14] = k[11];
        Span<double> v = stackalloc double[16];
        Jacobi4(k, v);
        var top = 0;
        for (var i = 1; i < 4; i++) if (k[5 * i] > k[5 * top]) top = i;
        double w = v[top], x = v[4 + top], y = v[8 + top], z = v[12 + top];
        var norm = Math.Sqrt(w * w + x * x + y * y + z * z);
        w /= norm; x /= norm; y /= norm; z /= norm;
        var r = rotationRowMajor;
        r[0] = w * w + x * x - y * y - z * z; r[1] = 2 * (x * y - w * z); r[2] = 2 * (x * z + w * y);
        r[3] = 2 * (x * y + w * z); r[4] = w * w - x * x + y * y - z * z; r[5] = 2 * (y * z - w * x);
        r[6] = 2 * (x * z - w * y); r[7] = 2 * (y * z + w * x); r[8] = w * w - x * x - y * y + z * z;
        var sum = 0.0;
        for (var i = 0; i < n; i++)
        {
            var p = mobile[i] - pc;
            var d = new Vec3(r[0] * p.X + r[1] * p.Y + r[2] * p.Z, r[3] * p.X + r[4] * p.Y + r[5] * p.Z, r[6] * p.X + r[7] * p.Y + r[8] * p.Z) + qc - reference[i];
            sum += d.LengthSquared;
        }
        mobileCentroid = pc;
        referenceCentroid = qc;
        return Math.Sqrt(sum / n);
    }

    /// <summary>Eigen-decomposition of a symmetric 4×4 matrix a (row-major) by cyclic Jacobi rotations: eigenvalues left on a's diagonal, eigenvectors in v's columns.</summary>
    private static void Jacobi4(Span<double> a, Span<double> v)
    {
        v.Clear();
        v[0] = v[5] = v[10] = v[15] = 1;
        var scale = 0.0;
        for (var i = 0; i < 16; i++) scale = Math.Max(scale, Math.Abs(a[i]));
        if (scale == 0) return;
        for (var sweep = 0; sweep < 50; sweep++)
        {
            var off = 0.0;
            for (var p = 0; p < 3; p++) for (var q = p + 1; q < 4; q++) off += a[4 * p + q] * a[4 * p + q];
            if (off <= 1e-30 * scale * scale) return;
            for (var p = 0; p < 3; p++)
                for (var q = p + 1; q < 4; q++)
                {
                    var apq = a[4 * p + q];
                    if (Math.Abs(apq) <= 1e-300) continue;
                    var theta = (a[5 * q] - a[5 * p]) / (2 * apq);
                    var t = Math.Sign(theta) / (Math.Abs(theta) + Math.Sqrt(theta * theta + 1));
                    if (theta == 0) t = 1;
                    var c = 1 / Math.Sqrt(t * t + 1);
                    var s = t * c;
                    for (var k = 0; k < 4; k++)
                    {
                        var akp = a[4 * k + p];
                        var akq = a[4 * k + q];
                        a[4 * k + p] = c * akp - s * akq;
                        a[4 * k + q] = s * akp + c * akq;
                    }
                    for (var k = 0; k < 4; k++)
                    {
                        var apk = a[4 * p + k];
                        var aqk = a[4 * q + k];
                        a[4 * p + k] = c * apk - s * aqk;
                        a[4 * q + k] = s * apk + c * aqk;
                    }
                    for (var k = 0; k < 4; k++)
                    {
                        var vkp = v[4 * k + p];
                        var vkq = v[4 * k + q];
                        v[4 * k + p] = c * vkp - s * vkq;
                        v[4 * k + q] = s * vkp + c * vkq;
                    }
                }
        }
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
