using System.Collections.Immutable;
using System.Globalization;

namespace BarrierLedger.Core.Geometry;

/// <summary>How an atom mapping ended.</summary>
public enum AtomMappingStatus
{
    /// <summary>A bond-preserving mapping was found.</summary>
    Mapped,
    /// <summary>The two structures do not have the same atoms (formula).</summary>
    DifferentAtoms,
    /// <summary>Same atoms, but no mapping preserves every bond: the structures are different molecules (isomers).</summary>
    DifferentBonds,
}

/// <summary>Settings of <see cref="AtomMapping"/>.</summary>
/// <param name="MaxSkeletonMappings">
/// How many bond-preserving mappings of the skeleton (every atom except interchangeable terminal atoms) are tried. A structure
/// with more (a cage of high symmetry) is compared through the best of those tried, and the result says so
/// (<see cref="AtomMappingResult.Exhaustive"/> false). Default 2,000.
/// </param>
/// <param name="MaxGroupPermutations">
/// When the skeleton alone cannot orient the structure (fewer than three atoms, or all on one line), the interchangeable terminal
/// atoms are tried in every order up to this many combinations. Default 5,040 (7!).
/// </param>
/// <param name="EquallyGoodAngstrom">Two mappings whose RMSDs differ by less than this fit equally well. Default 0.01 Å: common practice, no source.</param>
public sealed record AtomMappingOptions(int MaxSkeletonMappings = 2000, int MaxGroupPermutations = 5040, double EquallyGoodAngstrom = 0.01)
{
    public static AtomMappingOptions Default { get; } = new();
}

/// <summary>The outcome of <see cref="AtomMapping.Find(Molecule, Molecule, AtomMappingOptions?, ConnectivityOptions?)"/>.</summary>
/// <param name="Status">Mapped, or why not.</param>
/// <param name="Map">Map[i] is the 0-based atom of the reference that atom i of the mobile structure corresponds to; empty unless mapped.</param>
/// <param name="RmsdAngstrom">Kabsch RMSD of the mobile structure onto the reference with that mapping, Å (NaN unless mapped).</param>
/// <param name="IsIdentity">The mapping keeps every atom number (the same atom order in both files).</param>
/// <param name="Exhaustive">Every bond-preserving mapping of the skeleton was tried.</param>
/// <param name="MappingsTried">Bond-preserving skeleton mappings tried.</param>
/// <param name="EquallyGoodMappings">
/// How many of the tried skeleton mappings fit within <see cref="AtomMappingOptions.EquallyGoodAngstrom"/> of the best
/// (more than one: the structure is symmetric and which atom is which cannot be told from the geometry).
/// </param>
/// <param name="Message">One sentence for the user: how the atoms were matched, or why they could not be.</param>
public sealed record AtomMappingResult(
    AtomMappingStatus Status,
    ImmutableArray<int> Map,
    double RmsdAngstrom,
    bool IsIdentity,
    bool Exhaustive,
    int MappingsTried,
    int EquallyGoodMappings,
    string Message)
{
    public bool Succeeded => Status == AtomMappingStatus.Mapped;
}

/// <summary>Atoms of one class bonded only to the same parent (the hydrogens of a methyl group, the fluorines of CF₃).</summary>
/// <param name="Parent">The 0-based atom they are bonded to.</param>
/// <param name="Members">The 0-based atoms of the group, ascending.</param>
public sealed record InterchangeableGroup(int Parent, ImmutableArray<int> Members);

/// <summary>
/// The bond-preserving self-mappings of a structure (its graph automorphisms), as <see cref="AtomMapping.Symmetry"/> lists them: the
/// skeleton mappings, and the interchangeable terminal groups whose order is left to the geometry.
/// </summary>
/// <param name="Classes">Equivalence class of every atom (see <see cref="AtomMapping.EquivalenceClasses"/>).</param>
/// <param name="SkeletonMappings">
/// Every bond-preserving mapping of the skeleton onto itself, the identity first: Mapping[i] is the atom that atom i goes to. Members
/// of an interchangeable group go to the members of the image group in ascending order (their best order depends on the geometry).
/// </param>
/// <param name="Groups">The interchangeable terminal groups.</param>
/// <param name="Skeleton">The skeleton atoms (every atom outside an interchangeable group), 0-based, ascending.</param>
/// <param name="Exhaustive">Every skeleton mapping was listed (false: stopped at <see cref="AtomMappingOptions.MaxSkeletonMappings"/>).</param>
public sealed record AtomSymmetry(
    ImmutableArray<int> Classes,
    ImmutableArray<ImmutableArray<int>> SkeletonMappings,
    ImmutableArray<InterchangeableGroup> Groups,
    ImmutableArray<int> Skeleton,
    bool Exhaustive);

/// <summary>
/// Which atom of one structure is which atom of another, from the bond graphs (<see cref="Connectivity"/>) and, among the mappings
/// the bonds allow, the geometry (lowest <see cref="Kabsch"/> RMSD). The same atom order in both files is the common case and
/// comes out as the identity when it fits best; otherwise the atoms are matched by graph isomorphism.
/// <para>
/// Equivalence classes: atoms start in classes by element; each round splits a class by the multiset of its atoms' neighbour
/// classes, until no class splits (colour refinement: Morgan, J. Chem. Doc. 1965, 5, 107; Weisfeiler and Leman, 1968). Two atoms
/// in the same class have the same element and the same bonded neighbourhood at every depth; only atoms in the same class can
/// correspond. The classes of two structures are refined together, so a class present in one and missing from the other proves
/// that no bond-preserving mapping exists.
/// </para>
/// <para>
/// Mappings: the skeleton (every atom except interchangeable terminal atoms, i.e. two or more atoms of one class bonded only to the
/// same parent, such as the hydrogens of a methyl group) is matched by backtracking in breadth-first order, each atom only to an
/// unused atom of its class bonded to the images of its already matched neighbours and to no other matched atom (a plain
/// subgraph-isomorphism search, as in Ullmann, J. ACM 1976, 23, 31). For every complete skeleton mapping the interchangeable
/// terminal atoms are placed by geometry: the skeleton is superposed, each group takes the order that puts its atoms nearest their
/// counterparts, and superposition and assignment alternate until the assignment no longer changes. When the skeleton cannot fix
/// an orientation (fewer than three atoms, or collinear) every order of the groups is tried instead.
/// </para>
/// </summary>
public static class AtomMapping
{
    /// <summary>
    /// The equivalence classes of a structure's atoms (same element and same bonded neighbourhood, see <see cref="AtomMapping"/>):
    /// one class number per atom, numbered 0.. in a fixed order (by element, then by neighbourhood), so equal structures get equal
    /// numbers whatever their atom order.
    /// </summary>
    public static ImmutableArray<int> EquivalenceClasses(Molecule molecule, Connectivity? bonds = null)
    {
        ArgumentNullException.ThrowIfNull(molecule);
        var g = bonds ?? Connectivity.Of(molecule);
        if (g.AtomCount != molecule.AtomCount)
            throw new ArgumentException($"The bond graph has {g.AtomCount} atoms but the structure {molecule.AtomCount}.", nameof(bonds));
        return [.. Refine([molecule], [g])];
    }

    /// <summary>
    /// The bond-preserving self-mappings of <paramref name="molecule"/> (its topological symmetry), found by the same search as
    /// <see cref="Find(Molecule, Connectivity, Molecule, Connectivity, AtomMappingOptions?)"/> run on the structure against itself.
    /// Listing them once lets many structures with this bond graph (the conformers of one species, renumbered into its atom order)
    /// be compared pair by pair without repeating the graph search: every mapping between two of them is one of these.
    /// </summary>
    public static AtomSymmetry Symmetry(Molecule molecule, Connectivity? bonds = null, AtomMappingOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(molecule);
        var g = bonds ?? Connectivity.Of(molecule);
        if (g.AtomCount != molecule.AtomCount)
            throw new ArgumentException($"The bond graph has {g.AtomCount} atoms but the structure {molecule.AtomCount}.", nameof(bonds));
        var o = options ?? AtomMappingOptions.Default;
        if (o.MaxSkeletonMappings < 1) throw new ArgumentException("MaxSkeletonMappings must be 1 or more.", nameof(options));
        var colours = Refine([molecule], [g]);
        if (molecule.AtomCount == 0) return new AtomSymmetry([], [[]], [], [], true);
        var search = new Search(molecule, g, colours, molecule, g, colours, o, collect: true);
        search.Run();
        var groups = search.GroupsOfMobile.Select(x => new InterchangeableGroup(x.Parent, [.. x.Members])).ToImmutableArray();
        var inGroup = new bool[molecule.AtomCount];
        foreach (var grp in groups) foreach (var a in grp.Members) inGroup[a] = true;
        return new AtomSymmetry([.. colours], [.. search.Collected.Select(m => m.ToImmutableArray())], groups,
            [.. Enumerable.Range(0, molecule.AtomCount).Where(i => !inGroup[i])], search.Exhaustive);
    }

    /// <summary>
    /// One bond-preserving mapping of <paramref name="mobile"/> onto <paramref name="reference"/>, the first the search meets (the
    /// identity when it preserves every bond), without comparing geometries: for renumbering many structures of one bond graph
    /// into a common order before they are compared under <see cref="Symmetry"/> (which mapping is then immaterial). The result's
    /// RMSD is NaN; <see cref="AtomMappingResult.Exhaustive"/> is false unless no other mapping could exist.
    /// </summary>
    public static AtomMappingResult FindAny(Molecule mobile, Connectivity mobileBonds, Molecule reference, Connectivity referenceBonds)
    {
        ArgumentNullException.ThrowIfNull(mobile);
        ArgumentNullException.ThrowIfNull(mobileBonds);
        ArgumentNullException.ThrowIfNull(reference);
        ArgumentNullException.ThrowIfNull(referenceBonds);
        if (mobileBonds.AtomCount != mobile.AtomCount) throw new ArgumentException("The mobile bond graph does not fit the mobile structure.", nameof(mobileBonds));
        if (referenceBonds.AtomCount != reference.AtomCount) throw new ArgumentException("The reference bond graph does not fit the reference structure.", nameof(referenceBonds));
        if (mobile.AtomCount == reference.AtomCount && mobileBonds.SameAs(referenceBonds)
            && mobile.Elements.Select(e => e.AtomicNumber).SequenceEqual(reference.Elements.Select(e => e.AtomicNumber)))
            return new AtomMappingResult(AtomMappingStatus.Mapped, [.. Enumerable.Range(0, mobile.AtomCount)], double.NaN, true, false, 1, 1,
                "atoms in the same order with the same bonds");
        var fm = Formula.Of(mobile);
        var fr = Formula.Of(reference);
        if (fm != fr)
            return Fail(AtomMappingStatus.DifferentAtoms, $"the atoms differ: {fm} against {fr} ({fm.DifferenceFrom(fr)})");
        var colours = Refine([mobile, reference], [mobileBonds, referenceBonds]);
        var n = mobile.AtomCount;
        var cm = colours[..n];
        var cr = colours[n..];
        if (!cm.Order().SequenceEqual(cr.Order()))
            return Fail(AtomMappingStatus.DifferentBonds, "the same atoms, but " + BondTypeDifference(mobile, mobileBonds, reference, referenceBonds));
        var search = new Search(mobile, mobileBonds, cm, reference, referenceBonds, cr, AtomMappingOptions.Default with { MaxSkeletonMappings = 1 }, collect: true);
        search.Run();
        if (search.Collected.Count == 0)
            return Fail(AtomMappingStatus.DifferentBonds, "the same atoms and the same kinds of bonds, but joined differently: no numbering of one gives the bonds of the other");
        var map = search.Collected[0];
        var identity = map.Select((v, i) => v == i).All(x => x);
        return new AtomMappingResult(AtomMappingStatus.Mapped, [.. map], double.NaN, identity, false, 1, 1,
            identity ? "atoms matched in the same order" : $"atoms matched in another order by their bonds ({Describe(mobile, reference, map)})");
    }

    /// <summary>Maps <paramref name="mobile"/> onto <paramref name="reference"/>, bonds from <see cref="Connectivity.Of"/>.</summary>
    public static AtomMappingResult Find(Molecule mobile, Molecule reference, AtomMappingOptions? options = null, ConnectivityOptions? connectivity = null)
    {
        ArgumentNullException.ThrowIfNull(mobile);
        ArgumentNullException.ThrowIfNull(reference);
        return Find(mobile, Connectivity.Of(mobile, connectivity), reference, Connectivity.Of(reference, connectivity), options);
    }

    /// <summary>Maps <paramref name="mobile"/> onto <paramref name="reference"/> with the bond graphs given.</summary>
    public static AtomMappingResult Find(Molecule mobile, Connectivity mobileBonds, Molecule reference, Connectivity referenceBonds, AtomMappingOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(mobile);
        ArgumentNullException.ThrowIfNull(mobileBonds);
        ArgumentNullException.ThrowIfNull(reference);
        ArgumentNullException.ThrowIfNull(referenceBonds);
        if (mobileBonds.AtomCount != mobile.AtomCount) throw new ArgumentException("The mobile bond graph does not fit the mobile structure.", nameof(mobileBonds));
        if (referenceBonds.AtomCount != reference.AtomCount) throw new ArgumentException("The reference bond graph does not fit the reference structure.", nameof(referenceBonds));
        var o = options ?? AtomMappingOptions.Default;
        if (o.MaxSkeletonMappings < 1) throw new ArgumentException("MaxSkeletonMappings must be 1 or more.", nameof(options));

        var fm = Formula.Of(mobile);
        var fr = Formula.Of(reference);
        if (fm != fr)
            return Fail(AtomMappingStatus.DifferentAtoms, $"the atoms differ: {fm} against {fr} ({fm.DifferenceFrom(fr)})");
        if (mobile.AtomCount == 0) return new(AtomMappingStatus.Mapped, [], 0, true, true, 1, 1, "no atoms");

        var colours = Refine([mobile, reference], [mobileBonds, referenceBonds]);
        var n = mobile.AtomCount;
        var cm = colours[..n];
        var cr = colours[n..];
        if (!cm.Order().SequenceEqual(cr.Order()))
            return Fail(AtomMappingStatus.DifferentBonds, "the same atoms, but " + BondTypeDifference(mobile, mobileBonds, reference, referenceBonds));

        var search = new Search(mobile, mobileBonds, cm, reference, referenceBonds, cr, o);
        search.Run();
        if (search.BestMap is null)
            return Fail(AtomMappingStatus.DifferentBonds, "the same atoms and the same kinds of bonds, but joined differently: no numbering of one gives the bonds of the other");

        var map = search.BestMap;
        var identity = map.Select((v, i) => v == i).All(x => x);
        var equally = Math.Max(1, search.EquallyGood);
        var text = identity ? "atoms matched in the same order"
            : $"atoms matched in another order ({Describe(mobile, reference, map)})";
        if (!search.Exhaustive)
            text += $"; more than {o.MaxSkeletonMappings} bond-preserving mappings exist (a very symmetric structure), compared through the best of those tried";
        else if (equally > 1)
            text += $"; {equally} mappings fit equally well (a symmetric structure: which atom is which cannot be told from the geometry)";
        return new AtomMappingResult(AtomMappingStatus.Mapped, [.. map], search.BestRmsd, identity, search.Exhaustive, search.Tried, equally, text);
    }

    private static AtomMappingResult Fail(AtomMappingStatus status, string message) => new(status, [], double.NaN, false, true, 0, 0, message);

    private static string Describe(Molecule mobile, Molecule reference, int[] map)
    {
        var moved = Enumerable.Range(0, map.Length).Where(i => map[i] != i).ToList();
        var shown = moved.Take(4).Select(i => $"{mobile.AtomLabel(i)}→{reference.AtomLabel(map[i])}");
        return string.Join(", ", shown) + (moved.Count > 4 ? $" and {moved.Count - 4} more" : "");
    }

    /// <summary>"C–C bonds 4 against 6, C–H bonds 10 against 10" for the kinds whose counts differ.</summary>
    internal static string BondTypeDifference(Molecule a, Connectivity ga, Molecule b, Connectivity gb)
    {
        var ka = BondKinds(a, ga);
        var kb = BondKinds(b, gb);
        var diffs = ka.Keys.Union(kb.Keys).Order(StringComparer.Ordinal)
            .Where(k => ka.GetValueOrDefault(k) != kb.GetValueOrDefault(k))
            .Select(k => $"{k} bonds {ka.GetValueOrDefault(k)} against {kb.GetValueOrDefault(k)}").ToList();
        return diffs.Count == 0
            ? "the same kinds of bonds joined differently"
            : "other bonds: " + string.Join(", ", diffs);
    }

    /// <summary>Bond counts by element pair ("C–H"), symbols in Hill-like order (C first, H second, then alphabetical).</summary>
    internal static Dictionary<string, int> BondKinds(Molecule m, Connectivity g)
    {
        var d = new Dictionary<string, int>(StringComparer.Ordinal);
        foreach (var b in g.Bonds)
        {
            var key = PairKey(m.Elements[b.A].Symbol, m.Elements[b.B].Symbol);
            d[key] = d.GetValueOrDefault(key) + 1;
        }
        return d;
    }

    internal static string PairKey(string x, string y)
    {
        static int Rank(string s) => s == "C" ? 0 : s == "H" ? 1 : 2;
        var first = Rank(x) != Rank(y) ? (Rank(x) < Rank(y) ? x : y) : string.CompareOrdinal(x, y) <= 0 ? x : y;
        var second = ReferenceEquals(first, x) ? y : x;
        return $"{first}–{second}";
    }

    /// <summary>Colour refinement over the disjoint union of the structures; returns one class number per atom, structures in order.</summary>
    private static int[] Refine(IReadOnlyList<Molecule> molecules, IReadOnlyList<Connectivity> graphs)
    {
        var total = molecules.Sum(m => m.AtomCount);
        var colour = new int[total];
        var neighbours = new int[total][];
        var offset = 0;
        for (var k = 0; k < molecules.Count; k++)
        {
            for (var i = 0; i < molecules[k].AtomCount; i++)
            {
                colour[offset + i] = molecules[k].Elements[i].AtomicNumber;
                var o = offset;
                neighbours[offset + i] = [.. graphs[k].Neighbours(i).Select(x => x + o)];
            }
            offset += molecules[k].AtomCount;
        }
        colour = Renumber(colour.Select(c => new[] { c }).ToArray());
        var classes = colour.Distinct().Count();
        while (true)
        {
            var keys = new int[total][];
            for (var i = 0; i < total; i++)
            {
                var key = new int[neighbours[i].Length + 1];
                key[0] = colour[i];
                for (var j = 0; j < neighbours[i].Length; j++) key[j + 1] = colour[neighbours[i][j]];
                Array.Sort(key, 1, key.Length - 1);
                keys[i] = key;
            }
            var next = Renumber(keys);
            var count = next.Distinct().Count();
            colour = next;
            if (count == classes) break;
            classes = count;
        }
        return colour;
    }

    /// <summary>Numbers distinct keys 0.. in lexicographic order (so numbering does not depend on atom order).</summary>
    private static int[] Renumber(int[][] keys)
    {
        var distinct = keys.Distinct(KeyComparer.Instance).Order(KeyComparer.Instance).ToList();
        var index = new Dictionary<int[], int>(KeyComparer.Instance);
        for (var i = 0; i < distinct.Count; i++) index[distinct[i]] = i;
        return [.. keys.Select(k => index[k])];
    }

    private sealed class KeyComparer : IEqualityComparer<int[]>, IComparer<int[]>
    {
        public static readonly KeyComparer Instance = new();
        public bool Equals(int[]? x, int[]? y) => x is not null && y is not null && x.AsSpan().SequenceEqual(y);
        public int GetHashCode(int[] obj)
        {
            var h = new HashCode();
            foreach (var v in obj) h.Add(v);
            return h.ToHashCode();
        }
        public int Compare(int[]? x, int[]? y)
        {
            if (x is null || y is null) return (x is null ? 0 : 1) - (y is null ? 0 : 1);
            for (var i = 0; i < Math.Min(x.Length, y.Length); i++)
                if (x[i] != y[i]) return x[i].CompareTo(y[i]);
            return x.Length.CompareTo(y.Length);
        }
    }

    /// <summary>The backtracking search with geometric placement of interchangeable terminal atoms.</summary>
    private sealed class Search
    {
        private readonly Molecule _m, _r;
        private readonly Connectivity _gm, _gr;
        private readonly int[] _cm, _cr;
        private readonly AtomMappingOptions _o;
        private readonly int _n;
        private readonly bool[] _groupMemberM, _groupMemberR;
        private readonly List<(int Parent, int Colour, int[] Members)> _groupsM = [];
        private readonly int[] _order;
        private readonly int[] _map, _reverse;
        private readonly bool _skeletonOrients;

        public Search(Molecule m, Connectivity gm, int[] cm, Molecule r, Connectivity gr, int[] cr, AtomMappingOptions o, bool collect = false)
        {
            (_m, _gm, _cm, _r, _gr, _cr, _o) = (m, gm, cm, r, gr, cr, o);
            _collect = collect ? [] : null;
            _n = m.AtomCount;
            _groupMemberM = Groups(gm, cm, _groupsM);
            _groupMemberR = Groups(gr, cr, null);
            _order = BreadthFirstSkeleton();
            _map = Enumerable.Repeat(-1, _n).ToArray();
            _reverse = Enumerable.Repeat(-1, _n).ToArray();
            _skeletonOrients = Orients([.. _order.Select(i => m.PositionsAngstrom[i])]);
        }

        public int[]? BestMap { get; private set; }
        public double BestRmsd { get; private set; } = double.PositiveInfinity;
        public int Tried { get; private set; }
        public bool Exhaustive { get; private set; } = true;
        public int EquallyGood { get; private set; }
        private readonly List<double> _rmsds = [];
        private readonly List<int[]>? _collect;

        /// <summary>In collecting mode: every complete skeleton mapping, groups in ascending order, in the order found.</summary>
        public IReadOnlyList<int[]> Collected => _collect ?? [];

        /// <summary>The interchangeable terminal groups of the mobile structure.</summary>
        public IReadOnlyList<(int Parent, int Colour, int[] Members)> GroupsOfMobile => _groupsM;

        public void Run()
        {
            Extend(0);
            if (_collect is not null) return;
            EquallyGood = _rmsds.Count(x => x <= BestRmsd + _o.EquallyGoodAngstrom);
        }

        private static bool[] Groups(Connectivity g, int[] colour, List<(int, int, int[])>? list)
        {
            var member = new bool[g.AtomCount];
            for (var p = 0; p < g.AtomCount; p++)
            {
                foreach (var grp in g.Neighbours(p).Where(t => g.Neighbours(t).Length == 1).GroupBy(t => colour[t]))
                {
                    var members = grp.Order().ToArray();
                    if (members.Length < 2) continue;
                    foreach (var t in members) member[t] = true;
                    list?.Add((p, grp.Key, members));
                }
            }
            return member;
        }

        private int[] BreadthFirstSkeleton()
        {
            var skeleton = Enumerable.Range(0, _n).Where(i => !_groupMemberM[i]).ToList();
            var frequency = _cm.GroupBy(c => c).ToDictionary(g => g.Key, g => g.Count());
            var seen = new bool[_n];
            var order = new List<int>();
            foreach (var start in skeleton.OrderBy(i => frequency[_cm[i]]).ThenBy(i => i))
            {
                if (seen[start]) continue;
                var queue = new Queue<int>([start]);
                seen[start] = true;
                while (queue.Count > 0)
                {
                    var a = queue.Dequeue();
                    order.Add(a);
                    foreach (var nb in _gm.Neighbours(a).Where(x => !_groupMemberM[x]).OrderBy(x => frequency[_cm[x]]).ThenBy(x => x))
                        if (!seen[nb]) { seen[nb] = true; queue.Enqueue(nb); }
                }
            }
            return [.. order];
        }

        private void Extend(int depth)
        {
            if (Tried >= _o.MaxSkeletonMappings) { Exhaustive = false; return; }
            if (depth == _order.Length)
            {
                Tried++;
                Complete();
                return;
            }
            var u = _order[depth];
            var mappedNeighbours = 0;
            foreach (var w in _gm.Neighbours(u)) if (_map[w] >= 0 && !_groupMemberM[w]) mappedNeighbours++;
            // Candidates: the identity first, so the same atom order is found first when it fits.
            var candidates = Enumerable.Range(0, _n).Where(v => v != u).Prepend(u);
            foreach (var v in candidates)
            {
                if (_reverse[v] >= 0 || _groupMemberR[v] || _cr[v] != _cm[u]) continue;
                var ok = true;
                foreach (var w in _gm.Neighbours(u))
                    if (_map[w] >= 0 && !_groupMemberM[w] && !_gr.AreBonded(v, _map[w])) { ok = false; break; }
                if (!ok) continue;
                var vMapped = 0;
                foreach (var x in _gr.Neighbours(v)) if (_reverse[x] >= 0 && !_groupMemberR[x]) vMapped++;
                if (vMapped != mappedNeighbours) continue;
                _map[u] = v;
                _reverse[v] = u;
                Extend(depth + 1);
                _map[u] = -1;
                _reverse[v] = -1;
                if (Tried >= _o.MaxSkeletonMappings) { Exhaustive = false; return; }
            }
        }

        /// <summary>A complete skeleton mapping: place the terminal groups and score.</summary>
        private void Complete()
        {
            var map = (int[])_map.Clone();
            var targets = new List<int[]>();
            foreach (var (parent, colour, members) in _groupsM)
            {
                var t = _gr.Neighbours(map[parent]).Where(x => _gr.Neighbours(x).Length == 1 && _cr[x] == colour).Order().ToArray();
                if (t.Length != members.Length) return; // cannot happen for equal classes; guard anyway
                targets.Add(t);
            }
            if (_collect is not null)
            {
                for (var g = 0; g < _groupsM.Count; g++)
                    for (var k = 0; k < targets[g].Length; k++) map[_groupsM[g].Members[k]] = targets[g][k];
                _collect.Add(map);
                return;
            }
            double rmsd;
            if (_groupsM.Count == 0)
            {
                rmsd = Rmsd(map);
            }
            else if (_skeletonOrients)
            {
                rmsd = PlaceByGeometry(map, targets);
            }
            else
            {
                var combinations = _groupsM.Aggregate(1.0, (acc, g) => acc * Factorial(g.Members.Length));
                if (combinations <= _o.MaxGroupPermutations) rmsd = PlaceByTrying(map, targets);
                else { Exhaustive = false; rmsd = PlaceByGeometry(map, targets); }
            }
            _rmsds.Add(rmsd);
            if (rmsd < BestRmsd - 1e-12 || BestMap is null)
            {
                BestRmsd = rmsd;
                BestMap = map;
            }
        }

        private double PlaceByGeometry(int[] map, List<int[]> targets)
        {
            // Start: each group in ascending order; superpose on the mapped skeleton.
            for (var g = 0; g < _groupsM.Count; g++)
                for (var k = 0; k < targets[g].Length; k++) map[_groupsM[g].Members[k]] = targets[g][k];
            var skeleton = _order;
            var (rot, pc, qc) = Fit(map, skeleton.Length >= 1 ? skeleton : Enumerable.Range(0, _n).ToArray());
            for (var iteration = 0; iteration < 20; iteration++)
            {
                var changed = false;
                for (var g = 0; g < _groupsM.Count; g++)
                {
                    var members = _groupsM[g].Members;
                    var moved = members.Select(i => Apply(rot, pc, qc, _m.PositionsAngstrom[i])).ToArray();
                    var best = NearestOrder(moved, targets[g], _r.PositionsAngstrom);
                    for (var k = 0; k < members.Length; k++)
                    {
                        if (map[members[k]] != best[k]) changed = true;
                        map[members[k]] = best[k];
                    }
                }
                if (!changed && iteration > 0) break;
                (rot, pc, qc) = Fit(map, Enumerable.Range(0, _n).ToArray());
            }
            return Rmsd(map);
        }

        private double PlaceByTrying(int[] map, List<int[]> targets)
        {
            var perms = targets.Select(t => Permutations(t).ToList()).ToList();
            var bestRmsd = double.PositiveInfinity;
            int[]? best = null;
            var index = new int[perms.Count];
            while (true)
            {
                for (var g = 0; g < _groupsM.Count; g++)
                    for (var k = 0; k < _groupsM[g].Members.Length; k++) map[_groupsM[g].Members[k]] = perms[g][index[g]][k];
                var r = Rmsd(map);
                if (r < bestRmsd) { bestRmsd = r; best = (int[])map.Clone(); }
                var p = 0;
                while (p < index.Length && ++index[p] == perms[p].Count) { index[p] = 0; p++; }
                if (p == index.Length) break;
            }
            Array.Copy(best!, map, map.Length);
            return bestRmsd;
        }

        internal static IEnumerable<int[]> Permutations(int[] items)
        {
            if (items.Length <= 1) { yield return (int[])items.Clone(); yield break; }
            for (var i = 0; i < items.Length; i++)
            {
                var rest = items.Where((_, k) => k != i).ToArray();
                foreach (var p in Permutations(rest)) yield return [items[i], .. p];
            }
        }

        private static double Factorial(int k) => k <= 1 ? 1 : k * Factorial(k - 1);

        private double Rmsd(int[] map)
        {
            var target = new Vec3[_n];
            for (var i = 0; i < _n; i++) target[i] = _r.PositionsAngstrom[map[i]];
            Span<double> rotation = stackalloc double[9];
            return Kabsch.Fit(_m.PositionsAngstrom.AsSpan(), target, rotation, out _, out _);
        }

        private (double[] Rot, Vec3 Pc, Vec3 Qc) Fit(int[] map, IReadOnlyList<int> atoms)
        {
            var mobile = new Vec3[atoms.Count];
            var target = new Vec3[atoms.Count];
            for (var k = 0; k < atoms.Count; k++)
            {
                mobile[k] = _m.PositionsAngstrom[atoms[k]];
                target[k] = _r.PositionsAngstrom[map[atoms[k]]];
            }
            var rotation = new double[9];
            Kabsch.Fit(mobile, target, rotation, out var pc, out var qc);
            return (rotation, pc, qc);
        }

        private static Vec3 Apply(double[] r, Vec3 pc, Vec3 qc, Vec3 x)
        {
            var p = x - pc;
            return new Vec3(r[0] * p.X + r[1] * p.Y + r[2] * p.Z, r[3] * p.X + r[4] * p.Y + r[5] * p.Z, r[6] * p.X + r[7] * p.Y + r[8] * p.Z) + qc;
        }

        /// <summary>Three or more points not all within 0.05 Å of one line: they fix an orientation.</summary>
        internal static bool Orients(Vec3[] points)
        {
            if (points.Length < 3) return false;
            var a = points[0];
            var far = points.MaxBy(p => (p - a).LengthSquared);
            var axis = far - a;
            if (axis.Length < 1e-6) return false;
            axis = axis.Normalized();
            return points.Any(p => ((p - a) - axis * (p - a).Dot(axis)).Length > 0.05);
        }
    }

    /// <summary>Every order of <paramref name="items"/>.</summary>
    internal static IEnumerable<int[]> OrdersOf(int[] items) => Search.Permutations(items);

    /// <summary>Three or more points not all within 0.05 Å of one line: they fix an orientation.</summary>
    internal static bool FixesOrientation(Vec3[] points) => Search.Orients(points);

    /// <summary>
    /// The order of <paramref name="targets"/> (atoms of <paramref name="reference"/>) that puts the <paramref name="moved"/> positions
    /// nearest, by the sum of squared distances: every order up to 6 atoms, beyond that the nearest pairs first (greedy).
    /// </summary>
    internal static int[] NearestOrder(IReadOnlyList<Vec3> moved, int[] targets, IReadOnlyList<Vec3> reference)
    {
        var m = new Vec3[moved.Count];
        for (var k = 0; k < m.Length; k++) m[k] = moved[k];
        var result = new int[targets.Length];
        NearestOrder(m, targets, reference, result);
        return result;
    }

    /// <summary>The same, written into <paramref name="order"/>, without allocation up to 6 atoms (Heap's algorithm over the orders).</summary>
    internal static void NearestOrder(ReadOnlySpan<Vec3> moved, ReadOnlySpan<int> targets, IReadOnlyList<Vec3> reference, Span<int> order)
    {
        var n = targets.Length;
        if (n <= 6)
        {
            Span<int> p = stackalloc int[n];
            Span<int> c = stackalloc int[n];
            targets.CopyTo(p);
            c.Clear();
            double Cost(ReadOnlySpan<Vec3> mv, Span<int> q)
            {
                var cost = 0.0;
                for (var k = 0; k < q.Length; k++) cost += (mv[k] - reference[q[k]]).LengthSquared;
                return cost;
            }
            var best = Cost(moved, p);
            p.CopyTo(order);
            var i = 1;
            while (i < n)
            {
                if (c[i] < i)
                {
                    if (i % 2 == 0) (p[0], p[i]) = (p[i], p[0]);
                    else (p[c[i]], p[i]) = (p[i], p[c[i]]);
                    var cost = Cost(moved, p);
                    if (cost < best) { best = cost; p.CopyTo(order); }
                    c[i]++;
                    i = 1;
                }
                else
                {
                    c[i] = 0;
                    i++;
                }
            }
            return;
        }
        var free = targets.ToArray().ToList();
        var pairs = new List<(int K, int T, double D)>(n * n);
        for (var k = 0; k < n; k++)
            foreach (var t in targets) pairs.Add((k, t, (moved[k] - reference[t]).LengthSquared));
        pairs.Sort((a, b) => a.D.CompareTo(b.D));
        var done = new bool[n];
        foreach (var (k, t, _) in pairs)
        {
            if (done[k] || !free.Contains(t)) continue;
            order[k] = t;
            done[k] = true;
            free.Remove(t);
        }
    }

    /// <summary>"1.234 Å" with three decimals.</summary>
    internal static string Angstrom(double x) => x.ToString("0.000", CultureInfo.InvariantCulture) + " Å";
}
