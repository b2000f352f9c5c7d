using System.Collections.Immutable;
using System.Globalization;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Vibrations;

namespace BarrierLedger.Core.Checks;

/// <summary>What a normal mode mainly does.</summary>
public enum ModeClass
{
    /// <summary>Dominated by a bond length change: the bond-forming/breaking stretch of a reaction mode, or a plain stretch.</summary>
    Stretch,
    /// <summary>Dominated by a twist about a bond; <see cref="ModeCharacterResult.RotorLike"/> says whether a terminal group turns.</summary>
    Torsion,
    /// <summary>Dominated by a bond-angle change.</summary>
    Bend,
    /// <summary>Near-zero numerical noise: a tiny wavenumber, or a displacement that is almost only overall translation and rotation.</summary>
    NumericalNoise,
    /// <summary>Not known: the mode came as a wavenumber without displacements.</summary>
    Unknown,
}

/// <summary>
/// One internal coordinate's part in a mode.
/// </summary>
/// <param name="Kind">Stretch, bend or torsion.</param>
/// <param name="Atoms">0-based atoms: 2 for a stretch, 3 for a bend, and for a torsion the 2 atoms of the bond it turns about.</param>
/// <param name="Label">"stretch C3–C11", "bend H4–C3–C11", "torsion about C2–C7".</param>
/// <param name="ChangePerUnitDisplacement">
/// dq/ds along the normalised Cartesian displacement: Å per Å for a stretch, degrees per Å for a bend or torsion
/// (for a torsion, the mean over the proper dihedrals about the bond). The sign follows the mode's arbitrary phase.
/// </param>
/// <param name="Share">This component's cos² (see <see cref="ModeCharacter"/>) divided by the sum over all components, 0–1.</param>
/// <param name="IsReactionBond">True for a stretch of a declared reaction-coordinate pair.</param>
public sealed record ModeComponent(InternalKind Kind, ImmutableArray<int> Atoms, string Label, double ChangePerUnitDisplacement, double Share, bool IsReactionBond);

/// <summary>The character of one mode.</summary>
/// <param name="FrequencyCm1">The mode's wavenumber (negative = imaginary).</param>
/// <param name="Components">All components with a non-zero share, largest share first.</param>
/// <param name="Class">The classification from the leading component (or noise).</param>
/// <param name="RotorLike">For a torsion: the smaller side of the bond is a terminal group (one atom carrying only terminal atoms, e.g. a methyl).</param>
/// <param name="RigidBodyFraction">Fraction of the squared displacement that is overall translation and rotation (0–1).</param>
/// <param name="Summary">"stretch C1–H2 (50%), stretch H2–Cl3 (50%): C1–H2 lengthens as H2–Cl3 shortens".</param>
public sealed record ModeCharacterResult(
    double FrequencyCm1,
    ImmutableArray<ModeComponent> Components,
    ModeClass Class,
    bool RotorLike,
    double RigidBodyFraction,
    string Summary)
{
    /// <summary>The <paramref name="count"/> largest components.</summary>
    public IEnumerable<ModeComponent> Leading(int count) => Components.Take(count);

    /// <summary>
    /// Bonded pairs and long contacts ranked by how fast their distance changes along the mode (<see cref="Checks.DistanceChanges"/>),
    /// so that a bond forming beyond the covalent cut-off is named even when no declared bond covers it. Empty when the mode came
    /// without displacements.
    /// </summary>
    public ImmutableArray<PairDistanceChange> DistanceChanges { get; init; } = [];
}

/// <summary>Settings for <see cref="ModeCharacter.Describe"/>.</summary>
/// <param name="NoiseFrequencyCm1">Modes with |ν̃| below this are numerical noise. Default 10 cm⁻¹: common practice, no source.</param>
/// <param name="NoiseRigidBodyFraction">Modes whose displacement is more than this fraction overall translation/rotation are numerical noise. Default 0.9: common practice, no source.</param>
/// <param name="SummaryComponentCount">How many components the summary names.</param>
/// <param name="SummaryMinimumShare">Components below this share are left out of the summary.</param>
/// <param name="Connectivity">How bonds are found.</param>
/// <param name="LongContactFactor">Atom pairs up to this multiple of their covalent-radius sum are ranked among the distance changes (<see cref="DistanceChangeOptions"/>).</param>
public sealed record ModeCharacterOptions(
    double NoiseFrequencyCm1 = 10.0,
    double NoiseRigidBodyFraction = 0.9,
    int SummaryComponentCount = 3,
    double SummaryMinimumShare = 0.05,
    ConnectivityOptions? Connectivity = null,
    double LongContactFactor = 2.0)
{
    public static ModeCharacterOptions Default { get; } = new();
}

/// <summary>
/// Which bonds, angles and torsions a normal mode moves.
/// <para>
/// The internal coordinates are every bonded distance (<see cref="Connectivity"/>) plus the declared reaction pairs,
/// every bond angle and every proper dihedral of the bond graph with the reaction pairs added (so angles at a partly formed
/// bond count). Dihedrals about the same bond are merged into one torsion whose value is their mean.
/// For each coordinate q the Cartesian gradient b = ∂q/∂x is taken by central differences (step 1e-5 Å; dihedral
/// differences wrapped into ±180°), as in the B matrix of Wilson, Decius and Cross (Molecular Vibrations, 1955). Along the
/// normalised displacement d the coordinate changes by b·d, and cos² = (b·d)² / (|b|²|d|²) is the fraction of the motion
/// that lies along the direction in which q changes fastest; it is free of units, so stretches, bends and torsions can be
/// ranked together. Shares are the cos² values normalised to sum to one.
/// </para>
/// <para>
/// Rigid-body part: d is projected on the six (five) orthonormalised overall translations and rotations about the centroid
/// (unweighted Cartesian); what lies there is no internal motion.
/// </para>
/// </summary>
public static class ModeCharacter
{
    private const double Step = 1e-5;

    /// <summary>The character of a mode given without displacements: class <see cref="ModeClass.Unknown"/>, no components.</summary>
    public static ModeCharacterResult Unknown(NormalMode mode)
    {
        ArgumentNullException.ThrowIfNull(mode);
        return new ModeCharacterResult(mode.FrequencyCm1, [], ModeClass.Unknown, false, double.NaN, "character unknown (no displacements given)");
    }

    /// <summary>Describes <paramref name="mode"/> of <paramref name="molecule"/>; <paramref name="reactionBonds"/> are 0-based atom pairs.</summary>
    public static ModeCharacterResult Describe(Molecule molecule, NormalMode mode, IReadOnlyList<(int A, int B)> reactionBonds, ModeCharacterOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(molecule);
        ArgumentNullException.ThrowIfNull(mode);
        ArgumentNullException.ThrowIfNull(reactionBonds);
        var o = options ?? ModeCharacterOptions.Default;
        var n = molecule.AtomCount;
        if (mode.DisplacementCartesian.Length != n)
            throw new ArgumentException($"The mode has {mode.DisplacementCartesian.Length} atom displacements but the molecule has {n} atoms.", nameof(mode));
        var reaction = new HashSet<Bond>();
        foreach (var (a, b) in reactionBonds)
        {
            if (a < 0 || b < 0 || a >= n || b >= n || a == b)
                throw new ArgumentException($"Reaction bond ({a + 1}, {b + 1}) does not name two different atoms among 1..{n}.", nameof(reactionBonds));
            reaction.Add(new Bond(a, b));
        }

        var d = mode.DisplacementCartesian.ToArray();
        var norm = Math.Sqrt(d.Sum(v => v.LengthSquared));
        if (!(norm > 0)) throw new ArgumentException("The mode's displacement is zero.", nameof(mode));
        d = [.. d.Select(v => v / norm)];
        var rigid = RigidBodyFraction(molecule.PositionsAngstrom, d);

        var bonded = Connectivity.Of(molecule, o.Connectivity);
        var graph = new Connectivity(n, bonded.Bonds.Concat(reaction));
        var raw = new List<(InternalKind Kind, ImmutableArray<int> Atoms, string Label, double Change, double Cos2, bool Reaction)>();
        var pos = molecule.PositionsAngstrom.ToArray();

        foreach (var bond in graph.Bonds)
        {
            var q = InternalCoordinate.Stretch(bond.A, bond.B);
            var (dq, cos2) = Project(q, pos, d);
            raw.Add((InternalKind.Stretch, [bond.A, bond.B], $"stretch {bond.Label(molecule)}", dq, cos2, reaction.Contains(bond)));
        }
        foreach (var q in InternalCoordinates.Angles(graph))
        {
            var (dq, cos2) = Project(q, pos, d);
            raw.Add((InternalKind.Bend, q.Atoms, $"bend {q.Label(molecule)}", dq * 180 / Math.PI, cos2, false));
        }
        foreach (var group in InternalCoordinates.ProperDihedrals(molecule, graph).GroupBy(q => new Bond(q.Atoms[1], q.Atoms[2])))
        {
            var (dq, cos2) = ProjectMean([.. group], pos, d);
            raw.Add((InternalKind.Torsion, [group.Key.A, group.Key.B], $"torsion about {group.Key.Label(molecule)}", dq * 180 / Math.PI, cos2, false));
        }

        var total = raw.Sum(r => r.Cos2);
        var components = raw
            .Where(r => r.Cos2 > 0 && total > 0)
            .Select(r => new ModeComponent(r.Kind, r.Atoms, r.Label, r.Change, r.Cos2 / total, r.Reaction))
            .Where(c => c.Share >= 1e-6)
            .OrderByDescending(c => c.Share)
            .ThenBy(c => c.Label, StringComparer.Ordinal)
            .ToImmutableArray();

        var noise = Math.Abs(mode.FrequencyCm1) < o.NoiseFrequencyCm1 || rigid > o.NoiseRigidBodyFraction || components.Length == 0;
        var cls = noise ? ModeClass.NumericalNoise : components[0].Kind switch
        {
            InternalKind.Stretch => ModeClass.Stretch,
            InternalKind.Torsion => ModeClass.Torsion,
            _ => ModeClass.Bend,
        };
        var rotor = cls == ModeClass.Torsion && IsTerminalGroupBond(graph, components[0].Atoms[0], components[0].Atoms[1]);
        var distances = DistanceChanges.Along(molecule, d, new DistanceChangeOptions(o.LongContactFactor, o.Connectivity), bonded);
        var summary = Summarise(molecule, components, cls, rotor, rigid, o);
        // A long contact that moves most and is not a declared pair is the motion the internal coordinates above cannot name.
        if (cls != ModeClass.NumericalNoise && distances.Length > 0 && distances[0] is { Relation: PairRelation.LongContact } top && !reaction.Contains(top.Pair))
            summary += $"; the distance that changes most is {top.Describe()}";
        return new ModeCharacterResult(mode.FrequencyCm1, components, cls, rotor, rigid, summary) { DistanceChanges = distances };
    }

    private static string Summarise(Molecule molecule, ImmutableArray<ModeComponent> components, ModeClass cls, bool rotor, double rigid, ModeCharacterOptions o)
    {
        var named = components.Take(o.SummaryComponentCount).Where(c => c.Share >= o.SummaryMinimumShare)
            .Select(c => $"{c.Label} ({Pct(c.Share)})").ToList();
        var text = named.Count > 0 ? string.Join(", ", named) : "no internal coordinate moves";
        switch (cls)
        {
            case ModeClass.NumericalNoise:
                return $"near-zero numerical noise ({Pct(rigid)} overall translation/rotation); {text}";
            case ModeClass.Torsion:
                var bond = new Bond(components[0].Atoms[0], components[0].Atoms[1]).Label(molecule);
                return rotor ? $"rotation of a terminal group about {bond}, rotor-like; {text}" : $"torsion about {bond}; {text}";
            case ModeClass.Stretch:
                var stretches = components.Where(c => c.Kind == InternalKind.Stretch).Take(2).ToArray();
                if (stretches.Length == 2 && stretches[1].Share >= 0.2 * stretches[0].Share
                    && Math.Sign(stretches[0].ChangePerUnitDisplacement) != Math.Sign(stretches[1].ChangePerUnitDisplacement))
                {
                    var (grow, shrink) = stretches[0].ChangePerUnitDisplacement > 0 ? (stretches[0], stretches[1]) : (stretches[1], stretches[0]);
                    return $"{text}: {grow.Label["stretch ".Length..]} lengthens as {shrink.Label["stretch ".Length..]} shortens (one bond breaks while the other forms)";
                }
                return text;
            default:
                return text;
        }
    }

    private static string Pct(double share) => (100 * share).ToString("0", CultureInfo.InvariantCulture) + "%";

    /// <summary>The smaller side of bond a–b is a single atom bearing only terminal atoms (a methyl, hydroxyl, amino, CF3 …).</summary>
    private static bool IsTerminalGroupBond(Connectivity g, int a, int b)
    {
        var sideB = g.SideOf(a, b);
        var sideA = g.SideOf(b, a);
        if (sideA is null || sideB is null) return false;
        var (small, pivot) = sideA.Count <= sideB.Count ? (sideA, a) : (sideB, b);
        return small.Count > 1 && small.All(x => x == pivot || g.Neighbours(x).Length == 1);
    }

    private static (double Change, double Cos2) Project(InternalCoordinate q, Vec3[] pos, Vec3[] d) => ProjectMean([q], pos, d);

    /// <summary>Gradient of the mean of <paramref name="qs"/> (radians for angles) by central differences; returns (b·d, cos²).</summary>
    private static (double Change, double Cos2) ProjectMean(IReadOnlyList<InternalCoordinate> qs, Vec3[] pos, Vec3[] d)
    {
        var grad = new Dictionary<int, Vec3>();
        foreach (var q in qs)
            foreach (var atom in q.Atoms.Distinct())
            {
                var g = new double[3];
                for (var c = 0; c < 3; c++)
                {
                    var plus = (Vec3[])pos.Clone();
                    var minus = (Vec3[])pos.Clone();
                    plus[atom] = Shift(pos[atom], c, Step);
                    minus[atom] = Shift(pos[atom], c, -Step);
                    var diff = q.ValueAt(plus) - q.ValueAt(minus);
                    if (q.Kind != InternalKind.Stretch) diff = InternalCoordinates.WrapDegrees(diff) * Math.PI / 180;
                    g[c] = diff / (2 * Step) / qs.Count;
                }
                grad[atom] = grad.GetValueOrDefault(atom) + new Vec3(g[0], g[1], g[2]);
            }
        var dot = grad.Sum(kv => kv.Value.Dot(d[kv.Key]));
        var b2 = grad.Values.Sum(v => v.LengthSquared);
        return b2 < 1e-12 ? (0.0, 0.0) : (dot, dot * dot / b2);
    }

    private static Vec3 Shift(Vec3 v, int c, double h) => c switch
    {
        0 => v with { X = v.X + h },
        1 => v with { Y = v.Y + h },
        _ => v with { Z = v.Z + h },
    };

    /// <summary>Fraction of |d|² in the span of overall translations and rotations about the centroid.</summary>
    internal static double RigidBodyFraction(IReadOnlyList<Vec3> positions, Vec3[] d)
    {
        var n = positions.Count;
        var centroid = positions.Aggregate(Vec3.Zero, (a, b) => a + b) / n;
        var basis = new List<double[]>();
        var axes = new[] { new Vec3(1, 0, 0), new Vec3(0, 1, 0), new Vec3(0, 0, 1) };
        var candidates = axes.Select(t => Enumerable.Range(0, n).Select(_ => t).ToArray())
            .Concat(axes.Select(ax => positions.Select(p => ax.Cross(p - centroid)).ToArray()));
        foreach (var cand in candidates)
        {
            var v = cand.SelectMany(x => new[] { x.X, x.Y, x.Z }).ToArray();
            foreach (var e in basis)
            {
                var proj = v.Zip(e, (a, b) => a * b).Sum();
                for (var k = 0; k < v.Length; k++) v[k] -= proj * e[k];
            }
            var len = Math.Sqrt(v.Sum(x => x * x));
            if (len < 1e-8) continue;
            basis.Add([.. v.Select(x => x / len)]);
        }
        var dv = d.SelectMany(x => new[] { x.X, x.Y, x.Z }).ToArray();
        var total = dv.Sum(x => x * x);
        return total == 0 ? 0 : basis.Sum(e => Math.Pow(dv.Zip(e, (a, b) => a * b).Sum(), 2)) / total;
    }
}
