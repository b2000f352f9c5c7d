namespace BarrierLedger.Ledger.Records;

/// <summary>
/// A record people edit: it carries a version that every save increments (checked as an optimistic-concurrency token),
/// so two people editing the same row cannot silently overwrite each other.
/// </summary>
public interface IVersioned
{
    long Version { get; set; }
}

/// <summary>A record that is retired rather than deleted, and can be restored.</summary>
public interface IRetirable
{
    bool Retired { get; set; }
    DateTimeOffset? RetiredAt { get; set; }
    string? RetiredByUserId { get; set; }
}
