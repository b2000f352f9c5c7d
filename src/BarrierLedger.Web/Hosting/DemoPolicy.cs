using System.Net;
using BarrierLedger.Ledger.Storage;

namespace BarrierLedger.Web.Hosting;

/// <summary>
/// Whether a first start on an empty store loads the demo study and its demo accounts (whose passwords are public). Only the
/// newcomer's first local start does so unasked: the embedded SQLite store, every listening address a loopback one, and no
/// production flag. PostgreSQL (a shared server), a network address or <c>BarrierLedger:Production=true</c> start without
/// demo accounts unless <c>BarrierLedger:LoadDemo=true</c> asks for them explicitly; <c>--no-demo</c> always starts empty.
/// </summary>
public static class DemoPolicy
{
    public sealed record Decision(bool Load, string Reason);

    /// <param name="loadDemo">The explicit setting: true (asked for), false (refused), null (decide from the instance).</param>
    public static Decision Decide(bool? loadDemo, StoreProvider provider, IEnumerable<string> listenUrls, bool production)
    {
        if (loadDemo == false) return new(false, "the demo was turned off (--no-demo or BarrierLedger:LoadDemo=false)");
        if (loadDemo == true) return new(true, "the demo was asked for explicitly (BarrierLedger:LoadDemo=true)");
        if (production) return new(false, "BarrierLedger:Production is set; ask with BarrierLedger:LoadDemo=true to load the demo anyway");
        if (provider != StoreProvider.Sqlite) return new(false, $"the store is {provider}, a shared server; ask with BarrierLedger:LoadDemo=true to load the demo anyway");
        var open = listenUrls.Where(u => !IsLoopback(u)).ToList();
        if (open.Count > 0) return new(false, $"the app listens on {string.Join(", ", open)}, not only on this computer; ask with BarrierLedger:LoadDemo=true to load the demo anyway");
        return new(true, "first local start on the embedded store");
    }

    /// <summary>http://127.0.0.1:5080, http://localhost:5080 and http://[::1]:5080 are loopback; 0.0.0.0, *, + and named hosts are not.</summary>
    public static bool IsLoopback(string url)
    {
        var host = url.Trim();
        var scheme = host.IndexOf("://", StringComparison.Ordinal);
        if (scheme >= 0) host = host[(scheme + 3)..];
        var slash = host.IndexOf('/');
        if (slash >= 0) host = host[..slash];
        if (host.StartsWith('['))
            host = host[1..Math.Max(1, host.IndexOf(']'))];
        else if (host.LastIndexOf(':') is var colon and > 0)
            host = host[..colon];
        if (host.Equals("localhost", StringComparison.OrdinalIgnoreCase)) return true;
        return IPAddress.TryParse(host, out var ip) && IPAddress.IsLoopback(ip);
    }

    /// <summary>The addresses the app is told to listen on: --urls, ASPNETCORE_URLS, else the default loopback address.</summary>
    public static IReadOnlyList<string> ListenUrls(IConfiguration configuration)
    {
        var urls = configuration["urls"] is { Length: > 0 } u ? u : configuration["ASPNETCORE_URLS"] is { Length: > 0 } e ? e : HostingExtensions.DefaultAddress;
        return urls.Split(';', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
    }
}
