using System.Text;
using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Reviews;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Export;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Tests.Derivation;

/// <summary>
/// The ledger lists a study from a status summarised on each reaction. These tests follow the stored summary (not only the
/// listed row) through every workflow that changes it, and compare it with the rule applied afresh to the checks and reviews.
/// </summary>
public sealed class ReactionStatusSummaryTests
{
    private static async Task<(int? Count, Verdict? Verdict, ReviewState? Review)> StoredAsync(TempLedger ledger, int reactionId)
    {
        await using var db = await ledger.DbAsync();
        var r = await db.Reactions.AsNoTracking().SingleAsync(x => x.Id == reactionId);
        return (r.SaddlePointCount, r.CheckVerdict, r.ReviewStatus);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task VerifyReturnAndReopen_ChangeTheStoredStatusAndTheRow(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var member = await ledger.AddUserAsync("member", Roles.Member);
        var reviewer = await ledger.AddUserAsync("pi", Roles.Reviewer);
        var stored = await ledger.Get<UploadService>().StoreDraftAsync(H3System.Draft(), new UploadChoices(), member);
        Assert.True(stored.Stored, string.Join("\n", stored.Errors));
        var studyId = stored.StudyId!.Value;
        var reactionId = stored.ReactionIds.Single();
        var query = ledger.Get<LedgerQueryService>();
        var reviews = ledger.Get<ReviewService>();

        // Stored by the upload: one saddle point, its check passed, nobody has looked at it yet.
        Assert.Equal((1, Verdict.Passed, ReviewState.AwaitingReview), await StoredAsync(ledger, reactionId));
        var tsCalc = Assert.Single(await reviews.QueueAsync(studyId)).CalculationId;

        await reviews.VerifyAsync(tsCalc, reviewer, "one clean reaction mode");
        Assert.Equal((1, Verdict.Passed, ReviewState.Verified), await StoredAsync(ledger, reactionId));
        Assert.Equal(ReviewState.Verified, Assert.Single((await query.GetLedgerRowsAsync(studyId)).Rows).ReviewStatus);

        await reviews.ReturnAsync(tsCalc, reviewer, "the scan maximum is elsewhere");
        Assert.Equal((1, Verdict.Passed, ReviewState.Returned), await StoredAsync(ledger, reactionId));
        Assert.Equal(ReviewState.Returned, Assert.Single((await query.GetLedgerRowsAsync(studyId)).Rows).ReviewStatus);
        // The status filters read the stored summary.
        Assert.Single((await query.GetLedgerRowsAsync(studyId, new LedgerFilter { ReviewStatus = ReviewState.Returned })).Rows);
        Assert.Empty((await query.GetLedgerRowsAsync(studyId, new LedgerFilter { ReviewStatus = ReviewState.Verified })).Rows);

        // A new calculation for the returned saddle point reopens it: awaiting review, and its check (no modes) fails.
        var stateId = (await ledger.Get<ReactionQueryService>().GetReactionAsync(reactionId))!.States.Single(s => s.Kind == StateKind.SaddlePoint).Id;
        var again = await ledger.Get<UploadService>().StoreAsync([new UploadFile("ts-again.xyz", Encoding.UTF8.GetBytes(H3System.TsXyz(-1.6551)))],
            new UploadChoices { StudyId = studyId, SpeciesLabel = "TS", Kind = CalculationKind.SaddlePoint, LevelOfTheory = H3System.Level, AttachToStateId = stateId },
            member);
        Assert.True(again.Stored, string.Join("\n", again.Errors));
        Assert.Equal((1, Verdict.Failed, ReviewState.AwaitingReview), await StoredAsync(ledger, reactionId));
        var row = Assert.Single((await query.GetLedgerRowsAsync(studyId)).Rows);
        Assert.Equal(ReviewState.AwaitingReview, row.ReviewStatus);
        Assert.Equal(Verdict.Failed, row.Verdict);
        Assert.Single((await query.GetLedgerRowsAsync(studyId, new LedgerFilter { Verdict = Verdict.Failed })).Rows);
        Assert.Empty((await query.GetLedgerRowsAsync(studyId, new LedgerFilter { Verdict = Verdict.Passed })).Rows);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task ThresholdChange_StoredVerdictFollowsTheRerunCheck(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var stored = await ledger.Get<UploadService>().StoreDraftAsync(H3System.Draft(), new UploadChoices(), "member");
        var reactionId = stored.ReactionIds.Single();
        Assert.Equal(Verdict.Passed, (await StoredAsync(ledger, reactionId)).Verdict);

        // With a 2000i cm⁻¹ threshold the 1500i mode is no longer significant: the recompute pass re-runs the check, which fails.
        var models = ledger.Get<EnergyModelService>();
        var m = await models.GetGroupDefaultAsync();
        Assert.True((await models.SaveGroupDefaultAsync(m.Settings with { SignificantImaginaryCm1 = 2000 }, m.Version, "admin")).Saved);
        await ledger.Get<RecomputeService>().WhenIdleAsync();

        Assert.Equal((1, Verdict.Failed, ReviewState.AwaitingReview), await StoredAsync(ledger, reactionId));
        Assert.Equal(Verdict.Failed, Assert.Single((await ledger.Get<LedgerQueryService>().GetLedgerRowsAsync(stored.StudyId!.Value)).Rows).Verdict);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task ReactionsStoredBeforeTheSummary_AreListedWithTheirStatusComputedOnTheWay(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var reviewer = await ledger.AddUserAsync("pi", Roles.Reviewer);
        var stored = await ledger.Get<UploadService>().StoreDraftAsync(H3System.Draft(), new UploadChoices(), "member");
        var studyId = stored.StudyId!.Value;
        var reviews = ledger.Get<ReviewService>();
        await reviews.VerifyAsync(Assert.Single(await reviews.QueueAsync(studyId)).CalculationId, reviewer, "fine");
        // What a ledger file migrated from before the summary columns holds: no summary at all.
        await using (var db = await ledger.DbAsync())
            await db.Reactions.ExecuteUpdateAsync(u => u.SetProperty(r => r.SaddlePointCount, (int?)null)
                .SetProperty(r => r.CheckVerdict, (Verdict?)null).SetProperty(r => r.ReviewStatus, (ReviewState?)null));

        var query = ledger.Get<LedgerQueryService>();
        var row = Assert.Single((await query.GetLedgerRowsAsync(studyId)).Rows);
        Assert.Equal((1, Verdict.Passed, ReviewState.Verified), (row.SaddlePointCount, row.Verdict, row.ReviewStatus));
        Assert.Single((await query.GetLedgerRowsAsync(studyId, new LedgerFilter { ReviewStatus = ReviewState.Verified, Verdict = Verdict.Passed })).Rows);
        Assert.Empty((await query.GetLedgerRowsAsync(studyId, new LedgerFilter { ReviewStatus = ReviewState.Returned })).Rows);

        // A recompute pass writes the summary back; so does the start-up (a restored old backup is migrated there).
        await ledger.Get<RecomputeService>().RecomputeAsync([studyId]);
        Assert.Equal((1, Verdict.Passed, ReviewState.Verified), await StoredAsync(ledger, stored.ReactionIds.Single()));
        await using (var db = await ledger.DbAsync())
            await db.Reactions.ExecuteUpdateAsync(u => u.SetProperty(r => r.SaddlePointCount, (int?)null));
        await LedgerDatabase.PrepareAsync(ledger.Options, ledger.Factory);
        Assert.Equal((1, Verdict.Passed, ReviewState.Verified), await StoredAsync(ledger, stored.ReactionIds.Single()));
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task DemoStudy_StoredStatusOfEveryReaction_IsTheRuleAppliedToItsChecksAndReviews(StoreProvider store)
    {
        var (ledger, studyId) = await DemoLedger.CreateAsync(store);
        await using var _ = ledger;
        var reviewer = await ledger.AddUserAsync("pi", Roles.Reviewer);
        var reviews = ledger.Get<ReviewService>();
        // Give the saddle points different fates: the first verified, the second returned, the rest left waiting.
        var queue = await reviews.QueueAsync(studyId);
        Assert.True(queue.Count >= 3, $"the demo study has {queue.Count} saddle points awaiting review");
        await reviews.VerifyAsync(queue[0].CalculationId, reviewer, "fine");
        await reviews.ReturnAsync(queue[1].CalculationId, reviewer, "wrong mode");

        await using var db = await ledger.DbAsync();
        var reactions = await db.Reactions.AsNoTracking().Where(r => r.StudyId == studyId).ToListAsync();
        var saddles = await db.ReactionStates.AsNoTracking().Where(s => s.Kind == StateKind.SaddlePoint && s.Reaction!.StudyId == studyId)
            .Select(s => new { s.ReactionId, s.SaddleCalculationId }).ToListAsync();
        var checks = await db.FrequencyChecks.AsNoTracking().ToDictionaryAsync(c => c.CalculationId, c => c.Verdict);
        var latest = (await db.Reviews.AsNoTracking().ToListAsync()).GroupBy(v => v.CalculationId).ToDictionary(g => g.Key, g => g.MaxBy(v => v.Id)!.Outcome);
        var statuses = new HashSet<ReviewState?>();
        foreach (var r in reactions)
        {
            // The rule as the ledger screen states it (LedgerRow): worst verdict, a missing check failing; Verified only when all
            // saddle points are, Returned when any is.
            var mine = saddles.Where(s => s.ReactionId == r.Id).ToList();
            var verdicts = mine.Select(s => s.SaddleCalculationId is { } c && checks.TryGetValue(c, out var v) ? v : (Verdict?)null).ToList();
            var outcomes = mine.Select(s => s.SaddleCalculationId is { } c && latest.TryGetValue(c, out var o) ? o : (ReviewOutcome?)null).ToList();
            Verdict? expectedVerdict = mine.Count == 0 ? null
                : verdicts.Contains(null) || verdicts.Contains(Verdict.Failed) ? Verdict.Failed
                : verdicts.Contains(Verdict.NeedsAttention) ? Verdict.NeedsAttention : Verdict.Passed;
            ReviewState? expectedReview = mine.Count == 0 ? null
                : outcomes.Contains(ReviewOutcome.Returned) ? ReviewState.Returned
                : outcomes.All(o => o == ReviewOutcome.Verified) ? ReviewState.Verified : ReviewState.AwaitingReview;
            Assert.Equal((mine.Count, expectedVerdict, expectedReview), (r.SaddlePointCount, r.CheckVerdict, r.ReviewStatus));
            statuses.Add(r.ReviewStatus);
        }
        // The comparison covered returned and waiting reactions at least (a reaction with two saddle points may not be all verified).
        Assert.Contains(ReviewState.Returned, statuses);
        Assert.Contains(ReviewState.AwaitingReview, statuses);
    }
}
