namespace BarrierLedger.Ledger.Derivation;

/// <summary>Normalised keys for matching levels of theory (whitespace removed, case folded).</summary>
public static class EnergyLevels
{
    public static string Key(string? level) =>
        string.Concat((level ?? "").Where(c => !char.IsWhiteSpace(c))).ToLowerInvariant();
}
