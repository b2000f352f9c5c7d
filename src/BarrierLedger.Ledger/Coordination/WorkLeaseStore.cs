using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Coordination;

/// <summary>How long a lease lasts without renewal, and how often a waiting instance looks at it.</summary>
public sealed class WorkLeaseOptions
{
    /// <summary>A holder that stops renewing (crashed, killed) loses the lease after this long.</summary>
    public TimeSpan Ttl { get; set; } = TimeSpan.FromSeconds(60);

    /// <summary>How often the holder renews and writes progress, and how often the others read it.</summary>
    public TimeSpan Interval { get; set; } = TimeSpan.FromSeconds(2);
}

/// <summary>Progress the holder writes into its lease row.</summary>
public readonly record struct LeaseProgress(string Phase, int Done, int Total, int Secondary);

/// <summary>
/// Leases on background work in the ledger database, shared by every app instance on it. Each step is one statement
/// (a conditional UPDATE through EF's ExecuteUpdate), so it is atomic on SQLite (one writer at a time) and on PostgreSQL
/// (the row lock makes a second UPDATE re-check its WHERE against the first one's result).
/// </summary>
public sealed class WorkLeaseStore(IDbContextFactory<LedgerDbContext> factory, WorkLeaseOptions options, TimeProvider time)
{
    public WorkLeaseOptions Options => options;

    /// <summary>A name for this process as a lease holder: host, process id and a random tag.</summary>
    public static string NewHolderId() => $"{Environment.MachineName}/{Environment.ProcessId}/{Guid.NewGuid().ToString("N")[..8]}";

    private long Now => time.GetUtcNow().ToUnixTimeMilliseconds();

    /// <summary>Records one more request for the work and returns its serial number.</summary>
    public async Task<long> RequestAsync(string name, CancellationToken ct = default)
    {
        await EnsureAsync(name, ct);
        return await LedgerRetry.RunAsync(async token =>
        {
            await using var db = await factory.CreateDbContextAsync(token);
            await using var tx = await db.Database.BeginTransactionAsync(token);
            await db.WorkLeases.Where(l => l.Name == name).ExecuteUpdateAsync(s => s.SetProperty(l => l.RequestSerial, l => l.RequestSerial + 1), token);
            var serial = await db.WorkLeases.Where(l => l.Name == name).Select(l => l.RequestSerial).SingleAsync(token);
            await tx.CommitAsync(token);
            return serial;
        }, ct);
    }

    /// <summary>Takes the lease when it is free, expired, or already ours; false when another live instance holds it.</summary>
    public async Task<bool> TryAcquireAsync(string name, string holder, CancellationToken ct = default)
    {
        await EnsureAsync(name, ct);
        var now = Now;
        var until = now + (long)options.Ttl.TotalMilliseconds;
        var rows = await LedgerRetry.RunAsync(async token =>
        {
            await using var db = await factory.CreateDbContextAsync(token);
            return await db.WorkLeases
                .Where(l => l.Name == name && (l.Holder == null || l.Holder == holder || l.ExpiresAtUnixMs < now))
                .ExecuteUpdateAsync(s => s
                    .SetProperty(l => l.Holder, holder)
                    .SetProperty(l => l.ExpiresAtUnixMs, until)
                    .SetProperty(l => l.Error, (string?)null), token);
        }, ct);
        return rows == 1;
    }

    /// <summary>Extends our lease and writes our progress; false when the lease is no longer ours (it expired and was taken).</summary>
    public async Task<bool> RenewAsync(string name, string holder, LeaseProgress progress, CancellationToken ct = default)
    {
        var until = Now + (long)options.Ttl.TotalMilliseconds;
        var rows = await LedgerRetry.RunAsync(async token =>
        {
            await using var db = await factory.CreateDbContextAsync(token);
            return await db.WorkLeases
                .Where(l => l.Name == name && l.Holder == holder)
                .ExecuteUpdateAsync(s => s
                    .SetProperty(l => l.ExpiresAtUnixMs, until)
                    .SetProperty(l => l.Phase, progress.Phase)
                    .SetProperty(l => l.Done, progress.Done)
                    .SetProperty(l => l.Total, progress.Total)
                    .SetProperty(l => l.Secondary, progress.Secondary), token);
        }, ct);
        return rows == 1;
    }

    /// <summary>
    /// Gives the lease up after a pass that began when the request serial was <paramref name="coveredSerial"/>, recording
    /// the pass's outcome. Refuses (false, lease kept) when requests arrived meanwhile, so the holder runs once more
    /// instead of leaving them to nobody.
    /// </summary>
    public async Task<bool> TryReleaseAsync(string name, string holder, long coveredSerial, LeaseProgress final, string? error, CancellationToken ct = default)
    {
        var now = Now;
        var rows = await LedgerRetry.RunAsync(async token =>
        {
            await using var db = await factory.CreateDbContextAsync(token);
            return await db.WorkLeases
                .Where(l => l.Name == name && l.Holder == holder && l.RequestSerial == coveredSerial)
                .ExecuteUpdateAsync(s => s
                    .SetProperty(l => l.Holder, (string?)null)
                    .SetProperty(l => l.ExpiresAtUnixMs, 0L)
                    .SetProperty(l => l.CompletedSerial, coveredSerial)
                    .SetProperty(l => l.Phase, final.Phase)
                    .SetProperty(l => l.Done, final.Done)
                    .SetProperty(l => l.Total, final.Total)
                    .SetProperty(l => l.Secondary, final.Secondary)
                    .SetProperty(l => l.FinishedAtUnixMs, now)
                    .SetProperty(l => l.Error, error), token);
        }, ct);
        return rows == 1;
    }

    /// <summary>Gives the lease up without a pass (there was nothing left to do); false when it is not ours or work is pending.</summary>
    public async Task<bool> TryReleaseUnusedAsync(string name, string holder, CancellationToken ct = default)
    {
        var rows = await LedgerRetry.RunAsync(async token =>
        {
            await using var db = await factory.CreateDbContextAsync(token);
            return await db.WorkLeases
                .Where(l => l.Name == name && l.Holder == holder && l.RequestSerial == l.CompletedSerial)
                .ExecuteUpdateAsync(s => s.SetProperty(l => l.Holder, (string?)null).SetProperty(l => l.ExpiresAtUnixMs, 0L), token);
        }, ct);
        return rows == 1;
    }

    /// <summary>The lease row as stored now (null before anyone asked for the work).</summary>
    public async Task<WorkLease?> ReadAsync(string name, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        return await db.WorkLeases.AsNoTracking().SingleOrDefaultAsync(l => l.Name == name, ct);
    }

    /// <summary>Whether the row says a live instance other than <paramref name="holder"/> holds the lease.</summary>
    public bool HeldByOther(WorkLease lease, string holder) =>
        lease.Holder is { } h && h != holder && lease.ExpiresAtUnixMs >= Now;

    private async Task EnsureAsync(string name, CancellationToken ct)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        if (await db.WorkLeases.AnyAsync(l => l.Name == name, ct)) return;
        db.WorkLeases.Add(new WorkLease { Name = name });
        try
        {
            await db.SaveChangesAsync(ct);
        }
        catch (DbUpdateException)
        {
            // Another instance inserted it first (primary-key clash) or the store was busy: either way the row exists
            // now or the next statement's retry will find it.
            await using var check = await factory.CreateDbContextAsync(ct);
            if (!await check.WorkLeases.AnyAsync(l => l.Name == name, ct)) throw;
        }
    }
}
