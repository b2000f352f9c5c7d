namespace BarrierLedger.Web.Endpoints;

/// <summary>Settings under "BarrierLedger:Api" (documented in docs/api.md).</summary>
public sealed class ApiOptions
{
    public const string SectionName = "BarrierLedger:Api";

    /// <summary>Largest accepted upload request (all parts together), in bytes; larger requests get 413 and nothing is stored.</summary>
    public long MaxUploadBytes { get; set; } = 64L * 1024 * 1024;

    /// <summary>Requests per verified token in each one-minute window.</summary>
    public int RequestsPerMinute { get; set; } = 120;

    /// <summary>Requests per client address in each one-minute window when the token is missing or does not verify.</summary>
    public int UnauthenticatedRequestsPerMinute { get; set; } = 30;
}
