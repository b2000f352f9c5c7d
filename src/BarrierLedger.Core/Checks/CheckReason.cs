namespace BarrierLedger.Core.Checks;

/// <summary>The outcome of an automatic check.</summary>
public enum Verdict
{
    Passed,
    NeedsAttention,
    Failed,
}

/// <summary>How much a reason weighs in the verdict.</summary>
public enum CheckSeverity
{
    /// <summary>Evidence for the record; does not change the verdict.</summary>
    Info,
    /// <summary>Makes the verdict at least <see cref="Verdict.NeedsAttention"/>.</summary>
    Attention,
    /// <summary>Makes the verdict <see cref="Verdict.Failed"/>.</summary>
    Failure,
}

/// <summary>
/// One reason behind a verdict: a stable code (stored, filtered and compared; never reworded) and a sentence a student
/// understands (may be reworded).
/// </summary>
public sealed record CheckReason(string Code, CheckSeverity Severity, string Message)
{
    /// <summary>A failure: the verdict of any list holding it is <see cref="Verdict.Failed"/> (a barrier with one is inconsistent).</summary>
    public bool Blocking => Severity == CheckSeverity.Failure;

    public override string ToString() => $"[{Code}] {Message}";

    /// <summary>The verdict a list of reasons leads to: Failed if any failure, else Needs attention if any attention, else Passed.</summary>
    public static Verdict VerdictOf(IEnumerable<CheckReason> reasons)
    {
        ArgumentNullException.ThrowIfNull(reasons);
        var list = reasons.ToList();
        return list.Any(r => r.Severity == CheckSeverity.Failure) ? Verdict.Failed
            : list.Any(r => r.Severity == CheckSeverity.Attention) ? Verdict.NeedsAttention
            : Verdict.Passed;
    }
}

/// <summary>Words for a verdict, as shown to users.</summary>
public static class VerdictText
{
    public static string Of(Verdict v) => v switch
    {
        Verdict.Passed => "Passed",
        Verdict.NeedsAttention => "Needs attention",
        Verdict.Failed => "Failed",
        _ => throw new ArgumentOutOfRangeException(nameof(v), v, "Unknown verdict."),
    };
}
