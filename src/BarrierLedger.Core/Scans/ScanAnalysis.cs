using System.Collections.Immutable;
using System.Globalization;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Units;
using MathNet.Numerics.Interpolation;

namespace BarrierLedger.Core.Scans;

/// <summary>
/// Analysis of a relaxed scan: interpolation, local maxima, barriers and flagged points.
/// <para>
/// Interpolant: an Akima spline (Akima, J. ACM 1970, 17, 589; MathNet <c>CubicSpline.InterpolateAkimaSorted</c>)
/// through the converged points when there are five or more, a natural cubic spline for three or four, linear for two.
/// Why Akima: a natural cubic spline is C² everywhere, which couples every interval to every other; a step in the data
/// (the very thing a relaxed scan often shows when something rearranges) makes it ring on both sides of the step,
/// creating overshoots and spurious local maxima several intervals away. Akima's slope at a point depends only on the
/// two secant slopes on each side, so a step disturbs only the neighbouring intervals and a smooth profile is still
/// reproduced to third order. The price is that it is only C¹, which is enough for finding maxima from dE/dx = 0.
/// </para>
/// <para>
/// Maxima: the derivative of the interpolant is sampled on a fine grid (64 cells per interval); every change of sign
/// from positive to non-positive is refined by bisection to 1e-12 of the interval width.
/// Barriers: the highest interior maximum minus the first converged point in scan order, and minus the lowest converged
/// point on the scan's starting side of the maximum.
/// Jumps: each converged point is compared with the cubic (or lower) polynomial through up to two converged neighbours on
/// each side, itself left out; in a run of neighbouring flagged points only those within 90 % of the run's largest
/// departure are kept, so a step flags the two points it lies between and a spike flags itself, not its neighbours.
/// </para>
/// </summary>
public static class ScanAnalysis
{
    private const int DerivativeCellsPerInterval = 64;

    /// <summary>
    /// Analyses a relaxed scan. <paramref name="points"/> are in scan order; their coordinates must change strictly in one
    /// direction. Throws <see cref="ArgumentException"/> for non-finite values or a coordinate that turns back.
    /// </summary>
    public static ScanProfile Analyze(IReadOnlyList<ScanPoint> points, ScanCoordinate? coordinate, ScanOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(points);
        var o = options ?? ScanOptions.Default;
        if (!(o.JumpThresholdKcalPerMol > 0)) throw new ArgumentException("Jump threshold must be positive.", nameof(options));
        if (!(o.IrregularStepFactor > 1)) throw new ArgumentException("Irregular-step factor must be above 1.", nameof(options));
        if (o.SamplesPerInterval < 1) throw new ArgumentException("Samples per interval must be 1 or more.", nameof(options));
        Validate(points);
        var unit = coordinate?.Unit ?? "Å";
        var flags = new List<ScanFlag>();

        var typicalStep = FlagSteps(points, unit, o, flags);
        for (var i = 0; i < points.Count; i++)
            if (!points[i].Converged)
                flags.Add(new ScanFlag(ScanFlagCodes.NotConverged, i,
                    $"Point {i + 1} ({Coord(points[i].Coordinate, unit)}) did not converge; it is left out of the profile. " +
                    "Rerun it from a neighbouring point's geometry before trusting the barrier."));

        var converged = Enumerable.Range(0, points.Count).Where(i => points[i].Converged).ToArray();
        FlagJumps(points, converged, unit, o, flags);
        var bondChanges = FindBondChanges(points, converged, coordinate, o, flags);

        if (converged.Length < 2)
        {
            flags.Add(new ScanFlag(ScanFlagCodes.TooFewPoints, converged.Length == 1 ? converged[0] : 0,
                $"Only {converged.Length} converged point(s): no profile can be drawn and no maximum found."));
            return new ScanProfile(coordinate, [.. points], "none", [], [], null, null, null, null, typicalStep,
                [.. flags.OrderBy(f => f.PointIndex)], bondChanges);
        }

        var sorted = converged.OrderBy(i => points[i].Coordinate).ToArray();
        var xs = sorted.Select(i => points[i].Coordinate).ToArray();
        var ys = sorted.Select(i => points[i].EnergyHartree).ToArray();
        (IInterpolation spline, string name) = xs.Length switch
        {
            >= 5 => ((IInterpolation)CubicSpline.InterpolateAkimaSorted(xs, ys), "Akima"),
            >= 3 => (CubicSpline.InterpolateNaturalSorted(xs, ys), "natural cubic"),
            _ => (LinearSpline.InterpolateSorted(xs, ys), "linear"),
        };

        var samples = new List<ScanSample>();
        for (var k = 0; k < xs.Length - 1; k++)
            for (var s = 0; s < o.SamplesPerInterval; s++)
            {
                var x = xs[k] + (xs[k + 1] - xs[k]) * s / o.SamplesPerInterval;
                samples.Add(new ScanSample(x, Energy.FromHartree(spline.Interpolate(x))));
            }
        samples.Add(new ScanSample(xs[^1], Energy.FromHartree(ys[^1])));

        var maxima = FindMaxima(spline, xs)
            .Select(x => new ScanMaximum(x, Energy.FromHartree(spline.Interpolate(x)),
                converged.MinBy(i => Math.Abs(points[i].Coordinate - x))))
            .ToImmutableArray();
        var highest = maxima.Length == 0 ? null : maxima.MaxBy(m => m.Energy.Hartree);

        Energy? fromFirst = null, fromLowest = null;
        int? lowestIndex = null;
        var ascending = points.Count < 2 || points[^1].Coordinate > points[0].Coordinate;
        if (highest is not null)
        {
            var first = converged[0];
            fromFirst = highest.Energy - Energy.FromHartree(points[first].EnergyHartree);
            var before = converged.Where(i => ascending ? points[i].Coordinate < highest.Coordinate : points[i].Coordinate > highest.Coordinate).ToArray();
            if (before.Length > 0)
            {
                var low = before.MinBy(i => points[i].EnergyHartree);
                lowestIndex = low;
                fromLowest = highest.Energy - Energy.FromHartree(points[low].EnergyHartree);
            }
        }
        else
        {
            var top = converged.MaxBy(i => points[i].EnergyHartree);
            flags.Add(new ScanFlag(ScanFlagCodes.NoInteriorMaximum, top,
                $"The profile has no maximum inside the scanned range; its highest point is point {top + 1} ({Coord(points[top].Coordinate, unit)}) " +
                "at an end of the scan. The saddle point lies beyond the scan, or there is none along this coordinate."));
        }

        return new ScanProfile(coordinate, [.. points], name, [.. samples], maxima, highest, fromFirst, fromLowest, lowestIndex,
            typicalStep, [.. flags.OrderBy(f => f.PointIndex).ThenBy(f => f.Code, StringComparer.Ordinal)], bondChanges);
    }

    private static void Validate(IReadOnlyList<ScanPoint> points)
    {
        for (var i = 0; i < points.Count; i++)
        {
            var p = points[i] ?? throw new ArgumentException($"Scan point {i + 1} is missing.", nameof(points));
            if (!double.IsFinite(p.Coordinate))
                throw new ArgumentException($"Scan point {i + 1}: coordinate is not a finite number ({p.Coordinate}).", nameof(points));
            if (!double.IsFinite(p.EnergyHartree))
                throw new ArgumentException($"Scan point {i + 1}: energy is not a finite number ({p.EnergyHartree}).", nameof(points));
        }
        if (points.Count < 2) return;
        var direction = Math.Sign(points[1].Coordinate - points[0].Coordinate);
        for (var i = 1; i < points.Count; i++)
        {
            var d = Math.Sign(points[i].Coordinate - points[i - 1].Coordinate);
            if (d == 0)
                throw new ArgumentException($"Scan points {i} and {i + 1} have the same coordinate ({F(points[i].Coordinate)}); each point must be a new value.", nameof(points));
            if (d != direction)
                throw new ArgumentException(
                    $"Scan point {i + 1}: the coordinate turns back ({F(points[i - 1].Coordinate)} → {F(points[i].Coordinate)}) while the scan started " +
                    $"{(direction > 0 ? "increasing" : "decreasing")}; give the points in scan order along one direction.", nameof(points));
        }
    }

    private static double FlagSteps(IReadOnlyList<ScanPoint> points, string unit, ScanOptions o, List<ScanFlag> flags)
    {
        if (points.Count < 2) return double.NaN;
        var steps = Enumerable.Range(1, points.Count - 1).Select(i => Math.Abs(points[i].Coordinate - points[i - 1].Coordinate)).ToArray();
        var ordered = steps.Order().ToArray();
        var median = ordered.Length % 2 == 1 ? ordered[ordered.Length / 2] : 0.5 * (ordered[ordered.Length / 2 - 1] + ordered[ordered.Length / 2]);
        if (steps.Length < 3) return median;
        for (var k = 0; k < steps.Length; k++)
        {
            var ratio = steps[k] / median;
            if (ratio > o.IrregularStepFactor || ratio < 1.0 / o.IrregularStepFactor)
                flags.Add(new ScanFlag(ScanFlagCodes.IrregularStep, k + 1,
                    $"The step from point {k + 1} to point {k + 2} is {F(steps[k])} {unit}, {F(ratio, "0.0")} times the scan's typical step of {F(median)} {unit}; " +
                    (ratio > 1 ? "a maximum inside a long step can be missed or misplaced." : "check that the point belongs to this scan.")));
        }
        return median;
    }

    private static void FlagJumps(IReadOnlyList<ScanPoint> points, int[] converged, string unit, ScanOptions o, List<ScanFlag> flags)
    {
        var thresholdHartree = Energy.FromKcalPerMol(o.JumpThresholdKcalPerMol).Hartree;
        var residual = new double[converged.Length];
        for (var m = 0; m < converged.Length; m++)
        {
            residual[m] = double.NaN;
            var left = Enumerable.Range(Math.Max(0, m - 2), m - Math.Max(0, m - 2)).ToArray();
            var right = Enumerable.Range(m + 1, Math.Min(converged.Length, m + 3) - (m + 1)).ToArray();
            if (left.Length == 0 || right.Length == 0) continue;
            var use = left.Concat(right).Select(k => points[converged[k]]).ToArray();
            residual[m] = points[converged[m]].EnergyHartree - Lagrange(use, points[converged[m]].Coordinate);
        }
        var m0 = 0;
        while (m0 < converged.Length)
        {
            if (!(Math.Abs(residual[m0]) > thresholdHartree)) { m0++; continue; }
            var m1 = m0;
            while (m1 + 1 < converged.Length && Math.Abs(residual[m1 + 1]) > thresholdHartree) m1++;
            var runMax = Enumerable.Range(m0, m1 - m0 + 1).Max(m => Math.Abs(residual[m]));
            for (var m = m0; m <= m1; m++)
            {
                if (Math.Abs(residual[m]) < 0.9 * runMax) continue;
                var i = converged[m];
                var kcal = Energy.FromHartree(residual[m]).KcalPerMol;
                var partner = m + 1 <= m1 && Math.Abs(residual[m + 1]) >= 0.9 * runMax && Math.Sign(residual[m + 1]) != Math.Sign(residual[m]) ? converged[m + 1]
                    : m - 1 >= m0 && Math.Abs(residual[m - 1]) >= 0.9 * runMax && Math.Sign(residual[m - 1]) != Math.Sign(residual[m]) ? converged[m - 1]
                    : -1;
                var where = partner < 0
                    ? "it stands out from both neighbours"
                    : $"the energy jumps between points {Math.Min(i, partner) + 1} and {Math.Max(i, partner) + 1}";
                flags.Add(new ScanFlag(ScanFlagCodes.Jump, i,
                    $"Point {i + 1} ({Coord(points[i].Coordinate, unit)}) is {F(Math.Abs(kcal), "0.0")} kcal/mol {(kcal > 0 ? "above" : "below")} what its neighbours predict " +
                    $"(threshold {F(o.JumpThresholdKcalPerMol, "0.0")}); {where}. This usually means something rearranged (a proton or a solvent molecule moved, " +
                    "a conformer changed) that the chemical model does not describe smoothly: compare the geometries on both sides."));
            }
            m0 = m1 + 1;
        }
    }

    private static double Lagrange(ScanPoint[] nodes, double x)
    {
        var sum = 0.0;
        for (var a = 0; a < nodes.Length; a++)
        {
            var w = 1.0;
            for (var b = 0; b < nodes.Length; b++)
                if (b != a) w *= (x - nodes[b].Coordinate) / (nodes[a].Coordinate - nodes[b].Coordinate);
            sum += w * nodes[a].EnergyHartree;
        }
        return sum;
    }

    private static ImmutableArray<ScanBondChange> FindBondChanges(
        IReadOnlyList<ScanPoint> points, int[] converged, ScanCoordinate? coordinate, ScanOptions o, List<ScanFlag> flags)
    {
        var changes = new List<ScanBondChange>();
        var scanned = coordinate?.Atoms.ToHashSet() ?? [];
        bool IsScanned(Bond b) => scanned.Contains(b.A) && scanned.Contains(b.B);
        for (var m = 1; m < converged.Length; m++)
        {
            var (i, j) = (converged[m - 1], converged[m]);
            if (points[i].Geometry is not { } gi || points[j].Geometry is not { } gj) continue;
            if (gi.AtomCount != gj.AtomCount)
                throw new ArgumentException($"Scan points {i + 1} and {j + 1} have geometries of {gi.AtomCount} and {gj.AtomCount} atoms.", nameof(points));
            var (formed, broken) = Connectivity.Of(gi, o.Connectivity).Compare(Connectivity.Of(gj, o.Connectivity));
            formed = [.. formed.Where(b => !IsScanned(b))];
            broken = [.. broken.Where(b => !IsScanned(b))];
            if (formed.Length == 0 && broken.Length == 0) continue;
            var parts = new List<string>();
            if (formed.Length > 0) parts.Add($"{string.Join(", ", formed.Select(b => b.Label(gj)))} form{(formed.Length == 1 ? "s" : "")}");
            if (broken.Length > 0) parts.Add($"{string.Join(", ", broken.Select(b => b.Label(gj)))} break{(broken.Length == 1 ? "s" : "")}");
            var message = $"Between points {i + 1} and {j + 1} {string.Join(" and ", parts)}, besides the scanned coordinate: " +
                          "the scan follows more than one reaction here, and its energy change is not that of the scanned coordinate alone.";
            changes.Add(new ScanBondChange(i, j, formed, broken, message));
            flags.Add(new ScanFlag(ScanFlagCodes.BondChange, j, message));
        }
        return [.. changes];
    }

    private static List<double> FindMaxima(IInterpolation spline, double[] xs)
    {
        var found = new List<double>();
        if (xs.Length < 3) return found;
        for (var k = 0; k < xs.Length - 1; k++)
        {
            var h = (xs[k + 1] - xs[k]) / DerivativeCellsPerInterval;
            for (var c = 0; c < DerivativeCellsPerInterval; c++)
            {
                var a = xs[k] + c * h;
                var b = c == DerivativeCellsPerInterval - 1 ? xs[k + 1] : a + h;
                var da = spline.Differentiate(a);
                var db = spline.Differentiate(b);
                if (!(da > 0 && db <= 0)) continue;
                if (b >= xs[^1] && db == 0) continue;
                for (var it = 0; it < 200 && b - a > 1e-12 * (xs[k + 1] - xs[k]); it++)
                {
                    var mid = 0.5 * (a + b);
                    if (spline.Differentiate(mid) > 0) a = mid; else b = mid;
                }
                var x = 0.5 * (a + b);
                if (x > xs[0] && x < xs[^1] && (found.Count == 0 || x - found[^1] > 1e-9)) found.Add(x);
            }
        }
        return found;
    }

    private static string F(double x, string format = "0.000") => x.ToString(format, CultureInfo.InvariantCulture);

    private static string Coord(double x, string unit) => $"{F(x)} {unit}";
}
