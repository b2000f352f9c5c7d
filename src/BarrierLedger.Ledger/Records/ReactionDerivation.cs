namespace BarrierLedger.Ledger.Records;

/// <summary>
/// The derived values of one reaction under its energy model: the overall barrier and reaction energy (hartree), the rate
/// constant and half-life at the model temperature, the per-state and per-step values (JSON), consistency reasons, and the
/// fingerprints it was computed from. Stale when the model fingerprint or the reaction's inputs revision moved on.
/// </summary>
public class ReactionDerivation
{
    public int Id { get; set; }
    public int ReactionId { get; set; }
    public Reaction? Reaction { get; set; }
    public double? BarrierGibbsHartree { get; set; }
    public double? ReactionGibbsHartree { get; set; }
    public double? BarrierElectronicHartree { get; set; }
    public double? RateConstantPerSecond { get; set; }
    public double? HalfLifeSeconds { get; set; }
    public double TemperatureKelvin { get; set; }
    /// <summary>Level(s) of theory the energies came from ("A//B"; several joined by "; " when mixed).</summary>
    public string LevelOfTheory { get; set; } = "";
    public bool Consistent { get; set; }
    /// <summary>JSON array of {code, message} for every consistency rule broken.</summary>
    public string ConsistencyJson { get; set; } = "[]";
    /// <summary>JSON array of states with ΔE/ΔH/ΔG (hartree) relative to the first state.</summary>
    public string StatesJson { get; set; } = "[]";
    /// <summary>JSON array of steps with ΔG‡, ΔG_r (hartree), k (s⁻¹), t½ (s).</summary>
    public string StepsJson { get; set; } = "[]";
    public string ModelFingerprint { get; set; } = "";
    public string InputFingerprint { get; set; } = "";
    public long InputsRevision { get; set; }
    public DateTimeOffset ComputedAt { get; set; }
}
