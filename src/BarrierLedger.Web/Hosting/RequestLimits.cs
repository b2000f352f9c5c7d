using System.Globalization;
using System.Security.Claims;
using System.Threading.RateLimiting;
using BarrierLedger.Web.Endpoints;
using Microsoft.AspNetCore.Authentication;
using Microsoft.AspNetCore.RateLimiting;

namespace BarrierLedger.Web.Hosting;

/// <summary>Settings under "BarrierLedger:Limits" (documented in docs/api.md, "Limits").</summary>
public sealed class RequestLimitOptions
{
    public const string SectionName = "BarrierLedger:Limits";

    /// <summary>File downloads (exports, stored files, backups) per signed-in account in each one-minute window.</summary>
    public int DownloadsPerMinute { get; set; } = 60;

    /// <summary>Sign-in form posts per client address in each one-minute window, whatever the account.</summary>
    public int SignInPostsPerMinute { get; set; } = 10;

    /// <summary>Failed sign-ins for one account from one client address before that pair has to wait.</summary>
    public int FailedSignInsPerAccountAndAddress { get; set; } = 5;

    /// <summary>How long failed sign-ins are remembered, and how long a throttled pair waits, in minutes.</summary>
    public int FailedSignInWindowMinutes { get; set; } = 15;
}

/// <summary>
/// Who may send how much, decided on verified identities only. API requests count per verified token; a request whose token
/// does not verify (forged, revoked, wrong secret) or that has none counts against its client address, so neither forging
/// tokens buys fresh allowances nor can a stranger who knows a token id use up that token's allowance. Downloads count per
/// signed-in account, sign-in form posts per client address. The client address is the connection's, or the one a known
/// proxy forwarded (see <see cref="TransportSecurity"/>).
/// </summary>
public static class RequestLimits
{
    public const string ApiPolicy = "api";
    public const string DownloadPolicy = "downloads";
    private const string VerifiedCallerKey = "barrierledger:verified-api-caller";

    public static IServiceCollection AddBarrierLedgerRequestLimits(this IServiceCollection services, IConfiguration configuration)
    {
        var limits = new RequestLimitOptions();
        configuration.GetSection(RequestLimitOptions.SectionName).Bind(limits);
        services.AddSingleton(limits);
        services.AddSingleton<SignInThrottle>();

        services.AddRateLimiter(o =>
        {
            o.RejectionStatusCode = StatusCodes.Status429TooManyRequests;
            o.AddPolicy(ApiPolicy, http =>
            {
                var api = http.RequestServices.GetRequiredService<ApiOptions>();
                return http.Items[VerifiedCallerKey] is string tokenId
                    ? PerMinute("token:" + tokenId, api.RequestsPerMinute)
                    : PerMinute("api-address:" + ClientAddress(http), api.UnauthenticatedRequestsPerMinute);
            });
            o.AddPolicy(DownloadPolicy, http => http.User.FindFirstValue(ClaimTypes.NameIdentifier) is { } userId
                ? PerMinute("download-user:" + userId, limits.DownloadsPerMinute)
                : PerMinute("download-address:" + ClientAddress(http), limits.DownloadsPerMinute));
            // Sign-in posts are throttled for every route that takes them, before any password is checked.
            o.GlobalLimiter = PartitionedRateLimiter.Create<HttpContext, string>(http => IsSignInPost(http)
                ? PerMinute("signin-address:" + ClientAddress(http), limits.SignInPostsPerMinute)
                : RateLimitPartition.GetNoLimiter("none"));
            o.OnRejected = async (c, ct) =>
            {
                var seconds = c.Lease.TryGetMetadata(MetadataName.RetryAfter, out var after) ? Math.Max(1, (int)Math.Ceiling(after.TotalSeconds)) : 60;
                var http = c.HttpContext;
                http.Response.Headers.RetryAfter = seconds.ToString(CultureInfo.InvariantCulture);
                if (IsSignInPost(http))
                {
                    http.Response.ContentType = "text/plain; charset=utf-8";
                    await http.Response.WriteAsync($"Too many sign-in attempts from this computer. Wait {seconds} s, then try again.", ct);
                    return;
                }
                var detail = http.Request.Path.StartsWithSegments(ApiExtensions.Prefix)
                    ? http.Items[VerifiedCallerKey] is null
                        ? $"Too many requests without a valid token from this address; try again in {seconds} s."
                        : $"At most {http.RequestServices.GetRequiredService<ApiOptions>().RequestsPerMinute} requests per minute per token; try again in {seconds} s."
                    : $"At most {limits.DownloadsPerMinute} downloads per minute per account; try again in {seconds} s.";
                await ApiProblems.WriteAsync(http, StatusCodes.Status429TooManyRequests, "rate-limited", "Too many requests", detail);
            };
        });
        return services;
    }

    /// <summary>
    /// After authentication: verifies an API request's bearer token (the result is kept for the authorization step, so the
    /// token is checked once) and records the verified token id for the limiter; then the limits.
    /// </summary>
    public static IApplicationBuilder UseBarrierLedgerRequestLimits(this IApplicationBuilder app)
    {
        app.Use(async (context, next) =>
        {
            if (context.Request.Path.StartsWithSegments(ApiExtensions.Prefix) && context.Request.Headers.Authorization.Count > 0)
            {
                var result = await context.AuthenticateAsync(AccessTokenAuthenticationHandler.SchemeName);
                if (result.Succeeded && result.Principal.FindFirstValue(ApiClaims.TokenId) is { } tokenId)
                    context.Items[VerifiedCallerKey] = tokenId;
            }
            await next();
        });
        return app.UseRateLimiter();
    }

    /// <summary>The address a request is counted against: the connection's, or one forwarded by a known proxy.</summary>
    public static string ClientAddress(HttpContext http) => http.Connection.RemoteIpAddress?.ToString() ?? "unknown";

    private static bool IsSignInPost(HttpContext http) =>
        HttpMethods.IsPost(http.Request.Method) && http.Request.Path.Equals("/Account/Login", StringComparison.OrdinalIgnoreCase);

    private static RateLimitPartition<string> PerMinute(string key, int permits) =>
        RateLimitPartition.GetFixedWindowLimiter(key, _ => new FixedWindowRateLimiterOptions
        {
            PermitLimit = Math.Max(1, permits), Window = TimeSpan.FromMinutes(1), QueueLimit = 0, AutoReplenishment = true,
        });
}

/// <summary>
/// Failed sign-ins counted per (client address, account). A pair that fails too often waits; the account itself is never
/// locked by failures, so nobody can lock another person (or the admin) out by guessing from their own computer, and a
/// guesser gets a handful of tries per window from each address. An admin's "disable" is the only lock an account gets.
/// </summary>
public sealed class SignInThrottle(RequestLimitOptions limits, TimeProvider clock)
{
    private readonly Dictionary<string, List<DateTimeOffset>> _failures = new(StringComparer.Ordinal);
    private readonly Lock _gate = new();

    /// <summary>How long the pair still has to wait (zero when it may try).</summary>
    public TimeSpan WaitFor(string address, string userName)
    {
        lock (_gate)
        {
            var recent = Recent(Key(address, userName));
            return recent.Count < limits.FailedSignInsPerAccountAndAddress
                ? TimeSpan.Zero
                : recent[^limits.FailedSignInsPerAccountAndAddress] + Window - clock.GetUtcNow();
        }
    }

    public void RecordFailure(string address, string userName)
    {
        lock (_gate)
        {
            var key = Key(address, userName);
            Recent(key).Add(clock.GetUtcNow());
            if (_failures.Count > 100_000) Prune();
        }
    }

    public void RecordSuccess(string address, string userName)
    {
        lock (_gate) _failures.Remove(Key(address, userName));
    }

    private TimeSpan Window => TimeSpan.FromMinutes(limits.FailedSignInWindowMinutes);

    private static string Key(string address, string userName) => address + "\n" + userName.Trim().ToUpperInvariant();

    private List<DateTimeOffset> Recent(string key)
    {
        if (!_failures.TryGetValue(key, out var list)) _failures[key] = list = [];
        var since = clock.GetUtcNow() - Window;
        list.RemoveAll(t => t < since);
        return list;
    }

    private void Prune()
    {
        var since = clock.GetUtcNow() - Window;
        foreach (var key in _failures.Where(kv => kv.Value.TrueForAll(t => t < since)).Select(kv => kv.Key).ToList())
            _failures.Remove(key);
    }
}
