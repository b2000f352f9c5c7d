using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Tests.ReferenceData;
using BarrierLedger.Core.Tests.Support;

namespace BarrierLedger.Core.Tests.Geometry;

public class InertiaTests
{
    [Fact]
    public void CentreOfMass_OfHCl_LiesOnTheBondAtTheMassWeightedPoint()
    {
        var m = TestMolecules.HCl;
        var com = Inertia.CentreOfMass(m);
        var mh = m.Elements[0].MostAbundantIsotopeMassDa;
        var mcl = m.Elements[1].MostAbundantIsotopeMassDa;
        var expected = (mh * m.PositionsAngstrom[0] + mcl * m.PositionsAngstrom[1]) / (mh + mcl);
        Close.Absolute(0, (com - expected).Length, 1e-12, "centre of mass of HCl", "definition R = Σ m r / Σ m");
    }

    // Huber & Herzberg (1979), from memory: B_e(N₂) = 1.99824 cm⁻¹ at r_e = 1.09768 Å; B_e(H³⁵Cl) = 10.5934 cm⁻¹ at r_e = 1.27455 Å.
    [Fact]
    public void RotationalConstants_OfDiatomics_MatchSpectroscopy()
    {
        var n2 = Inertia.PrincipalMomentsAmuAngstrom2(TestMolecules.N2);
        Close.Relative(Spectroscopy.N2RotationalConstantCm1, Inertia.RotationalConstantCm1(n2[2]),
            Spectroscopy.RotationalConstantRelativeTolerance, "B_e of N2", Spectroscopy.HuberHerzberg);
        var hcl = Inertia.PrincipalMomentsAmuAngstrom2(TestMolecules.HCl);
        Close.Relative(Spectroscopy.HClRotationalConstantCm1, Inertia.RotationalConstantCm1(hcl[1]),
            Spectroscopy.RotationalConstantRelativeTolerance, "B_e of HCl", Spectroscopy.HuberHerzberg);
        Close.Absolute(0, hcl[0], 1e-12, "axial moment of HCl", "a linear molecule has a zero axial moment");
        Close.Relative(hcl[1], hcl[2], 1e-12, "the two perpendicular moments of HCl", "symmetry of a linear rotor");
    }

    // Planar rigid body: I_C = I_A + I_B (perpendicular-axis theorem, any mechanics textbook).
    [Fact]
    public void PrincipalMoments_OfPlanarWater_ObeyPerpendicularAxisTheorem()
    {
        var i = Inertia.PrincipalMomentsAmuAngstrom2(TestMolecules.H2O);
        Assert.True(i[0] <= i[1] && i[1] <= i[2]);
        Close.Relative(i[0] + i[1], i[2], 1e-12, "I_C vs I_A + I_B of H2O", "perpendicular-axis theorem");
        // I_B (axis ⟂ to C2 in the plane) = 2 m_H (r sin(θ/2))², independent of the O position: the H atoms' distance to the C2 axis.
        var r = Spectroscopy.H2OBondLengthAngstrom;
        var half = Spectroscopy.H2OAngleDegrees / 2 * Math.PI / 180;
        var mh = TestMolecules.H2O.Elements[1].MostAbundantIsotopeMassDa;
        var aboutC2 = 2 * mh * Math.Pow(r * Math.Sin(half), 2);
        Assert.Contains(i, v => Math.Abs(v - aboutC2) < 1e-12);
    }

    [Fact]
    public void Moments_AreUnchangedByTranslationAndRotation()
    {
        var m = TestMolecules.H2O;
        var (c, s) = (Math.Cos(0.7), Math.Sin(0.7));
        var moved = new Molecule(m.Elements, m.PositionsAngstrom.Select(p => new Vec3(c * p.X - s * p.Y + 3, s * p.X + c * p.Y - 1, p.Z + 2)));
        var a = Inertia.PrincipalMomentsAmuAngstrom2(m);
        var b = Inertia.PrincipalMomentsAmuAngstrom2(moved);
        for (var k = 0; k < 3; k++) Close.Relative(a[k], b[k], 1e-12, $"moment {k} after a rigid motion", "invariance of principal moments");
    }

    [Fact]
    public void Shape_TellsAtomLinearAndNonLinear()
    {
        Assert.Equal(MolecularShape.Atom, Inertia.Shape(TestMolecules.Ar));
        Assert.Equal(MolecularShape.Linear, Inertia.Shape(TestMolecules.HCl));
        Assert.Equal(MolecularShape.Linear, Inertia.Shape(TestMolecules.CO2));
        Assert.Equal(MolecularShape.NonLinear, Inertia.Shape(TestMolecules.H2O));
    }

    [Fact]
    public void Shape_UsesTheTolerance_ForANearlyLinearTriatomic()
    {
        // O–C–O with C 0.005 Å off the line: smallest moment ≈ 2.2·10⁻⁴ amu·Å², within the default 10⁻³.
        var bent = TestMolecules.Build(("O", -1.16, 0, 0), ("C", 0, 0.005, 0), ("O", 1.16, 0, 0));
        Assert.Equal(MolecularShape.Linear, Inertia.Shape(bent));
        Assert.Equal(MolecularShape.NonLinear, Inertia.Shape(bent, linearToleranceAmuAngstrom2: 1e-5));
    }

    [Fact]
    public void EmptyMolecule_IsRejected() =>
        Assert.Throws<ArgumentException>(() => Inertia.Shape(new Molecule([], [])));
}
