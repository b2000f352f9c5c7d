namespace BarrierLedger.Ledger.Records;

/// <summary>Who did what, when, to which record, with a before/after summary.</summary>
public class AuditEvent
{
    public long Id { get; set; }
    public DateTimeOffset At { get; set; }
    public string UserId { get; set; } = "";
    /// <summary>Stable action code, e.g. "upload.stored", "review.verified", "record.retired".</summary>
    public string Action { get; set; } = "";
    public string EntityType { get; set; } = "";
    public string EntityId { get; set; } = "";
    public string Summary { get; set; } = "";
    public string? Before { get; set; }
    public string? After { get; set; }
}
