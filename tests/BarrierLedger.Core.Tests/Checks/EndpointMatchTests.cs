using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Tests.Checks;

public class EndpointMatchTests
{
    /// <summary>The hydrogen-transfer system with H8 moved onto C2 (reactant: ethane + Cl) or onto Cl9 (product: ethyl + HCl).</summary>
    private static (Molecule Reactant, Molecule Product) Minima()
    {
        var ts = TestSystems.HydrogenTransfer();
        var p = ts.PositionsAngstrom;
        Molecule With(Vec3 h8, Vec3 cl9) => new(ts.Elements, p.SetItem(7, h8).SetItem(8, cl9), ts.Charge, ts.Multiplicity);
        var u = (p[7] - p[1]).Normalized();
        var w = (p[8] - p[7]).Normalized();
        var reactant = With(p[1] + 1.09 * u, p[1] + 1.09 * u + 3.0 * w);
        var product = With(p[1] + 3.0 * u, p[1] + 3.0 * u + 1.27 * w);
        return (reactant, product);
    }

    private static Molecule Moved(Molecule m, double angle)
    {
        // Rotation about an arbitrary axis (Rodrigues) and a translation: a rigid copy.
        var k = new Vec3(0.4, -0.8, 0.45).Normalized();
        return new Molecule(m.Elements, m.PositionsAngstrom.Select(v =>
            v * Math.Cos(angle) + k.Cross(v) * Math.Sin(angle) + k * (k.Dot(v) * (1 - Math.Cos(angle))) + new Vec3(3, 1, -2)), m.Charge, m.Multiplicity);
    }

    [Fact]
    public void EndpointsThatAreRotatedCopiesOfTheMinima_Pass_WithRmsdBelow1e8()
    {
        // Kabsch, Acta Cryst. A 1976, 32, 922: a rigid copy superposes exactly. Issue criterion: RMSD < 1e-8 Å, connectivity equal.
        var (r, p) = Minima();
        var result = EndpointMatch.Compare(Moved(p, 1.3), Moved(r, -2.2), r, p);
        Assert.True(result.Verdict == Verdict.Passed, result.Report());
        Assert.Equal(EndpointOutcome.MatchesExpected, result.Forward.Outcome);
        Assert.Equal(EndpointOutcome.MatchesExpected, result.Backward.Outcome);
        Assert.True(result.Forward.RmsdToExpectedAngstrom < 1e-8, $"forward RMSD {result.Forward.RmsdToExpectedAngstrom:G3}");
        Assert.True(result.Backward.RmsdToExpectedAngstrom < 1e-8, $"backward RMSD {result.Backward.RmsdToExpectedAngstrom:G3}");
        Assert.True(result.Forward.RmsdToOtherAngstrom > 0.5);
    }

    [Fact]
    public void ForwardEndAtTheReactant_IsSwapped()
    {
        var (r, p) = Minima();
        var result = EndpointMatch.Compare(Moved(r, 0.7), Moved(p, 0.2), r, p);
        Assert.True(result.Swapped);
        Assert.Equal(Verdict.NeedsAttention, result.Verdict);
        Assert.Equal(EndpointMatchCodes.Swapped, result.Reasons[0].Code);
    }

    [Fact]
    public void BothEndsAtTheReactant_Fails()
    {
        var (r, p) = Minima();
        var result = EndpointMatch.Compare(r, r, r, p);
        Assert.Equal(Verdict.Failed, result.Verdict);
        Assert.Contains(result.Reasons, x => x.Code == EndpointMatchCodes.NoMatch && x.Message.Contains("forward end falls back to the reactant"));
    }

    [Fact]
    public void EndpointWithOtherBonds_FailsAndNamesThem()
    {
        var (r, p) = Minima();
        // H8 stays between C2 and Cl9 and Cl9 swings onto C1: neither minimum.
        var ts = TestSystems.HydrogenTransfer();
        var odd = new Molecule(ts.Elements, ts.PositionsAngstrom.SetItem(8, ts.PositionsAngstrom[0] + new Vec3(0, 0, -1.78)), ts.Charge, ts.Multiplicity);
        var result = EndpointMatch.Compare(odd, r, r, p);
        Assert.Equal(Verdict.Failed, result.Verdict);
        Assert.Equal(EndpointOutcome.MatchesNeither, result.Forward.Outcome);
        Assert.Contains(new Bond(0, 8), result.Forward.Formed);
    }

    [Fact]
    public void DifferentFormula_IsAClearError()
    {
        var (r, p) = Minima();
        var fewer = new Molecule(r.Elements.RemoveAt(8).Add(Elements.H), r.PositionsAngstrom);
        var e = Assert.Throws<ArgumentException>(() => EndpointMatch.Compare(fewer, r, r, p));
        Assert.Contains("forward endpoint is C2H7 but the reactant is C2H6Cl (−Cl +H)", e.Message);
    }

    [Fact]
    public void DifferentAtomOrder_IsAClearError()
    {
        var (r, p) = Minima();
        var reordered = new Molecule(r.Elements.RemoveAt(0).Insert(2, Elements.C), r.PositionsAngstrom);
        var e = Assert.Throws<ArgumentException>(() => EndpointMatch.Compare(reordered, r, r, p));
        Assert.Contains("Atom 2 is H in the forward endpoint but C in the reactant", e.Message); // C, H, C, … against C, C, H, …
        Assert.Contains("atom order", e.Message);
    }
}
