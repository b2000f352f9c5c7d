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

    /// <summary>The newest events first, optionally for one record.</summary>
    public async Task<IReadOnlyList<AuditEntry>> GetEventsAsync(string? entityType = null, string? entityId = null, int take = 200, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        var q = db.AuditEvents.AsNoTracking();
        if (entityType is not null) q = q.Where(e => e.EntityType == entityType);
        if (entityId is not null) q = q.Where(e => e.EntityId == entityId);
        return await q.OrderByDescending(e => e.Id).Take(take)
            .Select(e => new AuditEntry(e.Id, e.At, e.UserId,
                db.Users.Where(u => u.Id == e.UserId).Select(u => u.DisplayName != "" ? u.DisplayName : u.UserName).FirstOrDefault() ?? e.UserId,
                e.Action, e.EntityType, e.EntityId, e.Summary, e.Before, e.After))
            .ToListAsync(ct);
    }
}
