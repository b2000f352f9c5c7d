using BarrierLedger.Ledger.Storage;
using BarrierLedger.Demo;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Tests.Export;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;

namespace BarrierLedger.Ledger.Tests.Derivation;

/// <summary>
/// The committed demo study, stored through the upload workflow and derived under its stated protocol
/// (single-point energies, thermal corrections from the frequency calculations). The energies are invented;
/// what is checked is that the ledger combines them as a chemist would.
/// </summary>
public sealed class DemoImportTests
{
    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task DemoStudy_UnderItsProtocol_GivesSaneBarriers_AndFlagsOnlyTheMixedLevelReaction(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var files = DemoLedger.Files(DemoLedger.DemoFolder);
        var outcome = await ledger.Get<UploadService>().StoreAsync(files, new UploadChoices(), "member-1");
        Assert.True(outcome.Stored, string.Join("\n", outcome.Errors));
        var studyId = outcome.StudyId!.Value;

        // The protocol is the bundle's study.energy_model, which the upload set as the study's own model before deriving.
        var model = await ledger.Get<EnergyModelService>().GetForStudyAsync(studyId);
        Assert.True(model.IsOverride);
        Assert.Equal((DemoScenario.SinglePointLevel, DemoScenario.GeometryLevel), (model.Settings.EnergyLevel, model.Settings.ThermalLevel));
        await ledger.Get<RecomputeService>().WhenIdleAsync();

        var page = await ledger.Get<LedgerQueryService>().GetLedgerRowsAsync(studyId);
        var rows = page.Rows.ToDictionary(r => r.Label);
        Assert.Equal(8, rows.Count);
        // A two-step pathway whose spectator species (fluoride, iodide, chloride) must each keep their own energy:
        // before the fix the saddle point's energy was used for every species of its state (a barrier of −697 Eh).
        Assert.True(rows["IX"].Consistent, string.Join(" ", rows["IX"].ConsistencyReasons.Select(r => r.Message)));
        foreach (var label in new[] { "DA", "MT", "IX", "EL", "CB" })
        {
            var row = rows[label];
            Assert.True(row.Consistent, $"{label}: {string.Join(" ", row.ConsistencyReasons.Select(r => r.Message))}");
            var barrier = row.BarrierGibbs!.Value.KcalPerMol;
            // Molecular barriers of reactions that happen at all lie between 0 and ~60 kcal/mol (common practice, no source).
            Assert.InRange(barrier, 0.0, 60.0);
        }
        // KE mixes a geometry protocol on purpose (vinyl alcohol at another level): it must be marked, never silently used.
        Assert.False(rows["KE"].Consistent);
        Assert.NotEmpty(rows["KE"].ConsistencyReasons);

        // The demo IRCs reach the check through the upload: KE's connects both sides, EO's lands on vinyl alcohol (KE), not oxirane.
        foreach (var (label, connection, verdict) in new[] { ("KE", "BothSides", Core.Checks.Verdict.Passed), ("EO", "OneSide", Core.Checks.Verdict.Failed) })
        {
            var check = (await ledger.Get<ReactionQueryService>().GetReactionAsync(rows[label].ReactionId))!.SaddleChecks.Single();
            Assert.Equal(connection, check.Evidence!.Connection!.Connection);
            Assert.Equal(verdict, check.Verdict);
        }
    }
}
