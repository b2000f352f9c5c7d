using System.Text.Json;
using BarrierLedger.Core.Formats;

namespace BarrierLedger.Cli;

/// <summary>Where a command writes, and the shared ways it reports issues and JSON.</summary>
public sealed class CliContext(TextWriter output, TextWriter error)
{
    public TextWriter Out { get; } = output;
    public TextWriter Err { get; } = error;

    public static readonly JsonSerializerOptions JsonOptions = new()
    {
        WriteIndented = true,
        PropertyNamingPolicy = JsonNamingPolicy.SnakeCaseLower,
        NumberHandling = System.Text.Json.Serialization.JsonNumberHandling.AllowNamedFloatingPointLiterals,
    };

    /// <summary>Prints issues one per line ("file:line: error: message") to standard error.</summary>
    public void WriteIssues(IEnumerable<ReadIssue> issues)
    {
        foreach (var i in issues) Err.WriteLine(i.ToString());
    }

    /// <summary>Writes one JSON document to standard output.</summary>
    public void WriteJson(object document)
    {
        Out.WriteLine(JsonSerializer.Serialize(document, document.GetType(), JsonOptions));
    }

    /// <summary>Issues as JSON objects, the shape used by every command's "issues" key.</summary>
    public static object[] IssuesToJson(IEnumerable<ReadIssue> issues) =>
        [.. issues.Select(i => new { severity = i.IsError ? "error" : "warning", file = i.FileName, line = i.Line, json_path = i.JsonPath, message = i.Message })];
}
