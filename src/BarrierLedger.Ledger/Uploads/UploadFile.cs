namespace BarrierLedger.Ledger.Uploads;

/// <summary>One file as the user gave it.</summary>
public sealed record UploadFile(string FileName, byte[] Content);
