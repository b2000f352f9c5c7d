namespace BarrierLedger.Ledger.Records;

/// <summary>What a review said.</summary>
public enum ReviewOutcome
{
    Verified,
    Returned,
    /// <summary>Written by the ledger when a new calculation replaced a reviewed saddle point (the old review stays).</summary>
    Reopened,
}

/// <summary>One entry of a saddle-point calculation's review history (never changed once written).</summary>
public class Review
{
    public int Id { get; set; }
    public int CalculationId { get; set; }
    public Calculation? Calculation { get; set; }
    public ReviewOutcome Outcome { get; set; }
    public string Comment { get; set; } = "";
    public string ReviewerUserId { get; set; } = "";
    public DateTimeOffset At { get; set; }
}
