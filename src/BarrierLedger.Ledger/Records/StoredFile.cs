namespace BarrierLedger.Ledger.Records;

/// <summary>An original uploaded file, byte for byte, addressed by its SHA-256 (stored once however often it is named).</summary>
public class StoredFile
{
    public int Id { get; set; }
    /// <summary>Lower-case hex SHA-256 of <see cref="Content"/>.</summary>
    public string Sha256 { get; set; } = "";
    public string FileName { get; set; } = "";
    public long SizeBytes { get; set; }
    public byte[] Content { get; set; } = [];
    public string UploadedByUserId { get; set; } = "";
    public DateTimeOffset UploadedAt { get; set; }
}
