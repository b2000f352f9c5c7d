namespace BarrierLedger.Ledger.Uploads;

/// <summary>Where an issue was found: file, 1-based line or JSON path (any may be absent), and what is wrong.</summary>
public sealed record UploadIssue(string FileName, int? Line, string? JsonPath, string Message, bool IsError = true)
{
    public override string ToString()
    {
        var where = FileName;
        if (Line is { } l) where += $":{l}";
        if (!string.IsNullOrEmpty(JsonPath)) where += $" {JsonPath}";
        return $"{where}: {(IsError ? "error" : "warning")}: {Message}";
    }
}
