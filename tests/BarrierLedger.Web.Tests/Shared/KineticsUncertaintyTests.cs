using BarrierLedger.Core.Kinetics;
using BarrierLedger.Core.Units;
using BarrierLedger.Web.Components.Shared;

namespace BarrierLedger.Web.Tests.Shared;

public class KineticsUncertaintyTests
{
    // S → P over a saddle point 22 kcal/mol above S (P 20 kcal/mol below, so the reverse step is negligible), 0.1 mol/L S at 298.15 K.
    private static ReactionNetwork Network(double sigma) => new(["S", "P"],
        [new ElementaryStep("S→P", [new StepTerm("S")], [new StepTerm("P")], new EyringRates("S", "TS", "P"))],
        [new EnergyLevel("S", Energy.Zero, null, sigma), new EnergyLevel("TS", Energy.FromKcalPerMol(22), null, sigma), new EnergyLevel("P", Energy.FromKcalPerMol(-20), null, sigma)]);

    private static readonly SimulationConditions Conditions =
        new(new Dictionary<string, double> { ["S"] = 0.1 }, TemperatureProgram.Isothermal(298.15), 1e9, [3600.0]);

    private static readonly KineticsQuestion Question = new("S", ["P"]);

    private static IRenderedComponent<KineticsUncertainty> Render(BunitContext ctx, ReactionNetwork network, SimulationConditions? conditions = null) =>
        ctx.Render<KineticsUncertainty>(p => p.Add(c => c.Network, network).Add(c => c.Conditions, conditions ?? Conditions).Add(c => c.Question, Question)
            .Add(c => c.Describe, "σ = 2.0 kcal/mol per barrier (the default for every level; common practice, no source)").Add(c => c.Id, "mc-test"));

    // Nominal answers against the Eyring equation k = (k_B T/h) exp(−ΔG‡/RT) with CODATA 2018 k_B, h and R, computed independently in
    // Python: k = 4.646759e-4 s⁻¹, t(50 %) = ln 2/k = 1491.7 s ("25 min"), t(95 %) = ln 20/k = 6446.9 s = 107.4 min ("1.8 h", 1.79 h). The sampled median and
    // interval are what Core's Monte Carlo gives for the same key (its agreement with the analytic interval is checked in
    // Core.Tests RateUncertaintyTests); here the screen must show exactly those numbers, with its progress at the end.
    [Fact]
    public void Run_ShowsProgressThenEveryAnswerWithMedianAndInterval()
    {
        using var ctx = new BunitContext();
        var cut = Render(ctx, Network(2.0));
        cut.Find("[data-testid=mc-run]").Click();
        cut.WaitForAssertion(() => Assert.NotEmpty(cut.FindAll("[data-testid=mc-table]")), TimeSpan.FromSeconds(120));

        Assert.Contains("1,000 of 1,000 samples", cut.Find("[data-testid=mc-progress]").TextContent);
        var expected = Microkinetics.Sample(Network(2.0), Conditions, Question, new MonteCarloOptions(Samples: 1000));
        var rows = cut.FindAll("[data-testid=mc-table] tbody tr").Select(tr => tr.Children.Select(td => td.TextContent.Trim()).ToArray()).ToArray();
        Assert.Equal(4, rows.Length); // 50 %, 95 %, conversion at 1 h, yield of P; no ratio with one product
        Assert.Equal(["time to 50 % conversion", "25 min"], rows[0][..2]);
        Assert.Equal(["time to 95 % conversion", "1.8 h"], rows[1][..2]); // 6447 s, in hours past 1 h like every other table
        var t50 = expected.ConversionTimes[0];
        Assert.Equal(Microkinetics.Format.Duration(t50.Median), rows[0][2]);
        Assert.Equal($"{Microkinetics.Format.Duration(t50.Lower)} to {Microkinetics.Format.Duration(t50.Upper)}", rows[0][3]);
        Assert.Equal($"{Microkinetics.Format.Percent(expected.FinalYields[0].Lower)} to {Microkinetics.Format.Percent(expected.FinalYields[0].Upper)}", rows[3][3]);
        Assert.Equal(expected.Sentence, cut.Find("[data-testid=mc-answer]").TextContent.Trim());
        Assert.Contains("random key 2026", cut.Find("caption").TextContent);
    }

    // A run of 3000 s ends before the nominal 95 % conversion (6447 s, above): the screen says "not reached" and counts the samples.
    [Fact]
    public void AnswerBeyondTheRun_IsShownAsNotReached()
    {
        using var ctx = new BunitContext();
        var cut = Render(ctx, Network(2.0), Conditions with { EndTimeSeconds = 3000, ReportTimesSeconds = [1000.0] });
        cut.Find("[data-testid=mc-samples]").Change("200");
        cut.Find("[data-testid=mc-run]").Click();
        cut.WaitForAssertion(() => Assert.NotEmpty(cut.FindAll("[data-testid=mc-table]")), TimeSpan.FromSeconds(60));
        var row = cut.FindAll("[data-testid=mc-table] tbody tr")[1].Children.Select(td => td.TextContent.Trim()).ToArray();
        Assert.Equal("not reached", row[1]);
        Assert.Matches(@"to not reached \([\d,]+ samples not within the run\)$", row[3]);
    }

    [Fact]
    public void NoUncertaintySet_SaysSoAndOffersNoRun()
    {
        using var ctx = new BunitContext();
        var cut = Render(ctx, Network(0.0));
        Assert.StartsWith(UncertainValue.NotSet, cut.Find("[data-testid=mc-none]").TextContent.Trim());
        Assert.Empty(cut.FindAll("[data-testid=mc-run]"));
    }

    [Fact]
    public void TooFewSamples_AreRefusedInWords()
    {
        using var ctx = new BunitContext();
        var cut = Render(ctx, Network(2.0));
        cut.Find("[data-testid=mc-samples]").Change("10");
        cut.Find("[data-testid=mc-run]").Click();
        Assert.Equal("Choose between 100 and 20,000 samples.", cut.Find("[role=alert]").TextContent.Trim());
        Assert.Empty(cut.FindAll("[data-testid=mc-table]"));
    }

    [Fact]
    public void Stop_EndsTheRunWithoutAnInterval()
    {
        using var ctx = new BunitContext();
        var cut = Render(ctx, Network(2.0));
        cut.Find("[data-testid=mc-samples]").Change("20000");
        cut.Find("[data-testid=mc-run]").Click();
        cut.Find("[data-testid=mc-stop]").Click();
        cut.WaitForAssertion(() => Assert.Contains("stopped; no interval shown", cut.Find("[data-testid=mc-progress]").TextContent), TimeSpan.FromSeconds(60));
        Assert.Empty(cut.FindAll("[data-testid=mc-table]"));
    }

    [Fact]
    public void NewConditions_ClearTheOldResult()
    {
        using var ctx = new BunitContext();
        var cut = Render(ctx, Network(2.0));
        cut.Find("[data-testid=mc-samples]").Change("100");
        cut.Find("[data-testid=mc-run]").Click();
        cut.WaitForAssertion(() => Assert.NotEmpty(cut.FindAll("[data-testid=mc-table]")), TimeSpan.FromSeconds(60));
        cut.Render(p => p.Add(c => c.Conditions, Conditions with { EndTimeSeconds = 2e6 }));
        Assert.Empty(cut.FindAll("[data-testid=mc-table]"));
    }
}
