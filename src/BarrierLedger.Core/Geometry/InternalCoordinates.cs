using System.Collections.Immutable;

namespace BarrierLedger.Core.Geometry;

/// <summary>Which internal coordinate.</summary>
public enum InternalKind
{
    /// <summary>A distance between two atoms (a bond or a declared reaction pair), Å.</summary>
    Stretch,
    /// <summary>A bond angle i–j–k with j at the centre, degrees.</summary>
    Bend,
    /// <summary>A proper dihedral i–j–k–l about the j–k bond, degrees in (−180, 180].</summary>
    Torsion,
}

/// <summary>One internal coordinate: its kind and 0-based atoms (2, 3 or 4).</summary>
public sealed record InternalCoordinate(InternalKind Kind, ImmutableArray<int> Atoms)
{
    public static InternalCoordinate Stretch(int a, int b) => new(InternalKind.Stretch, [a, b]);
    public static InternalCoordinate Bend(int i, int j, int k) => new(InternalKind.Bend, [i, j, k]);
    public static InternalCoordinate Torsion(int i, int j, int k, int l) => new(InternalKind.Torsion, [i, j, k, l]);

    /// <summary>The value at these positions: Å for a stretch, degrees for a bend or torsion.</summary>
    public double ValueAt(IReadOnlyList<Vec3> positions) => Kind switch
    {
        InternalKind.Stretch => InternalCoordinates.Distance(positions[Atoms[0]], positions[Atoms[1]]),
        InternalKind.Bend => InternalCoordinates.AngleDegrees(positions[Atoms[0]], positions[Atoms[1]], positions[Atoms[2]]),
        _ => InternalCoordinates.DihedralDegrees(positions[Atoms[0]], positions[Atoms[1]], positions[Atoms[2]], positions[Atoms[3]]),
    };

    /// <summary>"C1–C2", "C1–C2–O3" or "H5–C1–C2–O3" with 1-based numbers.</summary>
    public string Label(Molecule molecule) => string.Join("–", Atoms.Select(molecule.AtomLabel));
}

/// <summary>
/// Distances, angles and dihedrals, and the enumeration of bonded angles and proper dihedrals from a bond graph.
/// Formulas: r = |b − a|; θ = atan2(|u × v|, u·v) with u = a − b, v = c − b (robust near 0° and 180°);
/// φ = atan2(|b2| b1·(b2 × b3), (b1 × b2)·(b2 × b3)) with b1 = b − a, b2 = c − b, b3 = d − c (IUPAC sign convention:
/// positive when, looking along b→c, the front bond a–b must turn clockwise to eclipse the back bond c–d).
/// </summary>
public static class InternalCoordinates
{
    /// <summary>Angles closer than this to 180° are treated as linear: no dihedral is defined through them.</summary>
    public const double LinearAngleLimitDegrees = 175.0;

    public static double Distance(Vec3 a, Vec3 b) => (b - a).Length;

    public static double AngleDegrees(Vec3 a, Vec3 b, Vec3 c)
    {
        var u = a - b;
        var v = c - b;
        return Math.Atan2(u.Cross(v).Length, u.Dot(v)) * 180.0 / Math.PI;
    }

    public static double DihedralDegrees(Vec3 a, Vec3 b, Vec3 c, Vec3 d)
    {
        var b1 = b - a;
        var b2 = c - b;
        var b3 = d - c;
        var n1 = b1.Cross(b2);
        var n2 = b2.Cross(b3);
        var x = n1.Dot(n2);
        var y = b2.Length * b1.Dot(n2);
        var phi = Math.Atan2(y, x) * 180.0 / Math.PI;
        return phi <= -180.0 ? phi + 360.0 : phi;
    }

    /// <summary>Wraps an angle difference in degrees into (−180, 180].</summary>
    public static double WrapDegrees(double d)
    {
        d %= 360.0;
        if (d > 180.0) d -= 360.0;
        if (d <= -180.0) d += 360.0;
        return d;
    }

    /// <summary>Every bonded angle i–j–k (i &lt; k, both bonded to j).</summary>
    public static IReadOnlyList<InternalCoordinate> Angles(Connectivity bonds)
    {
        ArgumentNullException.ThrowIfNull(bonds);
        var list = new List<InternalCoordinate>();
        for (var j = 0; j < bonds.AtomCount; j++)
        {
            var n = bonds.Neighbours(j);
            for (var x = 0; x < n.Length; x++)
                for (var y = x + 1; y < n.Length; y++)
                    list.Add(InternalCoordinate.Bend(n[x], j, n[y]));
        }
        return list;
    }

    /// <summary>
    /// Every proper dihedral i–j–k–l over a bond j–k (j &lt; k), i bonded to j, l bonded to k, i ≠ l (no three-membered ring
    /// dihedrals), skipping those where i–j–k or j–k–l is within 5° of linear at <paramref name="molecule"/>'s geometry
    /// (the dihedral is undefined there).
    /// </summary>
    public static IReadOnlyList<InternalCoordinate> ProperDihedrals(Molecule molecule, Connectivity bonds)
    {
        ArgumentNullException.ThrowIfNull(molecule);
        ArgumentNullException.ThrowIfNull(bonds);
        var p = molecule.PositionsAngstrom;
        var list = new List<InternalCoordinate>();
        foreach (var bond in bonds.Bonds)
        {
            var (j, k) = (bond.A, bond.B);
            foreach (var i in bonds.Neighbours(j))
            {
                if (i == k || AngleDegrees(p[i], p[j], p[k]) > LinearAngleLimitDegrees) continue;
                foreach (var l in bonds.Neighbours(k))
                {
                    if (l == j || l == i || AngleDegrees(p[j], p[k], p[l]) > LinearAngleLimitDegrees) continue;
                    list.Add(InternalCoordinate.Torsion(i, j, k, l));
                }
            }
        }
        return list;
    }
}
