using BarrierLedger.Core.Checks;
using BarrierLedger.Demo;
using BarrierLedger.Core.Kinetics;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Export;
using BarrierLedger.Ledger.Kinetics;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Tests.Export;
using BarrierLedger.Ledger.Tests.Support;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Tests.Kinetics;

public class ReactionKineticsTests
{
    // The demo study under its protocol (single points on the optimised geometries), and its reaction IX as the reaction page reads it.
    private static async Task<(TempLedger Ledger, ModelSettings Settings, ReactionDetail Detail)> DemoPathwayAsync()
    {
        var (ledger, studyId) = await DemoLedger.CreateAsync();
        var models = ledger.Get<EnergyModelService>();
        // The demo bundle gives the study its own model (study.energy_model): save over the version it has.
        var current = await models.GetForStudyAsync(studyId);
        var settings = current.Settings with { EnergyLevel = DemoScenario.SinglePointLevel, ThermalLevel = DemoScenario.GeometryLevel };
        Assert.True((await models.SaveStudyOverrideAsync(studyId, settings, current.IsOverride ? current.Version : 0, "demo-user")).Saved);
        await ledger.Get<RecomputeService>().WhenIdleAsync();
        int reactionId;
        await using (var db = await ledger.DbAsync())
            reactionId = await db.Reactions.Where(r => r.StudyId == studyId && r.Label == "IX").Select(r => r.Id).SingleAsync();
        return (ledger, settings, (await ledger.Get<ReactionQueryService>().GetReactionAsync(reactionId))!);
    }

    // The demo's catalysed pathway IX (chloromethane + fluoride + iodide → TS1 → iodomethane + chloride + fluoride → TS2 → fluoromethane +
    // chloride + iodide) under the demo study's protocol: the network is built from the stored steps, its rate constants at the model
    // temperature are the stored ones (one derivation, read not redone), and the simulation conserves iodine (iodide + iodomethane) and
    // carbon (the three methyl compounds), a conservation law of the chemistry independent of the integrator.
    [Fact]
    public async Task CatalysedPathway_BuildsFromStoredSteps_AndSimulatesWithConservation()
    {
        var (ledger, settings, detail) = await DemoPathwayAsync();
        await using var _ = ledger;

        var model = ReactionKinetics.Build(detail);
        Assert.True(model.CanSimulate, string.Join("; ", model.Problems));
        Assert.Equal(["iodide"], model.Catalysts);
        Assert.Equal("chloromethane", model.Substrate);
        Assert.Contains("fluoromethane", model.Products);
        Assert.Equal(2, model.Network.Steps.Count);
        Assert.Equal(2, model.Network.Steps[0].ForwardOrder);
        Assert.Equal(0.005, model.StartingMolPerL["iodide"], 12);

        var conditions = new SimulationConditions(model.StartingMolPerL, TemperatureProgram.Isothermal(settings.TemperatureKelvin), 7 * 86400.0, [3600.0, 86400.0]);
        var result = Microkinetics.Simulate(model.Network, conditions, new KineticsQuestion("chloromethane", ["fluoromethane"]));
        for (var i = 0; i < model.Network.Steps.Count; i++)
            if (model.StoredRateConstants[i] is { } k && !result.RateConstantsAtStart[i].BarrierRaised)
                Assert.Equal(1.0, result.RateConstantsAtStart[i].Forward / k, 9);
        Assert.True(result.Outcome.Completed, result.Outcome.FailureReason);
        var iodide = result.IndexOf("iodide");
        var iodomethane = result.IndexOf("iodomethane");
        var methyls = new[] { result.IndexOf("chloromethane"), iodomethane, result.IndexOf("fluoromethane") };
        foreach (var p in result.Curve)
        {
            Assert.Equal(0.005, p.MolPerL[iodide] + p.MolPerL[iodomethane], 9);
            Assert.Equal(0.1, methyls.Sum(i => p.MolPerL[i]), 9);
        }
        Assert.False(string.IsNullOrWhiteSpace(result.Answers!.Sentence));
        Assert.Contains("chloromethane", result.Answers.Sentence);
    }

    // The demo's IX proposes a run at 80 °C for 24 h (its definition's kinetics; at 298 K it converts well under 1 % in a day and the
    // curve is flat). At those conditions the curve must show the pathway happening: most of the chloromethane is gone in 24 h.
    [Fact]
    public async Task CatalysedPathway_DeclaresWarmConditions_UnderWhichTheCurveShowsConversion()
    {
        var (ledger, settings, detail) = await DemoPathwayAsync();
        await using var _ = ledger;
        Assert.Equal((353.15, 24.0), (detail.Kinetics!.TemperatureKelvin, detail.Kinetics.TimeHours));

        var model = ReactionKinetics.Build(detail);
        Assert.True(model.CanSimulate, string.Join("; ", model.Problems));
        var question = new KineticsQuestion("chloromethane", ["fluoromethane"]);
        double Conversion(double kelvin)
        {
            var run = Microkinetics.Simulate(model.Network, new SimulationConditions(model.StartingMolPerL, TemperatureProgram.Isothermal(kelvin), 86400.0, [86400.0]), question);
            return run.Answers!.AtReportTimes[0].Conversion;
        }
        var (cold, warm) = (Conversion(detail.Model.Settings.TemperatureKelvin), Conversion(353.15));
        Assert.True(cold < 0.01, $"at the model temperature: {cold:P2}");
        Assert.True(warm > 0.5, $"at 353.15 K: {warm:P2}");
    }

    // One route to rate constants: for every step of every demo reaction, the forward k the kinetics panel shows (the rate table of a
    // simulation started at the model temperature) is the k the reaction page shows (the derivation's stored k), to 9 digits. The
    // stored k is Eyring's equation as Core's derivation computed it (checked there against CODATA 2018 and Eyring, J. Chem. Phys.
    // 3, 107 (1935)); no reaction is refused for a k that differs.
    [Fact]
    public async Task EveryDemoStep_PanelRateConstantIsTheReactionPagesRateConstant()
    {
        var (ledger, settings, _) = await DemoPathwayAsync();
        await using var __ = ledger;
        List<int> ids;
        await using (var db = await ledger.DbAsync())
            ids = await db.Reactions.Where(r => !r.Retired).Select(r => r.Id).ToListAsync();
        var compared = 0;
        foreach (var id in ids)
        {
            var detail = (await ledger.Get<ReactionQueryService>().GetReactionAsync(id))!;
            var model = ReactionKinetics.Build(detail);
            Assert.False(model.Problems.Any(p => p.Contains("differs from the derivation", StringComparison.Ordinal)), string.Join("; ", model.Problems));
            if (detail.Label == "EL")
            {
                // EL's saddle point lies below its product (ΔG‡ 2.9 < ΔG_r 8.0 kcal/mol in the demo): refused, not simulated with a raised barrier.
                Assert.Contains(model.Problems, p => p.StartsWith("Step fluoroethane → ethylene + hydrogen fluoride: its saddle point lies below the minimum after it", StringComparison.Ordinal));
                continue;
            }
            if (!model.CanSimulate) continue;
            var start = model.StartingMolPerL.Count > 0 ? model.StartingMolPerL : model.Network.Species.ToDictionary(x => x, _ => 0.1);
            var run = Microkinetics.Simulate(model.Network, new SimulationConditions(start, TemperatureProgram.Isothermal(settings.TemperatureKelvin), 1.0, [1.0]));
            var stored = detail.Steps.OrderBy(x => x.SaddlePosition).ToList();
            Assert.Equal(stored.Count, run.RateConstantsAtStart.Count);
            for (var i = 0; i < stored.Count; i++)
            {
                Assert.NotNull(stored[i].RateConstant);
                Assert.Equal(1.0, run.RateConstantsAtStart[i].Forward / stored[i].RateConstant!.Value, 9);
                compared++;
            }
        }
        Assert.True(compared >= 5, $"only {compared} demo steps compared");
    }

    // A step the derivation gave no rate constant (here: its saddle point below the minimum before it, ΔG‡ < 0) is refused by the
    // panel with the derivation's own sentence, not simulated with a raised barrier (Eyring's k needs ΔG‡ ≥ 0; J. Chem. Phys. 3, 107 (1935)).
    [Fact]
    public async Task StepTheDerivationRefused_IsRefusedWithTheDerivationsReason()
    {
        var (ledger, _, detail) = await DemoPathwayAsync();
        await using var _ = ledger;
        var first = detail.Steps.OrderBy(x => x.SaddlePosition).First();
        var from = detail.States.Single(s => s.Position == first.SaddlePosition - 1);
        var saddle = detail.States.Single(s => s.Position == first.SaddlePosition);
        var reason = new CheckReason(BarrierLedger.Core.Pathways.PathwayEnergyCodes.NegativeBarrier, CheckSeverity.Failure,
            $"Step {from.Label} → {saddle.Label}: the saddle point lies 1.2 kcal/mol below the minimum before it under this energy model.");
        var refused = detail with
        {
            Steps = [.. detail.Steps.Select(x => x == first ? x with { RateConstant = null, HalfLifeSeconds = null } : x)],
            ConsistencyReasons = [.. detail.ConsistencyReasons, reason],
        };

        var model = ReactionKinetics.Build(refused);
        Assert.False(model.CanSimulate);
        var problem = Assert.Single(model.Problems, p => p.Contains(reason.Message, StringComparison.Ordinal));
        Assert.StartsWith($"Step {from.Label} → ", problem);
        Assert.True(ReactionKinetics.Build(detail).CanSimulate);
    }
}
