using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Ledger.Reactions;
using BarrierLedger.Web.Components.Pages.Builder;

namespace BarrierLedger.Web.Tests.Builder;

public class BondTextTests
{
    /// <summary>Four atoms in file order: C1, C2, O3, H4 (positions do not matter to the text).</summary>
    internal static Molecule Small => new([Elements.C, Elements.C, Elements.O, Elements.H],
        [new Vec3(0, 0, 0), new Vec3(1.5, 0, 0), new Vec3(2.2, 1.1, 0), new Vec3(-0.6, 0.9, 0)]);

    [Theory]
    [InlineData("C1–C2")]
    [InlineData("c1-c2")]
    [InlineData(" 1 - 2 ")]
    [InlineData("C1—2")]
    public void TryParse_OneBondWrittenAnyUsualWay_GivesTheOneBasedPair(string text)
    {
        Assert.True(BondText.TryParse(text, Small, out var pairs, out var error), error);
        Assert.Equal([new AtomPair(1, 2)], pairs);
    }

    [Fact]
    public void TryParse_SeveralBonds_GivesThemInOrder()
    {
        Assert.True(BondText.TryParse("C1–C2, O3-H4; 2-3", Small, out var pairs, out var error), error);
        Assert.Equal([new AtomPair(1, 2), new AtomPair(3, 4), new AtomPair(2, 3)], pairs);
    }

    [Theory]
    [InlineData("O1–C2", "atom 1 is C1, not O1")]
    [InlineData("C1–C9", "there is no atom 9: the saddle point has atoms 1 to 4")]
    [InlineData("C2–C2", "'C2–C2' names atom 2 twice; a bond joins two different atoms")]
    [InlineData("C1 C2", "'C1 C2' is not two atoms joined by a dash (e.g. C1–C6)")]
    [InlineData("  ", "type a bond as two atoms, e.g. C1–C6")]
    public void TryParse_WrongText_SaysWhatIsWrong(string text, string expected)
    {
        Assert.False(BondText.TryParse(text, Small, out _, out var error));
        Assert.Equal(expected, error);
    }

    [Fact]
    public void Label_WithAndWithoutGeometry_NamesTheAtoms()
    {
        Assert.Equal("C2–O3", BondText.Label(new AtomPair(2, 3), Small));
        Assert.Equal("2–3", BondText.Label(new AtomPair(2, 3), null));
        Assert.Equal("2–7", BondText.Label(new AtomPair(2, 7), Small));
    }
}
