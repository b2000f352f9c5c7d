using System.Globalization;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Symmetry;

/// <summary>
/// The point group found for a structure.
/// </summary>
/// <param name="Group">The group at <paramref name="ToleranceAngstrom"/>.</param>
/// <param name="ToleranceAngstrom">How far an atom's image under a symmetry operation may lie from the atom it maps onto.</param>
/// <param name="DeviationAngstrom">The largest such distance among the operations found (0 for C1): how symmetric the structure really is.</param>
/// <param name="Nearly">A higher group the structure reaches at ten times the tolerance (a loosely optimised symmetric structure), or null.</param>
/// <param name="NearlyDeviationAngstrom">The largest atom displacement from that higher group, when there is one.</param>
public sealed record PointGroupResult(PointGroup Group, double ToleranceAngstrom, double DeviationAngstrom, PointGroup? Nearly, double? NearlyDeviationAngstrom)
{
    /// <summary>Rotational symmetry number σ of <see cref="Group"/>.</summary>
    public int SymmetryNumber => Group.SymmetryNumber;

    /// <summary>
    /// "" or, e.g., "nearly C2v: atoms lie up to 0.12 Å from that symmetry (tolerance 0.05 Å); a tighter optimisation may reach it
    /// (σ would be 2)".
    /// </summary>
    public string Note => Nearly is null || NearlyDeviationAngstrom is null
        ? ""
        : string.Create(CultureInfo.InvariantCulture,
            $"nearly {Nearly.Name}: atoms lie up to {NearlyDeviationAngstrom.Value:0.###} Å from that symmetry (tolerance {ToleranceAngstrom:0.###} Å); " +
            $"a tighter optimisation may reach it{(Nearly.SymmetryNumber != Group.SymmetryNumber ? $" (σ would be {Nearly.SymmetryNumber}, not {Group.SymmetryNumber})" : "")}");
}

/// <summary>
/// Point group and rotational symmetry number of a structure from its geometry.
/// <para>
/// Method (the flow chart of any group-theory text, e.g. F. A. Cotton, Chemical Applications of Group Theory, 3rd ed., 1990,
/// ch. 3): centre on the centre of mass (isotope masses) and turn into the principal-axis frame; an atom is linear when every
/// atom lies within the tolerance of one line (C∞v, or D∞h with a centre of inversion). Otherwise candidate axes are the
/// principal axes and, when two or three principal moments are equal within what the tolerance allows (symmetric and
/// spherical tops, whose symmetry axes need not be principal axes), directions built from the smallest class of
/// interchangeable atoms (same element, same distance from the centre): through an atom, through the midpoint of two, normal
/// to the plane of three. Each candidate's highest proper rotation order is found; two or more axes of order ≥ 3 at
/// distinct angles make a cubic or icosahedral group (T, Td, Th, O, Oh, I, Ih); otherwise the highest axis Cn is the main
/// axis and two-fold axes perpendicular to it give the D groups (Dnh with a horizontal mirror, Dnd with vertical mirrors,
/// else Dn), their absence the C groups (Cnh, Cnv, S2n, Cn); without any axis, Cs, Ci or C1.
/// </para>
/// <para>
/// An operation holds when the image of every atom lies within <c>toleranceAngstrom</c> of an atom of the same element. The
/// structure is examined again at ten times the tolerance; a higher group found there is reported as "nearly" that group,
/// with the largest displacement, so that a loosely optimised symmetric structure can be tidied up.
/// </para>
/// σ follows from the group (<see cref="PointGroup.SymmetryNumber"/>). Chirality does not enter σ: a chiral structure
/// (<see cref="PointGroup.IsChiral"/>) has the σ of its group, and the number of optical isomers is a separate factor (see
/// docs/symmetry.md).
/// </summary>
public static class PointGroups
{
    /// <summary>
    /// Default tolerance, 0.05 Å: far above the round-off of optimised coordinates written with 5–6 decimals (10⁻⁵ Å) and the
    /// asymmetry a default optimisation leaves (typically 10⁻³–10⁻² Å), far below the 0.5 Å and more that separates a real
    /// lower-symmetry structure from a symmetric one (common practice, no source).
    /// </summary>
    public const double DefaultToleranceAngstrom = 0.05;

    /// <summary>How much looser the "nearly" search is than the tolerance.</summary>
    public const double NearlyFactor = 10.0;

    /// <summary>Point group of <paramref name="molecule"/> at <paramref name="toleranceAngstrom"/> (Å), with a "nearly" higher group at ten times it.</summary>
    public static PointGroupResult Detect(Molecule molecule, double toleranceAngstrom = DefaultToleranceAngstrom)
    {
        ArgumentNullException.ThrowIfNull(molecule);
        if (molecule.AtomCount == 0) throw new ArgumentException("The molecule has no atoms.", nameof(molecule));
        if (!(toleranceAngstrom > 0) || !double.IsFinite(toleranceAngstrom))
            throw new ArgumentException($"The tolerance must be positive and finite, got {toleranceAngstrom} Å.", nameof(toleranceAngstrom));
        for (var i = 0; i < molecule.AtomCount; i++)
            if (!molecule.PositionsAngstrom[i].IsFinite)
                throw new ArgumentException($"Atom {molecule.AtomLabel(i)} has a non-finite position.", nameof(molecule));

        var (group, deviation) = Classify(molecule, toleranceAngstrom);
        var (loose, looseDeviation) = Classify(molecule, toleranceAngstrom * NearlyFactor);
        var higher = loose.Order > group.Order && loose != group;
        return new PointGroupResult(group, toleranceAngstrom, deviation, higher ? loose : null, higher ? looseDeviation : null);
    }

    private static (PointGroup Group, double Deviation) Classify(Molecule molecule, double tolerance)
    {
        if (molecule.AtomCount == 1) return (new PointGroup(PointGroupFamily.Kh), 0);
        var f = new SymmetryFrame(molecule, tolerance);
        var group = Find(f);
        return (group, f.LargestAcceptedDeviation);
    }

    private static PointGroup Find(SymmetryFrame f)
    {
        if (f.IsLinear())
            return f.Holds(Operation.Inversion) ? new PointGroup(PointGroupFamily.DInfinityH) : new PointGroup(PointGroupFamily.CInfinityV);

        var d01 = f.Degenerate(0, 1);
        var d12 = f.Degenerate(1, 2);
        var spherical = d01 && d12;
        // The unique axis of a symmetric top: the principal axis whose moment differs from the other two.
        Vec3? unique = spherical ? null : d01 ? SymmetryFrame.Axis(2) : d12 ? SymmetryFrame.Axis(0) : null;

        var candidates = new List<Vec3> { SymmetryFrame.Axis(0), SymmetryFrame.Axis(1), SymmetryFrame.Axis(2) };
        var mirrorNormals = new List<Vec3>(candidates);
        if (d01 || d12) AddClassCandidates(f, candidates, mirrorNormals, spherical);

        var axes = new List<(Vec3 Axis, int Order)>();
        foreach (var c in candidates) AddAxis(axes, c, f.MaxOrder(c));

        var high = axes.Where(a => a.Order >= 3).ToList();
        if (high.Any(a => high.Any(b => Math.Abs(a.Axis.Dot(b.Axis)) < Math.Cos(30 * Math.PI / 180))))
            return Cubic(f, axes, mirrorNormals);

        if (axes.Count == 0)
        {
            if (mirrorNormals.Any(n => f.Holds(Operation.Reflection(n)))) return new PointGroup(PointGroupFamily.Cs);
            return f.Holds(Operation.Inversion) ? new PointGroup(PointGroupFamily.Ci) : PointGroup.C1;
        }

        // The main axis: the highest order; among equals (D2, D2d), the one nearest the symmetric top's unique axis.
        var top = axes.Max(a => a.Order);
        var main = axes.Where(a => a.Order == top)
            .OrderByDescending(a => unique is { } u ? Math.Abs(a.Axis.Dot(u)) : 0).First();
        var (axis, n) = main;
        var inPlane = InPlaneCandidates(f, axis);
        var perpendicularC2 = axes.Any(a => a.Order % 2 == 0 && Math.Abs(a.Axis.Dot(axis)) < 0.1)
                              || inPlane.Any(w => f.Holds(Operation.Rotation(w, Math.PI)));
        var horizontal = f.Holds(Operation.Reflection(axis));
        if (perpendicularC2)
        {
            if (horizontal) return new PointGroup(PointGroupFamily.Dnh, n);
            return inPlane.Any(w => f.Holds(Operation.Reflection(axis.Cross(w).Normalized())))
                ? new PointGroup(PointGroupFamily.Dnd, n)
                : new PointGroup(PointGroupFamily.Dn, n);
        }
        if (horizontal) return new PointGroup(PointGroupFamily.Cnh, n);
        if (inPlane.Any(w => f.Holds(Operation.Reflection(axis.Cross(w).Normalized())))) return new PointGroup(PointGroupFamily.Cnv, n);
        if (f.Holds(Operation.Improper(axis, Math.PI / n))) return new PointGroup(PointGroupFamily.Sn, 2 * n);
        return new PointGroup(PointGroupFamily.Cn, n);
    }

    /// <summary>T, Td, Th, O, Oh, I or Ih from the axes found (at least two of order ≥ 3).</summary>
    private static PointGroup Cubic(SymmetryFrame f, List<(Vec3 Axis, int Order)> axes, List<Vec3> mirrorNormals)
    {
        var inversion = f.Holds(Operation.Inversion);
        if (axes.Any(a => a.Order % 5 == 0)) return new PointGroup(inversion ? PointGroupFamily.Ih : PointGroupFamily.I);
        if (axes.Any(a => a.Order % 4 == 0)) return new PointGroup(inversion ? PointGroupFamily.Oh : PointGroupFamily.O);
        if (inversion) return new PointGroup(PointGroupFamily.Th);
        // Td's dihedral planes contain one two-fold axis and bisect the other two: normals along the sum or difference of two
        // C2 axes; they also swap two atoms of a class (normal along their difference).
        var c2 = axes.Where(a => a.Order == 2).Select(a => a.Axis).ToList();
        var normals = new List<Vec3>(mirrorNormals);
        for (var i = 0; i < c2.Count; i++)
            for (var j = i + 1; j < c2.Count; j++)
            {
                AddDirection(normals, c2[i] + c2[j]);
                AddDirection(normals, c2[i] - c2[j]);
            }
        return new PointGroup(normals.Any(n => f.Holds(Operation.Reflection(n))) ? PointGroupFamily.Td : PointGroupFamily.T);
    }

    /// <summary>
    /// Candidate axes from the smallest class of interchangeable atoms (first atom a): through a; through the midpoint of a and
    /// each other atom b (a two-fold axis swapping them); for a spherical top, normal to the plane of a, b and c (an n-fold axis
    /// turning a into b and b into c). Candidate mirror normals: along a − b (a plane swapping them).
    /// </summary>
    private static void AddClassCandidates(SymmetryFrame f, List<Vec3> axes, List<Vec3> normals, bool spherical)
    {
        if (f.SmallestOffClass(null) is not { } cls) return;
        var a = f.Position(cls[0]);
        AddDirection(axes, a);
        for (var j = 1; j < cls.Length; j++)
        {
            var b = f.Position(cls[j]);
            if ((a + b).Length > f.Tolerance) AddDirection(axes, a + b);
            AddDirection(normals, a - b);
            if (!spherical) continue;
            for (var k = j + 1; k < cls.Length; k++)
                AddDirection(axes, (b - a).Cross(f.Position(cls[k]) - a));
        }
        // A pair through the centre (b = −a) fixes no direction by itself; the normal of a, b and the next atom does.
        if (cls.Length >= 2) AddDirection(axes, a.Cross(f.Position(cls[1])));
    }

    /// <summary>
    /// Directions perpendicular to <paramref name="axis"/> that can carry a two-fold axis or lie in a vertical mirror plane:
    /// through the first off-axis atom a of the smallest suitable class, and bisecting a and each other atom b of it (or, when
    /// they are opposite, perpendicular to both in the plane).
    /// </summary>
    private static List<Vec3> InPlaneCandidates(SymmetryFrame f, Vec3 axis)
    {
        var result = new List<Vec3>();
        if (f.SmallestOffClass(axis) is not { } cls) return result;
        Vec3 Perp(Vec3 p) => p - p.Dot(axis) * axis;
        var a = Perp(f.Position(cls[0]));
        AddDirection(result, a);
        AddDirection(result, axis.Cross(a));
        for (var j = 1; j < cls.Length; j++)
        {
            var b = Perp(f.Position(cls[j]));
            var sum = a + b;
            if (sum.Length > f.Tolerance) AddDirection(result, sum);
            else AddDirection(result, axis.Cross(a - b));
        }
        return result;
    }

    /// <summary>Adds the unit direction of <paramref name="v"/> unless it is (anti)parallel to one already there or too short.</summary>
    private static void AddDirection(List<Vec3> list, Vec3 v)
    {
        var length = v.Length;
        if (!(length > 1e-6)) return;
        var u = v / length;
        foreach (var w in list)
            if (Math.Abs(w.Dot(u)) > 0.99999) return;
        list.Add(u);
    }

    /// <summary>Adds an axis of order ≥ 2, merging it with one within 5° (keeping the higher order).</summary>
    private static void AddAxis(List<(Vec3 Axis, int Order)> axes, Vec3 axis, int order)
    {
        if (order < 2) return;
        for (var i = 0; i < axes.Count; i++)
        {
            if (Math.Abs(axes[i].Axis.Dot(axis)) <= Math.Cos(5 * Math.PI / 180)) continue;
            if (order > axes[i].Order) axes[i] = (axis, order);
            return;
        }
        axes.Add((axis, order));
    }
}
