using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Symmetry;

/// <summary>
/// A structure prepared for symmetry tests: centred on its centre of mass, turned into its principal-axis frame, its atoms
/// sorted into classes that a symmetry operation may permute among themselves (same element, same distance from the centre
/// within the tolerance), and the operations tested against it. An operation holds when every atom's image lies within the
/// tolerance of an atom of its class.
/// </summary>
internal sealed class SymmetryFrame
{
    private readonly Vec3[] _x;
    private readonly int[][] _classes;
    private readonly int[] _classOf;

    public SymmetryFrame(Molecule molecule, double toleranceAngstrom)
    {
        Tolerance = toleranceAngstrom;
        var masses = Inertia.MassesAmu(molecule);
        var (moments, axes) = Inertia.PrincipalAxes(molecule, masses);
        var com = Inertia.CentreOfMass(molecule, masses);
        Moments = moments;
        _x = new Vec3[molecule.AtomCount];
        for (var i = 0; i < _x.Length; i++)
        {
            var r = molecule.PositionsAngstrom[i] - com;
            _x[i] = new Vec3(r.Dot(axes[0]), r.Dot(axes[1]), r.Dot(axes[2]));
        }

        // Classes: sorted by element, then distance from the centre; neighbours within the tolerance share a class.
        var order = Enumerable.Range(0, _x.Length).OrderBy(i => molecule.Elements[i].AtomicNumber).ThenBy(i => _x[i].Length).ToArray();
        var classes = new List<List<int>>();
        for (var k = 0; k < order.Length; k++)
        {
            var i = order[k];
            if (k > 0 && molecule.Elements[order[k - 1]].AtomicNumber == molecule.Elements[i].AtomicNumber
                      && _x[i].Length - _x[order[k - 1]].Length <= toleranceAngstrom)
                classes[^1].Add(i);
            else
                classes.Add([i]);
        }
        _classes = [.. classes.Select(c => c.ToArray())];
        _classOf = new int[_x.Length];
        for (var c = 0; c < _classes.Length; c++)
            foreach (var i in _classes[c]) _classOf[i] = c;

        // Moments closer than the most a displacement of every atom by the tolerance can move them count as equal:
        // δI ≤ Σ m (2 |r| tol + tol²) for each moment, twice that for a difference.
        var bound = 0.0;
        for (var i = 0; i < _x.Length; i++) bound += masses[i] * (2 * _x[i].Length * toleranceAngstrom + toleranceAngstrom * toleranceAngstrom);
        MomentTolerance = 2 * bound;
    }

    public double Tolerance { get; }

    /// <summary>Principal moments (amu·Å², ascending); the frame's x, y, z axes are their axes.</summary>
    public double[] Moments { get; }

    public double MomentTolerance { get; }

    public int AtomCount => _x.Length;

    /// <summary>The largest atom displacement of any operation found to hold so far.</summary>
    public double LargestAcceptedDeviation { get; private set; }

    public static Vec3 Axis(int k) => k switch { 0 => new Vec3(1, 0, 0), 1 => new Vec3(0, 1, 0), _ => new Vec3(0, 0, 1) };

    public bool Degenerate(int a, int b) => Math.Abs(Moments[a] - Moments[b]) <= MomentTolerance;

    /// <summary>True when every atom lies within the tolerance of the line along the axis of the smallest moment.</summary>
    public bool IsLinear() => _x.All(p => Math.Sqrt(p.Y * p.Y + p.Z * p.Z) <= Tolerance);

    /// <summary>Whether the operation (a 3×3 matrix, row-major) maps the structure onto itself within the tolerance.</summary>
    public bool Holds(Operation op)
    {
        var d = Deviation(op, Tolerance);
        if (d > Tolerance) return false;
        LargestAcceptedDeviation = Math.Max(LargestAcceptedDeviation, d);
        return true;
    }

    /// <summary>
    /// The largest distance from an atom's image to the nearest atom of its class; stops early (returning +∞) as soon as one
    /// atom exceeds <paramref name="limit"/>.
    /// </summary>
    public double Deviation(Operation op, double limit)
    {
        var worst = 0.0;
        var limit2 = limit * limit;
        for (var i = 0; i < _x.Length; i++)
        {
            var image = op.Apply(_x[i]);
            var best = double.PositiveInfinity;
            foreach (var j in _classes[_classOf[i]])
            {
                var d = (image - _x[j]).LengthSquared;
                if (d < best) best = d;
            }
            if (best > limit2) return double.PositiveInfinity;
            if (best > worst) worst = best;
        }
        return Math.Sqrt(worst);
    }

    /// <summary>
    /// The highest n for which the n-fold rotation about <paramref name="axis"/> holds (1 when none does). Off-axis atoms of a
    /// class fall into orbits of exactly n atoms, so only divisors of the greatest common divisor of those counts are tried.
    /// </summary>
    public int MaxOrder(Vec3 axis)
    {
        var g = 0;
        foreach (var cls in _classes)
        {
            var off = 0;
            foreach (var i in cls)
            {
                var p = _x[i];
                var along = p.Dot(axis);
                if (p.LengthSquared - along * along > Tolerance * Tolerance) off++;
            }
            g = Gcd(g, off);
            if (g == 1) return 1;
        }
        if (g == 0) return 1; // every atom on the axis: a linear structure, handled before
        for (var n = g; n >= 2; n--)
            if (g % n == 0 && Holds(Operation.Rotation(axis, 2 * Math.PI / n))) return n;
        return 1;
    }

    /// <summary>Position of atom <paramref name="i"/> in the principal-axis frame.</summary>
    public Vec3 Position(int i) => _x[i];

    /// <summary>
    /// The atoms of the smallest class that has an atom at least the tolerance away from <paramref name="line"/> (from the centre
    /// when null), with such an atom first. Every symmetry operation permutes such a class, so candidate axes and planes can be
    /// built from it alone.
    /// </summary>
    public int[]? SmallestOffClass(Vec3? line)
    {
        int[]? best = null;
        var bestFirst = -1;
        foreach (var cls in _classes)
        {
            if (best is not null && cls.Length >= best.Length) continue;
            var first = -1;
            foreach (var i in cls)
                if (Off(_x[i], line) > Tolerance) { first = i; break; }
            if (first < 0) continue;
            best = cls;
            bestFirst = first;
        }
        if (best is null) return null;
        return [bestFirst, .. best.Where(i => i != bestFirst)];
    }

    private static double Off(Vec3 p, Vec3? line)
    {
        if (line is not { } u) return p.Length;
        var along = p.Dot(u);
        return Math.Sqrt(Math.Max(0, p.LengthSquared - along * along));
    }

    private static int Gcd(int a, int b)
    {
        while (b != 0) (a, b) = (b, a % b);
        return a;
    }
}

/// <summary>An orthogonal 3×3 operation (rotation, reflection, improper rotation, inversion), row-major.</summary>
internal readonly record struct Operation(double A, double B, double C, double D, double E, double F, double G, double H, double I)
{
    public Vec3 Apply(Vec3 v) => new(A * v.X + B * v.Y + C * v.Z, D * v.X + E * v.Y + F * v.Z, G * v.X + H * v.Y + I * v.Z);

    public static Operation Inversion { get; } = new(-1, 0, 0, 0, -1, 0, 0, 0, -1);

    /// <summary>Rotation by <paramref name="angle"/> (rad) about the unit <paramref name="u"/> (Rodrigues' formula).</summary>
    public static Operation Rotation(Vec3 u, double angle)
    {
        var (c, s) = (Math.Cos(angle), Math.Sin(angle));
        var t = 1 - c;
        return new(
            c + u.X * u.X * t, u.X * u.Y * t - u.Z * s, u.X * u.Z * t + u.Y * s,
            u.Y * u.X * t + u.Z * s, c + u.Y * u.Y * t, u.Y * u.Z * t - u.X * s,
            u.Z * u.X * t - u.Y * s, u.Z * u.Y * t + u.X * s, c + u.Z * u.Z * t);
    }

    /// <summary>Reflection through the plane with unit normal <paramref name="n"/>: 1 − 2 n nᵀ.</summary>
    public static Operation Reflection(Vec3 n) => new(
        1 - 2 * n.X * n.X, -2 * n.X * n.Y, -2 * n.X * n.Z,
        -2 * n.Y * n.X, 1 - 2 * n.Y * n.Y, -2 * n.Y * n.Z,
        -2 * n.Z * n.X, -2 * n.Z * n.Y, 1 - 2 * n.Z * n.Z);

    /// <summary>Improper rotation S: rotation by <paramref name="angle"/> about <paramref name="u"/>, then reflection through the plane normal to it.</summary>
    public static Operation Improper(Vec3 u, double angle) => Reflection(u).Times(Rotation(u, angle));

    public Operation Times(Operation o) => new(
        A * o.A + B * o.D + C * o.G, A * o.B + B * o.E + C * o.H, A * o.C + B * o.F + C * o.I,
        D * o.A + E * o.D + F * o.G, D * o.B + E * o.E + F * o.H, D * o.C + E * o.F + F * o.I,
        G * o.A + H * o.D + I * o.G, G * o.B + H * o.E + I * o.H, G * o.C + H * o.F + I * o.I);
}
