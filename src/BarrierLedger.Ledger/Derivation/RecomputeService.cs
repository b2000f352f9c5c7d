using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Derivation;

/// <summary>Where a recompute pass stands.</summary>
/// <param name="Running">Whether a pass is under way.</param>
/// <param name="Phase">What it is doing, in words.</param>
/// <param name="Done">Reactions derived so far in this pass.</param>
/// <param name="Total">Reactions in this pass (0 until known).</param>
/// <param name="ChecksRun">Frequency checks re-run in this pass.</param>
/// <param name="Error">The last pass's failure, if it failed.</param>
public sealed record RecomputeProgress(bool Running, string Phase, int Done, int Total, int ChecksRun, DateTimeOffset? FinishedAt, string? Error)
{
    public static RecomputeProgress Idle { get; } = new(false, "idle", 0, 0, 0, null, null);
    public double Fraction => Total == 0 ? (Running ? 0 : 1) : (double)Done / Total;
}

/// <summary>
/// Recomputes derived values (frequency checks whose fingerprint changed, and every reaction's pathway energies) for one
/// study or all, in the background, one write transaction per study, reporting progress. Requests made while a pass runs
/// are folded into one more pass. Singleton.
/// </summary>
public sealed class RecomputeService(IDbContextFactory<LedgerDbContext> factory, DerivationService derivation, TimeProvider time)
{
    private readonly Lock _gate = new();
    private Task _running = Task.CompletedTask;
    private readonly HashSet<int?> _pending = [];

    public RecomputeProgress Current { get; private set; } = RecomputeProgress.Idle;

    /// <summary>Raised on every progress change (from a background thread).</summary>
    public event Action<RecomputeProgress>? ProgressChanged;

    /// <summary>Asks for a background pass over one study (or all, when null). Returns the task of the pass that will include it.</summary>
    public Task Request(int? studyId = null)
    {
        lock (_gate)
        {
            _pending.Add(studyId);
            if (_running.IsCompleted) _running = Task.Run(DrainAsync);
            return _running;
        }
    }

    /// <summary>Waits for the background passes requested so far.</summary>
    public Task WhenIdleAsync()
    {
        lock (_gate) return _running;
    }

    private async Task DrainAsync()
    {
        while (true)
        {
            int?[] batch;
            lock (_gate)
            {
                if (_pending.Count == 0) return;
                batch = [.. _pending];
                _pending.Clear();
            }
            try
            {
                await RecomputeAsync(batch.Contains(null) ? null : [.. batch.Select(b => b!.Value)], CancellationToken.None);
            }
            catch (Exception ex)
            {
                Publish(Current with { Running = false, Phase = "failed", Error = ex.Message, FinishedAt = time.GetUtcNow() });
            }
        }
    }

    /// <summary>Runs a pass now over the given studies (all live studies when null) and returns the final progress.</summary>
    public async Task<RecomputeProgress> RecomputeAsync(IReadOnlyCollection<int>? studyIds = null, CancellationToken ct = default)
    {
        List<int> studies;
        int total;
        await using (var db = await factory.CreateDbContextAsync(ct))
        {
            studies = studyIds is null ? await db.Studies.Where(s => !s.Retired).Select(s => s.Id).ToListAsync(ct) : [.. studyIds];
            total = await db.Reactions.CountAsync(r => !r.Retired && studies.Contains(r.StudyId), ct);
        }
        Publish(new RecomputeProgress(true, "starting", 0, total, 0, null, null));
        var done = 0;
        var checks = 0;
        foreach (var studyId in studies)
        {
            var before = done;
            await LedgerRetry.RunAsync(async token =>
            {
                done = before;
                await using var db = await factory.CreateDbContextAsync(token);
                await using var tx = await LedgerRetry.BeginWriteAsync(db, token);
                var (model, _) = await DerivationService.EffectiveModelAsync(db, studyId, token);
                Publish(Current with { Phase = $"checking saddle points (study {studyId})" });
                checks += await derivation.RefreshChecksAsync(db, model, [studyId], null, force: false, token);
                Publish(Current with { Phase = $"deriving energies (study {studyId})", ChecksRun = checks });
                var n = await derivation.DeriveAsync(db, model, [studyId], null, (d, _) => Publish(Current with { Done = before + d }), token);
                // Re-checked saddle points updated their reactions' status already; the pass also fills in a status never computed.
                await ReactionStatusSummary.FillMissingAsync(db, studyId, token);
                await tx.CommitAsync(token);
                done = before + n;
                return n;
            }, ct);
        }
        var final = new RecomputeProgress(false, "done", done, total, checks, time.GetUtcNow(), null);
        Publish(final);
        return final;
    }

    private void Publish(RecomputeProgress p)
    {
        Current = p;
        ProgressChanged?.Invoke(p);
    }
}
