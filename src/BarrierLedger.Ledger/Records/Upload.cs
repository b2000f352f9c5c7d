namespace BarrierLedger.Ledger.Records;

/// <summary>One stored upload (all its records were written in one transaction).</summary>
public class Upload
{
    public int Id { get; set; }
    /// <summary>
    /// Caller-chosen or generated key; unique per uploader, so a retried store cannot write the same upload twice, and one
    /// user's key never answers for another's upload.
    /// </summary>
    public string Key { get; set; } = "";
    /// <summary>
    /// SHA-256 (hex) over the files and choices stored under <see cref="Key"/> (<see cref="Uploads.UploadFingerprint"/>): the same
    /// key sent again with other content is refused, not taken for a retry. Null for uploads stored before it was kept.
    /// </summary>
    public string? ContentSha256 { get; set; }
    public int StudyId { get; set; }
    public string UploaderUserId { get; set; } = "";
    public DateTimeOffset At { get; set; }
    public string Summary { get; set; } = "";
}
