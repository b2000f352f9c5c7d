using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Tests.Support;
using MathNet.Numerics.LinearAlgebra;

namespace BarrierLedger.Core.Tests.Geometry;

public class KabschTests
{
    private static Vec3 Rotate(Vec3 v, Vec3 axis, double angle)
    {
        // Rodrigues' rotation formula.
        var k = axis.Normalized();
        return v * Math.Cos(angle) + k.Cross(v) * Math.Sin(angle) + k * (k.Dot(v) * (1 - Math.Cos(angle)));
    }

    [Fact]
    public void SelfMatchAfterRotationAndTranslation_RmsdBelow1e8()
    {
        // Kabsch, Acta Cryst. A 1976, 32, 922: a rigidly moved copy superposes exactly. Issue criterion: RMSD < 1e-8 Å.
        var m = InternalCoordinatesTests.StaggeredEthane();
        var moved = m.PositionsAngstrom.Select(p => Rotate(p, new Vec3(0.3, -1.2, 0.7), 2.1) + new Vec3(4.0, -3.0, 12.5)).ToList();
        var r = Kabsch.Superpose(moved, m.PositionsAngstrom);
        Assert.True(r.RmsdAngstrom < 1e-8, $"RMSD {r.RmsdAngstrom:G3} Å");
        var rot = r.RotationRowMajor;
        var det = rot[0] * (rot[4] * rot[8] - rot[5] * rot[7]) - rot[1] * (rot[3] * rot[8] - rot[5] * rot[6]) + rot[2] * (rot[3] * rot[7] - rot[4] * rot[6]);
        Assert.True(Math.Abs(det - 1) < 1e-12, $"det R = {det}");
    }

    [Fact]
    public void MirrorImage_IsNotSuperposedByARotation()
    {
        // Kabsch, Acta Cryst. A 1978, 34, 827: without the sign correction a reflection would give RMSD 0 for a chiral set.
        Vec3[] chiral = [new(0, 0, 0), new(1.1, 0, 0), new(0, 1.4, 0), new(0, 0, 1.8), new(-0.6, -0.7, -0.5)];
        var mirror = chiral.Select(p => new Vec3(-p.X, p.Y, p.Z)).ToArray();
        Assert.True(Kabsch.Superpose(mirror, chiral).RmsdAngstrom > 0.1);
    }

    [Fact]
    public void PerturbedStructure_RotationIsLocallyOptimal()
    {
        // Property check: turning the optimal superposition by any small rotation about its centroid never lowers the RMSD.
        var m = InternalCoordinatesTests.StaggeredEthane();
        var rng = new Random(7);
        var noisy = m.PositionsAngstrom.Select(p => p + new Vec3(rng.NextDouble() - 0.5, rng.NextDouble() - 0.5, rng.NextDouble() - 0.5) * 0.2).ToList();
        var best = Kabsch.Superpose(noisy, m.PositionsAngstrom);
        var c = best.AlignedAngstrom.Aggregate(Vec3.Zero, (a, b) => a + b) / best.AlignedAngstrom.Length;
        foreach (var axis in new[] { new Vec3(1, 0, 0), new Vec3(0, 1, 0), new Vec3(0, 0, 1), new Vec3(1, 1, 1) })
            foreach (var angle in new[] { -1e-3, 1e-3 })
            {
                var turned = best.AlignedAngstrom.Select(p => Rotate(p - c, axis, angle) + c).ToArray();
                var rmsd = Math.Sqrt(turned.Zip(m.PositionsAngstrom, (a, b) => (a - b).LengthSquared).Sum() / turned.Length);
                Assert.True(rmsd >= best.RmsdAngstrom - 1e-12, $"turning by {angle} about {axis} lowered RMSD to {rmsd} from {best.RmsdAngstrom}");
            }
    }

    /// <summary>
    /// Independent reference: Horn's closed-form unit-quaternion solution (B. K. P. Horn, J. Opt. Soc. Am. A 1987, 4, 629). The
    /// best rotation is the unit quaternion that is the eigenvector of the largest eigenvalue λ of the symmetric 4×4 matrix N built
    /// from S_ab = Σ p_a q_b (centred sets); RMSD² = (Σ|p|² + Σ|q|² − 2λ)/n. An eigenproblem, not an SVD: a different route to the same optimum.
    /// </summary>
    private static (double[] Rotation, double Rmsd) Horn(IReadOnlyList<Vec3> mobile, IReadOnlyList<Vec3> reference)
    {
        var n = mobile.Count;
        var pc = mobile.Aggregate(Vec3.Zero, (a, b) => a + b) / n;
        var qc = reference.Aggregate(Vec3.Zero, (a, b) => a + b) / n;
        var s = new double[3, 3];
        double pp = 0, qq = 0;
        for (var i = 0; i < n; i++)
        {
            var p = mobile[i] - pc;
            var q = reference[i] - qc;
            pp += p.LengthSquared;
            qq += q.LengthSquared;
            for (var a = 0; a < 3; a++) for (var b = 0; b < 3; b++) s[a, b] += p[a] * q[b];
        }
        var N = Matrix<double>.Build.DenseOfArray(new[,]
        {
            { s[0, 0] + s[1, 1] + s[2, 2], s[1, 2] - s[2, 1], s[2, 0] - s[0, 2], s[0, 1] - s[1, 0] },
            { s[1, 2] - s[2, 1], s[0, 0] - s[1, 1] - s[2, 2], s[0, 1] + s[1, 0], s[2, 0] + s[0, 2] },
            { s[2, 0] - s[0, 2], s[0, 1] + s[1, 0], -s[0, 0] + s[1, 1] - s[2, 2], s[1, 2] + s[2, 1] },
            { s[0, 1] - s[1, 0], s[2, 0] + s[0, 2], s[1, 2] + s[2, 1], -s[0, 0] - s[1, 1] + s[2, 2] },
        });
        var evd = N.Evd(Symmetricity.Symmetric);
        var k = Enumerable.Range(0, 4).MaxBy(i => evd.EigenValues[i].Real);
        var lambda = evd.EigenValues[k].Real;
        var v = evd.EigenVectors.Column(k);
        double q0 = v[0], qx = v[1], qy = v[2], qz = v[3];
        double[] r =
        [
            q0 * q0 + qx * qx - qy * qy - qz * qz, 2 * (qx * qy - q0 * qz), 2 * (qx * qz + q0 * qy),
            2 * (qy * qx + q0 * qz), q0 * q0 - qx * qx + qy * qy - qz * qz, 2 * (qy * qz - q0 * qx),
            2 * (qz * qx - q0 * qy), 2 * (qz * qy + q0 * qx), q0 * q0 - qx * qx - qy * qy + qz * qz,
        ];
        return (r, Math.Sqrt(Math.Max(0, pp + qq - 2 * lambda) / n));
    }

    private static Vec3 Apply(IReadOnlyList<double> r, Vec3 v) =>
        new(r[0] * v.X + r[1] * v.Y + r[2] * v.Z, r[3] * v.X + r[4] * v.Y + r[5] * v.Z, r[6] * v.X + r[7] * v.Y + r[8] * v.Z);

    [Fact]
    public void KnownRotationAndTranslation_AreRecoveredTo1e10()
    {
        // A rigid motion x' = R0 x + t0 with R0 from Rodrigues' formula: Kabsch must return R0 and, with the centroids, t0.
        var rng = new Random(11);
        var points = Enumerable.Range(0, 12).Select(_ => new Vec3(rng.NextDouble() * 4 - 2, rng.NextDouble() * 4 - 2, rng.NextDouble() * 4 - 2)).ToArray();
        var axis = new Vec3(0.2, -0.9, 0.4).Normalized();
        const double angle = 2.6;
        var t0 = new Vec3(-3.25, 7.5, 0.125);
        var moved = points.Select(p => Rotate(p, axis, angle) + t0).ToArray();
        var r = Kabsch.Superpose(points, moved);
        Vec3[] basis = [new(1, 0, 0), new(0, 1, 0), new(0, 0, 1)];
        for (var c = 0; c < 3; c++)
        {
            var expected = Rotate(basis[c], axis, angle); // column c of R0
            for (var row = 0; row < 3; row++)
                Close.Absolute(expected[row], r.RotationRowMajor[3 * row + c], 1e-10, $"R[{row},{c}]", "Rodrigues' rotation formula (construction)");
        }
        var pc = points.Aggregate(Vec3.Zero, (a, b) => a + b) / points.Length;
        var qc = moved.Aggregate(Vec3.Zero, (a, b) => a + b) / moved.Length;
        var t = qc - Apply(r.RotationRowMajor, pc);
        for (var k = 0; k < 3; k++) Close.Absolute(t0[k], t[k], 1e-10, $"translation component {k}", "the applied translation (construction)");
        Close.Absolute(0, r.RmsdAngstrom, 1e-10, "RMSD of an exact rigid copy", "Kabsch, Acta Cryst. A 1976, 32, 922");
    }

    [Fact]
    public void NoisyStructure_RotationAndRmsd_AgreeWithHornsQuaternionSolutionTo1e10()
    {
        var m = InternalCoordinatesTests.StaggeredEthane();
        var rng = new Random(5);
        var noisy = m.PositionsAngstrom.Select(p => Rotate(p, new Vec3(1, 2, -0.5), 0.9) + new Vec3(1, -2, 3)
            + new Vec3(rng.NextDouble() - 0.5, rng.NextDouble() - 0.5, rng.NextDouble() - 0.5) * 0.3).ToList();
        var kabsch = Kabsch.Superpose(noisy, m.PositionsAngstrom);
        var (rotation, rmsd) = Horn(noisy, m.PositionsAngstrom);
        for (var i = 0; i < 9; i++)
            Close.Absolute(rotation[i], kabsch.RotationRowMajor[i], 1e-10, $"rotation element {i}", "Horn, J. Opt. Soc. Am. A 1987, 4, 629 (quaternion method, computed here)");
        Close.Absolute(rmsd, kabsch.RmsdAngstrom, 1e-10, "RMSD", "Horn, J. Opt. Soc. Am. A 1987, 4, 629 (quaternion method, computed here)");
        Assert.True(rmsd > 0.05, "the noise must leave a residual for the comparison to mean something");
    }
    [Fact]
    public void Fit_AgreesWithTheSvdSuperposition_OnNoisyMirroredAndPlanarSets()
    {
        // The allocation-free quaternion path (Horn 1987) against the SVD path (Kabsch 1976/1978): the same least-squares problem
        // solved two ways. Sets: a noisy rigid copy, a mirror image (the best proper rotation is then far from exact), a planar set.
        var rng = new Random(8);
        var m = InternalCoordinatesTests.StaggeredEthane().PositionsAngstrom;
        var noisy = m.Select(p => Rotate(p, new Vec3(1, 2, -0.5), 0.9) + new Vec3(1, -2, 3) + new Vec3(rng.NextDouble() - 0.5, rng.NextDouble() - 0.5, rng.NextDouble() - 0.5) * 0.3).ToArray();
        // A random (chiral) cloud: a symmetric one such as ethane would make the best rotation of its mirror image non-unique.
        var cloud = Enumerable.Range(0, 8).Select(_ => new Vec3(rng.NextDouble(), rng.NextDouble(), rng.NextDouble()) * 3).ToArray();
        var mirror = cloud.Select(p => Rotate(new Vec3(-p.X, p.Y, p.Z), new Vec3(0.2, 1, 0.3), 2.0)).ToArray();
        var planar = Enumerable.Range(0, 6).Select(k => new Vec3(Math.Cos(k), Math.Sin(2.0 * k), 0)).ToArray();
        var planarMoved = planar.Select(p => Rotate(p, new Vec3(1, 1, 0), 0.7) + new Vec3(0, 0, 0.05 * rng.NextDouble())).ToArray();
        foreach (var (name, mobile, reference) in new[] { ("noisy", noisy, m.ToArray()), ("mirror", mirror, cloud), ("planar", planarMoved, planar) })
        {
            var svd = Kabsch.Superpose(mobile, reference);
            var rotation = new double[9];
            var rmsd = Kabsch.Fit(mobile, reference, rotation, out var pc, out var qc);
            Close.Absolute(svd.RmsdAngstrom, rmsd, 1e-10, $"RMSD, {name} set", "Kabsch SVD solution (Acta Cryst. A 1976, 32, 922; 1978, 34, 827)");
            for (var i = 0; i < 9; i++)
                Close.Absolute(svd.RotationRowMajor[i], rotation[i], 1e-9, $"rotation element {i}, {name} set", "Kabsch SVD solution");
            // The returned centroids and rotation reproduce the SVD path's aligned positions.
            for (var a = 0; a < mobile.Length; a++)
            {
                var x = Apply([.. rotation], mobile[a] - pc) + qc;
                Close.Absolute(0, (x - svd.AlignedAngstrom[a]).Length, 1e-9, $"aligned atom {a + 1}, {name} set", "Kabsch SVD solution");
            }
        }
        Assert.True(Kabsch.Superpose(mirror, cloud).RmsdAngstrom > 0.2, "a mirror image is not superposed by a proper rotation");
    }

    [Fact]
    public void Fit_MismatchedOrEmptySets_AreRejected()
    {
        var r = new double[9];
        Assert.Throws<ArgumentException>(() => Kabsch.Fit([Vec3.Zero], [Vec3.Zero, Vec3.Zero], r, out _, out _));
        Assert.Throws<ArgumentException>(() => Kabsch.Fit([], [], r, out _, out _));
    }
}
