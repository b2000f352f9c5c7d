using BarrierLedger.Core.Checks;

namespace BarrierLedger.Cli;

/// <summary>How the command line prints a check's verdict and reasons, as text and as JSON, and which exit code it gives.</summary>
internal static class VerdictOutput
{
    /// <summary>"Saddle-point check — Verdict: Needs attention" and one "- [code] message" line per reason.</summary>
    public static void Write(TextWriter o, string title, Verdict verdict, IEnumerable<CheckReason> reasons)
    {
        o.WriteLine();
        o.WriteLine($"{title}: {CheckReport.Format(verdict, reasons)}");
    }

    /// <summary>JSON shape: { "verdict": "needs_attention", "reasons": [ { "code", "severity", "message" } ] }.</summary>
    public static object Json(Verdict verdict, IEnumerable<CheckReason> reasons) => new
    {
        verdict = Snake(verdict.ToString()),
        reasons = reasons.Select(r => new { code = r.Code, severity = Snake(r.Severity.ToString()), message = r.Message }),
    };

    /// <summary>Failed → <see cref="ExitCodes.ChecksFailed"/>; Passed and Needs attention → <see cref="ExitCodes.Ok"/> (the reasons are printed).</summary>
    public static int ExitCode(Verdict verdict) => verdict == Verdict.Failed ? ExitCodes.ChecksFailed : ExitCodes.Ok;

    private static string Snake(string pascal) =>
        string.Concat(pascal.Select((c, i) => char.IsUpper(c) && i > 0 ? "_" + char.ToLowerInvariant(c) : char.ToLowerInvariant(c).ToString()));
}
