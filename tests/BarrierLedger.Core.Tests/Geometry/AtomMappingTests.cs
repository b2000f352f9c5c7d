using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Tests.Checks;
using BarrierLedger.Core.Tests.Support;

namespace BarrierLedger.Core.Tests.Geometry;

public class AtomMappingTests
{
    private static Vec3 Rotate(Vec3 v, Vec3 axis, double angle)
    {
        var k = axis.Normalized();
        return v * Math.Cos(angle) + k.Cross(v) * Math.Sin(angle) + k * (k.Dot(v) * (1 - Math.Cos(angle)));
    }

    /// <summary>The hydrogen-transfer test system with every atom nudged (up to 0.05 Å), so that no two atoms are symmetry-equivalent.</summary>
    private static Molecule Asymmetric()
    {
        var m = TestSystems.HydrogenTransfer();
        var rng = new Random(3);
        return new Molecule(m.Elements, m.PositionsAngstrom.Select(p => p + new Vec3(rng.NextDouble() - 0.5, rng.NextDouble() - 0.5, rng.NextDouble() - 0.5) * 0.1), m.Charge, m.Multiplicity);
    }

    private static Molecule Permuted(Molecule m, int[] order, Func<Vec3, Vec3> move) =>
        new(order.Select(i => m.Elements[i]), order.Select(i => move(m.PositionsAngstrom[i])), m.Charge, m.Multiplicity);

    [Fact]
    public void SameOrder_RigidCopy_IsTheIdentityWithRmsdBelow1e10()
    {
        var m = Asymmetric();
        var copy = Permuted(m, [.. Enumerable.Range(0, m.AtomCount)], p => Rotate(p, new Vec3(1, 1, 0), 1.1) + new Vec3(2, 0, -1));
        var r = AtomMapping.Find(copy, m);
        Assert.True(r.Succeeded, r.Message);
        Assert.True(r.IsIdentity, r.Message);
        Assert.Equal("atoms matched in the same order", r.Message);
        Close.Absolute(0, r.RmsdAngstrom, 1e-10, "RMSD of a rigid copy", "Kabsch, Acta Cryst. A 1976, 32, 922");
    }

    [Fact]
    public void PermutedRigidCopy_IsRecoveredThroughTheMapping()
    {
        // Shuffled atom order plus a rotation and a translation: the mapping must undo the shuffle exactly (no two atoms are
        // equivalent after the nudges) and the superposition must then be exact.
        var m = Asymmetric();
        int[] order = [8, 3, 0, 7, 5, 1, 6, 2, 4];
        var shuffled = Permuted(m, order, p => Rotate(p, new Vec3(-0.3, 0.8, 0.5), 2.3) + new Vec3(-4, 1.5, 9));
        var r = AtomMapping.Find(shuffled, m);
        Assert.True(r.Succeeded, r.Message);
        Assert.False(r.IsIdentity);
        Assert.Equal(order, r.Map.ToArray()); // atom k of the shuffled copy is atom order[k] of the original
        Close.Absolute(0, r.RmsdAngstrom, 1e-10, "RMSD after mapping", "Kabsch, Acta Cryst. A 1976, 32, 922; the construction");
        Assert.StartsWith("atoms matched in another order (Cl1→Cl9, H2→H4, C3→C1, H4→H8", r.Message);
    }

    [Fact]
    public void MethylTurnedBy120Degrees_MapsOntoItselfThroughTheHydrogens()
    {
        // Ethane with one methyl turned by 120° about C–C is the same structure with its hydrogens renumbered (threefold rotor).
        var e = InternalCoordinatesTests.StaggeredEthane();
        var axis = e.PositionsAngstrom[1] - e.PositionsAngstrom[0];
        var turned = new Molecule(e.Elements, e.PositionsAngstrom.Select((p, i) =>
            i >= 2 && (p - e.PositionsAngstrom[0]).Length < 1.2 ? Rotate(p - e.PositionsAngstrom[0], axis, 2 * Math.PI / 3) + e.PositionsAngstrom[0] : p));
        var sameOrder = Kabsch.Rmsd(turned, e);
        Assert.True(sameOrder > 0.3, $"same-order RMSD {sameOrder}");
        var r = AtomMapping.Find(turned, e);
        Assert.True(r.Succeeded, r.Message);
        Close.Absolute(0, r.RmsdAngstrom, 1e-10, "RMSD with hydrogens renumbered", "threefold symmetry of a methyl rotor (construction)");
        Assert.False(r.IsIdentity);
    }

    [Fact]
    public void EquivalenceClasses_OfFluoroethane_SeparateTheTwoCarbonsAndTheirHydrogens()
    {
        // CH3–CH2F: topologically the three methyl H are equivalent, the two CH2 H are equivalent, and C1, C2, F differ: 5 classes.
        var c1 = Vec3.Zero;
        var c2 = new Vec3(1.52, 0, 0);
        var m = new Molecule(
            [Elements.C, Elements.C, Elements.Get("F"), Elements.H, Elements.H, Elements.H, Elements.H, Elements.H],
            [c1, c2, c2 + new Vec3(0.45, 1.3, 0), c1 + new Vec3(-0.36, 1.0, 0), c1 + new Vec3(-0.36, -0.5, 0.87), c1 + new Vec3(-0.36, -0.5, -0.87),
             c2 + new Vec3(0.36, -0.5, 0.87), c2 + new Vec3(0.36, -0.5, -0.87)]);
        var classes = AtomMapping.EquivalenceClasses(m);
        Assert.Equal(5, classes.Distinct().Count());
        Assert.Equal(classes[3], classes[4]);
        Assert.Equal(classes[4], classes[5]);
        Assert.Equal(classes[6], classes[7]);
        Assert.NotEqual(classes[3], classes[6]);
        Assert.NotEqual(classes[0], classes[1]);
    }

    [Fact]
    public void Isomers_AreDifferentBonds_AndDifferentFormulas_AreDifferentAtoms()
    {
        // Ethanol CH3CH2OH against dimethyl ether CH3OCH3 (both C2H6O): one C–O bond against two, one C–C against none.
        Molecule Build(bool ether)
        {
            var c1 = Vec3.Zero;
            var x2 = new Vec3(1.45, 0, 0);
            var x3 = new Vec3(1.95, 1.35, 0);
            var el = ether ? new[] { Elements.C, Elements.Get("O"), Elements.C } : [Elements.C, Elements.C, Elements.Get("O")];
            var pos = new List<Vec3> { c1, x2, x3 };
            var atoms = el.ToList();
            void H(Vec3 at, Vec3 dir) { atoms.Add(Elements.H); pos.Add(at + dir.Normalized() * 1.09); }
            H(c1, new Vec3(-1, 0.2, 0)); H(c1, new Vec3(0.1, -0.6, 0.9)); H(c1, new Vec3(0.1, -0.6, -0.9));
            if (ether) { H(x3, new Vec3(1, 0.3, 0)); H(x3, new Vec3(-0.1, 0.6, 0.9)); H(x3, new Vec3(-0.1, 0.6, -0.9)); }
            else { H(x2, new Vec3(0.3, -0.6, 0.9)); H(x2, new Vec3(0.3, -0.6, -0.9)); H(x3, new Vec3(1, 0.2, 0)); }
            return new Molecule(atoms, pos);
        }
        var r = AtomMapping.Find(Build(false), Build(true));
        Assert.Equal(AtomMappingStatus.DifferentBonds, r.Status);
        Assert.Contains("C–C bonds 1 against 0", r.Message);
        Assert.Contains("C–O bonds 1 against 2", r.Message);

        var water = new Molecule([Elements.Get("O"), Elements.H, Elements.H], [Vec3.Zero, new Vec3(0.96, 0, 0), new Vec3(-0.24, 0.93, 0)]);
        var d = AtomMapping.Find(water, Build(false));
        Assert.Equal(AtomMappingStatus.DifferentAtoms, d.Status);
        Assert.Contains("H2O against C2H6O", d.Message);
    }

    [Fact]
    public void FindAny_ShuffledCopy_GivesABondPreservingNumbering()
    {
        var m = Asymmetric();
        int[] order = [8, 3, 0, 7, 5, 1, 6, 2, 4];
        var shuffled = Permuted(m, order, p => Rotate(p, new Vec3(-0.3, 0.8, 0.5), 2.3));
        var gs = Connectivity.Of(shuffled);
        var gm = Connectivity.Of(m);
        var r = AtomMapping.FindAny(shuffled, gs, m, gm);
        Assert.True(r.Succeeded, r.Message);
        Assert.False(r.IsIdentity);
        Assert.Equal(m.AtomCount, r.Map.Distinct().Count());
        Assert.All(gs.Bonds, b => Assert.True(gm.AreBonded(r.Map[b.A], r.Map[b.B]), $"bond {b.Label(shuffled)} is not kept"));
        Assert.All(Enumerable.Range(0, m.AtomCount), i => Assert.Equal(shuffled.Elements[i], m.Elements[r.Map[i]]));

        var same = AtomMapping.FindAny(m, gm, m, gm);
        Assert.True(same.IsIdentity);
        Assert.Equal("atoms in the same order with the same bonds", same.Message);

        var water = new Molecule([Elements.Get("O"), Elements.H, Elements.H], [Vec3.Zero, new Vec3(0.96, 0, 0), new Vec3(-0.24, 0.93, 0)]);
        Assert.Equal(AtomMappingStatus.DifferentAtoms, AtomMapping.FindAny(water, Connectivity.Of(water), m, gm).Status);
    }

    [Fact]
    public void Symmetry_ListsTheSkeletonSelfMappingsAndTheInterchangeableGroups()
    {
        // Cube of eight carbons: the 48 symmetry operations of O_h are its 48 bond-preserving self-mappings, identity first.
        var corners = new List<Vec3>();
        for (var i = 0; i < 8; i++) corners.Add(new Vec3(i & 1, (i >> 1) & 1, (i >> 2) & 1) * 1.55);
        var cube = AtomMapping.Symmetry(new Molecule(Enumerable.Repeat(Elements.C, 8), corners));
        Assert.Equal(48, cube.SkeletonMappings.Length);
        Assert.Equal(Enumerable.Range(0, 8), cube.SkeletonMappings[0]);
        Assert.Equal(48, cube.SkeletonMappings.Select(m => string.Join(",", m)).Distinct().Count());
        Assert.True(cube.Exhaustive);
        Assert.Empty(cube.Groups);

        // Staggered ethane: the skeleton is the two carbons (2 mappings: C1↔C2 or not); each methyl's hydrogens are a group.
        var e = AtomMapping.Symmetry(InternalCoordinatesTests.StaggeredEthane());
        Assert.Equal(2, e.SkeletonMappings.Length);
        Assert.Equal([0, 1], e.Skeleton.ToArray());
        Assert.Equal(2, e.Groups.Length);
        Assert.All(e.Groups, g => Assert.Equal(3, g.Members.Length));
        // The C1↔C2 mapping sends the hydrogens of C1 to those of C2.
        var swap = e.SkeletonMappings[1];
        Assert.Equal(1, swap[0]);
        Assert.Equal(e.Groups.Single(g => g.Parent == 1).Members, e.Groups.Single(g => g.Parent == 0).Members.Select(h => swap[h]));

        var limited = AtomMapping.Symmetry(new Molecule(Enumerable.Repeat(Elements.C, 8), corners), options: new AtomMappingOptions(MaxSkeletonMappings: 5));
        Assert.Equal(5, limited.SkeletonMappings.Length);
        Assert.False(limited.Exhaustive);
    }

    [Fact]
    public void HighlySymmetricStructure_SaysWhenTheSearchStoppedAtItsLimit()
    {
        // Cubane-like C8 cage (48 automorphisms) without hydrogens, limited to 5 mappings: the answer says it is not exhaustive.
        var corners = new List<Vec3>();
        for (var i = 0; i < 8; i++) corners.Add(new Vec3(i & 1, (i >> 1) & 1, (i >> 2) & 1) * 1.55);
        var cube = new Molecule(Enumerable.Repeat(Elements.C, 8), corners);
        var all = AtomMapping.Find(cube, cube);
        Assert.True(all.Exhaustive);
        Assert.Equal(48, all.MappingsTried); // the symmetry group of the cube, O_h, has 48 elements
        // The 24 proper rotations (group O) superpose the cube on itself exactly; the 24 improper ones (reflections) cannot.
        Assert.Equal(24, all.EquallyGoodMappings);
        Close.Absolute(0, all.RmsdAngstrom, 1e-10, "RMSD of the cube on itself", "construction");
        Assert.Contains("24 mappings fit equally well", all.Message);
        var limited = AtomMapping.Find(cube, cube, new AtomMappingOptions(MaxSkeletonMappings: 5));
        Assert.False(limited.Exhaustive);
        Assert.Contains("more than 5 bond-preserving mappings", limited.Message);
    }
}
