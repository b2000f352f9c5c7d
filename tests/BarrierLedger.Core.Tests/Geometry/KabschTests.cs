using BarrierLedger.Core.Geometry;

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
}
