using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Paths;
using BarrierLedger.Core.Tests.Scans;
using BarrierLedger.Core.Tests.Support;

namespace BarrierLedger.Core.Tests.Paths;

/// <summary>
/// A synthetic IRC: the steepest-descent path of the Müller–Brown surface (K. Müller, L. D. Brown, Theor. Chim. Acta 1979, 53, 75)
/// from its saddle points, followed in the test, mapped to the Cartesian coordinates of a bent C–N–O triatomic whose bonds differ
/// between the three minima (A: C–N bonded, O apart; C: both bonded; B: N–O bonded, C apart).
/// </summary>
public class IrcPathTests
{
    private const double Bonded = 1.30, Apart = 2.60; // Å; C–N cut-off 1.2 × (0.76 + 0.71) = 1.76 Å, N–O 1.2 × (0.71 + 0.66) = 1.64 Å
    private static readonly (double X, double Y) MinA = (MullerBrown.Minima[0].X, MullerBrown.Minima[0].Y);
    private static readonly (double X, double Y) MinB = (MullerBrown.Minima[1].X, MullerBrown.Minima[1].Y);
    private static readonly (double X, double Y) MinC = (MullerBrown.Minima[2].X, MullerBrown.Minima[2].Y);

    /// <summary>r = a + b x + c y through three (x, y, r) points (Cramer's rule).</summary>
    private static Func<double, double, double> Plane((double X, double Y, double R) p, (double X, double Y, double R) q, (double X, double Y, double R) s)
    {
        double Det(double a, double b, double c, double d, double e, double f, double g, double h, double i) => a * (e * i - f * h) - b * (d * i - f * g) + c * (d * h - e * g);
        var det = Det(1, p.X, p.Y, 1, q.X, q.Y, 1, s.X, s.Y);
        var a0 = Det(p.R, p.X, p.Y, q.R, q.X, q.Y, s.R, s.X, s.Y) / det;
        var a1 = Det(1, p.R, p.Y, 1, q.R, q.Y, 1, s.R, s.Y) / det;
        var a2 = Det(1, p.X, p.R, 1, q.X, q.R, 1, s.X, s.R) / det;
        return (x, y) => a0 + a1 * x + a2 * y;
    }

    private static readonly Func<double, double, double> R12 = Plane((MinA.X, MinA.Y, Bonded), (MinC.X, MinC.Y, Bonded), (MinB.X, MinB.Y, Apart));
    private static readonly Func<double, double, double> R23 = Plane((MinA.X, MinA.Y, Apart), (MinC.X, MinC.Y, Bonded), (MinB.X, MinB.Y, Bonded));

    /// <summary>C1–N2–O3 bent at 120° at N2 with the two mapped distances.</summary>
    private static Molecule Cartesian(double x, double y)
    {
        var r12 = R12(x, y);
        var r23 = R23(x, y);
        return new Molecule([Elements.C, Elements.Get("N"), Elements.Get("O")],
            [new Vec3(r12, 0, 0), Vec3.Zero, new Vec3(r23 * Math.Cos(2 * Math.PI / 3), r23 * Math.Sin(2 * Math.PI / 3), 0)]);
    }

    /// <summary>
    /// The steepest-descent path from a saddle point both ways: a step of 1e-3 off the saddle along the Hessian's negative-curvature
    /// eigenvector, then dx/ds = −∇V/|∇V| by fourth-order Runge–Kutta with arc-length step h until the energy stops falling.
    /// Returns the points from one end through the saddle point to the other end, with their energies.
    /// </summary>
    private static List<(double X, double Y, double V)> SteepestDescent((double X, double Y) saddle, double h = 1e-3)
    {
        var (_, _, _, hxx, hxy, hyy) = MullerBrown.Evaluate(saddle.X, saddle.Y);
        var (low, _) = MullerBrown.HessianEigenvalues(saddle.X, saddle.Y);
        var (ex, ey) = Math.Abs(hxy) > 1e-12 ? (hxy, low - hxx) : (hxx - low < 1e-12 ? (1.0, 0.0) : (0.0, 1.0));
        var len = Math.Sqrt(ex * ex + ey * ey);
        (ex, ey) = (ex / len, ey / len);
        _ = hyy;
        (double, double) Direction(double x, double y)
        {
            var (_, gx, gy, _, _, _) = MullerBrown.Evaluate(x, y);
            var g = Math.Sqrt(gx * gx + gy * gy);
            return (-gx / g, -gy / g);
        }
        List<(double, double, double)> Branch(double sign)
        {
            var (x, y) = (saddle.X + sign * 1e-3 * ex, saddle.Y + sign * 1e-3 * ey);
            var points = new List<(double, double, double)> { (x, y, MullerBrown.Evaluate(x, y).V) };
            for (var k = 0; k < 20000; k++)
            {
                var (k1x, k1y) = Direction(x, y);
                var (k2x, k2y) = Direction(x + 0.5 * h * k1x, y + 0.5 * h * k1y);
                var (k3x, k3y) = Direction(x + 0.5 * h * k2x, y + 0.5 * h * k2y);
                var (k4x, k4y) = Direction(x + h * k3x, y + h * k3y);
                var nx = x + h / 6 * (k1x + 2 * k2x + 2 * k3x + k4x);
                var ny = y + h / 6 * (k1y + 2 * k2y + 2 * k3y + k4y);
                var v = MullerBrown.Evaluate(nx, ny).V;
                if (v >= points[^1].Item3) break;
                (x, y) = (nx, ny);
                points.Add((x, y, v));
            }
            return points;
        }
        var back = Branch(-1);
        back.Reverse();
        return [.. back, (saddle.X, saddle.Y, MullerBrown.Evaluate(saddle.X, saddle.Y).V), .. Branch(1)];
    }

    private static (double X, double Y) Saddle(int k) => MullerBrown.Stationary(MullerBrown.SaddlePoints[k].X, MullerBrown.SaddlePoints[k].Y);

    /// <summary>The path as an IRC of the triatomic; energies as V × 10⁻³ hartree (an arbitrary scale for the test).</summary>
    private static ReactionPath Irc(int saddleIndex, out Molecule saddle)
    {
        var s = Saddle(saddleIndex);
        var points = SteepestDescent(s);
        saddle = Cartesian(s.X, s.Y);
        return IrcPath.FromFrames([.. points.Select(p => Cartesian(p.X, p.Y))], [.. points.Select(p => p.V * 1e-3)], saddle);
    }

    private static StateStructure StateA() => new("A", [
        new StateSpecies("CN", new Molecule([Elements.Get("N"), Elements.C], [new Vec3(5, 5, 5), new Vec3(5, 5, 5 + Bonded)])),
        new StateSpecies("O", new Molecule([Elements.Get("O")], [Vec3.Zero]))]);

    private static StateStructure StateB() => new("B", [
        new StateSpecies("NO", new Molecule([Elements.Get("O"), Elements.Get("N")], [Vec3.Zero, new Vec3(Bonded, 0, 0)])),
        new StateSpecies("C", new Molecule([Elements.C], [new Vec3(9, 9, 9)]))]);

    private static StateStructure StateC() => new("C", [
        // The same triatomic listed O, C, N: the check must find the mapping.
        new StateSpecies("CNO", new Molecule([Elements.Get("O"), Elements.C, Elements.Get("N")],
            [new Vec3(Bonded * Math.Cos(2 * Math.PI / 3), Bonded * Math.Sin(2 * Math.PI / 3), 1), new Vec3(Bonded, 0, 1), new Vec3(0, 0, 1)]))]);

    [Theory]
    [InlineData(0)]
    [InlineData(1)]
    public void SteepestDescentFromEachSaddlePoint_EndsAtThePublishedMinima(int saddleIndex)
    {
        // Müller & Brown 1979: the saddle point at (−0.822, 0.624) joins minima A and C, the one at (0.212, 0.293) joins C and B
        // (coordinates as widely reproduced, from memory, three decimals). The descent stops within one step (1e-3) of a minimum.
        var points = SteepestDescent(Saddle(saddleIndex));
        var expected = saddleIndex == 0 ? new[] { MinA, MinC } : [MinC, MinB];
        var ends = new[] { points[0], points[^1] }.OrderBy(p => Math.Abs(p.X - expected[0].X) + Math.Abs(p.Y - expected[0].Y)).ToArray();
        for (var k = 0; k < 2; k++)
        {
            Close.Absolute(expected[k].X, ends[k].X, MullerBrown.CoordinateTolerance + 2e-3, $"end {k} x", "Müller & Brown, Theor. Chim. Acta 1979, 53, 75 (from memory)");
            Close.Absolute(expected[k].Y, ends[k].Y, MullerBrown.CoordinateTolerance + 2e-3, $"end {k} y", "Müller & Brown, Theor. Chim. Acta 1979, 53, 75 (from memory)");
        }
    }

    [Fact]
    public void PathLength_IsZeroAtTheSaddleFrame_AndAddsUpTheCartesianSteps()
    {
        var path = Irc(1, out var saddle);
        Assert.NotNull(path.SaddleFrame);
        var s = path.SaddleFrame!.Value;
        Assert.Equal(0.0, path.Frames[s].Coordinate);
        Close.Absolute(0, Kabsch.Rmsd(path.Frames[s].Geometry!, saddle), 1e-12, "saddle frame against the saddle geometry", "construction");
        Assert.True(path.First.Coordinate < 0 && path.Last.Coordinate > 0);
        // Independent reading: a frame-to-frame step of the planar triatomic, measured without superposition, bounds the
        // superposed step from above, and both agree closely for these small steps.
        for (var i = 1; i < path.Frames.Length; i += 97)
        {
            var a = path.Frames[i - 1].Geometry!;
            var b = path.Frames[i].Geometry!;
            var raw = Math.Sqrt(a.PositionsAngstrom.Zip(b.PositionsAngstrom, (p, q) => (p - q).LengthSquared).Sum());
            var step = path.Frames[i].Coordinate - path.Frames[i - 1].Coordinate;
            Assert.True(step <= raw + 1e-12, $"step {i}: {step} > {raw}");
            Assert.True(step > 0.5 * raw, $"step {i}: {step} much below {raw}");
        }
    }

    [Fact]
    public void IrcBetweenCAndB_ConnectsBothSides()
    {
        var path = Irc(1, out var saddle);
        var result = ConnectionCheck.Run(new ConnectionCheckInput(saddle, StateC(), StateB(), [StateA()], path));
        Assert.True(result.Connection == Connection.BothSides, result.Report());
        Assert.Equal(Verdict.Passed, result.Verdict);
        Assert.Equal(["C", "B"], result.Ends.Select(e => e.Reached!.State).ToArray());
        // The ends stop within one 1e-3 step of the minima, which the linear map turns into well under 0.05 Å.
        Assert.All(result.Ends, e => Assert.True(e.Reached!.RmsdAngstrom < 0.05, $"{e.Name}: {e.Reached.RmsdAngstrom}"));
        Assert.Equal("connects C and B", result.Headline);
    }

    [Fact]
    public void IrcOfTheOtherSaddlePoint_DrawnBetweenCAndB_ConnectsOneSideAndNamesA()
    {
        var path = Irc(0, out var saddle);
        var result = ConnectionCheck.Run(new ConnectionCheckInput(saddle, StateC(), StateB(), [StateA()], path));
        Assert.True(result.Connection == Connection.OneSide, result.Report());
        Assert.Equal(Verdict.Failed, result.Verdict);
        Assert.Equal("connects C with A, not B", result.Headline);
        Assert.Contains(result.Reasons, r => r.Code == ConnectionCheckCodes.OneSide && r.Message.Contains("lands on A"));
    }

    [Fact]
    public void BondEvents_AlongThePath_FallWhereTheMappedDistanceCrossesTheCutOff()
    {
        var path = Irc(1, out _);
        var events = path.BondEvents();
        var cn = events.Single(e => e.Formed.Contains(new Bond(0, 1)) || e.Broken.Contains(new Bond(0, 1)));
        // Independent reading: r(C1–N2) on both frames straddles 1.2 × (0.76 + 0.71) Å (Cordero et al., Dalton Trans. 2008, 2832).
        var cutoff = 1.2 * (0.76 + 0.71);
        var before = (path.Frames[cn.FromFrame].Geometry!.PositionsAngstrom[0] - path.Frames[cn.FromFrame].Geometry!.PositionsAngstrom[1]).Length;
        var after = (path.Frames[cn.ToFrame].Geometry!.PositionsAngstrom[0] - path.Frames[cn.ToFrame].Geometry!.PositionsAngstrom[1]).Length;
        Assert.True(before <= cutoff && after > cutoff, $"{before} → {after}");
        Assert.Equal(cn.FromFrame + 1, cn.ToFrame);
        Assert.Contains(new Bond(0, 1), cn.Broken);
        // It breaks on the side of the saddle point where the map carries r(C1–N2) past the cut-off: the C side (negative path
        // length) when the saddle point already has it beyond the cut-off, else the B side.
        var s = Saddle(1);
        Assert.Equal(R12(s.X, s.Y) > cutoff, cn.Coordinate < 0);
        Close.Absolute(0.5 * (path.Frames[cn.FromFrame].Coordinate + path.Frames[cn.ToFrame].Coordinate), cn.Coordinate, 1e-12, "event coordinate", "midpoint of its frames (definition)");
    }
}
