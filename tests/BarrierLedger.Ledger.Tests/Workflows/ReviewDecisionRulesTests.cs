using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Auditing;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Reviews;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Tests.Workflows;

/// <summary>
/// Issue 19, finding 9: review decisions under the rules of docs/ledger.md, "Who reviews". Before the fix two reviewers
/// deciding the same saddle point both succeeded (a return could be overwritten unseen by a verify), an Admin saw buttons the
/// server refused, and self-review had no rule.
/// </summary>
public sealed class ReviewDecisionRulesTests
{
    private static async Task<(TempLedger Ledger, int CalculationId, string Member)> StoredSaddleAsync(StoreProvider store)
    {
        var ledger = await TempLedger.CreateAsync(store);
        var member = await ledger.AddUserAsync("member", Roles.Member);
        var stored = await ledger.Get<UploadService>().StoreDraftAsync(H3System.Draft(), new UploadChoices(), member);
        Assert.True(stored.Stored, string.Join("\n", stored.Errors));
        var item = Assert.Single(await ledger.Get<ReviewService>().QueueAsync(stored.StudyId));
        return (ledger, item.CalculationId, member);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task ASecondReviewerDecidingFromTheSameQueue_IsRefused_AndTheFirstVerdictStands(StoreProvider store)
    {
        var (ledger, calc, _) = await StoredSaddleAsync(store);
        await using var _ = ledger;
        var rhea = await ledger.AddUserAsync("rhea", Roles.Reviewer);
        var tomas = await ledger.AddUserAsync("tomas", Roles.Reviewer);
        var reviews = ledger.Get<ReviewService>();

        await reviews.ReturnAsync(calc, rhea, "the imaginary mode is a methyl rotation", ReviewBasis.Waiting);
        var conflict = await Assert.ThrowsAsync<ReviewConflictException>(() => reviews.VerifyAsync(calc, tomas, "fine", ReviewBasis.Waiting));

        Assert.Contains("returned by rhea", conflict.Message);
        await using var db = await ledger.DbAsync();
        var outcome = Assert.Single(await db.Reviews.Where(r => r.CalculationId == calc).Select(r => r.Outcome).ToListAsync());
        Assert.Equal(ReviewOutcome.Returned, outcome);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task TwoReviewersDecidingAtTheSameMoment_ExactlyOneIsRecorded(StoreProvider store)
    {
        var (ledger, calc, _) = await StoredSaddleAsync(store);
        await using var _ = ledger;
        var rhea = await ledger.AddUserAsync("rhea", Roles.Reviewer);
        var tomas = await ledger.AddUserAsync("tomas", Roles.Reviewer);
        var reviews = ledger.Get<ReviewService>();

        var results = await Task.WhenAll(
            Attempt(() => reviews.ReturnAsync(calc, rhea, "check the mode", ReviewBasis.Waiting)),
            Attempt(() => reviews.VerifyAsync(calc, tomas, "clean mode", ReviewBasis.Waiting)));

        Assert.Equal(1, results.Count(ok => ok));
        await using var db = await ledger.DbAsync();
        Assert.Equal(1, await db.Reviews.CountAsync(r => r.CalculationId == calc));

        static async Task<bool> Attempt(Func<Task<ReviewEntry>> decide)
        {
            try { await decide(); return true; }
            catch (ReviewConflictException) { return false; }
        }
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task ABasisNamingTheLatestReviewSeen_AllowsARevision_ButNotOverAnUnseenOne(StoreProvider store)
    {
        var (ledger, calc, _) = await StoredSaddleAsync(store);
        await using var _ = ledger;
        var rhea = await ledger.AddUserAsync("rhea", Roles.Reviewer);
        var reviews = ledger.Get<ReviewService>();
        var returned = await reviews.ReturnAsync(calc, rhea, "mode unclear", ReviewBasis.Waiting);

        await Assert.ThrowsAsync<ReviewConflictException>(() => reviews.VerifyAsync(calc, rhea, "now clear", ReviewBasis.Seen(null)));
        var revised = await reviews.VerifyAsync(calc, rhea, "the owner explained the mode", ReviewBasis.Seen(returned.Id));

        Assert.Equal(ReviewOutcome.Verified, revised.Outcome);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task VerifyingOnesOwnUpload_NeedsAComment_AndIsCalledASelfReview(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var pi = await ledger.AddUserAsync("pi", Roles.Reviewer);
        var stored = await ledger.Get<UploadService>().StoreDraftAsync(H3System.Draft(), new UploadChoices(), pi);
        var calc = Assert.Single(await ledger.Get<ReviewService>().QueueAsync(stored.StudyId)).CalculationId;
        var reviews = ledger.Get<ReviewService>();

        var refused = await Assert.ThrowsAsync<ArgumentException>(() => reviews.VerifyAsync(calc, pi, "", ReviewBasis.Waiting));
        Assert.Contains("you uploaded", refused.Message, StringComparison.OrdinalIgnoreCase);
        await reviews.VerifyAsync(calc, pi, "nobody else in the group reviews this week; mode checked by animation", ReviewBasis.Waiting);

        var audit = await ledger.Get<AuditService>().GetEventsAsync(nameof(Calculation), calc.ToString());
        Assert.Contains(audit, e => e.Action == "review.verified" && e.Summary.Contains("self-review"));
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task AnAdminWithoutTheReviewerRole_CannotDecide(StoreProvider store)
    {
        var (ledger, calc, _) = await StoredSaddleAsync(store);
        await using var _ = ledger;
        var ada = await ledger.AddUserAsync("ada", Roles.Admin);

        await Assert.ThrowsAsync<ReviewerRequiredException>(() => ledger.Get<ReviewService>().VerifyAsync(calc, ada, "ok", ReviewBasis.Waiting));
    }
}
