using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Paths;
using BarrierLedger.Core.Tests.Support;

namespace BarrierLedger.Core.Tests.Checks;

/// <summary>
/// The connection check on the hydrogen-transfer system: ethane + Cl (reactant side) and ethyl + HCl (product side), each side
/// two species stored in their own atom order; the endpoints keep the saddle point's order.
/// </summary>
public class ConnectionCheckTests
{
    private static Vec3 Rotate(Vec3 v, Vec3 axis, double angle)
    {
        var k = axis.Normalized();
        return v * Math.Cos(angle) + k.Cross(v) * Math.Sin(angle) + k * (k.Dot(v) * (1 - Math.Cos(angle)));
    }

    /// <summary>Reactant-like end (H8 on C2, Cl9 3 Å away) and product-like end (H8 1.27 Å from Cl9, 3 Å from C2), saddle-point order.</summary>
    private static (Molecule Saddle, Molecule ReactantEnd, Molecule ProductEnd) Ends()
    {
        var ts = TestSystems.HydrogenTransfer();
        var p = ts.PositionsAngstrom;
        var u = (p[7] - p[1]).Normalized();
        var w = (p[8] - p[7]).Normalized();
        Molecule With(Vec3 h8, Vec3 cl9) => new(ts.Elements, p.SetItem(7, h8).SetItem(8, cl9), ts.Charge, ts.Multiplicity);
        return (ts, With(p[1] + 1.09 * u, p[1] + 1.09 * u + 3.0 * w), With(p[1] + 3.0 * u, p[1] + 3.0 * u + 1.27 * w));
    }

    /// <summary>The atoms of <paramref name="end"/> listed in <paramref name="order"/> and rigidly moved: a species stored on its own.</summary>
    private static Molecule Species(Molecule end, int[] order, double angle, Vec3 shift, int multiplicity = 1) =>
        new(order.Select(i => end.Elements[i]), order.Select(i => Rotate(end.PositionsAngstrom[i], new Vec3(0.3, 0.5, -0.8), angle) + shift), 0, multiplicity);

    private static StateStructure Reactants(Molecule reactantEnd) => new("ethane + Cl", [
        new StateSpecies("ethane", Species(reactantEnd, [7, 2, 1, 6, 0, 5, 4, 3], 1.2, new Vec3(10, 0, 0))),
        new StateSpecies("chlorine atom", Species(reactantEnd, [8], 0, new Vec3(-4, 2, 1), 2))]);

    private static StateStructure Products(Molecule productEnd) => new("ethyl + HCl", [
        new StateSpecies("hydrogen chloride", Species(productEnd, [8, 7], -0.4, new Vec3(0, 7, 0))),
        new StateSpecies("ethyl", Species(productEnd, [1, 0, 6, 5, 4, 3, 2], 2.2, new Vec3(1, 1, 1), 2))]);

    [Fact]
    public void EndpointPair_ReachingBothSides_ConnectsBothSides_PerFragmentRmsdBelow1e10()
    {
        var (ts, r, p) = Ends();
        // Each species is superposed on its own piece, so moving the pieces of an end apart or turning them changes nothing.
        var loose = new Molecule(p.Elements, p.PositionsAngstrom.Select((x, i) => i is 7 or 8 ? Rotate(x, new Vec3(1, 0, 0), 0.7) + new Vec3(0, 0, 2) : x), p.Charge, p.Multiplicity);
        var result = ConnectionCheck.Run(new ConnectionCheckInput(ts, Reactants(r), Products(p), [], ForwardEnd: loose, BackwardEnd: r));
        Assert.True(result.Connection == Connection.BothSides, result.Report());
        Assert.Equal(Verdict.Passed, result.Verdict);
        var forward = result.Ends.Single(e => e.Name == "forward end");
        Assert.Equal("ethyl + HCl", forward.Reached!.State);
        Assert.Equal(2, forward.Reached.Fragments.Length);
        Close.Absolute(0, forward.Reached.RmsdAngstrom, 1e-10, "per-piece RMSD of the forward end", "Kabsch, Acta Cryst. A 1976, 32, 922; construction");
        Close.Absolute(0, result.Ends.Single(e => e.Name == "backward end").Reached!.RmsdAngstrom, 1e-10, "per-piece RMSD of the backward end", "construction");
        Assert.Contains(forward.Reached.Fragments, f => f.Species == "hydrogen chloride" && f.Atoms.SequenceEqual([7, 8]));
    }

    [Fact]
    public void LabelsTheOtherWayRound_StillConnectsBothSides_AndSaysSo()
    {
        var (ts, r, p) = Ends();
        var result = ConnectionCheck.Run(new ConnectionCheckInput(ts, Reactants(r), Products(p), [], ForwardEnd: r, BackwardEnd: p));
        Assert.Equal(Connection.BothSides, result.Connection);
        Assert.Contains(result.Reasons, x => x.Code == ConnectionCheckCodes.Reversed && x.Severity == CheckSeverity.Info);
    }

    [Fact]
    public void BothEndsAtTheReactants_ConnectsOneSide_AndFails()
    {
        var (ts, r, p) = Ends();
        var result = ConnectionCheck.Run(new ConnectionCheckInput(ts, Reactants(r), Products(p), [], ForwardEnd: r, BackwardEnd: r));
        Assert.Equal(Connection.OneSide, result.Connection);
        Assert.Equal(Verdict.Failed, result.Verdict);
        Assert.Equal("both ends reach ethane + Cl; never reaches ethyl + HCl", result.Headline);
        Assert.Contains("falls back to ethane + Cl as well", result.Reasons[0].Message);
    }

    [Fact]
    public void EndsAtOtherStates_AreNamed()
    {
        var (ts, r, p) = Ends();
        // Drawn between two states that are neither end; the study's real minima are listed as other states.
        var wrongBefore = new StateStructure("chloroethane + H", [
            new StateSpecies("chloroethane", Species(r, [0, 1, 2, 3, 4, 5, 6, 8], 0, Vec3.Zero)), new StateSpecies("H atom", Species(r, [7], 0, Vec3.Zero, 2))]);
        var result = ConnectionCheck.Run(new ConnectionCheckInput(ts, wrongBefore, wrongBefore, [Reactants(r), Products(p)], ForwardEnd: p, BackwardEnd: r));
        Assert.Equal(Connection.OtherStates, result.Connection);
        Assert.Equal(Verdict.Failed, result.Verdict);
        Assert.Equal("connects ethyl + HCl and ethane + Cl, not chloroethane + H and chloroethane + H", result.Headline);
    }

    [Fact]
    public void EndInOnePiece_AgainstATwoSpeciesState_SaysHowItDiffers()
    {
        var (ts, r, p) = Ends();
        var reactants = new StateStructure("ethane + Cl", [
            new StateSpecies("ethane", Species(r, [0, 1, 2, 3, 4, 5, 6, 7], 0, Vec3.Zero)), new StateSpecies("chlorine atom", Species(r, [8], 0, Vec3.Zero, 2))]);
        // Cl9 swung onto C1 while H8 stayed: an end that is neither side.
        var odd = new Molecule(ts.Elements, r.PositionsAngstrom.SetItem(8, r.PositionsAngstrom[0] + new Vec3(0, 0, -1.78)), ts.Charge, ts.Multiplicity);
        var m = EndpointMatch.AgainstState(odd, reactants);
        Assert.False(m.SameBonds);
        Assert.True(m.SameAtoms);
        Assert.Equal("it is one piece, C2H6Cl, where the state has C2H6 (ethane) + Cl (chlorine atom)", m.Explanation);
    }

    [Fact]
    public void StatesOfOtherAtoms_CannotTell_AndSayWhy()
    {
        var (ts, r, p) = Ends();
        var wrong = new StateStructure("ethane", [new StateSpecies("ethane", Species(r, [0, 1, 2, 3, 4, 5, 6, 7], 0, Vec3.Zero))]);
        var result = ConnectionCheck.Run(new ConnectionCheckInput(ts, wrong, Products(p), [], ForwardEnd: p, BackwardEnd: r));
        Assert.Equal(Connection.CannotTell, result.Connection);
        Assert.Equal(Verdict.NeedsAttention, result.Verdict);
        Assert.Contains("the state before it, ethane, holds C2H6 but the saddle point C2H6Cl (−Cl)", result.Reasons[0].Message);
    }

    [Fact]
    public void PathRunningOneWay_CannotTellTheOtherSide()
    {
        var (ts, r, p) = Ends();
        var frames = Enumerable.Range(0, 11).Select(k => Blend(ts, p, k / 10.0)).ToList();
        var path = IrcPath.FromFrames(frames, [.. frames.Select((_, k) => -500.0 - 0.001 * k)], ts);
        Assert.Equal(0, path.SaddleFrame);
        var result = ConnectionCheck.Run(new ConnectionCheckInput(ts, Reactants(r), Products(p), [], path));
        Assert.Equal(Connection.CannotTell, result.Connection);
        Assert.Single(result.Ends);
        Assert.Equal("reaches ethyl + HCl; the other direction is missing", result.Headline);
        Assert.Contains(result.Reasons, x => x.Code == ConnectionCheckCodes.CannotTell && x.Message.Contains("runs one way only"));
    }

    [Fact]
    public void PathFromAnotherSaddlePoint_IsFlagged()
    {
        var (ts, r, p) = Ends();
        var frames = Enumerable.Range(0, 21).Select(k => k <= 10 ? Blend(r, p, k / 10.0) : Blend(p, p, 1)).ToList();
        var far = new Molecule(ts.Elements, ts.PositionsAngstrom.Select(x => x * 1.3), ts.Charge, ts.Multiplicity);
        var path = IrcPath.FromFrames(frames, [.. frames.Select(_ => -500.0)], far);
        var result = ConnectionCheck.Run(new ConnectionCheckInput(far, Reactants(r), Products(p), [], path));
        Assert.Contains(result.Reasons, x => x.Code == ConnectionCheckCodes.PathMissesSaddle);
    }

    [Fact]
    public void PieceWithOtherBonds_InTheSameAtomOrder_NamesTheBondsItHasAndLacks()
    {
        var (_, r, _) = Ends();
        // Ethane stored in the end's own order; the end's ethane piece has H8 moved from C2 onto C1 (a 1,2-shift isomer).
        var ethane = new StateStructure("ethane + Cl", [
            new StateSpecies("ethane", Species(r, [0, 1, 2, 3, 4, 5, 6, 7], 0, Vec3.Zero)), new StateSpecies("chlorine atom", Species(r, [8], 0, Vec3.Zero, 2))]);
        var shifted = new Molecule(r.Elements, r.PositionsAngstrom.SetItem(7, r.PositionsAngstrom[0] + new Vec3(0, 0, -1.09)), r.Charge, r.Multiplicity);
        var m = EndpointMatch.AgainstState(shifted, ethane);
        Assert.False(m.SameBonds);
        Assert.Equal("its C2H6 piece is not ethane: it has C1–H8 in addition and it lacks C2–H8", m.Explanation);
    }

    /// <summary>
    /// The identity reaction H2 + H → H + H2 on a line: saddle H1···H2···H3 at 0.93 Å spacing; one end H1–H2 0.741 Å with H3 2.5 Å
    /// further, the other its mirror image (H2–H3 bonded). Both states are made of the same two species, so each end matches both
    /// sides bond for bond at the same RMSD (0 by construction, Kabsch).
    /// </summary>
    private static (Molecule Saddle, Molecule Left, Molecule Right, StateStructure Before, StateStructure After) HydrogenExchange(string afterLabel = "H + H2")
    {
        var h = Enumerable.Repeat(Elements.H, 3).ToArray();
        Molecule Line(double x1, double x2, double x3, int multiplicity = 2) => new(h, [new Vec3(x1, 0, 0), new Vec3(x2, 0, 0), new Vec3(x3, 0, 0)], 0, multiplicity);
        var dihydrogen = new StateSpecies("dihydrogen", new Molecule(h[..2], [new Vec3(5, 5, 5), new Vec3(5, 5.741, 5)], 0, 1));
        var atom = new StateSpecies("hydrogen atom", new Molecule(h[..1], [new Vec3(-3, 1, 0)], 0, 2));
        return (Line(0, 0.93, 1.86), Line(0, 0.741, 3.241), Line(-1.381, 1.119, 1.86),
            new StateStructure("H2 + H", [dihydrogen, atom]), new StateStructure(afterLabel, [atom, dihydrogen]));
    }

    [Theory]
    [InlineData("H + H2")]
    [InlineData("H2 + H")] // both sides labelled alike: the sides are still told apart by which state each end reached
    public void IdentityReaction_EndsOnEitherSide_ConnectsBothSides(string afterLabel)
    {
        var (ts, left, right, before, after) = HydrogenExchange(afterLabel);
        foreach (var (forward, backward) in new[] { (left, right), (right, left) })
        {
            var result = ConnectionCheck.Run(new ConnectionCheckInput(ts, before, after, [], ForwardEnd: forward, BackwardEnd: backward));
            // Each end ties between the two sides (same bonds, equal RMSD); the tie is settled for the pair, not end by end.
            Assert.True(result.Connection == Connection.BothSides, result.Report());
            Assert.NotEqual(Verdict.Failed, result.Verdict);
            Assert.All(result.Ends, e => Close.Absolute(0, e.Reached!.RmsdAngstrom, 1e-10, "per-piece RMSD of an end", "construction; Kabsch, Acta Cryst. A 1976, 32, 922"));
            Assert.Contains(result.Reasons, x => x.Code == ConnectionCheckCodes.SameBonds);
        }
    }

    [Fact]
    public void IdentityReaction_BothEndsTheSameMinimum_StaysOneSide()
    {
        // Both ends are H1–H2 + H3: one minimum, even though it ties between the two sides. The tie-break must not split them.
        var (ts, left, _, before, after) = HydrogenExchange();
        var result = ConnectionCheck.Run(new ConnectionCheckInput(ts, before, after, [], ForwardEnd: left, BackwardEnd: left));
        Assert.Equal(Connection.OneSide, result.Connection);
        Assert.Equal(Verdict.Failed, result.Verdict);
    }

    private static Molecule Blend(Molecule a, Molecule b, double t) =>
        new(a.Elements, a.PositionsAngstrom.Zip(b.PositionsAngstrom, (x, y) => x + t * (y - x)), a.Charge, a.Multiplicity);
}
