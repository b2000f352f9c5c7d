namespace BarrierLedger.Ledger.Records;

/// <summary>One stored upload (all its records were written in one transaction).</summary>
public class Upload
{
    public int Id { get; set; }
    /// <summary>Caller-chosen or generated key; unique, so a retried store cannot write the same upload twice.</summary>
    public string Key { get; set; } = "";
    public int StudyId { get; set; }
    public string UploaderUserId { get; set; } = "";
    public DateTimeOffset At { get; set; }
    public string Summary { get; set; } = "";
}
