using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Tests.Support;

namespace BarrierLedger.Core.Tests.Geometry;

public class InternalCoordinatesTests
{
    /// <summary>
    /// Staggered ethane from r(C–C) = 1.536 Å, r(C–H) = 1.091 Å, ∠HCC = 110.9° (gas-phase structure, from memory),
    /// built here by hand so every distance, angle and dihedral is known in closed form.
    /// </summary>
    internal static Molecule StaggeredEthane()
    {
        const double rcc = 1.536, rch = 1.091, hcc = 110.9 * Math.PI / 180;
        var c = Elements.C; var h = Elements.H;
        var pos = new List<Vec3> { new(0, 0, 0), new(0, 0, rcc) };
        for (var k = 0; k < 3; k++)
        {
            var phi = 2 * Math.PI * k / 3;
            pos.Add(new Vec3(rch * Math.Sin(hcc) * Math.Cos(phi), rch * Math.Sin(hcc) * Math.Sin(phi), -rch * Math.Cos(Math.PI - hcc)));
        }
        for (var k = 0; k < 3; k++)
        {
            var phi = 2 * Math.PI * k / 3 + Math.PI / 3;
            pos.Add(new Vec3(rch * Math.Sin(hcc) * Math.Cos(phi), rch * Math.Sin(hcc) * Math.Sin(phi), rcc + rch * Math.Cos(Math.PI - hcc)));
        }
        return new Molecule([c, c, h, h, h, h, h, h], pos);
    }

    [Fact]
    public void Ethane_DistancesAnglesAndDihedrals_MatchTheConstruction()
    {
        var m = StaggeredEthane();
        var p = m.PositionsAngstrom;
        Close.Absolute(1.536, InternalCoordinates.Distance(p[0], p[1]), 1e-12, "r(C–C)", "construction, from memory");
        Close.Absolute(1.091, InternalCoordinates.Distance(p[1], p[5]), 1e-12, "r(C–H)", "construction, from memory");
        Close.Absolute(110.9, InternalCoordinates.AngleDegrees(p[0], p[1], p[5]), 1e-10, "∠H–C–C", "construction, from memory");
        // Staggered: every H–C–C–H dihedral is ±60° or 180°.
        Close.Absolute(180.0, Math.Abs(InternalCoordinates.DihedralDegrees(p[2], p[0], p[1], p[6])), 1e-9, "anti H–C–C–H", "staggered geometry");
        Close.Absolute(60.0, Math.Abs(InternalCoordinates.DihedralDegrees(p[2], p[0], p[1], p[5])), 1e-9, "gauche H–C–C–H", "staggered geometry");
    }

    [Theory]
    // IUPAC Gold Book, "torsion angle": positive when, looking along B→C, the bond A–B turns clockwise (≤ 180°) to eclipse C–D.
    // With A on +x, B at the origin, C on +z, D at azimuth φ: looking along +z, counter-clockwise from above is clockwise, so φ.
    [InlineData(30.0)]
    [InlineData(-75.0)]
    [InlineData(150.0)]
    [InlineData(180.0)]
    public void Dihedral_FollowsIupacSignConvention(double phi)
    {
        var r = phi * Math.PI / 180;
        var value = InternalCoordinates.DihedralDegrees(new Vec3(1, 0, 0), Vec3.Zero, new Vec3(0, 0, 1), new Vec3(Math.Cos(r), Math.Sin(r), 1));
        Close.Absolute(phi, value, 1e-10, "dihedral", "IUPAC Gold Book sign convention");
    }

    [Fact]
    public void Ethane_Enumeration_CountsBondsAnglesAndProperDihedrals()
    {
        // Counted by hand: 7 bonds; each carbon has 4 neighbours, C(4,2) = 6 angles each → 12; dihedrals only about C–C: 3 × 3 = 9.
        var m = StaggeredEthane();
        var g = Connectivity.Of(m);
        Assert.Equal(7, g.Bonds.Length);
        Assert.Equal(12, InternalCoordinates.Angles(g).Count);
        Assert.Equal(9, InternalCoordinates.ProperDihedrals(m, g).Count);
        Assert.Equal(4, g.SideOf(1, 0)!.Count); // cutting C1–C2: C1 and its three hydrogens
    }

    [Fact]
    public void Water_BondsFromCovalentRadii()
    {
        // r(O–H) = 0.9572 Å, ∠HOH = 104.52° (gas-phase water, from memory). O–H is bonded (≤ 1.2 × (0.66 + 0.31) Å);
        // H···H at 1.51 Å is not (> 1.2 × 0.62 Å). Cordero radii as in the element table.
        const double r = 0.9572, half = 104.52 / 2 * Math.PI / 180;
        var m = new Molecule([Elements.O, Elements.H, Elements.H],
            [Vec3.Zero, new Vec3(r * Math.Sin(half), 0, r * Math.Cos(half)), new Vec3(-r * Math.Sin(half), 0, r * Math.Cos(half))]);
        var g = Connectivity.Of(m);
        Assert.Equal(new[] { new Bond(0, 1), new Bond(0, 2) }, g.Bonds.AsEnumerable());
        Assert.Null(new Connectivity(3, [new Bond(0, 1), new Bond(1, 2), new Bond(0, 2)]).SideOf(0, 1)); // a ring bond has no side
    }
}
