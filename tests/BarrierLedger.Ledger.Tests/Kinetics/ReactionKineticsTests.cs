using BarrierLedger.Demo;
using BarrierLedger.Core.Kinetics;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Export;
using BarrierLedger.Ledger.Kinetics;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Tests.Export;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Tests.Kinetics;

public class ReactionKineticsTests
{
    // The demo's catalysed pathway IX (chloromethane + fluoride + iodide → TS1 → iodomethane + chloride + fluoride → TS2 → fluoromethane +
    // chloride + iodide) under the demo study's protocol: the network is built from the stored steps, its rate constants at the model
    // temperature are the stored ones (one derivation, read not redone), and the simulation conserves iodine (iodide + iodomethane) and
    // carbon (the three methyl compounds), a conservation law of the chemistry independent of the integrator.
    [Fact]
    public async Task CatalysedPathway_BuildsFromStoredSteps_AndSimulatesWithConservation()
    {
        var (ledger, studyId) = await DemoLedger.CreateAsync();
        await using var _ = ledger;
        var models = ledger.Get<EnergyModelService>();
        var settings = (await models.GetForStudyAsync(studyId)).Settings with { EnergyLevel = DemoScenario.SinglePointLevel, ThermalLevel = DemoScenario.GeometryLevel };
        Assert.True((await models.SaveStudyOverrideAsync(studyId, settings, 0, "demo-user")).Saved);
        await ledger.Get<RecomputeService>().WhenIdleAsync();
        int reactionId;
        await using (var db = await ledger.DbAsync())
            reactionId = await db.Reactions.Where(r => r.StudyId == studyId && r.Label == "IX").Select(r => r.Id).SingleAsync();
        var detail = (await ledger.Get<ReactionQueryService>().GetReactionAsync(reactionId))!;

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
}
