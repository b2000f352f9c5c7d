using System.Text.Json;
using BarrierLedger.Ledger.Reactions;
using BarrierLedger.Web.Components.Shared.Charts;
using Plotly.Blazor.Interop;
using BarrierLedger.Web.Components.Pages.Builder;

namespace BarrierLedger.Web.Tests.Builder;

public class BondPickerTests
{
    private static (IRenderedComponent<BondPicker> Cut, List<IReadOnlyList<AtomPair>> Changes) Render(BunitContext ctx, IReadOnlyList<AtomPair> pairs)
    {
        ctx.JSInterop.Mode = JSRuntimeMode.Loose;
        var changes = new List<IReadOnlyList<AtomPair>>();
        var cut = ctx.Render<BondPicker>(p => p.Add(c => c.Molecule, BondTextTests.Small).Add(c => c.Pairs, pairs).Add(c => c.Id, "s2-bonds")
            .Add(c => c.OnChanged, (IReadOnlyList<AtomPair> x) => changes.Add(x)));
        return (cut, changes);
    }

    [Fact]
    public void PickAsync_TwoAtoms_AddsTheBondBetweenThem_OneBased()
    {
        using var ctx = new BunitContext();
        var (cut, changes) = Render(ctx, [new AtomPair(1, 2)]);

        // A click on C2 in the 3D view: Plotly reports trace 0 (the atoms), point 1 (0-based).
        var view = cut.FindComponent<MoleculeView>();
        var json = JsonDocument.Parse("""{ "c": 0, "p": 1 }""").RootElement;
        cut.InvokeAsync(() => view.Instance.OnClick([new EventDataPoint { CurveNumber = json.GetProperty("c"), PointNumber = json.GetProperty("p") }]));
        cut.WaitForAssertion(() => Assert.Contains("C2 picked: click the second atom.", cut.Markup));
        Assert.Empty(changes);
        cut.FindAll("button.chip").Single(b => b.TextContent == "O3").Click();

        Assert.Equal([new AtomPair(1, 2), new AtomPair(2, 3)], Assert.Single(changes));
    }

    [Fact]
    public void PickAsync_SameAtomTwiceOrABondAlreadyThere_AddsNothingNew()
    {
        using var ctx = new BunitContext();
        var (cut, changes) = Render(ctx, [new AtomPair(1, 2)]);

        cut.InvokeAsync(() => cut.Instance.PickAsync(0));
        cut.InvokeAsync(() => cut.Instance.PickAsync(0));
        cut.InvokeAsync(() => cut.Instance.PickAsync(1));
        cut.InvokeAsync(() => cut.Instance.PickAsync(0)); // 2–1 is the bond 1–2

        Assert.Equal([new AtomPair(1, 2)], Assert.Single(changes));
    }

    [Fact]
    public void TypedBonds_AreAdded_AndAWrongElementIsRefusedWithTheReason()
    {
        using var ctx = new BunitContext();
        var (cut, changes) = Render(ctx, []);

        cut.Find("#s2-bonds-text").Input("C1–H4, O3-C2");
        cut.FindAll("button").Single(b => b.TextContent == "Add bonds").Click();
        Assert.Equal([new AtomPair(1, 4), new AtomPair(3, 2)], Assert.Single(changes));

        cut.Find("#s2-bonds-text").Input("H1–C2");
        cut.FindAll("button").Single(b => b.TextContent == "Add bonds").Click();
        Assert.Single(changes);
        Assert.Equal("atom 1 is C1, not H1", cut.Find("[role=alert]").TextContent);
    }

    [Fact]
    public void Render_WithoutGeometry_AsksForTheCalculationFirst()
    {
        using var ctx = new BunitContext();
        ctx.JSInterop.Mode = JSRuntimeMode.Loose;
        var cut = ctx.Render<BondPicker>(p => p.Add(c => c.Molecule, null).Add(c => c.Pairs, [new AtomPair(1, 6)]));

        Assert.Contains("Choose the saddle-point calculation first", cut.Markup);
        Assert.Contains("1–6", cut.Find("ul.chips").TextContent);
    }
}
