using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Diagrams;
using BarrierLedger.Core.Units;
using BarrierLedger.Web.Components.Shared;
using BarrierLedger.Web.Components.Shared.Charts;
using Plotly.Blazor.Traces;

namespace BarrierLedger.Web.Tests.Shared;

public class ChartTests
{
    private static readonly DiagramState[] s_states =
    [
        new("A + B", Energy.Zero, false),
        new("TS1", Energy.FromKcalPerMol(21.3), true),
        new("P", Energy.FromKcalPerMol(-7.9), false),
    ];

    [Fact]
    public void DiagramTraces_DrawEachLevelOnce_SaddlesApart_AndDashedConnectors()
    {
        var traces = EnergyDiagramTraces.Build(EnergyDiagram.Layout(s_states, "ΔG", EnergyUnit.KcalPerMol));
        var byName = traces.OfType<Scatter>().ToDictionary(t => t.Name);

        Assert.Equal("dash", byName["connectors"].Line.Dash);
        Assert.Equal(2 * 3, byName["connectors"].X.Count); // two connectors, each x0, x1, gap
        Assert.Equal(2 * 3, byName["minima"].X.Count);     // A + B and P
        Assert.Equal(1 * 3, byName["saddle points"].X.Count);
        Assert.Equal(21.3, (double)byName["saddle points"].Y[0]!, 9);
        Assert.Equal(["A + B<br>0.0", "TS1<br>21.3", "P<br>\u22127.9"], byName["labels"].TextArray);
    }

    /// <summary>Issue 19, finding 9: a state label holding markup became a clickable link in the chart.</summary>
    [Fact]
    public void DiagramTraces_ShowMarkupInALabelAsText_NeverAsALinkOrFormatting()
    {
        DiagramState[] states =
        [
            new("<a href=\"https://example.invalid/x\">R</a>", Energy.Zero, false),
            new("TS <b>1</b> & co", Energy.FromKcalPerMol(10), true),
            new("Ç‡", Energy.FromKcalPerMol(-2), false),
        ];
        var labels = EnergyDiagramTraces.Build(EnergyDiagram.Layout(states, "ΔG", EnergyUnit.KcalPerMol)).OfType<Scatter>().Single(t => t.Name == "labels").TextArray;

        Assert.Equal(["&lt;a href=\"https://example.invalid/x\"&gt;R&lt;/a&gt;<br>0.0", "TS &lt;b&gt;1&lt;/b&gt; &amp; co<br>10.0", "Ç‡<br>\u22122.0"], labels);
        Assert.Equal("&lt;a&gt; title", EnergyDiagramTraces.BuildLayout(EnergyDiagram.Layout(states, "ΔG", EnergyUnit.KcalPerMol), "<a> title").Title.Text);
    }

    [Fact]
    public void DiagramChart_RendersAFigureWithTextAlternative()
    {
        using var ctx = new BunitContext();
        ctx.JSInterop.Mode = JSRuntimeMode.Loose;
        var cut = ctx.Render<EnergyDiagramChart>(p => p.Add(c => c.States, s_states).Add(c => c.Unit, EnergyUnit.KJPerMol));
        var caption = cut.Find("figcaption").TextContent;
        Assert.Contains("TS1: 89.1 kJ/mol (saddle point)", caption); // 21.3 × 4.184 = 89.12 kJ/mol
        Assert.Contains("P: \u221233.1 kJ/mol", caption);            // −7.9 × 4.184 = −33.05 kJ/mol
    }

    [Theory]
    [InlineData(Verdict.Passed, "badge-ok", "✔")]
    [InlineData(Verdict.NeedsAttention, "badge-warn", "⚠")]
    [InlineData(Verdict.Failed, "badge-bad", "✖")]
    public void VerdictBadge_ShowsWordAndIcon_NotColourAlone(Verdict verdict, string css, string icon)
    {
        using var ctx = new BunitContext();
        var cut = ctx.Render<VerdictBadge>(p => p.Add(c => c.Verdict, verdict));
        var badge = cut.Find("span.badge");
        Assert.Contains(css, badge.ClassName);
        Assert.Contains(icon, badge.TextContent);
        Assert.Contains(VerdictText.Of(verdict), badge.TextContent);
    }

    [Fact]
    public void VerdictBadge_SaysWhenACheckIsOutdated()
    {
        using var ctx = new BunitContext();
        var cut = ctx.Render<VerdictBadge>(p => p.Add(c => c.Verdict, Verdict.Passed).Add(c => c.Stale, true));
        Assert.Contains("(outdated)", cut.Markup);
    }
}
