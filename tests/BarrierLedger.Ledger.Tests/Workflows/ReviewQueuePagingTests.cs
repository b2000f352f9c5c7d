using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Reviews;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Export;
using BarrierLedger.Ledger.Tests.Support;

namespace BarrierLedger.Ledger.Tests.Workflows;

/// <summary>The review queue read one page at a time gives the same saddle points, in the same order, as the whole queue.</summary>
public sealed class ReviewQueuePagingTests
{
    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Pages_concatenate_to_the_whole_queue_and_follow_a_decision(StoreProvider store)
    {
        var (ledger, studyId) = await DemoLedger.CreateAsync(store);
        await using var _ = ledger;
        var reviews = ledger.Get<ReviewService>();
        var whole = await reviews.QueueAsync();
        Assert.True(whole.Count >= 5, $"the demo study has several saddle points waiting; found {whole.Count}");
        Assert.Equal(whole.Select(i => i.CalculationId).Order(), whole.Select(i => i.CalculationId));

        var paged = new List<ReviewQueueItem>();
        for (var skip = 0; ; skip += 3)
        {
            var page = await reviews.QueuePageAsync(skip, 3);
            Assert.Equal(whole.Count, page.Total);
            Assert.True(page.Items.Count <= 3);
            if (page.Items.Count == 0) break;
            paged.AddRange(page.Items);
        }
        Assert.Equal(whole.Select(i => (i.CalculationId, i.StateId)), paged.Select(i => (i.CalculationId, i.StateId)));
        Assert.Equal(whole.Select(i => i.Reasons.Count), paged.Select(i => i.Reasons.Count));

        // Deciding one removes it from the count and from every page; a study filter counts only that study's.
        var reviewer = await ledger.AddUserAsync("pi", Roles.Reviewer);
        await reviews.VerifyAsync(whole[1].CalculationId, reviewer, "one clean reaction mode");
        var after = await reviews.QueuePageAsync(0, 100);
        Assert.Equal(whole.Count - 1, after.Total);
        Assert.DoesNotContain(after.Items, i => i.CalculationId == whole[1].CalculationId);
        Assert.Equal(after.Total, (await reviews.QueuePageAsync(0, 100, studyId)).Total);
        Assert.Equal(0, (await reviews.QueuePageAsync(0, 100, studyId + 1000)).Total);
    }
}
