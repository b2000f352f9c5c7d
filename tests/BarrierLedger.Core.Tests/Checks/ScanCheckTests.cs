using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Scans;
using BarrierLedger.Core.Tests.Scans;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Tests.Checks;

public class ScanCheckTests
{
    [Fact]
    public void StepAndNonConvergedPoint_NeedAttention_WithTheFlagCodes()
    {
        var points = ScanAnalysisTests.StepProfile().Select(p => new ScanPoint(p.X, Energy.FromKcalPerMol(p.Kcal).Hartree, p.Converged)).ToList();
        var r = ScanCheck.Run(ScanAnalysis.Analyze(points, null));
        Assert.Equal(Verdict.NeedsAttention, r.Verdict);
        Assert.Equal(2, r.Reasons.Count(x => x.Code == ScanFlagCodes.Jump));
        Assert.Single(r.Reasons, x => x.Code == ScanFlagCodes.NotConverged);
    }

    [Fact]
    public void SmoothSingleBarrier_Passes_AndStatesTheMaximum()
    {
        // E = 10 sin(πx/2) kcal/mol on [0, 2]: maximum at x = 1 with 10 kcal/mol above the first point (closed form).
        var points = Enumerable.Range(0, 21).Select(i => 0.1 * i).Select(x => new ScanPoint(x, Energy.FromKcalPerMol(10 * Math.Sin(Math.PI * x / 2)).Hartree)).ToList();
        var r = ScanCheck.Run(ScanAnalysis.Analyze(points, null));
        Assert.True(r.Verdict == Verdict.Passed, r.Report());
        var info = Assert.Single(r.Reasons);
        Assert.Equal(ScanCheckCodes.Maximum, info.Code);
        Assert.Contains("1.000 Å", info.Message);
        Assert.Contains("10.00 kcal/mol above the first point", info.Message);
    }

    [Fact]
    public void SingleConvergedPoint_Fails()
    {
        var r = ScanCheck.Run(ScanAnalysis.Analyze([new ScanPoint(1.0, 0), new ScanPoint(1.1, 0.01, false)], null));
        Assert.Equal(Verdict.Failed, r.Verdict);
    }
}
