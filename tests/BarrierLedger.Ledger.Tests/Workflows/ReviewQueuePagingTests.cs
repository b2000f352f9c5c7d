using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Reviews;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Export;
using BarrierLedger.Ledger.Tests.Support;

namespace BarrierLedger.Ledger.Tests.Workflows;

/// <summary>
/// The review queue read one page at a time (keyset paging: each page starts after the last item of the one before) gives
/// the same saddle points, in the same order, as the whole queue; its count stops at a limit and then says "more than".
/// </summary>
public sealed class ReviewQueuePagingTests
{
    private static async Task<List<ReviewQueueItem>> AllPagesAsync(ReviewService reviews, int take, int expectedTotal)
    {
        var paged = new List<ReviewQueueItem>();
        ReviewQueueKey? after = null;
        while (true)
        {
            var page = await reviews.QueuePageAsync(after, take);
            Assert.Equal(expectedTotal, page.Total);
            Assert.False(page.MoreThanTotal);
            Assert.True(page.Items.Count <= take);
            paged.AddRange(page.Items);
            if (page.Next is null) break;
            Assert.Equal(take, page.Items.Count); // only a full page has a next one
            Assert.Equal(new ReviewQueueKey(page.Items[^1].CalculationId, page.Items[^1].StateId), page.Next);
            after = page.Next;
        }
        return paged;
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Pages_concatenate_to_the_whole_queue_and_follow_a_decision(StoreProvider store)
    {
        var (ledger, studyId) = await DemoLedger.CreateAsync(store);
        await using var _ = ledger;
        var reviews = ledger.Get<ReviewService>();
        var whole = await reviews.QueueAsync();
        Assert.True(whole.Count >= 5, $"the demo study has several saddle points waiting; found {whole.Count}");
        Assert.Equal(whole.Select(i => (i.CalculationId, i.StateId)).Order(), whole.Select(i => (i.CalculationId, i.StateId)));

        var paged = await AllPagesAsync(reviews, 3, whole.Count);
        Assert.Equal(whole.Select(i => (i.CalculationId, i.StateId)), paged.Select(i => (i.CalculationId, i.StateId)));
        Assert.Equal(whole.Select(i => i.Reasons.Count), paged.Select(i => i.Reasons.Count));
        Assert.Equal(whole.Select(i => i.Evidence is null), paged.Select(i => i.Evidence is null));

        // Deciding one removes it from the count and from every page; a page that started after it still starts where it was.
        var reviewer = await ledger.AddUserAsync("pi", Roles.Reviewer);
        var decided = whole[1].CalculationId;
        await reviews.VerifyAsync(decided, reviewer, "one clean reaction mode");
        var expected = whole.Where(i => i.CalculationId != decided).ToList();
        var rest = await AllPagesAsync(reviews, 3, expected.Count);
        Assert.Equal(expected.Select(i => i.StateId), rest.Select(i => i.StateId));
        var afterDecided = await reviews.QueuePageAsync(new ReviewQueueKey(decided, whole[1].StateId), 2);
        Assert.Equal(expected.Where(i => (i.CalculationId, i.StateId).CompareTo((decided, whole[1].StateId)) > 0).Take(2).Select(i => i.StateId),
            afterDecided.Items.Select(i => i.StateId));

        // A study filter counts only that study's.
        Assert.Equal(expected.Count, (await reviews.QueuePageAsync(null, 100, studyId)).Total);
        Assert.Equal(0, (await reviews.QueuePageAsync(null, 100, studyId + 1000)).Total);
        Assert.Null((await reviews.QueuePageAsync(null, 100, studyId)).Next);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task The_count_stops_at_its_limit_and_says_more_than(StoreProvider store)
    {
        var (ledger, _) = await DemoLedger.CreateAsync(store);
        await using var __ = ledger;
        var reviews = ledger.Get<ReviewService>();
        var whole = await reviews.QueueAsync();
        Assert.True(whole.Count >= 5, $"the demo study has several saddle points waiting; found {whole.Count}");

        var capped = await reviews.QueuePageAsync(null, 2, null, countLimit: 3, default);
        Assert.Equal(3, capped.Total);
        Assert.True(capped.MoreThanTotal);
        Assert.Equal(whole.Take(2).Select(i => i.StateId), capped.Items.Select(i => i.StateId));

        var exact = await reviews.QueuePageAsync(null, 2, null, countLimit: whole.Count, default);
        Assert.Equal(whole.Count, exact.Total);
        Assert.False(exact.MoreThanTotal);
    }
}
