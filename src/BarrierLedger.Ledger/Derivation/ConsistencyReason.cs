namespace BarrierLedger.Ledger.Derivation;

/// <summary>Why a barrier or reaction energy may mislead: a stable code, "Failure" / "Attention" / "Info", and a sentence.
/// A failure makes the reaction inconsistent (its barrier is shown and exported with the reason).</summary>
public sealed record ConsistencyReason(string Code, string Severity, string Message)
{
    public bool Blocking => Severity == "Failure";
}
