using System.Collections.Immutable;
using System.Globalization;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Checks;

/// <summary>How two atoms whose distance changes along a mode are related at the saddle geometry.</summary>
public enum PairRelation
{
    /// <summary>Bonded by covalent radii (<see cref="Connectivity"/>).</summary>
    Bond,
    /// <summary>Not bonded and not both bonded to one common atom, but within <see cref="DistanceChangeOptions.LongContactFactor"/> × the radius sum.</summary>
    LongContact,
}

/// <summary>One atom pair's distance and how fast it changes along a mode.</summary>
/// <param name="Pair">The two atoms (0-based).</param>
/// <param name="DistanceAngstrom">Their distance at the saddle geometry, Å.</param>
/// <param name="ChangePerUnitDisplacement">dr/ds along the normalised Cartesian displacement, Å per Å (sign follows the mode's arbitrary phase).</param>
/// <param name="RadiusSumMultiple">Distance divided by the sum of the two covalent radii.</param>
/// <param name="Relation">Bond or long contact.</param>
/// <param name="Label">"C1–C6" for a bond, "C1···C6" for a long contact.</param>
public sealed record PairDistanceChange(Bond Pair, double DistanceAngstrom, double ChangePerUnitDisplacement, double RadiusSumMultiple, PairRelation Relation, string Label)
{
    /// <summary>"C1···C6 2.41 Å (long contact, 1.59 × the radius sum) shortens" style text; <paramref name="sign"/> flips the mode's phase.</summary>
    public string Describe(double sign = 1.0)
    {
        var d = DistanceAngstrom.ToString("0.00", CultureInfo.InvariantCulture);
        var how = sign * ChangePerUnitDisplacement < 0 ? "shortens" : "lengthens";
        return Relation == PairRelation.LongContact
            ? $"{Label} {d} Å (long contact, {RadiusSumMultiple.ToString("0.00", CultureInfo.InvariantCulture)} × the covalent-radius sum) {how}"
            : $"{Label} {d} Å {how}";
    }
}

/// <summary>Settings of <see cref="DistanceChanges"/>.</summary>
/// <param name="LongContactFactor">
/// Pairs up to this multiple of the sum of their covalent radii count as long contacts (a bond forming or breaking at a saddle
/// point lies at 1.3–1.8 × the sum: 2.2–2.6 Å for C···C). Default 2.0: common practice, no source.
/// </param>
/// <param name="Connectivity">How bonds are found.</param>
public sealed record DistanceChangeOptions(double LongContactFactor = 2.0, ConnectivityOptions? Connectivity = null)
{
    public static DistanceChangeOptions Default { get; } = new();
}

/// <summary>
/// The atom pairs whose distance changes most along a displacement: every bonded pair and every long contact (see
/// <see cref="DistanceChangeOptions"/>), ranked by |dr/ds|. Pairs bonded to one common atom are left out: their distance follows
/// the bond angle, which the bends of <see cref="ModeCharacter"/> already describe. For atoms i, j at rᵢ, rⱼ and a normalised
/// displacement d, dr/ds = (rᵢ − rⱼ)·(dᵢ − dⱼ) / |rᵢ − rⱼ| (the first derivative of the distance; Wilson, Decius and Cross,
/// Molecular Vibrations, 1955, the stretch row of the B matrix). Radii: Cordero et al., Dalton Trans. 2008, 2832.
/// </summary>
public static class DistanceChanges
{
    /// <summary>All bonded pairs and long contacts with their rate of change, largest |dr/ds| first.</summary>
    public static ImmutableArray<PairDistanceChange> Along(Molecule molecule, IReadOnlyList<Vec3> displacement, DistanceChangeOptions? options = null, Connectivity? bonds = null)
    {
        ArgumentNullException.ThrowIfNull(molecule);
        ArgumentNullException.ThrowIfNull(displacement);
        var o = options ?? DistanceChangeOptions.Default;
        if (!(o.LongContactFactor > 0)) throw new ArgumentException("The long-contact factor must be positive.", nameof(options));
        var n = molecule.AtomCount;
        if (displacement.Count != n) throw new ArgumentException($"{displacement.Count} displacements for {n} atoms.", nameof(displacement));
        var norm = Math.Sqrt(displacement.Sum(v => v.LengthSquared));
        if (!(norm > 0)) throw new ArgumentException("The displacement is zero.", nameof(displacement));
        var g = bonds ?? Connectivity.Of(molecule, o.Connectivity);
        var p = molecule.PositionsAngstrom;
        var result = new List<PairDistanceChange>();
        for (var i = 0; i < n; i++)
            for (var j = i + 1; j < n; j++)
            {
                var sum = molecule.Elements[i].CovalentRadiusAngstrom + molecule.Elements[j].CovalentRadiusAngstrom;
                var r = p[i] - p[j];
                var dist = r.Length;
                var bonded = g.AreBonded(i, j);
                if (!bonded && (dist > o.LongContactFactor * sum || Geminal(g, i, j))) continue;
                var rate = r.Dot(displacement[i] - displacement[j]) / dist / norm;
                var pair = new Bond(i, j);
                result.Add(new PairDistanceChange(pair, dist, rate, dist / sum, bonded ? PairRelation.Bond : PairRelation.LongContact,
                    bonded ? pair.Label(molecule) : $"{molecule.AtomLabel(i)}···{molecule.AtomLabel(j)}"));
            }
        return [.. result.OrderByDescending(c => Math.Abs(c.ChangePerUnitDisplacement)).ThenBy(c => c.Pair.A).ThenBy(c => c.Pair.B)];
    }

    /// <summary>The leading changes: at most <paramref name="count"/>, each at least <paramref name="relative"/> × the largest |dr/ds|.</summary>
    public static IEnumerable<PairDistanceChange> Leading(ImmutableArray<PairDistanceChange> changes, int count = 3, double relative = 0.25)
    {
        if (changes.IsDefaultOrEmpty) return [];
        var top = Math.Abs(changes[0].ChangePerUnitDisplacement);
        return changes.Take(count).Where(c => Math.Abs(c.ChangePerUnitDisplacement) >= relative * top);
    }

    private static bool Geminal(Connectivity g, int i, int j)
    {
        foreach (var k in g.Neighbours(i))
            if (g.AreBonded(k, j)) return true;
        return false;
    }
}
