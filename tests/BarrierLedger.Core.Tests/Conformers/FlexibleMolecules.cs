using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Tests.Conformers;

/// <summary>
/// Structures built from internal coordinates for the conformer tests and benchmarks (shared with tests/BarrierLedger.Benchmarks).
/// Bond lengths and angles are rounded typical values (C–C 1.53 Å, C–H 1.09 Å, aromatic C–C 1.39 Å, C–F 1.34 Å, tetrahedral
/// 109.5°: from memory); only the torsions differ between conformers, so every pair is a true pair of conformers.
/// </summary>
internal static class FlexibleMolecules
{
    /// <summary>
    /// Places an atom bonded to <paramref name="c"/> at distance <paramref name="r"/> (Å), angle b–c–new <paramref name="angleDegrees"/>
    /// and dihedral a–b–c–new <paramref name="dihedralDegrees"/> (natural extension reference frame, the usual Z-matrix rule).
    /// </summary>
    public static Vec3 Place(Vec3 a, Vec3 b, Vec3 c, double r, double angleDegrees, double dihedralDegrees)
    {
        var theta = angleDegrees * Math.PI / 180;
        var phi = dihedralDegrees * Math.PI / 180;
        var bc = (c - b).Normalized();
        var n = (b - a).Cross(bc).Normalized();
        var m = n.Cross(bc);
        var d2 = new Vec3(-r * Math.Cos(theta), r * Math.Sin(theta) * Math.Cos(phi), r * Math.Sin(theta) * Math.Sin(phi));
        return c + bc * d2.X + m * d2.Y + n * d2.Z;
    }

    /// <summary>
    /// Butane C4H10 with C1–C2–C3–C4 dihedral <paramref name="dihedralDegrees"/> (180 anti, ±65 gauche), staggered methyls. Atoms:
    /// C1, C2, C3, C4, then the hydrogens of C1, C2, C3, C4.
    /// </summary>
    public static Molecule Butane(double dihedralDegrees)
    {
        const double cc = 1.53, ch = 1.09, ccc = 112.0, hcc = 109.5;
        var c1 = Vec3.Zero;
        var c2 = new Vec3(cc, 0, 0);
        var c3 = Place(new Vec3(0, 1, 0), c1, c2, cc, ccc, 180);
        var c4 = Place(c1, c2, c3, cc, ccc, dihedralDegrees);
        var pos = new List<Vec3> { c1, c2, c3, c4 };
        foreach (var t in new[] { 180.0, 60.0, -60.0 }) pos.Add(Place(c3, c2, c1, ch, hcc, t));
        foreach (var t in new[] { 120.0, -120.0 }) pos.Add(Place(c4, c3, c2, ch, hcc, dihedralDegrees + t));
        foreach (var t in new[] { 120.0, -120.0 }) pos.Add(Place(c1, c2, c3, ch, hcc, dihedralDegrees + t));
        foreach (var t in new[] { 180.0, 60.0, -60.0 }) pos.Add(Place(c2, c3, c4, ch, hcc, t));
        return new Molecule([.. Enumerable.Repeat(Elements.C, 4), .. Enumerable.Repeat(Elements.H, 10)], pos);
    }

    /// <summary>The torsions of <see cref="Arylalkane"/>.</summary>
    /// <param name="Chain">Dihedrals along the chain, degrees: ring–CH2 first, one per chain bond (length = chain length).</param>
    /// <param name="Isopropyl">Rotation of the terminal isopropyl group about its bond, degrees.</param>
    /// <param name="Trifluoromethyl">Rotation of the CF₃ group, degrees.</param>
    /// <param name="Methyls">Rotation of the two methyl groups, degrees.</param>
    public sealed record Torsions(double[] Chain, double Isopropyl, double Trifluoromethyl, double Methyls);

    /// <summary>
    /// 1-(ω-methylalkyl)-4-(trifluoromethyl)benzene, F₃C–C₆H₄–(CH₂)ₖ–CH(CH₃)₂ with k = Chain.Length methylene groups: 30 atoms at
    /// k = 2, 60 at k = 12. Its topological symmetry: the ring flip and the two isopropyl methyls (4 skeleton mappings), the three
    /// fluorines (an interchangeable terminal group) and the hydrogens of each CH₂ and CH₃.
    /// Atom order: ring C1–C6 (C1 bears the chain, C4 the CF₃), CF₃ carbon, three F, chain carbons, CH carbon, two methyl carbons,
    /// then every hydrogen.
    /// </summary>
    public static Molecule Arylalkane(Torsions t)
    {
        if (t.Chain.Length < 2) throw new ArgumentException("At least two chain torsions.", nameof(t));
        const double ar = 1.39, ch = 1.09, cc = 1.53, cf = 1.34, tet = 109.5;
        var heavy = new List<(Element E, Vec3 P)>();
        var hydrogens = new List<Vec3>();
        var ring = Enumerable.Range(0, 6).Select(k => new Vec3(ar * Math.Cos(k * Math.PI / 3), ar * Math.Sin(k * Math.PI / 3), 0)).ToArray();
        foreach (var p in ring) heavy.Add((Elements.C, p));
        foreach (var k in new[] { 1, 2, 4, 5 }) hydrogens.Add(ring[k] + ring[k].Normalized() * 1.08);
        var cf3 = ring[3] + ring[3].Normalized() * 1.50;
        heavy.Add((Elements.C, cf3));
        foreach (var a in new[] { 90.0, 210.0, 330.0 }) heavy.Add((Elements.Get("F"), Place(ring[2], ring[3], cf3, cf, 111.5, a + t.Trifluoromethyl)));

        // Chain: atom list grows from the ring; each new carbon from the previous three atoms.
        var back = new List<Vec3> { ring[1], ring[0], ring[0] + ring[0].Normalized() * 1.51 };
        heavy.Add((Elements.C, back[2]));
        for (var k = 0; k < t.Chain.Length; k++)
        {
            var next = Place(back[^3], back[^2], back[^1], cc, 112.0, t.Chain[k]);
            foreach (var s in new[] { 120.0, -120.0 }) hydrogens.Add(Place(back[^3], back[^2], back[^1], ch, tet, t.Chain[k] + s));
            back.Add(next);
            heavy.Add((Elements.C, next));
        }
        // The last chain carbon is the CH of the isopropyl group: two methyls and one H.
        var (a3, a2, a1) = (back[^3], back[^2], back[^1]);
        var methyls = new[] { Place(a3, a2, a1, cc, 110.0, t.Isopropyl + 60), Place(a3, a2, a1, cc, 110.0, t.Isopropyl - 60) };
        hydrogens.Add(Place(a3, a2, a1, ch, tet, t.Isopropyl + 180));
        foreach (var me in methyls)
        {
            heavy.Add((Elements.C, me));
            foreach (var s in new[] { 60.0, 180.0, 300.0 }) hydrogens.Add(Place(a2, a1, me, ch, tet, s + t.Methyls));
        }
        return new Molecule([.. heavy.Select(x => x.E), .. Enumerable.Repeat(Elements.H, hydrogens.Count)], [.. heavy.Select(x => x.P), .. hydrogens]);
    }

    /// <summary>Random staggered torsions (60, 180 or 300° plus up to ±<paramref name="noiseDegrees"/>) for a chain of <paramref name="chainTorsions"/>.</summary>
    public static Torsions RandomTorsions(Random rng, int chainTorsions, double noiseDegrees = 10)
    {
        double Staggered() => 60.0 + 120.0 * rng.Next(3) + (rng.NextDouble() * 2 - 1) * noiseDegrees;
        var chain = new double[chainTorsions];
        chain[0] = 90 + (rng.NextDouble() * 2 - 1) * 60; // ring–CH2: perpendicular-ish
        for (var k = 1; k < chain.Length; k++) chain[k] = Staggered();
        return new Torsions(chain, Staggered(), rng.NextDouble() * 360, rng.NextDouble() * 360);
    }

    /// <summary>
    /// A random conformer of <see cref="Arylalkane"/> whose bond graph is the molecule's (one ring, so as many bonds as atoms):
    /// torsions that bring two atoms within bonding distance are drawn again.
    /// </summary>
    public static Molecule RandomArylalkane(Random rng, int chainTorsions, double trifluoromethyl = double.NaN)
    {
        for (var attempt = 0; attempt < 1000; attempt++)
        {
            var t = RandomTorsions(rng, chainTorsions);
            if (!double.IsNaN(trifluoromethyl)) t = t with { Trifluoromethyl = trifluoromethyl };
            var m = Arylalkane(t);
            if (Connectivity.Of(m).Bonds.Length == m.AtomCount) return m;
        }
        throw new InvalidOperationException("No conformer without close contacts in 1,000 draws.");
    }

    /// <summary>The atoms in <paramref name="order"/>, positions rotated about <paramref name="axis"/> by <paramref name="angle"/> rad and moved by <paramref name="shift"/>.</summary>
    public static Molecule Moved(Molecule m, int[] order, Vec3 axis, double angle, Vec3 shift)
    {
        var k = axis.Normalized();
        Vec3 R(Vec3 v) => v * Math.Cos(angle) + k.Cross(v) * Math.Sin(angle) + k * (k.Dot(v) * (1 - Math.Cos(angle)));
        return new Molecule(order.Select(i => m.Elements[i]), order.Select(i => R(m.PositionsAngstrom[i]) + shift), m.Charge, m.Multiplicity);
    }

    /// <summary>A random order of <paramref name="n"/> atoms.</summary>
    public static int[] Shuffle(Random rng, int n)
    {
        var order = Enumerable.Range(0, n).ToArray();
        rng.Shuffle(order);
        return order;
    }
}
