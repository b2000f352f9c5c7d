using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Demo;

/// <summary>
/// Builds demo structures atom by atom: at fixed Cartesian positions, or from a bond length, a bond angle and a dihedral
/// to atoms already placed (a Z-matrix line). Placement follows the natural extension reference frame of Parsons et al.,
/// J. Comput. Chem. 26, 1063 (2005). Indices are 0-based.
/// </summary>
internal sealed class GeometryBuilder
{
    private readonly List<Element> _elements = [];
    private readonly List<Vec3> _positions = [];

    public int Count => _elements.Count;

    public Vec3 this[int i] => _positions[i];

    /// <summary>An atom at a given position (Å).</summary>
    public int At(Element element, Vec3 position)
    {
        _elements.Add(element);
        _positions.Add(position);
        return _elements.Count - 1;
    }

    /// <summary>An atom at distance r from atom c, angle θ to b–c, dihedral φ to a–b–c (degrees).</summary>
    public int Z(Element element, int c, double r, int b, double thetaDegrees, int a, double phiDegrees) =>
        At(element, Place(_positions[a], _positions[b], _positions[c], r, thetaDegrees, phiDegrees));

    /// <summary>Two hydrogens on an sp3 carbon <paramref name="c"/> with heavy neighbours a and b (H–C–H ≈ 108°).</summary>
    public void Methylene(int c, int a, int b, double r = 1.092, double hchDegrees = 107.5)
    {
        var (h1, h2) = Tetrahedral(_positions[c], _positions[a], _positions[b], r, hchDegrees);
        At(Elements.H, h1);
        At(Elements.H, h2);
    }

    /// <summary>A hydrogen on an sp2 centre c with neighbours a and b, in their plane, bisecting the outer angle.</summary>
    public int TrigonalH(int c, int a, int b, double r = 1.085)
    {
        var u = (_positions[a] - _positions[c]).Normalized() + (_positions[b] - _positions[c]).Normalized();
        return At(Elements.H, _positions[c] - r * u.Normalized());
    }

    public Molecule Build(int charge = 0, int multiplicity = 1) => new(_elements, _positions, charge, multiplicity);

    /// <summary>d with |d − c| = r, angle b–c–d = θ and dihedral a–b–c–d = φ (degrees).</summary>
    public static Vec3 Place(Vec3 a, Vec3 b, Vec3 c, double r, double thetaDegrees, double phiDegrees)
    {
        var theta = thetaDegrees * Math.PI / 180;
        var phi = phiDegrees * Math.PI / 180;
        var bc = (c - b).Normalized();
        var n = (b - a).Cross(bc).Normalized();
        var m = n.Cross(bc);
        var local = new Vec3(-r * Math.Cos(theta), r * Math.Sin(theta) * Math.Cos(phi), r * Math.Sin(theta) * Math.Sin(phi));
        return c + local.X * bc + local.Y * m + local.Z * n;
    }

    /// <summary>The two substituent positions of a tetrahedral centre c whose other two neighbours are a and b.</summary>
    public static (Vec3, Vec3) Tetrahedral(Vec3 c, Vec3 a, Vec3 b, double r, double angleDegrees)
    {
        var bisector = -((a - c).Normalized() + (b - c).Normalized()).Normalized();
        var normal = (a - c).Cross(b - c).Normalized();
        var half = angleDegrees / 2 * Math.PI / 180;
        return (c + r * (Math.Cos(half) * bisector + Math.Sin(half) * normal),
                c + r * (Math.Cos(half) * bisector - Math.Sin(half) * normal));
    }

    /// <summary>Unit vector at <paramref name="angleDegrees"/> from the +z axis, turned by <paramref name="azimuthDegrees"/> about it.</summary>
    public static Vec3 Polar(double angleDegrees, double azimuthDegrees)
    {
        var t = angleDegrees * Math.PI / 180;
        var p = azimuthDegrees * Math.PI / 180;
        return new Vec3(Math.Sin(t) * Math.Cos(p), Math.Sin(t) * Math.Sin(p), Math.Cos(t));
    }

    /// <summary>Positions rounded to 1e-6 Å, so that what is written is exactly what the demo analyses.</summary>
    public static Molecule Rounded(Molecule m) =>
        new(m.Elements, m.PositionsAngstrom.Select(p => new Vec3(R(p.X), R(p.Y), R(p.Z))), m.Charge, m.Multiplicity);

    private static double R(double x)
    {
        var r = Math.Round(x, 6, MidpointRounding.ToEven);
        return r == 0 ? 0.0 : r; // no negative zero in the files
    }
}
