using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Auditing;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Reviews;

/// <summary>One entry of a review history.</summary>
public sealed record ReviewEntry(int Id, int CalculationId, string CalculationLabel, ReviewOutcome Outcome, string Comment, string ReviewerUserId, string ReviewerName, DateTimeOffset At);

/// <summary>A saddle point awaiting sign-off, with its evidence.</summary>
public sealed record ReviewQueueItem(
    int CalculationId, string CalculationLabel, string LevelOfTheory, int StateId, string StateLabel, int ReactionId, string ReactionLabel,
    int StudyId, string StudyName, string UploadedByUserId, string UploadedByName, DateTimeOffset UploadedAt,
    Verdict? Verdict, IReadOnlyList<CheckReason> Reasons, CheckEvidence? Evidence, bool PreviouslyReviewed);

/// <summary>Where a page of the review queue starts: after this saddle point (its calculation, then its state), in queue order.</summary>
public sealed record ReviewQueueKey(int CalculationId, int StateId);

/// <summary>
/// One page of the review queue. <see cref="Total"/> is the number of saddle points waiting in all, counted up to
/// <see cref="ReviewService.CountLimit"/>: when more wait, <see cref="MoreThanTotal"/> is set and the page says "more than".
/// <see cref="Next"/> is where the following page starts, or null on the last page.
/// </summary>
public sealed record ReviewQueueSlice(IReadOnlyList<ReviewQueueItem> Items, int Total, bool MoreThanTotal, ReviewQueueKey? Next);

/// <summary>
/// The decision a reviewer makes is based on what they saw: <see cref="Waiting"/> (the saddle point had no decision, or was
/// reopened) or the exact latest review they saw. If another reviewer decided in between, nothing is recorded.
/// </summary>
public sealed record ReviewBasis(bool Exact, int? LatestReviewId)
{
    public static ReviewBasis Waiting { get; } = new(false, null);
    public static ReviewBasis Seen(int? latestReviewId) => new(true, latestReviewId);
}

/// <summary>Someone else decided the saddle point after the reviewer's screen was drawn; nothing was recorded.</summary>
public sealed class ReviewConflictException(string message) : InvalidOperationException(message);

/// <summary>A refusal because the user is not a reviewer (the page hides the controls too; this is the server's own check).</summary>
public sealed class ReviewerRequiredException(string message) : UnauthorizedAccessException(message);

/// <summary>
/// The review workflow: the queue of saddle points awaiting sign-off, verify and return (only users in the Reviewer role,
/// checked here against the store), and review history. A new calculation for a reviewed saddle point reopens it (written by
/// the upload); the old reviews stay.
/// </summary>
public sealed class ReviewService(IDbContextFactory<LedgerDbContext> factory, AuditService audit, TimeProvider time)
{
    /// <summary>The queue's total is counted up to this many saddle points (beyond it the page says "more than"), so that
    /// opening the queue costs the same whatever the size of the ledger.</summary>
    public const int CountLimit = 1000;

    /// <summary>Saddle points in use by a live reaction whose current calculation has no verdict yet, oldest upload first (the whole queue, for tools and tests).</summary>
    public async Task<IReadOnlyList<ReviewQueueItem>> QueueAsync(int? studyId = null, CancellationToken ct = default) =>
        (await QueuePageAsync(null, int.MaxValue, studyId, ct)).Items;

    /// <summary>
    /// One page of the queue in queue order (calculation id, then state id: the order of upload), starting after
    /// <paramref name="after"/> (null: the first page), with the number waiting (see <see cref="ReviewQueueSlice"/>). Which
    /// saddle points wait is read from each calculation's stored <see cref="Calculation.ReviewState"/>, the page is found by
    /// its key in the (calculation, state) index instead of by skipping rows, and only the page's items are read in full
    /// (reasons and evidence): a queue of tens of thousands costs a reviewer's screen one page.
    /// </summary>
    public Task<ReviewQueueSlice> QueuePageAsync(ReviewQueueKey? after, int take, int? studyId = null, CancellationToken ct = default) =>
        QueuePageAsync(after, take, studyId, CountLimit, ct);

    internal async Task<ReviewQueueSlice> QueuePageAsync(ReviewQueueKey? after, int take, int? studyId, int countLimit, CancellationToken ct)
    {
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(take);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(countLimit);
        await using var db = await factory.CreateDbContextAsync(ct);
        var q = db.ReactionStates.AsNoTracking()
            .Where(s => s.Kind == StateKind.SaddlePoint && s.SaddleCalculationId != null && !s.Reaction!.Retired && !s.Reaction.Study!.Retired
                        && !s.SaddleCalculation!.Retired
                        && (s.SaddleCalculation.ReviewState == ReviewState.AwaitingReview || s.SaddleCalculation.ReviewState == ReviewState.Reopened));
        if (studyId is { } sid) q = q.Where(s => s.Reaction!.StudyId == sid);
        var whole = take == int.MaxValue;
        var counted = whole ? -1 : await q.Take(countLimit + 1).CountAsync(ct);
        if (after is { } key)
            q = q.Where(s => s.SaddleCalculationId > key.CalculationId || (s.SaddleCalculationId == key.CalculationId && s.Id > key.StateId));
        var ordered = q.OrderBy(s => s.SaddleCalculationId).ThenBy(s => s.Id).AsQueryable();
        if (!whole) ordered = ordered.Take(take + 1); // one more than the page: tells whether a next page exists
        var rows = await ordered.Select(s => new
        {
            CalcId = s.SaddleCalculationId!.Value,
            CalcLabel = s.SaddleCalculation!.Label,
            s.SaddleCalculation.LevelOfTheory,
            StateId = s.Id,
            StateLabel = s.Label,
            s.ReactionId,
            ReactionLabel = s.Reaction!.Label,
            s.Reaction.StudyId,
            StudyName = s.Reaction.Study!.Name,
            s.SaddleCalculation.UploadedByUserId,
            UploaderName = db.Users.Where(u => u.Id == s.SaddleCalculation.UploadedByUserId).Select(u => u.DisplayName).FirstOrDefault(),
            s.SaddleCalculation.UploadedAt,
            // Reviewed before: a saddle-point calculation of the species has a review entry, i.e. a stored state other than
            // "awaiting review" (every entry leads elsewhere); read through the (species, kind) index, not the review history.
            Earlier = db.Calculations.Any(c => c.SpeciesId == s.SaddleCalculation.SpeciesId && c.Kind == CalculationKind.SaddlePoint
                                               && c.ReviewState != ReviewState.AwaitingReview),
        }).ToListAsync(ct);
        var more = !whole && rows.Count > take;
        if (more) rows.RemoveAt(rows.Count - 1);
        // The page's checks by their (unique) calculation index, in a second round trip: as a subquery of the page EF joins a
        // numbering of every check in the ledger instead.
        var calcIds = rows.Select(r => r.CalcId).Distinct().ToList();
        var checks = await db.FrequencyChecks.AsNoTracking().Where(c => EF.Parameter(calcIds).Contains(c.CalculationId))
            .Select(c => new { c.CalculationId, c.Verdict, c.ReasonsJson, c.EvidenceJson }).ToDictionaryAsync(c => c.CalculationId, ct);
        IReadOnlyList<ReviewQueueItem> items = [.. rows.Select(r => (Row: r, Check: checks.GetValueOrDefault(r.CalcId))).Select(x => new ReviewQueueItem(
            x.Row.CalcId, x.Row.CalcLabel, x.Row.LevelOfTheory, x.Row.StateId, x.Row.StateLabel, x.Row.ReactionId, x.Row.ReactionLabel, x.Row.StudyId, x.Row.StudyName,
            x.Row.UploadedByUserId, string.IsNullOrEmpty(x.Row.UploaderName) ? x.Row.UploadedByUserId : x.Row.UploaderName, x.Row.UploadedAt,
            x.Check?.Verdict, x.Check is null ? [] : DerivedJson.Read<List<CheckReason>>(x.Check.ReasonsJson),
            x.Check is null ? null : DerivedJson.Read<CheckEvidence>(x.Check.EvidenceJson), x.Row.Earlier))];
        return whole ? new ReviewQueueSlice(items, items.Count, false, null)
            : new ReviewQueueSlice(items, Math.Min(counted, countLimit), counted > countLimit, more ? new ReviewQueueKey(items[^1].CalculationId, items[^1].StateId) : null);
    }

    /// <summary>
    /// Signs off a saddle-point calculation. Throws <see cref="ReviewerRequiredException"/> for a non-reviewer, and
    /// <see cref="ArgumentException"/> when the saddle point failed its check and no comment says why it is accepted anyway.
    /// </summary>
    /// <param name="basis">What the reviewer saw; if the saddle point changed since, <see cref="ReviewConflictException"/> and nothing is
    /// recorded. Null only for callers that decide without a screen (tests, tools).</param>
    public Task<ReviewEntry> VerifyAsync(int calculationId, string reviewerUserId, string? comment, ReviewBasis? basis = null, CancellationToken ct = default) =>
        DecideAsync(calculationId, reviewerUserId, comment ?? "", ReviewOutcome.Verified, basis, ct);

    /// <summary>Returns a saddle-point calculation to its owner with a comment (required: the owner must learn what to fix).</summary>
    public Task<ReviewEntry> ReturnAsync(int calculationId, string reviewerUserId, string comment, ReviewBasis? basis = null, CancellationToken ct = default)
    {
        if (string.IsNullOrWhiteSpace(comment)) throw new ArgumentException("Say why the saddle point is returned, so its owner knows what to fix.", nameof(comment));
        return DecideAsync(calculationId, reviewerUserId, comment, ReviewOutcome.Returned, basis, ct);
    }

    /// <summary>Whether the user holds the Reviewer role (read from the store, not from a cookie).</summary>
    public async Task<bool> IsReviewerAsync(string userId, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        return await IsReviewerAsync(db, userId, ct);
    }

    private static Task<bool> IsReviewerAsync(LedgerDbContext db, string userId, CancellationToken ct) =>
        db.UserRoles.AnyAsync(ur => ur.UserId == userId && db.Roles.Any(r => r.Id == ur.RoleId && EF.Parameter(Roles.MayReview).Contains(r.Name!)), ct);

    private async Task<ReviewEntry> DecideAsync(int calculationId, string reviewerUserId, string comment, ReviewOutcome outcome, ReviewBasis? basis, CancellationToken ct)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(reviewerUserId);
        return await LedgerRetry.RunAsync(async token =>
        {
            await using var db = await factory.CreateDbContextAsync(token);
            await using var tx = await LedgerRetry.BeginWriteAsync(db, token);
            if (!await IsReviewerAsync(db, reviewerUserId, token))
                throw new ReviewerRequiredException("Only a reviewer can verify or return a saddle point; this account does not have the Reviewer role.");
            var calc = await db.Calculations.FirstOrDefaultAsync(c => c.Id == calculationId, token)
                ?? throw new ArgumentException($"Calculation {calculationId} does not exist.", nameof(calculationId));
            if (calc.Kind != CalculationKind.SaddlePoint)
                throw new ArgumentException($"Calculation '{calc.Label}' is a {calc.Kind.Words()} calculation, not a saddle point; only saddle points are reviewed.", nameof(calculationId));
            if (calc.Retired) throw new ArgumentException($"Calculation '{calc.Label}' is retired; restore it before reviewing it.", nameof(calculationId));
            if (outcome == ReviewOutcome.Verified && string.IsNullOrWhiteSpace(comment)
                && await db.FrequencyChecks.AnyAsync(c => c.CalculationId == calculationId && c.Verdict == Verdict.Failed, token))
                throw new ArgumentException($"Saddle point '{calc.Label}' failed its frequency check; verifying it needs a comment that says why it is accepted anyway.", nameof(comment));
            // Self-review (docs/ledger.md, "Who reviews"): verifying a saddle point one uploaded oneself needs a comment saying why
            // no other reviewer checked it; the history and audit then call it a self-review.
            var selfReview = outcome == ReviewOutcome.Verified && calc.UploadedByUserId == reviewerUserId;
            if (selfReview && string.IsNullOrWhiteSpace(comment))
                throw new ArgumentException($"You uploaded saddle point '{calc.Label}' yourself; verifying your own work needs a comment that says why no other reviewer checked it.", nameof(comment));
            var latest = await db.Reviews.Where(v => v.CalculationId == calculationId).OrderByDescending(v => v.Id)
                .Select(v => new { v.Id, v.Outcome, v.ReviewerUserId, v.At }).FirstOrDefaultAsync(token);
            var previous = (ReviewOutcome?)latest?.Outcome;
            if (basis is not null && (basis.Exact ? latest?.Id != basis.LatestReviewId : !ReviewStates.IsWaiting(ReviewStates.After(previous))))
            {
                var who = latest is null ? "someone" : await db.Users.Where(u => u.Id == latest.ReviewerUserId).Select(u => u.DisplayName ?? u.UserName).FirstOrDefaultAsync(token) ?? latest.ReviewerUserId;
                throw new ReviewConflictException(latest is null
                    ? $"Saddle point '{calc.Label}' changed while you were deciding; nothing was recorded. Reload to see it as it is now."
                    : $"Saddle point '{calc.Label}' was {latest.Outcome.ToString().ToLowerInvariant()} by {who} at {latest.At:yyyy-MM-dd HH:mm} UTC while you were deciding; nothing was recorded. Reload to see it as it is now.");
            }
            var review = new Review { CalculationId = calculationId, Outcome = outcome, Comment = comment.Trim(), ReviewerUserId = reviewerUserId, At = time.GetUtcNow() };
            await ReviewStates.RecordAsync(db, review, token);
            audit.Record(db, reviewerUserId, outcome == ReviewOutcome.Verified ? "review.verified" : "review.returned", nameof(Calculation), calculationId,
                $"Saddle point '{calc.Label}' {(outcome == ReviewOutcome.Verified ? selfReview ? "verified by its own uploader (self-review)" : "verified" : "returned")}" + (comment.Length > 0 ? $": {comment.Trim()}" : "."),
                before: ReviewStates.Text(ReviewStates.After(previous)), after: ReviewStates.Text(ReviewStates.After(outcome)));
            await db.SaveChangesAsync(token);
            await ReactionStatusSummary.RefreshForCalculationsAsync(db, [calculationId], token);
            await tx.CommitAsync(token);
            var name = await db.Users.Where(u => u.Id == reviewerUserId).Select(u => u.DisplayName).FirstOrDefaultAsync(token);
            return new ReviewEntry(review.Id, calculationId, calc.Label, outcome, review.Comment, reviewerUserId, string.IsNullOrEmpty(name) ? reviewerUserId : name, review.At);
        }, ct);
    }

    /// <summary>Every review of every saddle-point calculation of the state's species (newest first), so replaced ones stay visible.</summary>
    public async Task<IReadOnlyList<ReviewEntry>> HistoryAsync(int stateId, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        return await HistoryAsync(db, [stateId], ct) is var all && all.TryGetValue(stateId, out var list) ? list : [];
    }

    internal static async Task<Dictionary<int, List<ReviewEntry>>> HistoryAsync(LedgerDbContext db, IReadOnlyCollection<int> stateIds, CancellationToken ct)
    {
        var species = await db.ReactionStates.AsNoTracking().Where(s => stateIds.Contains(s.Id) && s.SaddleCalculationId != null)
            .Select(s => new { s.Id, s.SaddleCalculation!.SpeciesId }).ToListAsync(ct);
        var speciesIds = species.Select(s => s.SpeciesId).Distinct().ToList();
        var reviews = await db.Reviews.AsNoTracking().Where(v => speciesIds.Contains(v.Calculation!.SpeciesId))
            .OrderByDescending(v => v.Id)
            .Select(v => new
            {
                v.Calculation!.SpeciesId,
                Entry = new ReviewEntry(v.Id, v.CalculationId, v.Calculation.Label, v.Outcome, v.Comment, v.ReviewerUserId,
                    db.Users.Where(u => u.Id == v.ReviewerUserId).Select(u => u.DisplayName).FirstOrDefault() ?? v.ReviewerUserId, v.At),
            }).ToListAsync(ct);
        return species.ToDictionary(s => s.Id, s => reviews.Where(r => r.SpeciesId == s.SpeciesId).Select(r => r.Entry).ToList());
    }
}
