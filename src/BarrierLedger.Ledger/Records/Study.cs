namespace BarrierLedger.Ledger.Records;

/// <summary>A group project that holds reactions (for example one manuscript).</summary>
public class Study : IVersioned, IRetirable
{
    public int Id { get; set; }
    public string Name { get; set; } = "";
    public string Description { get; set; } = "";
    public string? OwnerUserId { get; set; }
    public DateTimeOffset CreatedAt { get; set; }
    public bool Retired { get; set; }
    public DateTimeOffset? RetiredAt { get; set; }
    public string? RetiredByUserId { get; set; }
    public long Version { get; set; }

    public List<Species> Species { get; set; } = [];
    public List<Reaction> Reactions { get; set; } = [];
}
