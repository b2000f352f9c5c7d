namespace BarrierLedger.Ledger.Coordination;

/// <summary>
/// A named lease on a piece of background work, shared by every app instance on one database: the holder runs the work
/// and writes its progress here, the others read it. A lease whose expiry has passed may be taken over (its holder died).
/// Times are Unix milliseconds (UTC) so the conditional UPDATE that acquires a lease compares plain integers on SQLite
/// and PostgreSQL alike.
/// </summary>
public class WorkLease
{
    /// <summary>What the lease is for, e.g. "recompute".</summary>
    public string Name { get; set; } = "";

    /// <summary>The instance holding it (host, process and a random tag), or null when free.</summary>
    public string? Holder { get; set; }

    /// <summary>When the holder's claim lapses unless renewed.</summary>
    public long ExpiresAtUnixMs { get; set; }

    /// <summary>Bumped by every request for the work, from any instance.</summary>
    public long RequestSerial { get; set; }

    /// <summary>The request serial the last finished pass covered; work is pending while it is below <see cref="RequestSerial"/>.</summary>
    public long CompletedSerial { get; set; }

    /// <summary>What the current or last pass is doing, in words.</summary>
    public string Phase { get; set; } = "idle";

    public int Done { get; set; }
    public int Total { get; set; }

    /// <summary>A second count the work reports (for recomputation: saddle-point checks re-run).</summary>
    public int Secondary { get; set; }

    public long? FinishedAtUnixMs { get; set; }

    /// <summary>The last pass's failure, if it failed.</summary>
    public string? Error { get; set; }
}
