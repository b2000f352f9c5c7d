using BarrierLedger.Core.Conformers;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Tests.Conformers;

public class ConformerEnsembleTests
{
    private static Molecule Nudged(Molecule m, double amplitude, int rngState)
    {
        var rng = new Random(rngState);
        return new Molecule(m.Elements, m.PositionsAngstrom.Select(p => p + new Vec3(rng.NextDouble() - 0.5, rng.NextDouble() - 0.5, rng.NextDouble() - 0.5) * (2 * amplitude)));
    }

    private static Energy? Kcal(double x) => Energy.FromHartree(-158.0) + Energy.FromKcalPerMol(x);

    [Fact]
    public void Compare_ButaneEnsemble_FindsTheDuplicateAndTheMirrorImagePair()
    {
        // anti, a re-optimised copy of anti (every atom moved by ≤ 0.01 Å, 0.02 kcal/mol higher), gauche+ and gauche− at the same
        // energy (mirror images), and a copy of anti with an energy 0.5 kcal/mol off (same geometry, another calculation).
        var anti = FlexibleMolecules.Butane(180);
        var geometries = new[] { anti, Nudged(anti, 0.01, 4), FlexibleMolecules.Butane(65), FlexibleMolecules.Butane(-65), anti };
        var energies = new[] { Kcal(0), Kcal(0.02), Kcal(0.9), Kcal(0.9), Kcal(0.5) };
        var c = ConformerEnsemble.Compare(geometries, energies);

        Assert.Null(c.Conformers[0].DuplicateOf);
        Assert.Equal(0, c.Conformers[1].DuplicateOf);
        Assert.Null(c.Conformers[2].DuplicateOf);
        Assert.Equal(3, c.Conformers[2].EnantiomerOf);
        Assert.Equal(2, c.Conformers[3].EnantiomerOf);
        Assert.Null(c.Conformers[4].DuplicateOf); // same geometry, but its energy is 0.5 kcal/mol off: not counted as a duplicate
        Assert.Equal([0, 2, 3, 4], c.Unique);

        var dup = Assert.Single(c.Pairs, p => p.Relation == ConformerRelation.Duplicate);
        Assert.Equal((0, 1), (dup.First, dup.Second));
        Assert.InRange(dup.RmsdAngstrom, 1e-4, 0.02);
        var mirror = Assert.Single(c.Pairs, p => p.Relation == ConformerRelation.Enantiomer);
        Assert.Equal((2, 3), (mirror.First, mirror.Second));
        Assert.True(mirror.MirrorRmsdAngstrom < 1e-9);
        Assert.Contains(c.Pairs, p => p.Relation == ConformerRelation.SameStructureOtherEnergy && p.First == 0 && p.Second == 4);
        Assert.Equal("5 conformers, 1 duplicate, 1 mirror-image pair (heavy-atom RMSD below 0.1 Å and ΔE below 0.1 kcal/mol)", c.Summary);
    }

    [Fact]
    public void Compare_DuplicateSet_PointsToItsLowestEnergyMember()
    {
        var anti = FlexibleMolecules.Butane(180);
        var c = ConformerEnsemble.Compare([Nudged(anti, 0.01, 1), Nudged(anti, 0.01, 2), Nudged(anti, 0.01, 3)], [Kcal(0.05), Kcal(0.01), Kcal(0.04)]);
        Assert.Equal(1, c.Conformers[0].DuplicateOf);
        Assert.Null(c.Conformers[1].DuplicateOf);
        Assert.Equal(1, c.Conformers[2].DuplicateOf);
        Assert.Equal([1], c.Unique);
    }

    [Fact]
    public void Compare_ThresholdsAreOptions()
    {
        // gauche ±65° are 0.49 Å apart: a 0.6 Å threshold makes them duplicates; a geometry off by 0.05 Å with 0.05 kcal/mol is
        // a duplicate at the defaults but not with a 0.01 kcal/mol energy threshold.
        var c = ConformerEnsemble.Compare([FlexibleMolecules.Butane(65), FlexibleMolecules.Butane(-65)], [Kcal(1), Kcal(1)], new ConformerOptions(DuplicateRmsdAngstrom: 0.6));
        Assert.Equal(0, c.Conformers[1].DuplicateOf);
        var anti = FlexibleMolecules.Butane(180);
        Assert.Equal(0, ConformerEnsemble.Compare([anti, Nudged(anti, 0.01, 9)], [Kcal(0), Kcal(0.05)]).Conformers[1].DuplicateOf);
        Assert.Null(ConformerEnsemble.Compare([anti, Nudged(anti, 0.01, 9)], [Kcal(0), Kcal(0.05)], new ConformerOptions(DuplicateEnergyKcalPerMol: 0.01)).Conformers[1].DuplicateOf);
    }

    [Fact]
    public void Compare_WithoutEnergies_JudgesByGeometry()
    {
        var anti = FlexibleMolecules.Butane(180);
        var c = ConformerEnsemble.Compare([anti, Nudged(anti, 0.01, 5), FlexibleMolecules.Butane(65)], [null, null, null]);
        Assert.Equal(0, c.Conformers[1].DuplicateOf);
        var d = Assert.Single(c.Pairs);
        Assert.Null(d.EnergyDifferenceKcalPerMol);
    }

    [Fact]
    public void Compare_BadInput_IsRejectedWithTheReason()
    {
        var anti = FlexibleMolecules.Butane(180);
        var e = Assert.Throws<ArgumentException>(() => ConformerEnsemble.Compare([anti, anti], [Kcal(0)]));
        Assert.Contains("1 energies for 2 conformers", e.Message);
        Assert.Throws<ArgumentException>(() => ConformerEnsemble.Compare([anti], [Kcal(0)], new ConformerOptions(DuplicateRmsdAngstrom: 0)));
    }
}
