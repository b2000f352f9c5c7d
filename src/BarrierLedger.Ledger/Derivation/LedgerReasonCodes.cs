namespace BarrierLedger.Ledger.Derivation;

/// <summary>Stable codes of reasons the ledger adds to Core's consistency and pathway reasons.</summary>
public static class LedgerReasonCodes
{
    public const string MissingEnergy = "ledger.missing-energy";
    public const string FormulaUnknown = "ledger.formula-unknown";
    public const string PathwayShape = "ledger.pathway-shape";
    public const string MissingSpecies = "ledger.missing-species";
    public const string ConformerLeftOut = "ledger.conformer-left-out";
}
