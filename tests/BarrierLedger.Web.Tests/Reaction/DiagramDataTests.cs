using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Web.Components.Pages.Reaction;

namespace BarrierLedger.Web.Tests.Reaction;

public class DiagramDataTests
{
    private static DerivedState State(int position, string label, string kind, double? e, double? h, double? g) =>
        new(position, label, kind, e, h, g, [], [], "MODEL-A/basis-1");

    // Given out of order on purpose: the diagram follows the pathway's positions, not the list's order.
    private static readonly DerivedState[] s_states =
    [
        State(2, "P", "Minimum", -0.0200, -0.0180, -0.0126),
        State(0, "A + B", "Minimum", 0.0, 0.0, 0.0),
        State(1, "TS1", "SaddlePoint", 0.0400, 0.0371, 0.0340),
    ];

    [Fact]
    public void FromStates_Gibbs_LevelsInPathwayOrder_WithSaddlePointMarked()
    {
        var levels = DiagramData.FromStates(s_states, DiagramData.Gibbs, out var missing);

        Assert.Empty(missing);
        Assert.Equal(["A + B", "TS1", "P"], levels.Select(l => l.Label));
        Assert.Equal([false, true, false], levels.Select(l => l.IsSaddle));
        Assert.Equal([0.0, 0.0340, -0.0126], levels.Select(l => l.Relative.Hartree));
        // 0.0340 Eh × 627.5094740631 kcal/mol per Eh (CODATA 2018 hartree energy × Avogadro constant / 4184 J per kcal;
        // from memory) = 21.3353 kcal/mol.
        Assert.Equal(21.3353, levels[1].Relative.KcalPerMol, 4);
    }

    [Theory]
    [InlineData(DiagramData.Electronic, 0.0400)]
    [InlineData(DiagramData.Enthalpy, 0.0371)]
    [InlineData(DiagramData.Gibbs, 0.0340)]
    public void FromStates_TakesTheChosenQuantity(string quantity, double saddleHartree)
    {
        var levels = DiagramData.FromStates(s_states, quantity, out _);
        Assert.Equal(saddleHartree, levels.Single(l => l.IsSaddle).Relative.Hartree);
    }

    [Fact]
    public void FromStates_AStateWithoutTheQuantity_NoDiagramAndItIsNamed()
    {
        DerivedState[] states = [.. s_states, State(3, "P2", "Minimum", -0.03, null, null)];

        var gibbs = DiagramData.FromStates(states, DiagramData.Gibbs, out var missing);
        Assert.Empty(gibbs);
        Assert.Equal(["P2"], missing);

        var electronic = DiagramData.FromStates(states, DiagramData.Electronic, out var none);
        Assert.Equal(4, electronic.Count);
        Assert.Empty(none);
    }

    [Fact]
    public void FromStates_UnknownQuantity_SaysWhichAreKnown()
    {
        var ex = Assert.Throws<ArgumentException>(() => DiagramData.FromStates(s_states, "ΔS", out _));
        Assert.Contains("ΔG, ΔH or ΔE", ex.Message);
    }

    /// <summary>When no state has a value the cause is the pathway, not missing frequencies (the demo's KE under its study's model).</summary>
    [Fact]
    public void MissingReason_NamesThePathway_WhenEveryStateLacksTheQuantity()
    {
        Assert.Contains("could not be formed", DiagramData.MissingReason(DiagramData.Gibbs, 3, 3));
        Assert.Equal("no thermal corrections (no frequencies or program corrections)", DiagramData.MissingReason(DiagramData.Gibbs, 1, 3));
        Assert.Equal("no electronic energy", DiagramData.MissingReason(DiagramData.Electronic, 1, 3));
    }
}
