using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Reviews;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Tests.Reviews;

/// <summary>
/// The one review state machine against its documentation (docs/ledger.md, "Review states"): the queue, the ledger row, its
/// filter and the exports all read the state from the same rule.
/// </summary>
public sealed class ReviewStatesTests
{
    [Theory]
    [InlineData(null, ReviewState.AwaitingReview, true)]
    [InlineData(ReviewOutcome.Verified, ReviewState.Verified, false)]
    [InlineData(ReviewOutcome.Returned, ReviewState.Returned, false)]
    [InlineData(ReviewOutcome.Reopened, ReviewState.Reopened, true)]
    public void TheLatestEntry_GivesTheState_AndWhetherItWaits(ReviewOutcome? latest, ReviewState expected, bool waiting)
    {
        Assert.Equal(expected, ReviewStates.After(latest));
        Assert.Equal(waiting, ReviewStates.IsWaiting(expected));
    }

    [Theory]
    [InlineData(new ReviewState[0], null)]
    [InlineData(new[] { ReviewState.Verified, ReviewState.Verified }, ReviewState.Verified)]
    [InlineData(new[] { ReviewState.Verified, ReviewState.Returned, ReviewState.Reopened }, ReviewState.Returned)]
    [InlineData(new[] { ReviewState.Verified, ReviewState.Reopened, ReviewState.AwaitingReview }, ReviewState.Reopened)]
    [InlineData(new[] { ReviewState.Verified, ReviewState.AwaitingReview }, ReviewState.AwaitingReview)]
    public void AReaction_CombinesItsSaddlePoints(ReviewState[] saddlePoints, ReviewState? expected) =>
        Assert.Equal(expected, ReviewStates.Combine(saddlePoints));

    [Fact]
    public void EveryState_HasWordsOfItsOwn() =>
        Assert.Equal(Enum.GetValues<ReviewState>().Length, Enum.GetValues<ReviewState>().Select(ReviewStates.Text).Distinct().Count());

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task AReopenedSaddlePoint_WaitsInTheQueue_IsFoundByTheAwaitingFilter_AndIsReopenedOnlyOnce(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var member = await ledger.AddUserAsync("member", Roles.Member);
        var reviewer = await ledger.AddUserAsync("pi", Roles.Reviewer);
        var stored = await ledger.Get<UploadService>().StoreDraftAsync(H3System.Draft(), new UploadChoices(), member);
        Assert.True(stored.Stored, string.Join("\n", stored.Errors));
        var studyId = stored.StudyId!.Value;
        var reviews = ledger.Get<ReviewService>();
        var calc = Assert.Single(await reviews.QueueAsync(studyId)).CalculationId;

        await using (var db = await ledger.DbAsync())
            Assert.Null(await ReviewStates.ReopenIfDecidedAsync(db, calc, member, DateTimeOffset.UtcNow, "nothing decided yet", default));

        await reviews.VerifyAsync(calc, reviewer, "one clean reaction mode");
        Assert.Empty(await reviews.QueueAsync(studyId));

        await using (var db = await ledger.DbAsync())
        {
            Assert.Equal(ReviewOutcome.Verified, await ReviewStates.ReopenIfDecidedAsync(db, calc, member, DateTimeOffset.UtcNow, "an IRC was added", default));
            await db.SaveChangesAsync();
            await ReactionStatusSummary.RefreshForCalculationsAsync(db, [calc], default);
            // Already waiting: a second reopening writes nothing.
            Assert.Null(await ReviewStates.ReopenIfDecidedAsync(db, calc, member, DateTimeOffset.UtcNow, "again", default));
            await db.SaveChangesAsync();
            Assert.Equal([ReviewOutcome.Verified, ReviewOutcome.Reopened],
                await db.Reviews.Where(r => r.CalculationId == calc).OrderBy(r => r.Id).Select(r => r.Outcome).ToListAsync());
        }

        var waiting = Assert.Single(await reviews.QueueAsync(studyId));
        Assert.True(waiting.PreviouslyReviewed);
        var query = ledger.Get<LedgerQueryService>();
        Assert.Equal(ReviewState.Reopened, Assert.Single((await query.GetLedgerRowsAsync(studyId)).Rows).ReviewStatus);
        Assert.Single((await query.GetLedgerRowsAsync(studyId, new LedgerFilter { ReviewStatus = ReviewState.AwaitingReview })).Rows);
        Assert.Single((await query.GetLedgerRowsAsync(studyId, new LedgerFilter { ReviewStatus = ReviewState.Reopened })).Rows);
        Assert.Empty((await query.GetLedgerRowsAsync(studyId, new LedgerFilter { ReviewStatus = ReviewState.Verified })).Rows);
    }
}
