using BarrierLedger.Core.Checks;

namespace BarrierLedger.Ledger.Records;

/// <summary>
/// The automatic saddle-point check of one calculation, with its reasons and evidence, and a fingerprint of the inputs
/// and thresholds it was computed from (when they change, it is recomputed).
/// </summary>
public class FrequencyCheck
{
    public int Id { get; set; }
    public int CalculationId { get; set; }
    public Calculation? Calculation { get; set; }
    public Verdict Verdict { get; set; }
    /// <summary>JSON array of {code, severity, message}.</summary>
    public string ReasonsJson { get; set; } = "[]";
    /// <summary>JSON evidence: imaginary modes with wavenumber, class and leading components; scan comparison.</summary>
    public string EvidenceJson { get; set; } = "{}";
    public string InputFingerprint { get; set; } = "";
    public DateTimeOffset ComputedAt { get; set; }
}
