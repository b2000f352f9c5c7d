using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Core.Units;
using static BarrierLedger.Core.Tests.Pathways.PathwayExamples;

namespace BarrierLedger.Core.Tests.Pathways;

public class BarrierConsistencyTests
{
    [Fact]
    public void BalancedPathwayAtOneLevel_Passes()
    {
        var r = BarrierConsistency.Check(Cycloaddition());
        Assert.True(r.Verdict == Verdict.Passed, r.Report());
        Assert.Empty(r.Reasons);
    }

    [Fact]
    public void OneSpeciesAtAnotherLevel_IsReported_NeverDropped()
    {
        var ts = Species("TS1", "C6H10", -234.10, LevelOfTheory.Parse("B3LYP/6-31G*"));
        var r = BarrierConsistency.Check(Cycloaddition(ts));
        Assert.Equal(Verdict.Failed, r.Verdict);
        var reason = Assert.Single(r.Reasons);
        Assert.Equal(ConsistencyCodes.MixedElectronicLevels, reason.Code);
        Assert.Contains("B3LYP/6-31G* for TS1", reason.Message);
        Assert.Contains("wB97X-D/def2-TZVP for diene, ene, adduct", reason.Message);
    }

    [Fact]
    public void UnbalancedState_NamesTheMissingAtoms()
    {
        var p = Cycloaddition();
        var water = Species("water", "H2O", -76.4);
        var withWater = p with { States = [p.States[0], p.States[1], p.States[2] with { Terms = [.. p.States[2].Terms, new(water)] }] };
        var r = BarrierConsistency.Check(withWater);
        Assert.Equal(Verdict.Failed, r.Verdict);
        var f = Assert.Single(r.Reasons, x => x.Code == ConsistencyCodes.FormulaDiffers);
        Assert.Contains("C6H12O", f.Message);
        Assert.Contains("+H2 +O", f.Message);
        Assert.Contains(r.Reasons, x => x.Code == ConsistencyCodes.ElectronsDiffer && x.Message.Contains("56 electrons")); // 46 + 10
    }

    [Fact]
    public void ChargeImbalance_IsAFailure()
    {
        var ts = new SpeciesRecord("TS1", BarrierLedger.Core.Geometry.Formula.Parse("C6H10"), 1, 2, Energy.FromHartree(-234.0), Level);
        var r = BarrierConsistency.Check(Cycloaddition(ts));
        Assert.Contains(r.Reasons, x => x.Code == ConsistencyCodes.ChargeDiffers);
        Assert.Contains(r.Reasons, x => x.Code == ConsistencyCodes.ElectronsDiffer);
    }

    [Fact]
    public void TwoDoubletsToASinglet_IsNamedButAllowed_SingletToTriplet_NeedsAttention()
    {
        // Angular-momentum addition: two S = ½ parts couple to S = 0 or 1 (multiplicity 1 or 3), so a singlet is reachable.
        var a = Species("R1", "C3H7", -118.0, multiplicity: 2);
        var b = Species("R2", "C3H3", -115.0, multiplicity: 2);
        var ts = Species("TS", "C6H10", -233.0, multiplicity: 1);
        var tri = Species("T", "C6H10", -233.1, multiplicity: 3);
        var singlet = Species("S", "C6H10", -233.2, multiplicity: 1);
        var path = new Pathway("radical", [
            new("R1 + R2", StateKind.Minimum, [new(a), new(b)]),
            new("TS", StateKind.SaddlePoint, [new(ts)]),
            new("S", StateKind.Minimum, [new(singlet)]),
            new("T", StateKind.Minimum, [new(tri)]),
        ]);
        var r = BarrierConsistency.Check(path);
        var spin = r.Reasons.Where(x => x.Code == ConsistencyCodes.SpinChange).ToList();
        Assert.Equal(2, spin.Count);
        Assert.Equal(CheckSeverity.Info, spin.Single(x => x.Message.Contains("'R1 + R2'")).Severity);
        Assert.Equal(CheckSeverity.Attention, spin.Single(x => x.Message.Contains("to 'T'")).Severity);
        Assert.Equal(Verdict.NeedsAttention, r.Verdict);
    }

    [Fact]
    public void MixedThermalLevelsAndTemperatures_AreFailures_MissingThermalIsNamed()
    {
        ThermalCorrection T(LevelOfTheory l, double k) => new(Energy.FromHartree(0.1), Energy.FromHartree(0.11), Energy.FromHartree(0.07), l, k);
        var diene = Species("diene", "C4H6", -155.90, thermal: T(FreqLevel, 298.15));
        var ene = Species("ene", "C2H4", -78.55, thermal: T(LevelOfTheory.Parse("B3LYP/6-31G*"), 298.15));
        var ts = Species("TS1", "C6H10", -234.42, thermal: T(FreqLevel, 373.15));
        var adduct = Species("adduct", "C6H10", -234.52);
        var path = new Pathway("p", [
            new("diene + ene", StateKind.Minimum, [new(diene), new(ene)]),
            new("TS1", StateKind.SaddlePoint, [new(ts)]),
            new("adduct", StateKind.Minimum, [new(adduct)]),
        ]);
        var r = BarrierConsistency.Check(path);
        Assert.Equal(Verdict.Failed, r.Verdict);
        Assert.Contains(r.Reasons, x => x.Code == ConsistencyCodes.MixedThermalLevels);
        Assert.Contains(r.Reasons, x => x.Code == ConsistencyCodes.MixedThermalTemperatures && x.Message.Contains("373.15 K for TS1"));
        Assert.Contains(r.Reasons, x => x.Code == ConsistencyCodes.MissingThermal && x.Message.StartsWith("adduct has"));
    }
}
