using BarrierLedger.Ledger.Coordination;
using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Derivation;

/// <summary>Where a recompute pass stands.</summary>
/// <param name="Running">Whether a pass is under way (here or, when <paramref name="Elsewhere"/>, on another instance).</param>
/// <param name="Phase">What it is doing, in words.</param>
/// <param name="Done">Reactions derived so far in this pass.</param>
/// <param name="Total">Reactions in this pass (0 until known).</param>
/// <param name="ChecksRun">Frequency checks re-run in this pass.</param>
/// <param name="Error">The last pass's failure, if it failed.</param>
/// <param name="Elsewhere">The figures are another app instance's, read from the database (it holds the recompute lease).</param>
public sealed record RecomputeProgress(bool Running, string Phase, int Done, int Total, int ChecksRun, DateTimeOffset? FinishedAt, string? Error, bool Elsewhere = false)
{
    public static RecomputeProgress Idle { get; } = new(false, "idle", 0, 0, 0, null, null);
    public double Fraction => Total == 0 ? (Running ? 0 : 1) : (double)Done / Total;
}

/// <summary>
/// Recomputes derived values (frequency checks whose fingerprint changed, and every reaction's pathway energies) for one
/// study or all, in the background, one write transaction per study, reporting progress. Requests made while a pass runs
/// are folded into one more pass. Singleton.
/// Several app instances on one database share the work through the "recompute" <see cref="WorkLease"/>: only the holder
/// runs a pass and writes its progress into the lease row; another instance that is asked for a pass records the request
/// there, shows "recompute running on another instance" with the holder's figures, and is done when the holder's pass
/// covers its request. A holder that dies stops renewing; once its lease expires the next instance takes it over.
/// </summary>
public sealed class RecomputeService(IDbContextFactory<LedgerDbContext> factory, DerivationService derivation, WorkLeaseStore leases, TimeProvider time)
{
    public const string LeaseName = "recompute";

    private readonly Lock _gate = new();
    private Task _running = Task.CompletedTask;
    private readonly HashSet<int?> _pending = [];
    private int _passes;

    public RecomputeProgress Current { get; private set; } = RecomputeProgress.Idle;

    /// <summary>This instance's name as a lease holder.</summary>
    public string InstanceId { get; } = WorkLeaseStore.NewHolderId();

    /// <summary>Background passes this instance ran while holding the lease.</summary>
    public int PassesRun => Volatile.Read(ref _passes);

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

    /// <summary>
    /// Asks for a pass over every study whose stored values were derived under another model fingerprint than the one now in
    /// force (an energy model changed while no instance ran, or this version derives more than the one that stored them), so
    /// nothing stays marked out of date after an upgrade. Returns how many studies were asked for.
    /// </summary>
    public async Task<int> RequestOutdatedAsync(CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        var stored = await db.Reactions.AsNoTracking().Where(r => !r.Retired && r.Derivation != null)
            .Select(r => new { r.StudyId, r.Derivation!.ModelFingerprint }).Distinct().ToListAsync(ct);
        var outdated = new List<int>();
        foreach (var g in stored.GroupBy(x => x.StudyId))
        {
            var (model, _) = await DerivationService.EffectiveModelAsync(db, g.Key, ct);
            if (g.Any(x => x.ModelFingerprint != model.Fingerprint)) outdated.Add(g.Key);
        }
        foreach (var id in outdated) _ = Request(id);
        return outdated.Count;
    }

    /// <summary>Waits for the background passes requested so far.</summary>
    public Task WhenIdleAsync()
    {
        lock (_gate) return _running;
    }

    /// <summary>
    /// The progress to show: this instance's own pass while it runs one, else what the database says (another instance's
    /// pass under way, or a pass finished later than the last one seen here).
    /// </summary>
    public async Task<RecomputeProgress> GetProgressAsync(CancellationToken ct = default)
    {
        var local = Current;
        if (local.Running && !local.Elsewhere) return local;
        var lease = await leases.ReadAsync(LeaseName, ct);
        if (lease is null) return local;
        if (leases.HeldByOther(lease, InstanceId)) return FromLease(lease, elsewhere: true);
        if (lease.Holder is null && lease.FinishedAtUnixMs is { } f && (local.FinishedAt is null || local.FinishedAt.Value.ToUnixTimeMilliseconds() < f))
            return FromLease(lease, elsewhere: false);
        return local;
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
                await RunUnderLeaseAsync(batch.Contains(null) ? null : [.. batch.Select(b => b!.Value)]);
            }
            catch (Exception ex)
            {
                Publish(Current with { Running = false, Phase = "failed", Error = ex.Message, FinishedAt = time.GetUtcNow(), Elsewhere = false });
            }
        }
    }

    private async Task RunUnderLeaseAsync(IReadOnlyCollection<int>? scope)
    {
        var serial = await leases.RequestAsync(LeaseName);
        while (true)
        {
            var lease = await leases.ReadAsync(LeaseName);
            if (lease is not null && lease.CompletedSerial >= serial)
            {
                Publish(FromLease(lease, elsewhere: false)); // a pass that began after our request was recorded covered it
                return;
            }
            if (await leases.TryAcquireAsync(LeaseName, InstanceId))
            {
                await RunAsHolderAsync(scope, serial);
                return;
            }
            lease = await leases.ReadAsync(LeaseName);
            if (lease is not null && leases.HeldByOther(lease, InstanceId)) Publish(FromLease(lease, elsewhere: true));
            await Task.Delay(leases.Options.Interval, time);
        }
    }

    private async Task RunAsHolderAsync(IReadOnlyCollection<int>? scope, long serial)
    {
        while (true)
        {
            var lease = await leases.ReadAsync(LeaseName) ?? throw new InvalidOperationException("The recompute lease row vanished.");
            var covered = lease.RequestSerial;
            if (lease.CompletedSerial >= serial && covered == lease.CompletedSerial)
            {
                // The previous holder finished a pass covering our request between our look and our acquire.
                if (await leases.TryReleaseUnusedAsync(LeaseName, InstanceId))
                {
                    Publish(FromLease(lease, elsewhere: false));
                    return;
                }
                continue;
            }
            // Requests besides ours are pending (made on another instance, or left by a holder that died): their scope is
            // not recorded, so this pass takes every study.
            if (covered - lease.CompletedSerial > 1) scope = null;

            using var passCts = new CancellationTokenSource();
            using var beatCts = new CancellationTokenSource();
            var lost = false;
            var beat = HeartbeatAsync(() => { lost = true; passCts.Cancel(); }, beatCts.Token);
            RecomputeProgress final;
            string? error = null;
            try
            {
                Interlocked.Increment(ref _passes);
                final = await RecomputeAsync(scope, passCts.Token);
            }
            catch (OperationCanceledException) when (lost)
            {
                Publish(Current with { Running = false, Phase = "stopped", Error = "Another instance took over the recompute lease (this one did not renew it in time); it runs the pass.", FinishedAt = time.GetUtcNow() });
                return;
            }
            catch (Exception ex)
            {
                error = ex.Message;
                final = Current with { Running = false, Phase = "failed", Error = ex.Message, FinishedAt = time.GetUtcNow() };
                Publish(final);
            }
            finally
            {
                await beatCts.CancelAsync();
                await beat;
            }
            if (await leases.TryReleaseAsync(LeaseName, InstanceId, covered, new LeaseProgress(final.Phase, final.Done, final.Total, final.ChecksRun), error))
                return;
            var now = await leases.ReadAsync(LeaseName);
            if (now?.Holder != InstanceId) return; // taken over while we finished; the new holder runs what is pending
            scope = null; // requests arrived during the pass: one more pass over everything, still holding the lease
        }
    }

    /// <summary>Renews the lease and writes the current figures into it every interval until stopped; reports a lost lease.</summary>
    private async Task HeartbeatAsync(Action onLost, CancellationToken stop)
    {
        while (true)
        {
            try
            {
                await Task.Delay(leases.Options.Interval, time, stop);
                var p = Current;
                if (!await leases.RenewAsync(LeaseName, InstanceId, new LeaseProgress(p.Phase, p.Done, p.Total, p.ChecksRun), stop))
                {
                    onLost();
                    return;
                }
            }
            catch (OperationCanceledException)
            {
                return;
            }
            catch (Exception)
            {
                // SQLite busy (our own pass holds the write lock for a whole study) or the store briefly unreachable: try at
                // the next beat. If the lease expires meanwhile and another instance takes it, that renewal reports it lost.
            }
        }
    }

    private static RecomputeProgress FromLease(WorkLease lease, bool elsewhere) => new(
        Running: elsewhere,
        Phase: elsewhere ? $"recompute running on another instance: {lease.Phase}" : lease.Phase,
        Done: lease.Done,
        Total: lease.Total,
        ChecksRun: lease.Secondary,
        FinishedAt: lease.FinishedAtUnixMs is { } f ? DateTimeOffset.FromUnixTimeMilliseconds(f) : null,
        Error: lease.Error,
        Elsewhere: elsewhere);

    /// <summary>Runs a pass now over the given studies (all live studies when null) and returns the final progress. This is
    /// the pass itself, without the lease: <see cref="Request"/> is the way in for anything that may run on several instances.</summary>
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
