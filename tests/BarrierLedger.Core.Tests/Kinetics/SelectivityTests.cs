using BarrierLedger.Core.Kinetics;
using BarrierLedger.Core.Tests.ReferenceData;
using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Units;
using static BarrierLedger.Core.Tests.Kinetics.NetworkBuilder;

namespace BarrierLedger.Core.Tests.Kinetics;

// Curtin–Hammett / kinetic control: J. I. Seeman, Chem. Rev. 1983, 83, 83. Parallel first-order reactions give [P₁]/[P₂] = k₁/k₂ at
// all times (Atkins & de Paula, parallel reactions; Steinfeld, Francisco & Hase ch. 2).
public class SelectivityTests
{
    private static CompetingChannel Ch(string label, double kcal, double sigma = 0) => new(label, Energy.FromKcalPerMol(kcal), UncertaintyKcalPerMol: sigma);

    [Fact]
    public void TwoChannelsFromOneState_RatioAgreesWithTheMicrokineticModel()
    {
        var network = new ReactionNetwork(["A", "P1", "P2"],
            [Eyring("1", "A", "P1", "A", "TS1", "P1"), Eyring("2", "A", "P2", "A", "TS2", "P2")],
            [Level("A", 0), Level("TS1", 18.0), Level("TS2", 19.5), Level("P1", -30), Level("P2", -31)]);
        var sim = Microkinetics.Simulate(network, At(Room, 1e5, null, ("A", 0.1)), options: Tight);
        var micro = sim.Final.MolPerL[1] / sim.Final.MolPerL[2];
        var sel = Selectivity.Compute([Ch("P1", 18.0), Ch("P2", 19.5)], Room);
        Close.Relative(Math.Exp(1.5 / RtKcal(Room)), sel.Ratio.Value, 1e-12, "ratio from ΔΔG‡ = 1.5 kcal/mol", "exp(ΔΔG‡/RT)");
        Close.Relative(sel.Ratio.Value, micro, 1e-6, "[P1]/[P2] of the simulation", "kinetic control: parallel first-order reactions");
        Assert.Equal("P1", sel.Major.Label);
        Close.Absolute(1.0, sel.Shares.Sum(s => s.Fraction), 1e-14, "Σ shares", "normalisation");
        Assert.Contains("Curtin–Hammett", sel.Conditions);
    }

    // Curtin–Hammett proper: conformers A ⇌ A′ (A′ 0.8 kcal/mol above A, 5 kcal/mol barrier) react through TS1 (from A, 18.0) and TS2 (from A′,
    // 18.9 on the same zero). Fast interconversion: the product ratio is exp((18.9 − 18.0)/RT) whatever the conformer populations (Seeman 1983).
    // Products lie 30 kcal/mol below A so that they do not convert back within the run (kinetic control).
    // Slow interconversion (27 kcal/mol barrier): each conformer's own product forms from the population it started with, and the
    // ratio is no longer the ΔΔG‡ one — the stated conditions matter.
    [Fact]
    public void Conformers_FastInterconversion_FollowTheSaddlePointsOnly()
    {
        ReactionNetwork Net(double interconversion) => new(["A", "A'", "P1", "P2"],
            [Eyring("conf", "A", "A'", "A", "TSc", "A'"), Eyring("1", "A", "P1", "A", "TS1", "P1"), Eyring("2", "A'", "P2", "A'", "TS2", "P2")],
            [Level("A", 0), Level("A'", 0.8), Level("TSc", interconversion), Level("TS1", 18.0), Level("TS2", 18.9), Level("P1", -30), Level("P2", -30)]);
        var sel = Selectivity.Compute([Ch("P1", 18.0), Ch("P2", 18.9)], Room);
        var fast = Microkinetics.Simulate(Net(5.0), At(Room, 1e4, null, ("A", 0.1)), options: Tight).Final.MolPerL;
        Close.Relative(sel.Ratio.Value, fast[2] / fast[3], 1e-6, "[P1]/[P2] with fast interconversion", "Curtin–Hammett (Seeman 1983)");
        var slow = Microkinetics.Simulate(Net(27.0), At(Room, 1e7, null, ("A", 0.1)), options: Tight).Final.MolPerL;
        Assert.True(slow[2] / slow[3] > 10 * sel.Ratio.Value, $"slow interconversion: ratio {slow[2] / slow[3]:G3}, Curtin–Hammett {sel.Ratio.Value:G3}");
    }

    // ΔΔG‡ = 1.364 kcal/mol gives 10 : 1 at 298 K (RT ln 10, KineticsReference, from memory), so ee = 9/11 = 81.8 %.
    [Fact]
    public void EnantiomericChannels_GiveEe()
    {
        var sel = Selectivity.Compute([Ch("(R)", 15.0, 1.0), Ch("(S)", 15.0 + KineticsReference.TenToOneKcalPerMol, 1.0)], 298.15, enantiomeric: true);
        Close.Relative(10.0, sel.Ratio.Value, 2e-3, "ratio", "RT ln 10 = 1.364 kcal/mol (from memory)");
        Close.Absolute(9.0 / 11.0, sel.EnantiomericExcess!.Value, 2e-4, "ee", "(r − 1)/(r + 1)");
        // σ(ΔΔG‡) = √((1² + 1²)/2) = 1 kcal/mol: the 95 % ratio interval is 10 × e^{±1.96/RT}; ee bounds follow the ratio bounds.
        var f = Math.Exp(1.959964 / RtKcal(298.15));
        Close.Relative(10.0 / f, sel.Ratio.Lower, 2e-3, "lower ratio", "z = 1.959964 (standard normal table)");
        Close.Relative((10.0 * f - 1) / (10.0 * f + 1), sel.EnantiomericExcess.Upper, 1e-4, "upper ee", "(r − 1)/(r + 1) of the upper ratio");
        Assert.Contains("ee", sel.Sentence);
    }

    [Fact]
    public void BadChannels_AreRejected()
    {
        Assert.Throws<ArgumentException>(() => Selectivity.Compute([Ch("only", 1)], 298.15));
        Assert.Throws<ArgumentException>(() => Selectivity.Compute([Ch("a", 1), Ch("b", 2), Ch("c", 3)], 298.15, enantiomeric: true));
    }
}
