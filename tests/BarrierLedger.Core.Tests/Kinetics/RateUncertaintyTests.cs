using BarrierLedger.Core.Kinetics;
using BarrierLedger.Core.Tests.Support;
using static BarrierLedger.Core.Tests.Kinetics.NetworkBuilder;

namespace BarrierLedger.Core.Tests.Kinetics;

public class RateUncertaintyTests
{
    // z for a central 95 % interval = 1.959964 (standard normal quantile, NIST/SEMATECH e-Handbook of Statistical Methods, §1.3.6.7.1).
    [Fact]
    public void Z_Of95Percent_IsTheNormalQuantile() =>
        Close.Absolute(1.959964, RateUncertainty.Z(0.95), 1e-6, "z(95 %)", "standard normal table");

    // Issue 22: ±1–3 kcal/mol is a factor of 5–150 in k at 298 K: e^{1/RT} = 5.41, e^{3/RT} = 158.13 (RT = 0.592485 kcal/mol, hand computed).
    [Fact]
    public void OneStandardDeviation_IsTheFactorTheIssueQuotes()
    {
        var oneSigma = 0.682689492; // P(|Z| < 1)
        Close.Relative(Math.Exp(1 / 0.592485), RateUncertainty.Factor(1.0, 298.15, oneSigma), 1e-6, "factor at σ = 1 kcal/mol", "e^{σ/RT}, hand computed");
        Close.Relative(158.13, RateUncertainty.Factor(3.0, 298.15, oneSigma), 1e-4, "factor at σ = 3 kcal/mol", "e^{3/RT}, hand computed (issue 22: about 150)");
        var k = RateUncertainty.RateConstant(1e-3, 2.0, 298.15);
        Close.Relative(1e-3 * Math.Exp(1.959964 * 2 / 0.592485), k.Upper, 1e-5, "upper k at σ = 2, 95 %", "e^{zσ/RT}, hand computed");
        var t = RateUncertainty.Time(Math.Log(2) / 1e-3, 2.0, 298.15);
        Close.Relative(Math.Log(2) / k.Upper, t.Lower, 1e-12, "shortest t½", "t½ = ln 2/k");
        Assert.False(RateUncertainty.RateConstant(1.0, 0.0, 298.15).IsSet);
    }

    // Monte Carlo of one step equals the analytic interval within sampling error. For N = 2000 samples of a normal quantity with
    // standard deviation s (here s = σ/RT in ln t), the standard error of the 2.5 % quantile is √(p(1 − p)/N)/φ(z_p) · s = 0.0598 s and of the
    // median √(π/(2N)) · s = 0.028 s (asymptotic variance of a sample quantile, e.g. Stuart & Ord, Kendall's Advanced Theory of Statistics,
    // from memory). Tolerances are four standard errors.
    [Fact]
    public void MonteCarloOfOneStep_EqualsTheAnalyticIntervalWithinSamplingError()
    {
        var network = new ReactionNetwork(["S", "P"], [Eyring("S→P", "S", "P", "S", "TS", "P")],
            [Level("S", 0, sigma: 2.0), Level("TS", 22, sigma: 2.0), Level("P", -20, sigma: 2.0)]);
        var conditions = At(Room, 1e9, null, ("S", 0.1));
        var question = new KineticsQuestion("S", ["P"], [0.5]);
        var mc = Microkinetics.Sample(network, conditions, question, new MonteCarloOptions(Samples: 2000, RandomKey: 7));
        var k = Microkinetics.Simulate(network, conditions).RateConstantsAtStart[0].Forward;
        var analytic = RateUncertainty.Time(Math.Log(2) / k, 2.0, Room);
        var s = 2.0 / RtKcal(Room);
        var t = mc.ConversionTimes[0];
        Assert.Equal(0, mc.Failed);
        Close.Absolute(Math.Log(analytic.Value), Math.Log(t.Median), 4 * 0.028 * s, "ln median t½", "analytic ln(ln 2/k)");
        Close.Absolute(Math.Log(analytic.Lower), Math.Log(t.Lower), 4 * 0.0598 * s, "ln lower t½ (2.5 %)", "analytic interval e^{−zσ/RT}");
        Close.Absolute(Math.Log(analytic.Upper), Math.Log(t.Upper), 4 * 0.0598 * s, "ln upper t½ (97.5 %)", "analytic interval e^{zσ/RT}");
        var kInterval = RateUncertainty.RateConstant(k, 2.0, Room);
        Close.Absolute(Math.Log(kInterval.Upper), Math.Log(mc.ForwardRateConstants[0].Upper), 4 * 0.0598 * s, "ln upper k", "analytic interval");
    }

    [Fact]
    public void MonteCarlo_IsReproducibleWhateverTheThreadCount()
    {
        var network = new ReactionNetwork(["S", "I", "P"], [Eyring("1", "S", "I", "S", "T1", "I"), Eyring("2", "I", "P", "I", "T2", "P")],
            [Level("S", 0, sigma: 1.5), Level("T1", 20, sigma: 1.5), Level("I", 2, sigma: 1.5), Level("T2", 21, sigma: 1.5), Level("P", -10, sigma: 1.5)]);
        var conditions = At(Room, 1e6, [3600], ("S", 0.1));
        var question = new KineticsQuestion("S", ["P"]);
        var one = Microkinetics.Sample(network, conditions, question, new MonteCarloOptions(Samples: 200, RandomKey: 11, MaxParallelism: 1));
        var two = Microkinetics.Sample(network, conditions, question, new MonteCarloOptions(Samples: 200, RandomKey: 11, MaxParallelism: 2));
        var other = Microkinetics.Sample(network, conditions, question, new MonteCarloOptions(Samples: 200, RandomKey: 12, MaxParallelism: 2));
        Assert.Equal(one.ConversionTimes.ToArray(), two.ConversionTimes.ToArray());
        Assert.Equal(one.FinalYields.ToArray(), two.FinalYields.ToArray());
        Assert.NotEqual(one.ConversionTimes[1].Median, other.ConversionTimes[1].Median);
        Assert.Contains(one.Notes, n => n.Contains("at least 1,000"));
    }

    [Fact]
    public void MonteCarlo_WithoutUncertainty_SaysSo()
    {
        var network = new ReactionNetwork(["S", "P"], [Eyring("S→P", "S", "P", "S", "TS", "P")], [Level("S", 0), Level("TS", 20), Level("P", -5)]);
        var mc = Microkinetics.Sample(network, At(Room, 1e4, null, ("S", 0.1)), new KineticsQuestion("S", ["P"]));
        Assert.False(mc.UncertaintySet);
        Assert.Equal(0, mc.Samples);
        Assert.Contains("No uncertainty set", mc.Sentence);
    }
}
