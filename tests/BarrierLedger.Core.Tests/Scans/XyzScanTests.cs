using System.Globalization;
using System.Text;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Scans;
using BarrierLedger.Core.Tests.Support;
using static BarrierLedger.Core.Tests.Formats.FormatTestHelpers;

namespace BarrierLedger.Core.Tests.Scans;

public class XyzScanTests
{
    private static XyzDocument Read(string text)
    {
        var r = XyzReader.Read(Utf8(text), "scan.xyz");
        Assert.True(r.Value is not null, string.Join("; ", r.Issues.Select(i => i.Message)));
        return r.Value!;
    }

    private static string F(double x) => x.ToString("R", CultureInfo.InvariantCulture);

    /// <summary>H–H stretched along z: frame i has the atoms exactly r_i apart.</summary>
    private static string Stretch(IEnumerable<(double R, double E, string Extra)> points)
    {
        var sb = new StringBuilder();
        foreach (var (r, e, extra) in points)
            sb.Append($"2\nenergy={F(e)}{extra}\nH 0 0 0\nH 0 0 {F(r)}\n");
        return sb.ToString();
    }

    [Fact]
    public void Distance_points_are_the_separations_the_frames_were_built_with()
    {
        var doc = Read(Stretch([(0.70, -1.10, ""), (0.80, -1.15, ""), (0.90, -1.12, " converged=no"), (1.00, -1.08, "")]));
        Assert.True(XyzScan.TryBuild(doc, new ScanCoordinate(ScanCoordinateKind.Distance, [0, 1]), "scan.xyz", out var points, out var problem), problem);
        Assert.Equal(4, points.Length);
        double[] expected = [0.70, 0.80, 0.90, 1.00];
        for (var i = 0; i < 4; i++)
            Close.Absolute(expected[i], points[i].Coordinate, 1e-12, $"distance of frame {i + 1}", "by construction: atoms placed on the z axis at that separation");
        Close.Absolute(-1.15, points[1].EnergyHartree, 1e-12, "energy of frame 2", "the comment line's energy=, in hartree");
        Assert.False(points[2].Converged);
        Assert.True(points[3].Converged);
        Assert.NotNull(points[0].Geometry);
    }

    [Fact]
    public void Dihedral_scan_through_180_degrees_is_unwrapped_to_stay_monotonic()
    {
        // A–B–C–D with B–C on the z axis and D rotated about it by φ: the torsion angle is φ by its definition
        // (IUPAC Gold Book, "torsion angle"; the sign convention is checked elsewhere), wrapped into (−180°, 180°].
        var sb = new StringBuilder();
        double[] phis = [150, 170, 190, 210];
        foreach (var phi in phis)
        {
            var rad = phi * Math.PI / 180;
            sb.Append($"4\nenergy=-1.0\nC 1 0 0\nC 0 0 0\nC 0 0 1.5\nC {F(Math.Cos(rad))} {F(Math.Sin(rad))} 1.5\n");
        }
        var doc = Read(sb.ToString());
        Assert.True(XyzScan.TryBuild(doc, new ScanCoordinate(ScanCoordinateKind.Dihedral, [0, 1, 2, 3]), "scan.xyz", out var points, out var problem), problem);
        var values = points.Select(p => Math.Abs(p.Coordinate)).ToArray();
        // Either sign convention gives |φ| = 150, 170, 190, 210 once unwrapped (wrapped, the last two would read 170 and 150).
        for (var i = 0; i < phis.Length; i++)
            Close.Absolute(phis[i], values[i], 1e-9, $"unwrapped torsion of frame {i + 1}", "by construction: rotation of the last atom about the B–C axis");
        var steps = points.Zip(points.Skip(1), (a, b) => b.Coordinate - a.Coordinate).ToArray();
        Assert.All(steps, s => Close.Absolute(20, Math.Abs(s), 1e-9, "torsion step", "by construction: 20° per frame"));
        Assert.True(steps.All(s => s > 0) || steps.All(s => s < 0), "the unwrapped torsion must move one way");
    }

    [Fact]
    public void Angle_is_measured_in_degrees()
    {
        // Three atoms at (1,0,0), origin, (cos θ, sin θ, 0): the angle at the middle atom is θ (plane geometry).
        var sb = new StringBuilder();
        foreach (var theta in new[] { 100.0, 110.0 })
        {
            var rad = theta * Math.PI / 180;
            sb.Append($"3\nenergy=-2.0\nO 1 0 0\nO 0 0 0\nO {F(Math.Cos(rad))} {F(Math.Sin(rad))} 0\n");
        }
        Assert.True(XyzScan.TryBuild(Read(sb.ToString()), new ScanCoordinate(ScanCoordinateKind.Angle, [0, 1, 2]), "scan.xyz", out var points, out _));
        Close.Absolute(100, points[0].Coordinate, 1e-9, "bend angle of frame 1", "by construction (plane geometry)");
        Close.Absolute(110, points[1].Coordinate, 1e-9, "bend angle of frame 2", "by construction (plane geometry)");
    }

    [Fact]
    public void A_frame_without_energy_is_named_with_its_line()
    {
        var doc = Read("2\nenergy=-1.1\nH 0 0 0\nH 0 0 0.7\n2\nno energy here\nH 0 0 0\nH 0 0 0.8\n");
        Assert.False(XyzScan.TryBuild(doc, new ScanCoordinate(ScanCoordinateKind.Distance, [0, 1]), "scan.xyz", out _, out var problem));
        Assert.Contains("scan.xyz:5: frame 2 has no energy", problem);
    }

    [Fact]
    public void A_coordinate_atom_beyond_the_frames_is_refused()
    {
        var doc = Read(Stretch([(0.7, -1.1, ""), (0.8, -1.15, "")]));
        Assert.False(XyzScan.TryBuild(doc, new ScanCoordinate(ScanCoordinateKind.Distance, [0, 2]), "scan.xyz", out _, out var problem));
        Assert.Contains("atom 3 does not exist", problem);
    }

    [Fact]
    public void An_unreadable_converged_flag_is_refused()
    {
        var doc = Read(Stretch([(0.7, -1.1, " converged=maybe"), (0.8, -1.15, "")]));
        Assert.False(XyzScan.TryBuild(doc, new ScanCoordinate(ScanCoordinateKind.Distance, [0, 1]), "scan.xyz", out _, out var problem));
        Assert.Contains("converged='maybe'", problem);
    }
}
