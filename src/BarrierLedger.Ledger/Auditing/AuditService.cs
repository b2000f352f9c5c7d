using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Auditing;

/// <summary>One audit entry as shown to people.</summary>
public sealed record AuditEntry(long Id, DateTimeOffset At, string UserId, string UserName, string Action, string EntityType, string EntityId,
    string Summary, string? Before, string? After);

/// <summary>Writes audit events inside the caller's transaction and reads the trail back.</summary>
public sealed class AuditService(IDbContextFactory<LedgerDbContext> factory, TimeProvider time)
{
    /// <summary>Adds an event to <paramref name="db"/>; it is saved with the caller's other changes (same transaction).</summary>
    public AuditEvent Record(LedgerDbContext db, string userId, string action, string entityType, object entityId, string summary,
        string? before = null, string? after = null)
    {
        var e = new AuditEvent
        {
            At = time.GetUtcNow(), UserId = userId, Action = action, EntityType = entityType,
            EntityId = Convert.ToString(entityId, System.Globalization.CultureInfo.InvariantCulture) ?? "",
            Summary = summary, Before = before, After = after,
        };
        db.AuditEvents.Add(e);
        return e;
    }

    /// <summary>Records one event on its own (no other change goes with it, e.g. a download), saved at once.</summary>
    public async Task RecordAsync(string userId, string action, string entityType, object entityId, string summary, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        Record(db, userId, action, entityType, entityId, summary);
        await db.SaveChangesAsync(ct);
    }

    /// <summary>The newest events first, optionally for one record.</summary>
    public async Task<IReadOnlyList<AuditEntry>> GetEventsAsync(string? entityType = null, string? entityId = null, int take = 200, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        var q = db.AuditEvents.AsNoTracking();
        if (entityType is not null) q = q.Where(e => e.EntityType == entityType);
        if (entityId is not null) q = q.Where(e => e.EntityId == entityId);
        return await EntriesAsync(db, q, take, ct);
    }

    /// <summary>The newest events first about any of <paramref name="entityTypes"/> (e.g. accounts and backups, for the admins).</summary>
    public async Task<IReadOnlyList<AuditEntry>> GetEventsAsync(IReadOnlyCollection<string> entityTypes, int take, CancellationToken ct = default)
    {
        var types = entityTypes.ToArray();
        await using var db = await factory.CreateDbContextAsync(ct);
        return await EntriesAsync(db, db.AuditEvents.AsNoTracking().Where(e => types.Contains(e.EntityType)), take, ct);
    }

    private static async Task<IReadOnlyList<AuditEntry>> EntriesAsync(LedgerDbContext db, IQueryable<AuditEvent> q, int take, CancellationToken ct) =>
        await q.OrderByDescending(e => e.Id).Take(take)
            .Select(e => new AuditEntry(e.Id, e.At, e.UserId,
                db.Users.Where(u => u.Id == e.UserId).Select(u => u.DisplayName != "" ? u.DisplayName : u.UserName).FirstOrDefault() ?? e.UserId,
                e.Action, e.EntityType, e.EntityId, e.Summary, e.Before, e.After))
            .ToListAsync(ct);
}
