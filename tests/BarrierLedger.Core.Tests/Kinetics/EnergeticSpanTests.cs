using BarrierLedger.Core.Kinetics;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Tests.Kinetics;

// Energetic-span model: S. Kozuch and S. Shaik, Acc. Chem. Res. 2011, 44, 101.
public class EnergeticSpanTests
{
    private static CycleState I(string label, double kcal) => new(label, Energy.FromKcalPerMol(kcal), StateKind.Minimum);
    private static CycleState T(string label, double kcal) => new(label, Energy.FromKcalPerMol(kcal), StateKind.SaddlePoint);

    // Hand derivation (kcal/mol, 298.15 K, RT = 0.592485): cycle I1 0 → T1 15 → I2 −5 → T2 12 → (I1 − 20), ΔG_r = −20.
    // Spans: T1/I1 (T after I) 15; T1/I2 (T before I) 15 + 5 − 20 = 0; T2/I1 (after) 12; T2/I2 (after) 12 + 5 = 17.
    // Largest: δE = 17, TDTS = T2, TDI = I2, T2 after I2.
    // TOF = (k_BT/h)(e^{20/RT} − 1)/(e^{35/RT} + e^{20/RT} + e^{32/RT} + e^{37/RT})
    //     = 6.21244e12 × e^{−17/RT} / (1 + e^{−2/RT} + e^{−5/RT} + e^{−17/RT}) × (1 − e^{−20/RT})
    //     = 2.14870 / 1.034418 = 2.0772 s⁻¹; approximation (k_BT/h) e^{−17/RT} = 2.1487 s⁻¹.
    // X_TOF(T2) = (1 + e^{−5/RT}) / 1.034418 = 0.96694; X_TOF(I2) = (1 + e^{−17/RT}) / 1.034418 = 0.96673.
    [Fact]
    public void HandDerivedCycle_TdtsAfterTdi()
    {
        var r = EnergeticSpan.Analyze([I("I1", 0), T("T1", 15), I("I2", -5), T("T2", 12)], Energy.FromKcalPerMol(-20), 298.15);
        Assert.Equal("T2", r.Tdts.Label);
        Assert.Equal("I2", r.Tdi.Label);
        Assert.True(r.TdtsAfterTdi);
        Close.Absolute(17.0, r.EnergeticSpanEnergy.KcalPerMol, 1e-10, "δE", "hand derivation, Kozuch & Shaik 2011");
        Close.Relative(2.0772, r.TurnoverFrequencyPerSecond, 1e-4, "TOF", "hand derivation, Kozuch & Shaik 2011");
        Close.Relative(2.1487, r.ApproximateTurnoverFrequencyPerSecond, 1e-4, "TOF ≈ (k_BT/h)e^{−δE/RT}", "Kozuch & Shaik 2011");
        Close.Absolute(0.96694, r.TransitionStateControl.Single(c => c.State.Label == "T2").Degree, 1e-5, "X_TOF(T2)", "hand derivation");
        Close.Absolute(0.96673, r.IntermediateControl.Single(c => c.State.Label == "I2").Degree, 1e-5, "X_TOF(I2)", "hand derivation");
        Close.Absolute(1.0, r.TransitionStateControl.Sum(c => c.Degree), 1e-12, "Σ X_TOF over TSs", "Kozuch & Shaik 2011");
        Assert.Empty(r.Notes);
    }

    // The energetic-span TOF is the exact steady-state turnover of the cycle (Kozuch and Shaik derived it from Christiansen's
    // steady-state formula, J. Am. Chem. Soc. 2006, 128, 3355; for two intermediates TOF = (k₁k₂ − k₋₁k₋₂)/(k₁ + k₋₁ + k₂ + k₋₂),
    // J. A. Christiansen, Adv. Catal. 1953, 5, 311, from memory). The same hand-derived cycle as above, run as a microkinetic model
    // (I1 → I2 over T1, I2 → I1 over T2 with the cycle's −20 kcal/mol) until its steady state: the net flux through T2 per
    // catalyst must equal the energetic-span TOF of 2.0772 s⁻¹, and the hand-computed degrees of control must follow from
    // the steady-state populations.
    [Fact]
    public void HandDerivedCycle_TofEqualsTheSteadyStateOfTheMicrokineticModel()
    {
        var levels = new[]
        {
            new EnergyLevel("I1", Energy.FromKcalPerMol(0)), new EnergyLevel("T1", Energy.FromKcalPerMol(15)), new EnergyLevel("I2", Energy.FromKcalPerMol(-5)),
            new EnergyLevel("T2", Energy.FromKcalPerMol(12)), new EnergyLevel("I1'", Energy.FromKcalPerMol(-20)),
        };
        var network = new ReactionNetwork(["I1", "I2"],
        [
            new ElementaryStep("1", [new("I1")], [new("I2")], new EyringRates("I1", "T1", "I2")),
            new ElementaryStep("2", [new("I2")], [new("I1")], new EyringRates("I2", "T2", "I1'")),
        ], levels);
        var conditions = new SimulationConditions(new Dictionary<string, double> { ["I1"] = 1.0 }, TemperatureProgram.Isothermal(298.15), 100.0);
        var sim = Microkinetics.Simulate(network, conditions, options: new SimulationOptions(1e-11, 1e-16));
        var k = sim.RateConstantsAtStart;
        var (i1, i2) = (sim.Final.MolPerL[0], sim.Final.MolPerL[1]);
        var flux = k[1].Forward * i2 - k[1].Reverse * i1;
        var span = EnergeticSpan.Analyze([I("I1", 0), T("T1", 15), I("I2", -5), T("T2", 12)], Energy.FromKcalPerMol(-20), 298.15);
        Close.Relative(span.TurnoverFrequencyPerSecond, flux, 1e-8, "steady-state TOF of the simulation", "energetic span = Christiansen steady state");
        Close.Relative(2.0772, flux, 1e-4, "steady-state TOF", "hand derivation above");
        var christiansen = (k[0].Forward * k[1].Forward - k[0].Reverse * k[1].Reverse) / (k[0].Forward + k[0].Reverse + k[1].Forward + k[1].Reverse);
        Close.Relative(christiansen, flux, 1e-8, "steady-state TOF", "Christiansen 1953 (from memory)");
    }

    // Hand derivation: I1 0 → T1 20 → I2 −15 → T2 0 → (I1 − 10), ΔG_r = −10. Spans: T1/I1 20; T1/I2 (T before I) 20 + 15 − 10 = 25;
    // T2/I1 0; T2/I2 15. δE = 25 with TDTS = T1 before TDI = I2: the span wraps round into the next turnover and ΔG_r enters.
    [Fact]
    public void HandDerivedCycle_TdtsBeforeTdi_AddsReactionEnergy()
    {
        var r = EnergeticSpan.Analyze([I("I1", 0), T("T1", 20), I("I2", -15), T("T2", 0)], Energy.FromKcalPerMol(-10), 298.15);
        Assert.Equal("T1", r.Tdts.Label);
        Assert.Equal("I2", r.Tdi.Label);
        Assert.False(r.TdtsAfterTdi);
        Close.Absolute(25.0, r.EnergeticSpanEnergy.KcalPerMol, 1e-10, "δE", "hand derivation, Kozuch & Shaik 2011");
    }

    // One reversible step: TOF must equal the net Eyring rate k_f (1 − e^{ΔG_r/RT}) (microscopic reversibility).
    [Fact]
    public void SingleStep_EqualsNetEyringRate()
    {
        var r = EnergeticSpan.Analyze([I("A", 0), T("TS", 10)], Energy.FromKcalPerMol(-1), 298.15);
        var kf = Eyring.RateConstant(Energy.FromKcalPerMol(10), 298.15);
        var rt = PhysicalConstants.GasConstantJoulePerMoleKelvin * 298.15 / 4184.0;
        Close.Relative(kf * (1 - Math.Exp(-1 / rt)), r.TurnoverFrequencyPerSecond, 1e-12, "TOF of one step", "Eyring forward − backward");
    }

    [Fact]
    public void EndergonicCycle_IsFlagged()
    {
        var r = EnergeticSpan.Analyze([I("A", 0), T("TS", 10)], Energy.FromKcalPerMol(2), 298.15);
        Assert.True(r.TurnoverFrequencyPerSecond < 0);
        Assert.Contains(r.Notes, n => n.Contains("not exergonic"));
    }

    [Fact]
    public void CycleStartingWithATransitionState_IsRejected()
    {
        var ex = Assert.Throws<ArgumentException>(() => EnergeticSpan.Analyze([T("TS", 10), I("A", 0)], Energy.FromKcalPerMol(-5), 298.15));
        Assert.Contains("must start with the intermediate", ex.Message);
    }
}
