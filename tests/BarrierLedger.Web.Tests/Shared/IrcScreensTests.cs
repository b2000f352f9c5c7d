using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Web.Components.Shared;
using BarrierLedger.Web.Components.Shared.Charts;
using Microsoft.Extensions.DependencyInjection;
using Plotly.Blazor.Traces;

namespace BarrierLedger.Web.Tests.Shared;

/// <summary>The connection verdict in words, the IRC profile and the path animation (issue 20).</summary>
public class IrcScreensTests
{
    private static readonly ConnectionEvidence s_elsewhere = new(7, "path", "OneSide", "connects acetaldehyde with vinyl alcohol (KE), not oxirane",
        [new EndEvidence("first frame", "acetaldehyde", true, 0.042, "bond for bond"), new EndEvidence("last frame", "vinyl alcohol (KE)", false, 0.051, "bond for bond")], 0.0);

    private static readonly ConnectionEvidence s_both = new(8, "path", "BothSides", "connects butadiene + ethylene and cyclohexene",
        [new EndEvidence("first frame", "butadiene + ethylene", true, 0.10, "bond for bond"), new EndEvidence("last frame", "cyclohexene", true, 0.05, "bond for bond")], 0.0);

    /// <summary>H3 on a line: three frames, the middle one the saddle point; energies −1.65, −1.64, −1.66 hartree.</summary>
    private static IrcView Path()
    {
        var h = Enumerable.Repeat(Elements.H, 3).ToArray();
        Molecule Line(double a, double b) => new(h, [new Vec3(0, 0, 0), new Vec3(a, 0, 0), new Vec3(a + b, 0, 0)], 0, 2);
        return new IrcView(7, 3, "irc-1", "test level", IrcForm.Path, 1, Line(0.93, 0.93), -1.64,
        [
            new IrcFrameView(0, IrcFrameRole.Path, -0.5, -1.65, Line(0.74, 2.5)),
            new IrcFrameView(1, IrcFrameRole.Path, 0.0, -1.64, Line(0.93, 0.93)),
            new IrcFrameView(2, IrcFrameRole.Path, 0.5, -1.66, Line(2.5, 0.74)),
        ]);
    }

    [Theory]
    [InlineData("OneSide", "The IRC connects one side only, it lands elsewhere on the other:", "alert-error")]
    [InlineData("BothSides", "The IRC connects both sides:", "alert-ok")]
    public void ConnectionSummary_SaysTheVerdictInWords_WithWhereEachEndLands(string kind, string lead, string css)
    {
        using var ctx = new BunitContext();
        var evidence = kind == "OneSide" ? s_elsewhere : s_both;
        var cut = ctx.Render<ConnectionSummary>(p => p.Add(c => c.Connection, evidence));
        var box = cut.Find("[data-testid=connection]");
        Assert.Contains(css, box.ClassName);
        Assert.Equal(lead, box.QuerySelector("strong")!.TextContent);
        Assert.Contains(evidence.Headline, box.TextContent);
        if (kind == "OneSide")
            Assert.Contains("The last frame (path) reaches vinyl alcohol (KE), which is not a neighbour of this saddle point, RMSD 0.051 Å.", box.TextContent);
    }

    [Fact]
    public void ConnectionSummary_WithoutAnIrc_ShowsTheModePrediction_AndWithNeitherNothing()
    {
        using var ctx = new BunitContext();
        var cut = ctx.Render<ConnectionSummary>(p => p.Add(c => c.Prediction, new PredictionEvidence("Disagrees", 0.3, "The mode breaks C1–H5, which no state change explains.")));
        Assert.Contains("No IRC uploaded.", cut.Markup);
        Assert.Contains("±0.30 Å", cut.Markup);
        Assert.Contains("alert-warn", cut.Find("[data-testid=connection]").ClassName);
        Assert.Empty(ctx.Render<ConnectionSummary>().FindAll("[data-testid=connection]"));
    }

    [Fact]
    public void IrcTraces_EnergiesInKcalPerMol_RelativeToTheSaddleFrame_EndsNamedByTheCheck()
    {
        var irc = Path();
        var traces = IrcTraces.Build(irc, s_elsewhere).OfType<Scatter>().ToDictionary(t => t.Name);
        // 1 hartree = 627.509474 kcal/mol: CODATA 2018 E_h = 4.3597447222071e-18 J × N_A 6.02214076e23 / 4184 J/kcal.
        var y = byNameY(traces["IRC"]);
        Assert.Equal(-0.01 * 627.509474, y[0], 5);
        Assert.Equal(0.0, y[1], 12);
        Assert.Equal(-0.02 * 627.509474, y[2], 5);
        Assert.Equal([-0.5, 0.0, 0.5], traces["IRC"].X.Select(v => (double)v!));
        Assert.Equal(["first frame: acetaldehyde", "last frame: vinyl alcohol (KE)"], traces["ends"].TextArray);
        Assert.Equal(0.0, (double)traces["saddle point"].X[0]!, 12);
        static double[] byNameY(Scatter s) => [.. s.Y.Select(v => (double)v!)];
    }

    [Fact]
    public void PathAnimation_Shown_KeepsTheEndsAndTheSaddleFrame_AndThinsLongPaths()
    {
        var shown = PathAnimation.Shown(2000, 150, 1234);
        Assert.Equal(0, shown[0]);
        Assert.Equal(1999, shown[^1]);
        Assert.Contains(1234, shown);
        Assert.InRange(shown.Length, 149, 151);
        Assert.True(shown.Zip(shown.Skip(1)).All(p => p.First < p.Second), "strictly increasing");
        Assert.Equal([0, 1, 2], PathAnimation.Shown(3, 150, 1));
    }

    [Fact]
    public void PathAnimation_StartsAtTheSaddleFrame_AndPlayLoadsTheFramesWithTheirOwnBonds()
    {
        using var ctx = new BunitContext();
        ctx.JSInterop.Mode = JSRuntimeMode.Loose;
        var irc = Path();
        var (frames, labels, start) = IrcPanel.Sequence(irc);
        var cut = ctx.Render<PathAnimation>(p => p.Add(c => c.Frames, frames).Add(c => c.Labels, labels).Add(c => c.Start, start).Add(c => c.Id, "p1"));
        Assert.Equal("2", cut.Find("input[type=range]").GetAttribute("max"));
        Assert.StartsWith("frame 2 of 3: s = 0.00 Å, ΔE = 0.00 kcal/mol", cut.Find("output").TextContent);
        cut.Find("button").Click();
        var load = ctx.JSInterop.Invocations.Single(i => i.Identifier == "load");
        var bonds = (int[][])load.Arguments[2]!;
        // Frame 1 bonds H1–H2 (0.74 Å), frame 2 none (0.93 Å > 1.2 × 2 × 0.31 Å), frame 3 H2–H3: radii of Cordero et al., Dalton Trans. 2008, 2832.
        Assert.Equal([[0, 1], [], [1, 2]], bonds);
        Assert.Equal("Pause", cut.Find("button").TextContent);
    }

    [Fact]
    public void IrcPanel_EndpointPair_PlaysBackwardEndSaddleForwardEnd_AndOffersToOpenTheIrc()
    {
        var path = Path();
        var pair = path with
        {
            Form = IrcForm.Endpoints, SaddleFrame = null,
            Frames = [new IrcFrameView(0, IrcFrameRole.Forward, null, null, path.Frames[2].Geometry), new IrcFrameView(1, IrcFrameRole.Backward, null, null, path.Frames[0].Geometry)],
        };
        var (frames, labels, start) = IrcPanel.Sequence(pair);
        Assert.Equal(["backward end", "saddle point", "forward end"], labels);
        Assert.Same(path.Frames[0].Geometry, frames[0]);
        Assert.Same(pair.Saddle, frames[1]);
        Assert.Equal(1, start);

        using var ctx = new BunitContext();
        ctx.Services.AddSingleton(new IrcQueryService(null!)); // not reached: nothing is opened here
        var cut = ctx.Render<IrcPanel>(p => p.Add(c => c.Connection, s_elsewhere).Add(c => c.Id, 3));
        Assert.Equal("Open the IRC profile and path", cut.Find("[data-testid=irc] button").TextContent);
        var none = ctx.Render<IrcPanel>(p => p.Add(c => c.Connection, s_elsewhere with { IrcId = null }).Add(c => c.Id, 4));
        Assert.Empty(none.FindAll("[data-testid=irc]"));
    }
}
