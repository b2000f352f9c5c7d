using System.Collections.Immutable;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Conformers;

/// <summary>How one conformer was numbered into the ensemble's common atom order.</summary>
/// <param name="Index">0-based position of the conformer in the ensemble.</param>
/// <param name="Comparable">It has the reference's atoms and bonds, so it can be compared with the others.</param>
/// <param name="SameOrder">Its atoms were already in the reference's order.</param>
/// <param name="Message">How its atoms were matched, or why they could not be.</param>
public sealed record ConformerNumbering(int Index, bool Comparable, bool SameOrder, string Message);

/// <summary>Two conformers superposed for display: both in the ensemble's atom order, the second moved onto the first.</summary>
/// <param name="First">The first conformer (positions as given, atoms in the ensemble's order).</param>
/// <param name="SecondAligned">
/// The second conformer rotated and moved onto the first, its atoms listed so that atom i corresponds to atom i of
/// <paramref name="First"/> (equivalent atoms renumbered as the comparison matched them; hydrogens left out of a heavy-atom
/// comparison keep the order their groups were listed in).
/// </param>
/// <param name="RmsdAngstrom">The permutation-aware RMSD of the comparison, Å.</param>
/// <param name="Mirrored">The second conformer was mirrored first (it superposes better as a mirror image).</param>
public sealed record ConformerOverlay(Molecule First, Molecule SecondAligned, double RmsdAngstrom, bool Mirrored);

/// <summary>
/// The conformers of one species prepared for pairwise comparison: RMSD after optimal superposition (<see cref="Kabsch"/>) and
/// after renumbering atoms that are equivalent by the bond graph (same element, same bonded neighbourhood:
/// <see cref="AtomMapping.EquivalenceClasses"/>), heavy atoms only by default.
/// <para>
/// Preparation, once per ensemble: a reference conformer is chosen (the first whose bond graph is the most common one), every
/// conformer is numbered into the reference's atom order by graph isomorphism (<see cref="AtomMapping.FindAny"/>),
/// and the reference's bond-preserving self-mappings are listed (<see cref="AtomMapping.Symmetry"/>). Every bond-preserving
/// mapping between two conformers is then one of those self-mappings, so a pair costs one superposition per self-mapping (a
/// phenyl ring flip, two methyls of an isopropyl group ...) and no graph search. Interchangeable terminal groups (the three
/// fluorines of CF₃, the two oxygens of a nitro group) are ordered by geometry as in <see cref="AtomMapping"/>.
/// </para>
/// <para>
/// Mirror images: the RMSD of one conformer mirrored (x → −x) onto another; a small value with a large direct RMSD marks
/// enantiomers (Kabsch with the improper-rotation correction never superposes a mirror image by rotation: Kabsch, Acta Cryst.
/// A 1978, 34, 827).
/// </para>
/// </summary>
public sealed class ConformerAlignment
{
    private readonly Vec3[]?[] _positions;
    private readonly Vec3[]?[] _mirrored;
    private readonly int[][] _maps;
    private readonly int[] _scored;
    private readonly int[] _fit;
    private readonly int[][] _groups;
    private readonly bool _fitOrients;
    private readonly AtomMappingOptions _mapping;
    private readonly Molecule _reference;

    private ConformerAlignment(Molecule reference, Vec3[]?[] positions, ImmutableArray<ConformerNumbering> numbering, AtomSymmetry symmetry,
        bool heavyOnly, AtomMappingOptions mapping, int referenceIndex)
    {
        _reference = reference;
        _positions = positions;
        _mirrored = [.. positions.Select(p => p?.Select(v => new Vec3(-v.X, v.Y, v.Z)).ToArray())];
        Numbering = numbering;
        HeavyAtomsOnly = heavyOnly;
        _mapping = mapping;
        ReferenceIndex = referenceIndex;
        _maps = [.. symmetry.SkeletonMappings.Select(m => m.ToArray())];
        Symmetry = symmetry;
        var n = reference.AtomCount;
        var scored = new bool[n];
        for (var i = 0; i < n; i++) scored[i] = !heavyOnly || reference.Elements[i].AtomicNumber > 1;
        _scored = [.. Enumerable.Range(0, n).Where(i => scored[i])];
        _groups = [.. symmetry.Groups.Where(g => scored[g.Members[0]]).Select(g => g.Members.ToArray())];
        var inScoredGroup = new bool[n];
        foreach (var g in _groups) foreach (var a in g) inScoredGroup[a] = true;
        _fit = [.. _scored.Where(i => !inScoredGroup[i])];
        _fitOrients = AtomMapping.FixesOrientation([.. _fit.Select(i => reference.PositionsAngstrom[i])]);
    }

    /// <summary>Number of conformers.</summary>
    public int Count => _positions.Length;

    /// <summary>The conformer whose atom order and bond graph all others are numbered into (0-based).</summary>
    public int ReferenceIndex { get; }

    /// <summary>How each conformer was numbered into the common order.</summary>
    public ImmutableArray<ConformerNumbering> Numbering { get; }

    /// <summary>The RMSD is taken over heavy atoms only (false: all atoms, by choice or because fewer than three heavy atoms exist).</summary>
    public bool HeavyAtomsOnly { get; }

    /// <summary>The reference's bond-preserving self-mappings (the permutations of equivalent atoms every pair is compared under).</summary>
    public AtomSymmetry Symmetry { get; }

    /// <summary>Number of atoms in the RMSD.</summary>
    public int ComparedAtomCount => _scored.Length;

    /// <summary>
    /// Numbers every conformer into one atom order and lists the equivalent-atom permutations. Conformers with other atoms or other
    /// bonds than the reference are kept but marked not comparable (their RMSDs are NaN).
    /// </summary>
    public static ConformerAlignment Prepare(IReadOnlyList<Molecule> conformers, ConformerOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(conformers);
        if (conformers.Count == 0) throw new ArgumentException("At least one conformer is needed.", nameof(conformers));
        for (var k = 0; k < conformers.Count; k++)
            if (conformers[k] is null) throw new ArgumentException($"Conformer {k + 1} is missing.", nameof(conformers));
        var o = options ?? ConformerOptions.Default;
        o.Validate(nameof(options));
        var mapping = o.Mapping ?? AtomMappingOptions.Default;
        var bonds = conformers.Select(c => Connectivity.Of(c, o.Connectivity)).ToArray();

        // The reference: the first conformer of the most common signature (every atom's element with its neighbours' elements,
        // the first round of the equivalence-class refinement), so one odd structure listed first does not make the whole
        // ensemble incomparable.
        var signatures = conformers.Select((c, k) => string.Join(";", Enumerable.Range(0, c.AtomCount)
            .Select(i => c.Elements[i].Symbol + ":" + string.Join(",", bonds[k].Neighbours(i).Select(x => c.Elements[x].Symbol).Order(StringComparer.Ordinal)))
            .Order(StringComparer.Ordinal))).ToArray();
        var common = signatures.GroupBy(s => s).OrderByDescending(g => g.Count()).ThenBy(g => Array.IndexOf(signatures, g.Key)).First().Key;
        var r = Array.IndexOf(signatures, common);
        var reference = conformers[r];

        var positions = new Vec3[]?[conformers.Count];
        var numbering = new ConformerNumbering[conformers.Count];
        for (var k = 0; k < conformers.Count; k++)
        {
            if (k == r)
            {
                positions[k] = [.. reference.PositionsAngstrom];
                numbering[k] = new ConformerNumbering(k, true, true, "the reference numbering");
                continue;
            }
            var m = AtomMapping.FindAny(conformers[k], bonds[k], reference, bonds[r]);
            if (!m.Succeeded)
            {
                numbering[k] = new ConformerNumbering(k, false, false, $"not comparable with conformer {r + 1}: {m.Message}");
                continue;
            }
            var p = new Vec3[reference.AtomCount];
            for (var i = 0; i < p.Length; i++) p[m.Map[i]] = conformers[k].PositionsAngstrom[i];
            positions[k] = p;
            numbering[k] = new ConformerNumbering(k, true, m.IsIdentity, m.Message);
        }
        var heavy = reference.Elements.Count(e => e.AtomicNumber > 1);
        var heavyOnly = o.HeavyAtomsOnly && heavy >= 3;
        var symmetry = AtomMapping.Symmetry(reference, bonds[r], mapping);
        return new ConformerAlignment(reference, positions, [.. numbering], symmetry, heavyOnly, mapping, r);
    }

    /// <summary>Whether conformer <paramref name="k"/> could be numbered into the common order.</summary>
    public bool IsComparable(int k) => _positions[k] is not null;

    /// <summary>
    /// The smallest RMSD (Å) of conformer <paramref name="i"/> onto conformer <paramref name="j"/> over proper rotations,
    /// translations and every permutation of equivalent atoms; NaN when either is not comparable.
    /// </summary>
    public double Rmsd(int i, int j) => Best(i, j, mirror: false).Rmsd;

    /// <summary>The same with conformer <paramref name="i"/> mirrored first (x → −x): near 0 for a mirror image.</summary>
    public double MirrorRmsd(int i, int j) => Best(i, j, mirror: true).Rmsd;

    /// <summary>The RMSD of every pair (symmetric, zero diagonal; NaN for conformers not comparable).</summary>
    public double[,] RmsdMatrix()
    {
        var n = Count;
        var d = new double[n, n];
        for (var i = 0; i < n; i++)
            for (var j = i + 1; j < n; j++)
                d[i, j] = d[j, i] = Rmsd(i, j);
        for (var i = 0; i < n; i++) d[i, i] = IsComparable(i) ? 0 : double.NaN;
        return d;
    }

    /// <summary>
    /// Conformer <paramref name="second"/> superposed onto <paramref name="first"/> for display (all atoms moved with the rotation
    /// found on the compared atoms); mirrored first when <paramref name="allowMirror"/> and the mirror image fits better.
    /// </summary>
    public ConformerOverlay Overlay(int first, int second, bool allowMirror = false)
    {
        if (!IsComparable(first) || !IsComparable(second))
            throw new ArgumentException($"Conformers {first + 1} and {second + 1} cannot be superposed: {Numbering[IsComparable(first) ? second : first].Message}.", nameof(second));
        var direct = Best(second, first, mirror: false);
        var use = direct;
        var mirrored = false;
        if (allowMirror)
        {
            var m = Best(second, first, mirror: true);
            if (m.Rmsd < direct.Rmsd) { use = m; mirrored = true; }
        }
        var x = mirrored ? _mirrored[second]! : _positions[second]!;
        // Atom a of the second conformer was matched to atom Map[a] of the first: list it there, so atom i of both is one atom.
        var moved = new Vec3[x.Length];
        for (var a = 0; a < x.Length; a++) moved[use.Map[a]] = Apply(use.Rotation, use.MobileCentroid, use.TargetCentroid, x[a]);
        return new ConformerOverlay(new Molecule(_reference.Elements, _positions[first]!, _reference.Charge, _reference.Multiplicity),
            new Molecule(_reference.Elements, moved, _reference.Charge, _reference.Multiplicity), use.Rmsd, mirrored);
    }

    /// <summary>A superposition: RMSD, rotation and centroids, and the atom matching it used.</summary>
    private sealed record Fit(double Rmsd, double[] Rotation, Vec3 MobileCentroid, Vec3 TargetCentroid, int[] Map);

    /// <summary>Scratch space of one comparison, so the inner loop allocates nothing.</summary>
    private sealed class Work(int atoms, int compared, int largestGroup)
    {
        public readonly int[] Map = new int[atoms];
        public readonly Vec3[] Mobile = new Vec3[compared];
        public readonly Vec3[] Target = new Vec3[compared];
        public readonly double[] Rotation = new double[9];
        public Vec3 MobileCentroid, TargetCentroid;
        public readonly Vec3[] Moved = new Vec3[largestGroup];
        public readonly int[] Targets = new int[largestGroup];
        public readonly int[] Order = new int[largestGroup];
    }

    private Fit Best(int i, int j, bool mirror)
    {
        if (!IsComparable(i) || !IsComparable(j)) return new Fit(double.NaN, [], Vec3.Zero, Vec3.Zero, []);
        var x = mirror ? _mirrored[i]! : _positions[i]!;
        var y = _positions[j]!;
        var w = new Work(x.Length, _scored.Length, _groups.Length == 0 ? 0 : _groups.Max(g => g.Length));
        Fit? best = null;
        foreach (var alpha in _maps)
        {
            Array.Copy(alpha, w.Map, w.Map.Length);
            var rmsd = Score(x, y, w);
            if (best is null || rmsd < best.Rmsd)
                best = new Fit(rmsd, (double[])w.Rotation.Clone(), w.MobileCentroid, w.TargetCentroid, (int[])w.Map.Clone());
        }
        return best!;
    }

    /// <summary>RMSD of x onto y with atom a of x matched to atom Map[a] of y; interchangeable groups reordered by geometry.</summary>
    private double Score(Vec3[] x, Vec3[] y, Work w)
    {
        if (_groups.Length == 0) return Superpose(x, y, _scored, w);
        if (!_fitOrients) return TryEveryOrder(x, y, w);
        var rmsd = Superpose(x, y, _fit, w);
        for (var iteration = 0; iteration < 20; iteration++)
        {
            var changed = PlaceGroups(x, y, w);
            rmsd = Superpose(x, y, _scored, w);
            if (!changed && iteration > 0) break;
        }
        return rmsd;
    }

    /// <summary>Each group takes the order of its targets nearest to its atoms moved by the current superposition; true when any changed.</summary>
    private bool PlaceGroups(Vec3[] x, Vec3[] y, Work w)
    {
        var changed = false;
        foreach (var members in _groups)
        {
            var moved = w.Moved.AsSpan(0, members.Length);
            var targets = w.Targets.AsSpan(0, members.Length);
            for (var k = 0; k < members.Length; k++)
            {
                moved[k] = Apply(w.Rotation, w.MobileCentroid, w.TargetCentroid, x[members[k]]);
                targets[k] = w.Map[members[k]];
            }
            targets.Sort();
            var order = w.Order.AsSpan(0, members.Length);
            AtomMapping.NearestOrder(moved, targets, y, order);
            for (var k = 0; k < members.Length; k++)
            {
                if (w.Map[members[k]] != order[k]) changed = true;
                w.Map[members[k]] = order[k];
            }
        }
        return changed;
    }

    /// <summary>When the skeleton cannot orient the structure: every order of the groups (up to the mapping limit), else by geometry.</summary>
    private double TryEveryOrder(Vec3[] x, Vec3[] y, Work w)
    {
        var targets = _groups.Select(g => g.Select(a => w.Map[a]).Order().ToArray()).ToArray();
        var combinations = targets.Aggregate(1.0, (acc, t) => acc * Enumerable.Range(1, t.Length).Aggregate(1.0, (a, b) => a * b));
        if (combinations > _mapping.MaxGroupPermutations)
        {
            // Too many orders: place by geometry from a superposition on every compared atom.
            Superpose(x, y, _scored, w);
            PlaceGroups(x, y, w);
            return Superpose(x, y, _scored, w);
        }
        var perms = targets.Select(t => AtomMapping.OrdersOf(t).ToList()).ToList();
        var index = new int[perms.Count];
        var best = double.PositiveInfinity;
        int[] bestMap = [];
        while (true)
        {
            for (var g = 0; g < _groups.Length; g++)
                for (var k = 0; k < _groups[g].Length; k++) w.Map[_groups[g][k]] = perms[g][index[g]][k];
            var r = Superpose(x, y, _scored, w);
            if (r < best) { best = r; bestMap = (int[])w.Map.Clone(); }
            var p = 0;
            while (p < index.Length && ++index[p] == perms[p].Count) { index[p] = 0; p++; }
            if (p == index.Length) break;
        }
        Array.Copy(bestMap, w.Map, w.Map.Length);
        return Superpose(x, y, _scored, w);
    }

    /// <summary>Superposes the listed atoms of x onto their matches in y (<see cref="Kabsch.Fit"/>); the rotation stays in the scratch space.</summary>
    private static double Superpose(Vec3[] x, Vec3[] y, int[] atoms, Work w)
    {
        for (var k = 0; k < atoms.Length; k++)
        {
            w.Mobile[k] = x[atoms[k]];
            w.Target[k] = y[w.Map[atoms[k]]];
        }
        return Kabsch.Fit(w.Mobile.AsSpan(0, atoms.Length), w.Target.AsSpan(0, atoms.Length), w.Rotation, out w.MobileCentroid, out w.TargetCentroid);
    }

    private static Vec3 Apply(ReadOnlySpan<double> r, Vec3 pc, Vec3 qc, Vec3 x)
    {
        var p = x - pc;
        return new Vec3(r[0] * p.X + r[1] * p.Y + r[2] * p.Z, r[3] * p.X + r[4] * p.Y + r[5] * p.Z, r[6] * p.X + r[7] * p.Y + r[8] * p.Z) + qc;
    }
}
