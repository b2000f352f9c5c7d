namespace BarrierLedger.Core.Formats;

/// <summary>How serious a reading problem is.</summary>
public enum IssueSeverity
{
    /// <summary>The input cannot be used as it stands.</summary>
    Error,
    /// <summary>The input was read, but something in it deserves a look.</summary>
    Warning,
}

/// <summary>
/// One problem found while reading a file: where it is (file name, 1-based line for text formats,
/// JSON path for JSON formats) and what was found versus what was expected.
/// </summary>
public sealed record ReadIssue(IssueSeverity Severity, string FileName, int? Line, string? JsonPath, string Message)
{
    public bool IsError => Severity == IssueSeverity.Error;

    /// <summary>"water.xyz:14: error: ..." or "run.json $.molecule.geometry[4]: warning: ...".</summary>
    public override string ToString()
    {
        var where = FileName;
        if (Line is { } l) where += $":{l}";
        if (!string.IsNullOrEmpty(JsonPath)) where += $" {JsonPath}";
        var sev = Severity == IssueSeverity.Error ? "error" : "warning";
        return $"{where}: {sev}: {Message}";
    }
}
