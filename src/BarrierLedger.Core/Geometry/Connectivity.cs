using System.Collections.Immutable;

namespace BarrierLedger.Core.Geometry;

/// <summary>A bond between two atoms, 0-based indices stored with <see cref="A"/> &lt; <see cref="B"/>.</summary>
public readonly record struct Bond
{
    public Bond(int a, int b)
    {
        if (a == b) throw new ArgumentException($"A bond needs two different atoms, got {a} twice.", nameof(b));
        if (a < 0 || b < 0) throw new ArgumentException($"Atom indices must be 0 or more, got {a} and {b}.", nameof(a));
        (A, B) = a < b ? (a, b) : (b, a);
    }

    public int A { get; }
    public int B { get; }

    /// <summary>"C3–C11" with 1-based numbers, as users see atoms.</summary>
    public string Label(Molecule molecule) => $"{molecule.AtomLabel(A)}–{molecule.AtomLabel(B)}";
}

/// <summary>Settings for <see cref="Connectivity.Of"/>.</summary>
/// <param name="ToleranceFactor">
/// Two atoms are bonded when their distance is at most this factor times the sum of their single-bond covalent radii
/// (Cordero et al., Dalton Trans. 2008, 2832). Default 1.2: common practice, no source. It accepts stretched bonds
/// up to about 20 % beyond the single-bond length (so C=C, C≡C and long C–Cl bonds count) while partly formed bonds at a saddle point
/// (typically 1.3–1.6 × the sum) do not; reaction bonds are declared separately for that reason.
/// </param>
public sealed record ConnectivityOptions(double ToleranceFactor = 1.2)
{
    public static ConnectivityOptions Default { get; } = new();
}

/// <summary>
/// The bond graph of a structure, derived from interatomic distances and covalent radii:
/// bonded when r_ij ≤ f (R_i + R_j), see <see cref="ConnectivityOptions"/>.
/// </summary>
public sealed class Connectivity
{
    private readonly HashSet<Bond> _set;
    private readonly ImmutableArray<int>[] _neighbours;

    public Connectivity(int atomCount, IEnumerable<Bond> bonds)
    {
        if (atomCount < 0) throw new ArgumentException("Atom count must be 0 or more.", nameof(atomCount));
        AtomCount = atomCount;
        _set = [.. bonds];
        foreach (var b in _set)
            if (b.B >= atomCount) throw new ArgumentException($"Bond {b.A + 1}–{b.B + 1} names an atom beyond the {atomCount} atoms.", nameof(bonds));
        Bonds = [.. _set.OrderBy(b => b.A).ThenBy(b => b.B)];
        var lists = Enumerable.Range(0, atomCount).Select(_ => new List<int>()).ToArray();
        foreach (var b in Bonds) { lists[b.A].Add(b.B); lists[b.B].Add(b.A); }
        _neighbours = [.. lists.Select(l => l.Order().ToImmutableArray())];
    }

    public int AtomCount { get; }

    /// <summary>Bonds sorted by first then second atom.</summary>
    public ImmutableArray<Bond> Bonds { get; }

    /// <summary>The bond graph of <paramref name="molecule"/>.</summary>
    public static Connectivity Of(Molecule molecule, ConnectivityOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(molecule);
        var f = (options ?? ConnectivityOptions.Default).ToleranceFactor;
        if (!(f > 0)) throw new ArgumentException($"Tolerance factor must be positive, got {f}.", nameof(options));
        var bonds = new List<Bond>();
        var p = molecule.PositionsAngstrom;
        for (var i = 0; i < molecule.AtomCount; i++)
            for (var j = i + 1; j < molecule.AtomCount; j++)
            {
                var limit = f * (molecule.Elements[i].CovalentRadiusAngstrom + molecule.Elements[j].CovalentRadiusAngstrom);
                if ((p[i] - p[j]).Length <= limit) bonds.Add(new Bond(i, j));
            }
        return new Connectivity(molecule.AtomCount, bonds);
    }

    public bool AreBonded(int a, int b) => a != b && _set.Contains(new Bond(a, b));

    /// <summary>Bonded neighbours of atom <paramref name="atom"/>, ascending.</summary>
    public ImmutableArray<int> Neighbours(int atom) => _neighbours[atom];

    /// <summary>Bonds present in <paramref name="other"/> but not here (Formed) and here but not in <paramref name="other"/> (Broken).</summary>
    public (ImmutableArray<Bond> Formed, ImmutableArray<Bond> Broken) Compare(Connectivity other)
    {
        ArgumentNullException.ThrowIfNull(other);
        if (other.AtomCount != AtomCount)
            throw new ArgumentException($"Cannot compare bond graphs of {AtomCount} and {other.AtomCount} atoms.", nameof(other));
        return ([.. other.Bonds.Where(b => !_set.Contains(b))], [.. Bonds.Where(b => !other._set.Contains(b))]);
    }

    /// <summary>
    /// The connected components of the bond graph (the separate molecules of a structure such as "A + B"): each an ascending
    /// list of 0-based atoms, the components ordered by their lowest atom.
    /// </summary>
    public ImmutableArray<ImmutableArray<int>> Components()
    {
        var seen = new bool[AtomCount];
        var result = ImmutableArray.CreateBuilder<ImmutableArray<int>>();
        for (var start = 0; start < AtomCount; start++)
        {
            if (seen[start]) continue;
            var members = new List<int>();
            var stack = new Stack<int>([start]);
            seen[start] = true;
            while (stack.Count > 0)
            {
                var a = stack.Pop();
                members.Add(a);
                foreach (var n in _neighbours[a])
                    if (!seen[n]) { seen[n] = true; stack.Push(n); }
            }
            members.Sort();
            result.Add([.. members]);
        }
        return result.ToImmutable();
    }

    /// <summary>The bond graph restricted to <paramref name="atoms"/> (0-based, ascending), renumbered 0..k−1 in that order.</summary>
    public Connectivity Subgraph(IReadOnlyList<int> atoms)
    {
        ArgumentNullException.ThrowIfNull(atoms);
        var index = new Dictionary<int, int>(atoms.Count);
        for (var k = 0; k < atoms.Count; k++) index[atoms[k]] = k;
        var bonds = new List<Bond>();
        foreach (var a in atoms)
            foreach (var n in _neighbours[a])
                if (n > a && index.TryGetValue(n, out var kn)) bonds.Add(new Bond(index[a], kn));
        return new Connectivity(atoms.Count, bonds);
    }

    /// <summary>Same atom count and exactly the same bonds.</summary>
    public bool SameAs(Connectivity other) => other.AtomCount == AtomCount && _set.SetEquals(other._set);

    /// <summary>
    /// The atoms on the <paramref name="towards"/> side of the bond <paramref name="from"/>–<paramref name="towards"/>
    /// (reachable from <paramref name="towards"/> without crossing that bond), or null when the bond is in a ring.
    /// </summary>
    public IReadOnlyCollection<int>? SideOf(int from, int towards)
    {
        var seen = new HashSet<int> { towards };
        var stack = new Stack<int>([towards]);
        while (stack.Count > 0)
        {
            var a = stack.Pop();
            foreach (var n in _neighbours[a])
            {
                if (a == towards && n == from) continue;
                if (n == from) return null;
                if (seen.Add(n)) stack.Push(n);
            }
        }
        return seen;
    }
}
