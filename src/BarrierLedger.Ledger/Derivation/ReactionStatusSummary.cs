using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Reviews;
using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Derivation;

/// <summary>A reaction's status as the ledger lists it: how many saddle points, their worst check verdict and their review status.</summary>
internal sealed record ReactionStatus(int SaddlePointCount, Verdict? Verdict, ReviewState? ReviewStatus)
{
    public static ReactionStatus None { get; } = new(0, null, null);

    /// <summary>
    /// The rule: without saddle points there is no verdict and no review. Otherwise the verdict is the worst of the saddle
    /// points' checks (a saddle point never checked counts as failed: nothing shows it is one); the review state is
    /// <see cref="ReviewStates.Combine"/> of the saddle points' states.
    /// </summary>
    public static ReactionStatus Of(IReadOnlyCollection<(Verdict? Verdict, ReviewOutcome? LatestReview)> saddles)
    {
        if (saddles.Count == 0) return None;
        var verdict = saddles.Any(s => s.Verdict is null or Core.Checks.Verdict.Failed) ? Core.Checks.Verdict.Failed
            : saddles.Any(s => s.Verdict == Core.Checks.Verdict.NeedsAttention) ? Core.Checks.Verdict.NeedsAttention : Core.Checks.Verdict.Passed;
        return new ReactionStatus(saddles.Count, verdict, ReviewStates.Combine([.. saddles.Select(s => ReviewStates.After(s.LatestReview))]));
    }
}

/// <summary>
/// Keeps <see cref="Reaction.SaddlePointCount"/>, <see cref="Reaction.CheckVerdict"/> and <see cref="Reaction.ReviewStatus"/> equal to
/// what the reaction's saddle-point states, their frequency checks and their latest reviews say. Every workflow that changes one of
/// those calls it inside its own transaction (upload and re-derivation, the recompute pass, verify and return), so the ledger lists a
/// study by reading one row per reaction instead of every saddle point's check and review history.
/// </summary>
internal static class ReactionStatusSummary
{
    /// <summary>The status of each given reaction, computed from its states, checks and reviews (reactions without saddle points included).</summary>
    public static async Task<Dictionary<int, ReactionStatus>> ComputeAsync(LedgerDbContext db, IReadOnlyCollection<int> reactionIds, CancellationToken ct)
    {
        var result = reactionIds.Distinct().ToDictionary(id => id, _ => ReactionStatus.None);
        if (result.Count == 0) return result;
        var ids = result.Keys.ToList();
        var saddles = await db.ReactionStates.AsNoTracking()
            .Where(s => EF.Parameter(ids).Contains(s.ReactionId) && s.Kind == StateKind.SaddlePoint)
            .Select(s => new
            {
                s.ReactionId,
                Verdict = db.FrequencyChecks.Where(c => c.CalculationId == s.SaddleCalculationId).Select(c => (Verdict?)c.Verdict).FirstOrDefault(),
                Latest = db.Reviews.Where(v => v.CalculationId == s.SaddleCalculationId).OrderByDescending(v => v.Id).Select(v => (ReviewOutcome?)v.Outcome).FirstOrDefault(),
            }).ToListAsync(ct);
        foreach (var g in saddles.GroupBy(s => s.ReactionId))
            result[g.Key] = ReactionStatus.Of([.. g.Select(s => (s.Verdict, s.Latest))]);
        return result;
    }

    /// <summary>Recomputes and stores the status of the given reactions (retired ones too: they keep an honest status for restore).</summary>
    public static async Task RefreshAsync(LedgerDbContext db, IReadOnlyCollection<int> reactionIds, CancellationToken ct)
    {
        var statuses = await ComputeAsync(db, reactionIds, ct);
        if (statuses.Count == 0) return;
        var all = statuses.Keys.ToList();
        var stored = await db.Reactions.AsNoTracking().Where(r => EF.Parameter(all).Contains(r.Id))
            .Select(r => new { r.Id, r.SaddlePointCount, r.CheckVerdict, r.ReviewStatus }).ToListAsync(ct);
        var same = stored.Where(r => r.SaddlePointCount is { } n && statuses[r.Id] == new ReactionStatus(n, r.CheckVerdict, r.ReviewStatus))
            .Select(r => r.Id).ToHashSet();
        // Only what changed is written: one UPDATE per distinct status (a handful), not one per reaction; each id list goes as one array parameter (EF.Parameter),
        // not as one SQL parameter per id (EF 10's default), which is slow to prepare and capped in count.
        foreach (var group in statuses.Where(s => !same.Contains(s.Key)).GroupBy(s => s.Value, s => s.Key))
        {
            var (count, verdict, review) = (group.Key.SaddlePointCount, group.Key.Verdict, group.Key.ReviewStatus);
            var ids = group.ToList();
            await db.Reactions.Where(r => EF.Parameter(ids).Contains(r.Id)).ExecuteUpdateAsync(u => u
                .SetProperty(r => r.SaddlePointCount, count)
                .SetProperty(r => r.CheckVerdict, verdict)
                .SetProperty(r => r.ReviewStatus, review), ct);
        }
    }

    /// <summary>
    /// Computes and stores the status of the reactions (of one study, or all) that have none yet: rows stored before the summary
    /// existed, e.g. in a restored backup. Run at start-up after the migrations and by every recompute pass.
    /// </summary>
    public static async Task FillMissingAsync(LedgerDbContext db, int? studyId, CancellationToken ct)
    {
        var q = db.Reactions.Where(r => r.SaddlePointCount == null);
        if (studyId is { } id) q = q.Where(r => r.StudyId == id);
        var missing = await q.Select(r => r.Id).ToListAsync(ct);
        if (missing.Count > 0) await RefreshAsync(db, missing, ct);
    }

    /// <summary>Recomputes and stores the status of every reaction whose saddle-point states use one of these calculations.</summary>
    public static async Task RefreshForCalculationsAsync(LedgerDbContext db, IReadOnlyCollection<int> calculationIds, CancellationToken ct)
    {
        if (calculationIds.Count == 0) return;
        var ids = calculationIds.Distinct().ToList();
        var reactions = await db.ReactionStates.Where(s => s.SaddleCalculationId != null && EF.Parameter(ids).Contains(s.SaddleCalculationId.Value))
            .Select(s => s.ReactionId).Distinct().ToListAsync(ct);
        await RefreshAsync(db, reactions, ct);
    }
}
