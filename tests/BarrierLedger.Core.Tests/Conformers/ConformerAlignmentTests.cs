using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Conformers;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Tests.ReferenceData;
using BarrierLedger.Core.Tests.Support;

namespace BarrierLedger.Core.Tests.Conformers;

public class ConformerAlignmentTests
{
    private static FlexibleMolecules.Torsions Sample => new([95.0, 65.0], 175.0, 20.0, 10.0);

    private static Molecule Scaled(Molecule m, double s)
    {
        var heavy = Enumerable.Range(0, m.AtomCount).Where(i => m.Elements[i].AtomicNumber > 1).ToList();
        var c = heavy.Aggregate(Vec3.Zero, (a, i) => a + m.PositionsAngstrom[i]) / heavy.Count;
        return new Molecule(m.Elements, m.PositionsAngstrom.Select(p => c + (p - c) * s), m.Charge, m.Multiplicity);
    }

    [Fact]
    public void Builder_GivesTheTorsionsAskedFor()
    {
        // The fixture itself: the C1–C2–C3–C4 dihedral of the butane builder is the one asked for (construction).
        foreach (var phi in new[] { 180.0, 65.0, -65.0 })
        {
            var p = FlexibleMolecules.Butane(phi).PositionsAngstrom;
            var d = InternalCoordinates.DihedralDegrees(p[0], p[1], p[2], p[3]);
            Close.Absolute(0, Math.IEEERemainder(d - phi, 360), 1e-9, $"C–C–C–C dihedral of butane built at {phi}°", "construction");
        }
        Assert.Equal(30, FlexibleMolecules.Arylalkane(Sample).AtomCount);
        Assert.Equal("C12H15F3", Formula.Of(FlexibleMolecules.Arylalkane(Sample)).ToString());
        Assert.Equal(60, FlexibleMolecules.Arylalkane(FlexibleMolecules.RandomTorsions(new Random(1), 12)).AtomCount);
    }

    [Fact]
    public void Rmsd_OfARotatedTranslatedAndRenumberedCopy_IsZero()
    {
        var m = FlexibleMolecules.Arylalkane(Sample);
        var order = FlexibleMolecules.Shuffle(new Random(21), m.AtomCount);
        var copy = FlexibleMolecules.Moved(m, order, new Vec3(0.3, -1, 0.7), 2.1, new Vec3(5, -3, 11));
        var a = ConformerAlignment.Prepare([m, copy]);
        Assert.True(a.IsComparable(1), a.Numbering[1].Message);
        Assert.False(a.Numbering[1].SameOrder);
        Assert.True(a.HeavyAtomsOnly);
        Assert.Equal(15, a.ComparedAtomCount); // 12 C + 3 F
        Close.Absolute(0, a.Rmsd(0, 1), 1e-9, "heavy-atom RMSD of a rigid, renumbered copy", "Kabsch, Acta Cryst. A 1976, 32, 922; the construction");
        Close.Absolute(0, a.Rmsd(1, 0), 1e-9, "the same the other way round", "construction");
        Close.Absolute(0, ConformerAlignment.Prepare([copy, m], new ConformerOptions(HeavyAtomsOnly: false)).Rmsd(0, 1), 1e-9,
            "all-atom RMSD of the same pair", "construction");
    }

    [Fact]
    public void Rmsd_RingFlippedAndTrifluoromethylTurned_IsZeroOnlyThroughEquivalentAtoms()
    {
        // The ring–CH2 torsion turned by 180° flips the para-disubstituted ring about its axis (ortho and meta carbons trade
        // places) and turns the CF3 group by 180° with it; CF3 turned back by a further 60° puts its three fluorines on each
        // other's places. The same structure, reachable only by renumbering: a ring automorphism plus the fluorine group order.
        var t = Sample;
        var flipped = FlexibleMolecules.Arylalkane(t with { Chain = [t.Chain[0] + 180, t.Chain[1]], Trifluoromethyl = t.Trifluoromethyl + 60 });
        var m = FlexibleMolecules.Arylalkane(t);
        var sameNumbering = Kabsch.Superpose(
            [.. Enumerable.Range(0, 16).Select(i => flipped.PositionsAngstrom[i])], [.. Enumerable.Range(0, 16).Select(i => m.PositionsAngstrom[i])]).RmsdAngstrom;
        Assert.True(sameNumbering > 0.3, $"without renumbering the heavy atoms differ by {sameNumbering:0.000} Å");
        var a = ConformerAlignment.Prepare([m, flipped]);
        Assert.Equal(4, a.Symmetry.SkeletonMappings.Length); // ring flip × isopropyl methyls
        Close.Absolute(0, a.Rmsd(0, 1), 1e-9, "heavy-atom RMSD of the flipped ring and turned CF3", "construction");
        var all = ConformerAlignment.Prepare([m, flipped], new ConformerOptions(HeavyAtomsOnly: false));
        Close.Absolute(0, all.Rmsd(0, 1), 1e-9, "all-atom RMSD of the same pair", "construction");

        // With another conformer as the reference, both are numbered onto it (each in the order that fits it best, not each
        // other), so the pair is matched through the listed self-mappings and the fluorine order alone.
        var rng = new Random(7);
        for (var k = 0; k < 6; k++)
        {
            var other = FlexibleMolecules.RandomArylalkane(rng, 2, trifluoromethyl: 60.0 * k);
            var b = ConformerAlignment.Prepare([other, m, flipped]);
            Assert.Equal(0, b.ReferenceIndex);
            Close.Absolute(0, b.Rmsd(1, 2), 1e-9, $"heavy-atom RMSD of the flipped pair, reference conformer {k}", "construction");
        }
    }

    [Fact]
    public void Rmsd_OfRandomConformerPairs_EqualsTheBruteForceMinimumOverEveryEquivalentNumbering()
    {
        // Independent check by exhaustion: the heavy atoms of F3C–C6H4–(CH2)2–CH(CH3)2 (builder order: ring C0–C5, CF3 carbon 6,
        // F 7–9, chain 10–12, methyls 13–14) can be renumbered by the ring flip (1↔5, 2↔4), the methyl swap (13↔14) and any order
        // of the three fluorines: 24 numberings, each superposed by Kabsch, the smallest RMSD kept. A third, unrelated conformer
        // listed first is the reference, so the pair is matched through the alignment's listed self-mappings, not directly.
        var rng = new Random(11);
        var flips = new[] { new[] { 0, 1, 2, 3, 4, 5 }, [0, 5, 4, 3, 2, 1] };
        var methyls = new[] { new[] { 13, 14 }, [14, 13] };
        var fluorines = new[] { new[] { 7, 8, 9 }, [7, 9, 8], [8, 7, 9], [8, 9, 7], [9, 7, 8], [9, 8, 7] };
        for (var trial = 0; trial < 12; trial++)
        {
            var r = FlexibleMolecules.RandomArylalkane(rng, 2);
            var a = FlexibleMolecules.RandomArylalkane(rng, 2);
            var b = FlexibleMolecules.RandomArylalkane(rng, 2);
            var brute = double.PositiveInfinity;
            foreach (var ring in flips)
                foreach (var me in methyls)
                    foreach (var f in fluorines)
                    {
                        int[] perm = [.. ring, 6, .. f, 10, 11, 12, .. me];
                        var rmsd = Kabsch.Superpose([.. Enumerable.Range(0, 15).Select(i => a.PositionsAngstrom[i])], [.. perm.Select(i => b.PositionsAngstrom[i])]).RmsdAngstrom;
                        brute = Math.Min(brute, rmsd);
                    }
            var alignment = ConformerAlignment.Prepare([r, a, b]);
            Assert.Equal(0, alignment.ReferenceIndex);
            Close.Absolute(brute, alignment.Rmsd(1, 2), 1e-9, $"heavy-atom RMSD, trial {trial}", "brute force over the 24 numberings (Kabsch each)");
        }
    }

    [Fact]
    public void Rmsd_OfAStretchedCopy_IsTheHandComputedValue()
    {
        // Every position scaled by s about the heavy-atom centroid c: the best rotation is the identity (H = s Σ pᵢpᵢᵀ is symmetric
        // positive semidefinite, so its SVD gives R = I) and RMSD = |1 − s| √(Σ |pᵢ − c|² / N) over the heavy atoms.
        var m = FlexibleMolecules.Arylalkane(Sample);
        var s = 1.05;
        var heavy = Enumerable.Range(0, m.AtomCount).Where(i => m.Elements[i].AtomicNumber > 1).Select(i => m.PositionsAngstrom[i]).ToList();
        var c = heavy.Aggregate(Vec3.Zero, (x, y) => x + y) / heavy.Count;
        var expected = (s - 1) * Math.Sqrt(heavy.Sum(p => (p - c).LengthSquared) / heavy.Count);
        var a = ConformerAlignment.Prepare([Scaled(m, s), m]);
        Close.Absolute(expected, a.Rmsd(0, 1), 1e-10, "RMSD of a copy stretched by 5 %", "hand computation (closed form above)");
        Assert.InRange(expected, 0.1, 0.3);
    }

    [Fact]
    public void Rmsd_AntiAgainstGaucheButane_MatchesAnIndependentComputation()
    {
        var anti = FlexibleMolecules.Butane(180);
        var gauche = FlexibleMolecules.Butane(65);
        var minus = FlexibleMolecules.Butane(-65);
        var a = ConformerAlignment.Prepare([anti, gauche, minus]);
        Close.Absolute(ConformerReference.ButaneAntiGaucheCarbonRmsd, a.Rmsd(1, 0), ConformerReference.RmsdTolerance,
            "carbon RMSD, gauche onto anti", "NumPy 1.24.2 SVD, see ConformerReference");
        Close.Absolute(ConformerReference.ButaneGaucheMirrorPairCarbonRmsd, a.Rmsd(1, 2), ConformerReference.RmsdTolerance,
            "carbon RMSD, +65° onto −65°", "NumPy 1.24.2 SVD, see ConformerReference");
        Close.Absolute(0, a.MirrorRmsd(1, 2), 1e-9, "carbon RMSD of +65° mirrored onto −65°", "mirror symmetry of the construction");
        Close.Absolute(ConformerReference.ButaneAntiGaucheCarbonRmsd, a.MirrorRmsd(1, 0), ConformerReference.RmsdTolerance,
            "anti is its own mirror image, so mirroring gauche changes nothing against it", "NumPy 1.24.2 SVD, see ConformerReference");
    }

    [Fact]
    public void Rmsd_OfAMolecularMirrorImage_IsZeroOnlyAfterInversion()
    {
        // Bromochlorofluoromethane and its mirror image: four different heavy atoms, chiral at carbon (construction).
        var m = TestMolecules.Build(("C", 0, 0, 0), ("F", 1.35, 0, 0), ("Cl", -0.59, 1.66, 0), ("Br", -0.64, -0.96, 1.62), ("H", -0.35, -0.2, -1.0));
        var mirror = new Molecule(m.Elements, m.PositionsAngstrom.Select(p => new Vec3(p.X, p.Y, -p.Z)));
        var turned = FlexibleMolecules.Moved(mirror, [4, 3, 2, 1, 0], new Vec3(1, 1, 1), 0.8, new Vec3(1, 2, 3));
        var a = ConformerAlignment.Prepare([m, turned]);
        Assert.True(a.Rmsd(0, 1) > 0.1, $"direct RMSD {a.Rmsd(0, 1)}");
        Close.Absolute(0, a.MirrorRmsd(0, 1), 1e-9, "RMSD after inversion", "construction");
    }

    [Fact]
    public void Prepare_AnIsomerInTheEnsemble_IsNotComparableAndTheReferenceIsTheCommonGraph()
    {
        // Butane conformers with an isobutane structure listed first: same formula, other bonds. The reference is a butane.
        var isobutane = TestMolecules.Build(("C", 0, 0, 0), ("C", 1.53, 0, 0), ("C", -0.51, 1.44, 0), ("C", -0.51, -0.72, 1.25),
            ("H", -0.36, -0.51, -0.89), ("H", 1.89, -1.03, 0), ("H", 1.89, 0.51, 0.89), ("H", 1.89, 0.51, -0.89), ("H", -0.15, 1.95, 0.89),
            ("H", -0.15, 1.95, -0.89), ("H", -1.6, 1.44, 0), ("H", -0.15, -1.75, 1.25), ("H", -1.6, -0.72, 1.25), ("H", -0.15, -0.21, 2.14));
        Assert.Equal("C4H10", Formula.Of(isobutane).ToString());
        var a = ConformerAlignment.Prepare([isobutane, FlexibleMolecules.Butane(180), FlexibleMolecules.Butane(65)]);
        Assert.Equal(1, a.ReferenceIndex);
        Assert.False(a.IsComparable(0));
        Assert.Contains("not comparable", a.Numbering[0].Message);
        Assert.True(double.IsNaN(a.Rmsd(0, 1)));
        Assert.True(a.IsComparable(2));
    }

    [Fact]
    public void Overlay_PutsTheSecondConformerOnTheFirst()
    {
        var m = FlexibleMolecules.Arylalkane(Sample);
        var other = FlexibleMolecules.Arylalkane(Sample with { Chain = [95.0, 180.0] });
        var moved = FlexibleMolecules.Moved(other, [.. Enumerable.Range(0, other.AtomCount)], new Vec3(0, 0, 1), 1.0, new Vec3(10, 0, 0));
        var a = ConformerAlignment.Prepare([m, moved]);
        var o = a.Overlay(0, 1);
        Assert.False(o.Mirrored);
        Close.Absolute(a.Rmsd(1, 0), o.RmsdAngstrom, 1e-12, "overlay RMSD", "the same comparison");
        // Atom i of both structures is one atom: the heavy atoms, index by index, give back the RMSD the comparison reported.
        var heavy = Enumerable.Range(0, m.AtomCount).Where(i => m.Elements[i].AtomicNumber > 1).ToList();
        var rmsd = Math.Sqrt(heavy.Sum(i => (o.SecondAligned.PositionsAngstrom[i] - o.First.PositionsAngstrom[i]).LengthSquared) / heavy.Count);
        Close.Absolute(o.RmsdAngstrom, rmsd, 1e-9, "RMSD recomputed from the overlay positions", "definition of RMSD");
    }

    [Fact]
    public void Prepare_NoConformers_IsRejected() =>
        Assert.Throws<ArgumentException>(() => ConformerAlignment.Prepare([]));
}
