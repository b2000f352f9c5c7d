using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Scans;
using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Tests.Scans;

public class ScanAnalysisTests
{
    // Müller–Brown energies are read as kcal/mol here so that the default jump threshold applies to them.
    private static ScanPoint MbPoint(double x, double y, bool converged = true) =>
        new(x, Energy.FromKcalPerMol(MullerBrown.Evaluate(x, y).V).Hartree, converged);

    [Fact]
    public void MullerBrown_PublishedSaddlePoints_HaveExactlyOneNegativeHessianEigenvalue()
    {
        // Müller & Brown, Theor. Chim. Acta 1979, 53, 75: the two saddle points (from memory, three decimals).
        foreach (var (x0, y0, v0) in MullerBrown.SaddlePoints)
        {
            var (x, y) = MullerBrown.Stationary(x0, y0);
            Close.Absolute(x0, x, MullerBrown.CoordinateTolerance, "Müller–Brown saddle x", "Müller & Brown 1979, from memory");
            Close.Absolute(y0, y, MullerBrown.CoordinateTolerance, "Müller–Brown saddle y", "Müller & Brown 1979, from memory");
            Close.Absolute(v0, MullerBrown.Evaluate(x, y).V, 0.01, "Müller–Brown saddle energy", "Müller & Brown 1979, from memory");
            var (low, high) = MullerBrown.HessianEigenvalues(x, y);
            Assert.True(low < 0 && high > 0, $"Saddle ({x:F3}, {y:F3}): eigenvalues {low:G4}, {high:G4}; expected exactly one negative.");
        }
        foreach (var (x0, y0, _) in MullerBrown.Minima)
        {
            var (x, y) = MullerBrown.Stationary(x0, y0);
            var (low, _) = MullerBrown.HessianEigenvalues(x, y);
            Assert.True(low > 0, $"Minimum ({x:F3}, {y:F3}) has a negative eigenvalue {low:G4}.");
        }
    }

    [Fact]
    public void MullerBrown_RelaxedScanAlongX_MaximumWithinOneStepOfPublishedSaddle()
    {
        // Relaxed scan: at each x, y is optimised starting from the previous point's y (minimum C to minimum B).
        const double step = 0.05;
        var points = new List<ScanPoint>();
        var ys = new List<double>();
        var y = MullerBrown.Minima[2].Y;
        for (var x = -0.05; x <= 0.65 + 1e-9; x += step)
        {
            ys.Add(y = MullerBrown.RelaxY(x, y));
            points.Add(MbPoint(x, y));
        }
        var profile = ScanAnalysis.Analyze(points, null);

        Assert.Equal("Akima", profile.Interpolation);
        var top = Assert.Single(profile.Maxima);
        var saddle = MullerBrown.SaddlePoints[1];
        Close.Absolute(saddle.X, top.Coordinate, step, "relaxed-scan maximum x", "Müller & Brown 1979 saddle x = 0.212, from memory; one scan step");
        // At S2 the unstable direction has a large y component, so a scan along x is not along the reaction coordinate:
        // the relaxed y stays in C's valley up to x = 0.20 and then drops into B's valley (Δy ≈ 0.35 before x = 0.25).
        // The profile therefore has a cusp at x = 0.20, which the jump check must point at, and no other flag.
        Assert.True(ys[5] - ys[6] > 0.2, $"relaxed y at x = 0.20 and 0.25: {ys[5]:F3}, {ys[6]:F3}");
        var flag = Assert.Single(profile.Flags);
        Assert.Equal((ScanFlagCodes.Jump, 5), (flag.Code, flag.PointIndex));
    }

    /// <summary>
    /// A smooth Morse-like rise sampled every 0.1 Å, then +6 kcal/mol added from point 9 on (a rearrangement), and point 4
    /// not converged with a nonsense energy (+50 kcal/mol) that must not enter the spline.
    /// </summary>
    internal static IEnumerable<(double X, double Kcal, bool Converged)> StepProfile()
    {
        for (var i = 0; i < 16; i++)
        {
            var x = 1.5 + 0.1 * i;
            var kcal = 30 * Math.Pow(1 - Math.Exp(-1.2 * (x - 1.5)), 2) - 8 * (x - 1.5) * (x - 1.5);
            if (i >= 8) kcal += 6.0;
            var converged = i != 3;
            if (!converged) kcal += 50;
            yield return (x, kcal, converged);
        }
    }

    [Fact]
    public void StepInTheProfile_FlagsTheTwoPointsItLiesBetween_AndNonConvergedPointIsExcluded()
    {
        var points = StepProfile().Select(p => new ScanPoint(p.X, -100 + Energy.FromKcalPerMol(p.Kcal).Hartree, p.Converged)).ToList();
        var profile = ScanAnalysis.Analyze(points, new ScanCoordinate(ScanCoordinateKind.Distance, [0, 1]));

        var jumps = profile.Flags.Where(f => f.Code == ScanFlagCodes.Jump).Select(f => f.PointIndex).ToArray();
        Assert.Equal([7, 8], jumps);
        Assert.Contains("between points 8 and 9", profile.Flags.First(f => f.Code == ScanFlagCodes.Jump).Message);
        var nc = Assert.Single(profile.Flags, f => f.Code == ScanFlagCodes.NotConverged);
        Assert.Equal(3, nc.PointIndex);
        Assert.DoesNotContain(profile.Samples, s => s.Energy.Hartree > -100 + Energy.FromKcalPerMol(40).Hartree);
    }

    [Fact]
    public void SmoothProfileWithMissingPoint_FlagsIrregularStep()
    {
        double[] xs = [1.0, 1.1, 1.2, 1.3, 1.4, 1.8, 1.9, 2.0];
        var points = xs.Select(x => new ScanPoint(x, Energy.FromKcalPerMol(10 * Math.Sin(x)).Hartree)).ToList();
        var profile = ScanAnalysis.Analyze(points, null);
        var flag = Assert.Single(profile.Flags);
        Assert.Equal(ScanFlagCodes.IrregularStep, flag.Code);
        Assert.Equal(5, flag.PointIndex);
        Close.Absolute(0.1, profile.TypicalStep, 1e-12, "median step", "the steps as constructed");
    }

    [Fact]
    public void DecreasingScan_BarrierMeasuredFromItsStartingSide()
    {
        // A symmetric parabola-topped profile scanned from large to small coordinate; the low start is on the right.
        var points = Enumerable.Range(0, 11).Select(i => 3.0 - 0.1 * i)
            .Select(x => new ScanPoint(x, Energy.FromKcalPerMol(-10 * (x - 2.5) * (x - 2.5) + (x > 2.5 ? 0 : 1.0 * (2.5 - x))).Hartree))
            .ToList();
        var profile = ScanAnalysis.Analyze(points, null);
        Assert.NotNull(profile.HighestMaximum);
        Assert.Equal(0, profile.LowestBeforeIndex);
        // Below 2.5 the profile is −10(x − 2.5)² + (2.5 − x): dE/dx = 0 at x = 2.45 (and that side is the higher one).
        Close.Absolute(2.45, profile.HighestMaximum!.Coordinate, 0.01, "maximum coordinate", "constructed profile, vertex at 2.45");
    }

    [Fact]
    public void RisingProfile_HasNoInteriorMaximum_AndSaysSo()
    {
        var points = Enumerable.Range(0, 6).Select(i => new ScanPoint(1 + 0.1 * i, 0.001 * i)).ToList();
        var profile = ScanAnalysis.Analyze(points, null);
        Assert.Null(profile.HighestMaximum);
        Assert.Null(profile.BarrierFromFirst);
        var flag = Assert.Single(profile.Flags);
        Assert.Equal(ScanFlagCodes.NoInteriorMaximum, flag.Code);
        Assert.Equal(5, flag.PointIndex);
    }

    [Fact]
    public void CoordinateTurningBack_IsAClearError()
    {
        var points = new[] { new ScanPoint(1.0, 0), new ScanPoint(1.1, 0), new ScanPoint(1.05, 0) };
        var e = Assert.Throws<ArgumentException>(() => ScanAnalysis.Analyze(points, null));
        Assert.Contains("Scan point 3", e.Message);
        Assert.Contains("turns back", e.Message);
    }

    [Fact]
    public void BondChangeBetweenFrames_IsNamed_ScannedPairIsNot()
    {
        // C1 with H2 being pulled away (the scanned pair); between frames 3 and 4 H3 hops from C1 to O4.
        var c = Elements.Get("C");
        var h = Elements.H;
        var o = Elements.O;
        var frames = new List<ScanPoint>();
        for (var i = 0; i < 6; i++)
        {
            var r = 1.1 + 0.3 * i;
            var h3 = i < 3 ? new Vec3(-1.09, 0, 0) : new Vec3(-2.9, 0, 0);
            var mol = new Molecule([c, h, h, o], [Vec3.Zero, new Vec3(r, 0, 0), h3, new Vec3(-3.86, 0, 0)]);
            frames.Add(new ScanPoint(r, -0.01 * i * i + 0.1 * i, true, mol));
        }
        var profile = ScanAnalysis.Analyze(frames, new ScanCoordinate(ScanCoordinateKind.Distance, [0, 1]));
        var change = Assert.Single(profile.BondChanges);
        Assert.Equal((2, 3), (change.FromPointIndex, change.ToPointIndex));
        Assert.Equal(new[] { new Bond(2, 3) }, change.Formed.AsEnumerable());
        Assert.Equal(new[] { new Bond(0, 2) }, change.Broken.AsEnumerable());
        Assert.Contains("H3–O4 forms", change.Message);
        Assert.Contains("C1–H3 breaks", change.Message);
        Assert.Contains(profile.Flags, f => f.Code == ScanFlagCodes.BondChange && f.PointIndex == 3);
    }
}
