using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Reviews;

/// <summary>
/// Where a saddle point stands in review: the state the calculation's latest <see cref="Review"/> entry leads to
/// (<see cref="ReviewStates.After"/>), so the history is the single truth. <see cref="Calculation.ReviewState"/> holds it as a
/// summary, written in the same transaction as every entry (<see cref="ReviewStates.RecordAsync"/>), for the review queue.
/// A reaction's state combines its saddle points' states (<see cref="ReviewStates.Combine"/>). docs/ledger.md, "Review
/// states", draws the machine.
/// </summary>
public enum ReviewState
{
    /// <summary>Never decided.</summary>
    AwaitingReview,
    Verified,
    Returned,
    /// <summary>Decided once, then its evidence changed (a new calculation, IRC or scan): it awaits review again.</summary>
    Reopened,
}

/// <summary>
/// The review state machine. Transitions, each written as one <see cref="Review"/> entry (entries are never changed):
/// <list type="bullet">
/// <item>Verify (a reviewer, <see cref="ReviewService"/>): any state → <see cref="ReviewState.Verified"/>.</item>
/// <item>Return (a reviewer, with a comment): any state → <see cref="ReviewState.Returned"/>.</item>
/// <item>Reopen (the ledger, when the evidence changes): <see cref="ReviewState.Verified"/> or <see cref="ReviewState.Returned"/>
/// → <see cref="ReviewState.Reopened"/>; from a waiting state nothing is written (it already waits).</item>
/// </list>
/// Waiting means <see cref="ReviewState.AwaitingReview"/> or <see cref="ReviewState.Reopened"/>: both are in the review queue,
/// both are "not verified" in every table and export.
/// </summary>
public static class ReviewStates
{
    /// <summary>The state a calculation's latest review entry leads to (no entry: awaiting review).</summary>
    public static ReviewState After(ReviewOutcome? latest) => latest switch
    {
        null => ReviewState.AwaitingReview,
        ReviewOutcome.Verified => ReviewState.Verified,
        ReviewOutcome.Returned => ReviewState.Returned,
        ReviewOutcome.Reopened => ReviewState.Reopened,
        _ => throw new ArgumentOutOfRangeException(nameof(latest), latest, "Unknown review outcome."),
    };

    /// <summary>Whether the saddle point waits for a reviewer (never decided, or reopened).</summary>
    public static bool IsWaiting(ReviewState s) => s is ReviewState.AwaitingReview or ReviewState.Reopened;

    /// <summary>The states a filter for <paramref name="wanted"/> finds: "awaiting review" finds the reopened ones too (both wait).</summary>
    public static ReviewState[] Matching(ReviewState wanted) =>
        wanted == ReviewState.AwaitingReview ? [ReviewState.AwaitingReview, ReviewState.Reopened] : [wanted];

    /// <summary>
    /// A reaction's state from its saddle points': Returned when any was returned, Verified when all were verified, Reopened
    /// when any of the others was reopened, else awaiting review. Null without saddle points.
    /// </summary>
    public static ReviewState? Combine(IReadOnlyCollection<ReviewState> saddlePoints) =>
        saddlePoints.Count == 0 ? null
        : saddlePoints.Contains(ReviewState.Returned) ? ReviewState.Returned
        : saddlePoints.All(s => s == ReviewState.Verified) ? ReviewState.Verified
        : saddlePoints.Contains(ReviewState.Reopened) ? ReviewState.Reopened
        : ReviewState.AwaitingReview;

    /// <summary>Words for a state, as shown on screens, in the audit and in exports.</summary>
    public static string Text(ReviewState s) => s switch
    {
        ReviewState.AwaitingReview => "Awaiting review",
        ReviewState.Verified => "Verified",
        ReviewState.Returned => "Returned",
        ReviewState.Reopened => "Reopened, awaiting review",
        _ => throw new ArgumentOutOfRangeException(nameof(s), s, "Unknown review state."),
    };

    /// <summary>
    /// The Reopen transition: when the calculation's latest review verified or returned it, adds a Reopened entry with the
    /// comment (saved with the caller's transaction) and returns the outcome it had; otherwise writes nothing and returns null.
    /// </summary>
    internal static async Task<ReviewOutcome?> ReopenIfDecidedAsync(LedgerDbContext db, int calculationId, string userId, DateTimeOffset at,
        string comment, CancellationToken ct)
    {
        var last = await db.Reviews.Where(v => v.CalculationId == calculationId).OrderByDescending(v => v.Id)
            .Select(v => (ReviewOutcome?)v.Outcome).FirstOrDefaultAsync(ct);
        if (last is not (ReviewOutcome.Verified or ReviewOutcome.Returned)) return null;
        await RecordAsync(db, new Review { CalculationId = calculationId, Outcome = ReviewOutcome.Reopened, ReviewerUserId = userId, At = at, Comment = comment }, ct);
        return last;
    }

    /// <summary>
    /// Adds a review entry (saved with the caller's transaction) and sets the calculation's stored
    /// <see cref="Calculation.ReviewState"/> to the state it leads to, at once and without bumping the calculation's version
    /// (a review is not an edit of the calculation). The only way entries are written.
    /// </summary>
    internal static async Task RecordAsync(LedgerDbContext db, Review review, CancellationToken ct)
    {
        db.Reviews.Add(review);
        var state = After(review.Outcome);
        await db.Calculations.Where(c => c.Id == review.CalculationId).ExecuteUpdateAsync(u => u.SetProperty(c => c.ReviewState, state), ct);
    }
}
