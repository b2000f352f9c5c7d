using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Tests.Support;

namespace BarrierLedger.Core.Tests.Checks;

public class ModeCharacterTests
{
    [Fact]
    public void LinearClHCl_AntisymmetricStretch_OneBondFormsWhileTheOtherBreaks()
    {
        // Derivation: r1 = x_H − x_Cl1, r2 = x_Cl3 − x_H. The antisymmetric mode (unnormalised) is Cl: +1, H: −2ρ, Cl: +1 with
        // ρ = m_Cl/m_H, |d|² = 2 + 4ρ². Then dr1/ds = (−1 − 2ρ)/|d| and dr2/ds = (1 + 2ρ)/|d|: equal size, opposite sign, so
        // the two Cl–H shares are 50 % each (the bend at 180° has no first-order change).
        var m = TestSystems.ClHCl();
        var mode = TestSystems.ClHClModes(-1200)[0];
        var c = ModeCharacter.Describe(m, mode, [(0, 1), (1, 2)]);

        Assert.Equal(ModeClass.Stretch, c.Class);
        Assert.Equal(2, c.Components.Length);
        Assert.All(c.Components, x => Assert.True(x.IsReactionBond && x.Kind == InternalKind.Stretch));
        var rho = Elements.Get("Cl").MostAbundantIsotopeMassDa / Elements.H.MostAbundantIsotopeMassDa;
        var expected = (1 + 2 * rho) / Math.Sqrt(2 + 4 * rho * rho);
        var byLabel = c.Components.ToDictionary(x => x.Label);
        Close.Absolute(-expected, byLabel["stretch Cl1–H2"].ChangePerUnitDisplacement, 1e-8, "dr(Cl1–H2)/ds", "analytic, derived in the comment");
        Close.Absolute(expected, byLabel["stretch H2–Cl3"].ChangePerUnitDisplacement, 1e-8, "dr(H2–Cl3)/ds", "analytic, derived in the comment");
        Close.Absolute(0.5, c.Components[0].Share, 1e-8, "share of each Cl–H stretch", "symmetry, derived in the comment");
        Assert.Contains("H2–Cl3 lengthens as Cl1–H2 shortens", c.Summary);
    }

    [Fact]
    public void LinearClHCl_SymmetricStretch_BothBondsLengthenTogether()
    {
        var m = TestSystems.ClHCl();
        var c = ModeCharacter.Describe(m, TestSystems.ClHClModes(-1200)[1], [(0, 1), (1, 2)]);
        Assert.Equal(ModeClass.Stretch, c.Class);
        Assert.Equal(Math.Sign(c.Components[0].ChangePerUnitDisplacement), Math.Sign(c.Components[1].ChangePerUnitDisplacement));
        Assert.DoesNotContain("lengthens as", c.Summary);
    }

    [Fact]
    public void MethylRotation_IsATorsionAboutCC_RotorLike()
    {
        // A rigid turn of H3–H5 about the C1–C2 axis changes no bond length or angle to first order (common geometry), only
        // the nine H–C1–C2–X dihedrals, all by the same amount.
        var m = TestSystems.HydrogenTransfer();
        var c = ModeCharacter.Describe(m, new(-45, TestSystems.MethylRotation(m)), [(1, 7), (7, 8)]);
        Assert.Equal(ModeClass.Torsion, c.Class);
        Assert.True(c.RotorLike);
        Assert.Equal("torsion about C1–C2", c.Components[0].Label);
        Assert.True(c.Components[0].Share > 0.9, $"torsion share {c.Components[0].Share}");
        Assert.StartsWith("rotation of a terminal group about C1–C2, rotor-like", c.Summary);
    }

    [Fact]
    public void OverallRotation_IsNumericalNoise()
    {
        var m = TestSystems.HydrogenTransfer();
        var axis = new Vec3(0.2, 1, 0.3);
        var d = TestSystems.Normalised(m.PositionsAngstrom.Select(p => axis.Cross(p)));
        var c = ModeCharacter.Describe(m, new(-25, d), []);
        Assert.Equal(ModeClass.NumericalNoise, c.Class);
        Close.Absolute(1.0, c.RigidBodyFraction, 1e-9, "rigid-body fraction of a pure rotation", "definition");
    }

    /// <summary>
    /// Two methyl radicals 2.40 Å apart (C1 with H2–H4, C5 with H6–H8), a C···C bond forming beyond the 1.2 × radius-sum cut-off
    /// (1.82 Å): the carbons approach each other and the hydrogens follow at 70 % (the groups flatten less than they move).
    /// </summary>
    private static (Molecule Molecule, System.Collections.Immutable.ImmutableArray<Vec3> Mode) ApproachingMethyls()
    {
        var atoms = new List<Element>();
        var pos = new List<Vec3>();
        var d = new List<Vec3>();
        foreach (var (centre, side) in new[] { (Vec3.Zero, -1.0), (new Vec3(2.40, 0, 0), 1.0) })
        {
            atoms.Add(Elements.C); pos.Add(centre); d.Add(new Vec3(-side, 0, 0));
            for (var k = 0; k < 3; k++)
            {
                var phi = 2 * Math.PI * k / 3 + (side > 0 ? Math.PI / 3 : 0);
                atoms.Add(Elements.H);
                pos.Add(centre + 1.09 * new Vec3(0.33 * side, 0.944 * Math.Cos(phi), 0.944 * Math.Sin(phi)));
                d.Add(new Vec3(-0.7 * side, 0, 0));
            }
        }
        return (new Molecule(atoms, pos, multiplicity: 1), TestSystems.Normalised(d));
    }

    [Fact]
    public void LongContactStretch_IsNamedAmongTheDistanceChanges_AndInTheSummary()
    {
        // dr/ds of C1···C5: (r1 − r5)·(d1 − d5)/|r1 − r5| with d1 = (1, 0, 0)/|d|, d5 = (−1, 0, 0)/|d|, r1 − r5 = (−2.4, 0, 0):
        // −2/|d|, |d|² = 2 + 6 × 0.49 = 4.94 (B-matrix stretch row, Wilson, Decius and Cross, Molecular Vibrations, 1955).
        var (m, mode) = ApproachingMethyls();
        var c = ModeCharacter.Describe(m, new(-420, mode), [(0, 1)]);
        var top = c.DistanceChanges[0];
        Assert.Equal(new Bond(0, 4), top.Pair);
        Assert.Equal(PairRelation.LongContact, top.Relation);
        Assert.Equal("C1···C5", top.Label);
        Close.Absolute(-2 / Math.Sqrt(4.94), top.ChangePerUnitDisplacement, 1e-12, "dr(C1···C5)/ds", "analytic, derived in the comment");
        Close.Absolute(2.40 / 1.52, top.RadiusSumMultiple, 1e-12, "distance / (R_C + R_C)", "Cordero et al., Dalton Trans. 2008, 2832 (R_C = 0.76 Å)");
        Assert.Contains("the distance that changes most is C1···C5 2.40 Å (long contact, 1.58 × the covalent-radius sum) shortens", c.Summary);
    }

    [Fact]
    public void LongContactStretch_WithWrongDeclaredBonds_TheFailureNamesTheRealMotion()
    {
        var (m, mode) = ApproachingMethyls();
        // Declared: C1–H2, which barely moves; the real motion is the C1···C5 approach.
        var result = SaddleCheck.Run(new SaddleCheckInput(m, [new(-420, mode)], [(0, 1)]));
        var failure = result.Reasons.Single(r => r.Code == SaddleCheckCodes.ModeMissesReactionBond);
        Assert.Contains("C1···C5 2.40 Å (long contact, 1.58 × the covalent-radius sum) shortens", failure.Message);
    }
    [Fact]
    public void DemoDielsAlderSaddle_TheFormingBondsBeyondTheCutOff_AreTheLeadingDistanceChanges_EvenWithWrongDeclaredBonds()
    {
        // TS-DA of the demo: C1···C6 and C4···C5 form at 2.2–2.6 Å, beyond the 1.2 × radius-sum bond cut-off (1.82 Å for C–C,
        // Cordero et al., Dalton Trans. 2008, 2832), so the bond graph holds neither. Declared here: C1–H7 only (wrong on purpose).
        var (_, _, saddle, _, _) = DemoBundleStates.Saddles().Single(s => s.Reaction == "DA");
        var m = saddle.Geometry!;
        var mode = DemoBundleStates.ImaginaryMode(saddle);
        var c = ModeCharacter.Describe(m, mode, [(0, 6)]);
        var top = c.DistanceChanges.Take(2).ToList();
        Assert.Equal([new Bond(0, 5), new Bond(3, 4)], top.Select(t => t.Pair).OrderBy(b => b.A).ToList());
        foreach (var t in top)
        {
            Assert.Equal(PairRelation.LongContact, t.Relation);
            Assert.InRange(t.DistanceAngstrom, 2.2, 2.6);
            Close.Absolute(t.DistanceAngstrom / 1.52, t.RadiusSumMultiple, 1e-12, "distance / (R_C + R_C)", "Cordero et al., Dalton Trans. 2008, 2832 (R_C = 0.76 Å)");
        }
        // Both forming bonds change at the same rate (the saddle point is symmetric, both bonds form together).
        Close.Absolute(Math.Abs(top[0].ChangePerUnitDisplacement), Math.Abs(top[1].ChangePerUnitDisplacement), 1e-3, "|dr/ds| of the two forming bonds", "mirror symmetry of the demo saddle point");
        var result = SaddleCheck.Run(new SaddleCheckInput(m, [mode], [(0, 6)]));
        var failure = result.Reasons.Single(r => r.Code == SaddleCheckCodes.ModeMissesReactionBond);
        Assert.Contains("long contact", failure.Message);
        Assert.True(failure.Message.Contains("C1···C6") || failure.Message.Contains("C4···C5"), failure.Message);
    }
}
