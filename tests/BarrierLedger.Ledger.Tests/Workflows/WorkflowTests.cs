using BarrierLedger.Core.Pathways;
using BarrierLedger.Ledger.Storage;
using System.Text;
using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Reviews;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Tests.Workflows;

/// <summary>The ledger's workflows end to end on a real SQLite file.</summary>
public sealed class WorkflowTests
{
    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task UploadCheckDeriveReviewReopen_FollowsTheSaddlePointThroughItsLife(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var member = await ledger.AddUserAsync("member", Roles.Member);
        var reviewer = await ledger.AddUserAsync("pi", Roles.Reviewer);
        var uploads = ledger.Get<UploadService>();
        var reviews = ledger.Get<ReviewService>();
        var ledgerQuery = ledger.Get<LedgerQueryService>();

        var stored = await uploads.StoreDraftAsync(H3System.Draft(), new UploadChoices(), member);
        Assert.True(stored.Stored, string.Join("\n", stored.Errors));
        var studyId = stored.StudyId!.Value;

        // Check and derivation are there at once; the saddle point waits for review.
        var row = Assert.Single((await ledgerQuery.GetLedgerRowsAsync(studyId)).Rows);
        Assert.Equal(Verdict.Passed, row.Verdict);
        Assert.Equal(ReviewState.AwaitingReview, row.ReviewStatus);
        Assert.False(row.Stale);
        Assert.Equal("member", row.OwnerName);
        var item = Assert.Single(await reviews.QueueAsync(studyId));
        Assert.Equal("ts", item.CalculationLabel);
        Assert.Contains(item.Evidence!.ImaginaryModes, m => m.Significant && m.FrequencyCm1 == -1500);

        // A member cannot verify, even by calling the service directly.
        await Assert.ThrowsAsync<ReviewerRequiredException>(() => reviews.VerifyAsync(item.CalculationId, member, "looks fine"));
        await Assert.ThrowsAsync<ArgumentException>(() => reviews.ReturnAsync(item.CalculationId, reviewer, "  "));
        await reviews.VerifyAsync(item.CalculationId, reviewer, "one clean reaction mode");
        Assert.Empty(await reviews.QueueAsync(studyId));
        Assert.Equal(ReviewState.Verified, Assert.Single((await ledgerQuery.GetLedgerRowsAsync(studyId)).Rows).ReviewStatus);

        // A new calculation for the verified saddle point reopens it; the old review stays in the history.
        var stateId = (await ledger.Get<ReactionQueryService>().GetReactionAsync(row.ReactionId))!.States.Single(s => s.Kind == StateKind.SaddlePoint).Id;
        var reopened = await uploads.StoreAsync([new UploadFile("ts-tighter.xyz", Encoding.UTF8.GetBytes(H3System.TsXyz(-1.6552)))],
            new UploadChoices { StudyId = studyId, SpeciesLabel = "TS", Kind = CalculationKind.SaddlePoint, LevelOfTheory = H3System.Level, AttachToStateId = stateId },
            member);
        Assert.True(reopened.Stored, string.Join("\n", reopened.Errors));
        var after = Assert.Single((await ledgerQuery.GetLedgerRowsAsync(studyId)).Rows);
        Assert.Equal(ReviewState.AwaitingReview, after.ReviewStatus);
        // The new calculation has no modes, so the check cannot pass; it says why.
        Assert.Equal(Verdict.Failed, after.Verdict);
        var queued = Assert.Single(await reviews.QueueAsync(studyId));
        Assert.Equal("ts-tighter", queued.CalculationLabel);
        Assert.True(queued.PreviouslyReviewed);
        Assert.Contains(queued.Reasons, r => r.Code == "saddle.no-modes");
        var history = await reviews.HistoryAsync(stateId);
        Assert.Equal([ReviewOutcome.Reopened, ReviewOutcome.Verified], history.Select(h => h.Outcome));
        // A saddle point that failed its check is verified only with a comment that says why it is accepted anyway
        // (common practice, no source: a sign-off against the evidence must carry its reason).
        var refused = await Assert.ThrowsAsync<ArgumentException>(() => reviews.VerifyAsync(queued.CalculationId, reviewer, " "));
        Assert.Contains("failed its frequency check", refused.Message);
        Assert.Single(await reviews.QueueAsync(studyId));
        // ΔE‡ follows the new saddle-point energy: −1.6552 − (−1.17 − 0.5) = 0.0148 Eh.
        Assert.Equal(0.0148, after.BarrierElectronic!.Value.Hartree, 9);
        await using var db = await ledger.DbAsync();
        Assert.Contains(await db.AuditEvents.Select(a => a.Action).ToListAsync(), a => a == "review.reopened");
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task EnergyModelChange_MarksValuesStale_ThenRecomputeGivesNewValues(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var stored = await ledger.Get<UploadService>().StoreDraftAsync(H3System.Draft(), new UploadChoices(), "member");
        var studyId = stored.StudyId!.Value;
        var query = ledger.Get<LedgerQueryService>();
        var before = Assert.Single((await query.GetLedgerRowsAsync(studyId)).Rows);
        Assert.False(before.Stale);

        var models = ledger.Get<EnergyModelService>();
        var current = await models.GetForStudyAsync(studyId);
        var hotter = current.Settings with { TemperatureKelvin = 400, Treatment = ThermoTreatment.Rrho };
        var saved = await models.SaveStudyOverrideAsync(studyId, hotter, current.StudyId == studyId && current.IsOverride ? current.Version : 0, "admin");
        Assert.True(saved.Saved, saved.Conflict);
        await ledger.Get<RecomputeService>().WhenIdleAsync();

        var after = Assert.Single((await query.GetLedgerRowsAsync(studyId)).Rows);
        Assert.False(after.Stale);
        Assert.Equal(400, after.TemperatureKelvin);
        // The electronic barrier does not depend on T; the Gibbs barrier does (−TΔS‡ grows with T).
        Assert.Equal(before.BarrierElectronic!.Value.Hartree, after.BarrierElectronic!.Value.Hartree, 12);
        Assert.NotEqual(before.BarrierGibbs!.Value.Hartree, after.BarrierGibbs!.Value.Hartree);
        Assert.True(after.RateConstantPerSecond > before.RateConstantPerSecond);
        Assert.Equal("done", ledger.Get<RecomputeService>().Current.Phase);
        Assert.Equal(1, ledger.Get<RecomputeService>().Current.Done);

        // Without the pass (a model saved, not yet recomputed), rows say they are stale.
        await using (var db = await ledger.DbAsync())
            await db.EnergyModels.Where(m => m.StudyId == studyId).ExecuteUpdateAsync(u => u.SetProperty(m => m.TemperatureKelvin, 350.0));
        Assert.True(Assert.Single((await query.GetLedgerRowsAsync(studyId)).Rows).Stale);
        Assert.True((await ledger.Get<ReactionQueryService>().GetReactionAsync(after.ReactionId))!.Stale);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task ThresholdChange_RerunsTheFrequencyCheck(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var stored = await ledger.Get<UploadService>().StoreDraftAsync(H3System.Draft(), new UploadChoices(), "member");
        var studyId = stored.StudyId!.Value;
        Assert.Equal(Verdict.Passed, Assert.Single((await ledger.Get<LedgerQueryService>().GetLedgerRowsAsync(studyId)).Rows).Verdict);

        // With a 2000i cm⁻¹ threshold the 1500i mode is no longer significant: the check must now fail, saying so.
        var models = ledger.Get<EnergyModelService>();
        var m = await models.GetGroupDefaultAsync();
        Assert.True((await models.SaveGroupDefaultAsync(m.Settings with { SignificantImaginaryCm1 = 2000 }, m.Version, "admin")).Saved);
        await ledger.Get<RecomputeService>().WhenIdleAsync();
        Assert.Equal(1, ledger.Get<RecomputeService>().Current.ChecksRun);
        var detail = (await ledger.Get<ReactionQueryService>().GetReactionAsync(stored.ReactionIds.Single()))!;
        var check = Assert.Single(detail.SaddleChecks);
        Assert.Equal(Verdict.Failed, check.Verdict);
        Assert.False(check.CheckStale);
        Assert.Contains(check.Reasons, r => r.Code == SaddleCheckCodes.NoSignificantImaginaryMode);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task ConflictingEdits_SecondEditorIsToldAndNothingIsOverwritten(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var stored = await ledger.Get<UploadService>().StoreDraftAsync(H3System.Draft(), new UploadChoices(), "member");
        var records = ledger.Get<RecordService>();
        var reactionId = stored.ReactionIds.Single();
        var seen = (await records.GetVersionAsync(RecordKind.Reaction, reactionId))!.Value;

        var first = await records.EditReactionAsync(reactionId, "H exchange (collinear)", "first editor", seen, "alice");
        var second = await records.EditReactionAsync(reactionId, "H exchange v2", "second editor", seen, "bob");

        Assert.True(first.Saved);
        Assert.False(second.Saved);
        Assert.Contains("changed by someone else", second.Conflict);
        await using var db = await ledger.DbAsync();
        var r = await db.Reactions.SingleAsync();
        Assert.Equal("H exchange (collinear)", r.Label);
        Assert.Equal(seen + 1, r.Version);

        // Same for the energy model.
        var models = ledger.Get<EnergyModelService>();
        var m = await models.GetGroupDefaultAsync();
        Assert.True((await models.SaveGroupDefaultAsync(m.Settings with { TemperatureKelvin = 310 }, m.Version, "alice")).Saved);
        var late = await models.SaveGroupDefaultAsync(m.Settings with { TemperatureKelvin = 320 }, m.Version, "bob");
        Assert.False(late.Saved);
        Assert.Contains("310 K", late.Conflict);
        Assert.Equal(310, (await models.GetGroupDefaultAsync()).Settings.TemperatureKelvin);
        await ledger.Get<RecomputeService>().WhenIdleAsync();
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task RetireThenRestore_HidesAndBringsBackRecordsAndTheirEffect(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var stored = await ledger.Get<UploadService>().StoreDraftAsync(H3System.Draft(), new UploadChoices(), "member");
        var studyId = stored.StudyId!.Value;
        var records = ledger.Get<RecordService>();
        var query = ledger.Get<LedgerQueryService>();
        var reactionId = stored.ReactionIds.Single();

        var v = (await records.GetVersionAsync(RecordKind.Reaction, reactionId))!.Value;
        Assert.True((await records.RetireAsync(RecordKind.Reaction, reactionId, v, "member", "duplicate of another")).Saved);
        Assert.Empty((await query.GetLedgerRowsAsync(studyId)).Rows);
        Assert.True(Assert.Single((await query.GetLedgerRowsAsync(studyId, new LedgerFilter { IncludeRetired = true })).Rows).Retired);
        Assert.True((await records.RestoreAsync(RecordKind.Reaction, reactionId, v + 1, "member")).Saved);
        Assert.False(Assert.Single((await query.GetLedgerRowsAsync(studyId)).Rows).Retired);

        // Retiring an input calculation re-derives: the pathway loses its energies and says why; restoring brings them back.
        var h2 = stored.CalculationIds.First();
        var cv = (await records.GetVersionAsync(RecordKind.Calculation, h2))!.Value;
        Assert.True((await records.RetireAsync(RecordKind.Calculation, h2, cv, "member", "wrong geometry")).Saved);
        var without = Assert.Single((await query.GetLedgerRowsAsync(studyId)).Rows);
        Assert.Null(without.BarrierGibbs);
        Assert.Contains(without.ConsistencyReasons, r => r.Code == LedgerReasonCodes.MissingEnergy);
        Assert.True((await records.RestoreAsync(RecordKind.Calculation, h2, cv + 1, "member")).Saved);
        var back = Assert.Single((await query.GetLedgerRowsAsync(studyId)).Rows);
        Assert.NotNull(back.BarrierGibbs);
        Assert.True(back.Consistent);

        await using var db = await ledger.DbAsync();
        Assert.Equal(3, await db.Calculations.CountAsync());
        Assert.Equal(4, await db.AuditEvents.CountAsync(a => a.Action == "record.retired" || a.Action == "record.restored"));
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task MixedLevelsAndBrokenFormula_AreShownWithTheirReasons(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var draft = H3System.Draft();
        // The saddle point at another level of theory: the barrier mixes levels and must say so.
        var ts = draft.Calculations[2];
        draft.Calculations[2] = ts with { LevelOfTheory = LevelOfTheory.Parse("MODEL-B/basis-2") };
        var stored = await ledger.Get<UploadService>().StoreDraftAsync(draft, new UploadChoices(), "member");
        var row = Assert.Single((await ledger.Get<LedgerQueryService>().GetLedgerRowsAsync(stored.StudyId!.Value)).Rows);
        Assert.False(row.Consistent);
        Assert.Contains(row.ConsistencyReasons, r => r.Code == Core.Pathways.ConsistencyCodes.MixedElectronicLevels && r.Blocking);
        Assert.NotNull(row.BarrierElectronic);
        // The ledger screen's "only inconsistent barriers" filter is applied by the query, in the store.
        var query = ledger.Get<LedgerQueryService>();
        Assert.Single((await query.GetLedgerRowsAsync(stored.StudyId!.Value, new LedgerFilter { OnlyInconsistent = true })).Rows);
        var clean = await ledger.Get<UploadService>().StoreDraftAsync(H3System.Draft(study: "Hydrogen exchange, one level (test)"), new UploadChoices(), "member");
        Assert.True(Assert.Single((await query.GetLedgerRowsAsync(clean.StudyId!.Value)).Rows).Consistent);
        Assert.Empty((await query.GetLedgerRowsAsync(clean.StudyId!.Value, new LedgerFilter { OnlyInconsistent = true })).Rows);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task ReactionDetail_HasStatesStepsCheckModesAndScans(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var draft = H3System.Draft();
        // A scan of the saddle-point species along H1–H2 with its maximum at 0.93 Å.
        var points = Enumerable.Range(0, 9).Select(i =>
        {
            var r = 0.85 + 0.02 * i;
            return new Core.Scans.ScanPoint(r, H3System.ETs - 0.02 * (r - 0.93) * (r - 0.93));
        }).ToList();
        draft.Scans.Add(new DraftScan("h1h2", "TS", H3System.Level, new Core.Scans.ScanCoordinate(Core.Scans.ScanCoordinateKind.Distance, [0, 1]), points, null));
        var stored = await ledger.Get<UploadService>().StoreDraftAsync(draft, new UploadChoices(), "member");
        Assert.True(stored.Stored, string.Join("\n", stored.Errors));

        var detail = (await ledger.Get<ReactionQueryService>().GetReactionAsync(stored.ReactionIds.Single()))!;
        Assert.Equal(3, detail.States.Count);
        Assert.Equal(["H1–H2", "H2–H3"], detail.States[1].CoordinateLabels);
        Assert.Equal(3, detail.StateEnergies.Count);
        Assert.Equal(0.0, detail.StateEnergies[0].DeltaEHartree!.Value, 12);
        var step = Assert.Single(detail.Steps);
        Assert.Equal(2, step.Molecularity); // H2 + H → TS: bimolecular
        Assert.Equal("M⁻¹ s⁻¹", step.RateConstantUnit);
        var check = Assert.Single(detail.SaddleChecks);
        Assert.Equal(Verdict.Passed, check.Verdict);
        Assert.Equal(3, check.Geometry!.AtomCount);
        Assert.Equal(4, check.Modes.Count);
        Assert.Contains(check.Reasons, r => r.Code == SaddleCheckCodes.NearScanMaximum);
        var scan = Assert.Single(detail.Scans);
        Assert.Equal(9, scan.Points.Count);
        Assert.NotNull(scan.Profile.HighestMaximum);
        Assert.Equal(0.93, scan.Profile.HighestMaximum!.Coordinate, 2);
    }
}
