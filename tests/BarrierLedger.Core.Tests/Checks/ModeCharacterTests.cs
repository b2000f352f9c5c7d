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
}
