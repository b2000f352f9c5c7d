using BarrierLedger.Core.Kinetics;
using BarrierLedger.Ledger.Kinetics;
using BarrierLedger.Web.Components.Shared;

namespace BarrierLedger.Web.Tests.Shared;

public class IntervalTextTests
{
    private static IRenderedComponent<IntervalText> Render(BunitContext ctx, double? value, EnergyUncertainty u, bool isTime = false, double? t = 298.15) =>
        ctx.Render<IntervalText>(p => p.Add(c => c.Value, value).Add(c => c.Uncertainty, u).Add(c => c.Level, "PBE0/def2-TZVP")
            .Add(c => c.TemperatureKelvin, t).Add(c => c.IsTime, isTime));

    // σ = 1 kcal/mol at 298.15 K: the central 95 % interval of k is k·exp(∓1.959964·σ/RT), a factor 27.33151 each way (R from CODATA 2018,
    // z from Python statistics.NormalDist): k = 2.5e-3 s⁻¹ gives 9.146953e-5 to 6.832877e-2.
    [Fact]
    public void RateConstant_ShowsTheIntervalAndWhereSigmaComesFrom()
    {
        using var ctx = new BunitContext();
        var span = Render(ctx, 2.5e-3, new EnergyUncertainty(1.0, [])).Find("[data-testid=interval]");
        Assert.Equal("9.15 × 10⁻⁵ – 6.83 × 10⁻²", span.TextContent.Trim());
        Assert.Equal("σ = 1.0 kcal/mol per barrier (the group's value for every level)", span.GetAttribute("title"));
    }

    // A time inversely proportional to k takes the same factor the other way: 3600 s gives 131.7 s (2.2 min) to 98,393 s (1.1 d).
    [Fact]
    public void Time_ShowsTheIntervalAsDurations()
    {
        using var ctx = new BunitContext();
        Assert.Equal("2.2 min – 1.1 d", Render(ctx, 3600, new EnergyUncertainty(1.0, []), isTime: true).Find("[data-testid=interval]").TextContent.Trim());
    }

    [Fact]
    public void NoUncertainty_SaysSo()
    {
        using var ctx = new BunitContext();
        Assert.Equal(UncertainValue.NotSet, Render(ctx, 2.5e-3, EnergyUncertainty.None).Find("[data-testid=interval]").TextContent.Trim());
    }

    [Theory]
    [InlineData(null, 298.15)]
    [InlineData(0.0, 298.15)]
    [InlineData(2.5e-3, null)]
    public void NoValueOrTemperature_ShowsADash(double? value, double? t)
    {
        using var ctx = new BunitContext();
        var cut = Render(ctx, value, new EnergyUncertainty(1.0, []), t: t);
        Assert.Equal("—", cut.Markup.Trim().Replace("<span>", "").Replace("</span>", ""));
        Assert.Empty(cut.FindAll("[data-testid=interval]"));
    }
}
