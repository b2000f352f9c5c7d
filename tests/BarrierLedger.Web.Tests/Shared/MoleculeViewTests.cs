using System.Text.Json;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Web.Components.Shared.Charts;
using Plotly.Blazor.Interop;

namespace BarrierLedger.Web.Tests.Shared;

public class MoleculeViewTests
{
    private static Molecule Water => new([Elements.O, Elements.H, Elements.H], [new Vec3(0, 0, 0), new Vec3(0.96, 0, 0), new Vec3(-0.24, 0.93, 0)]);

    [Fact]
    public void Render_DrawsThePlot_AndAClickOnAnAtomReportsItsIndex()
    {
        using var ctx = new BunitContext();
        ctx.JSInterop.Mode = JSRuntimeMode.Loose;
        var clicked = new List<int>();
        var cut = ctx.Render<MoleculeView>(p => p.Add(c => c.Molecule, Water).Add(c => c.OnAtomClicked, (int i) => clicked.Add(i)));

        Assert.Contains(ctx.JSInterop.Invocations, i => i.Identifier == "newPlot" && Equals(i.Arguments[0], "molecule-view"));
        Assert.Contains(ctx.JSInterop.Invocations, i => i.Identifier == "subscribeClickEvent");
        // Plotly sends numbers as JSON: a click on the third atom (trace 0 = atoms, 0-based point 2) and one on a bond (trace 1) that is ignored.
        var json = JsonDocument.Parse("""{ "c0": 0, "p2": 2, "c1": 1 }""").RootElement;
        cut.InvokeAsync(() => cut.Instance.OnClick([new EventDataPoint { CurveNumber = json.GetProperty("c1"), PointNumber = json.GetProperty("p2") }]));
        cut.InvokeAsync(() => cut.Instance.OnClick([new EventDataPoint { CurveNumber = json.GetProperty("c0"), PointNumber = json.GetProperty("p2") }]));
        cut.WaitForAssertion(() => Assert.Equal([2], clicked));
    }
}
