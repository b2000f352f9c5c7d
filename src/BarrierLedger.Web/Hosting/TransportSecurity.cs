using System.Net;
using BarrierLedger.Ledger.Storage;
using Microsoft.AspNetCore.Http;
using Microsoft.AspNetCore.HttpOverrides;

namespace BarrierLedger.Web.Hosting;

/// <summary>
/// Running behind a department's TLS proxy: X-Forwarded-For/-Proto are honoured from known proxies only
/// ("BarrierLedger:Proxy:KnownProxies", comma-separated addresses; default loopback), so cookies are Secure and HSTS is sent
/// when the browser spoke https; every response carries X-Content-Type-Options, Referrer-Policy and a Content-Security-Policy
/// that Blazor Server and Plotly work under.
/// </summary>
public static class TransportSecurity
{
    /// <summary>
    /// 'unsafe-eval' because plotly.js compiles some trace code at run time; 'unsafe-inline' for styles only (Blazor and Plotly
    /// set style attributes). No inline script runs, nothing is framed, nothing is loaded from elsewhere.
    /// </summary>
    public const string ContentSecurityPolicy =
        "default-src 'self'; script-src 'self' 'unsafe-eval'; style-src 'self' 'unsafe-inline'; img-src 'self' data: blob:; " +
        "font-src 'self' data:; connect-src 'self'; worker-src 'self' blob:; object-src 'none'; base-uri 'self'; form-action 'self'; frame-ancestors 'none'";

    public static IServiceCollection AddBarrierLedgerTransportSecurity(this IServiceCollection services, IConfiguration configuration)
    {
        services.Configure<ForwardedHeadersOptions>(o =>
        {
            o.ForwardedHeaders = ForwardedHeaders.XForwardedFor | ForwardedHeaders.XForwardedProto;
            if (configuration["BarrierLedger:Proxy:KnownProxies"] is { Length: > 0 } list)
            {
                o.KnownProxies.Clear();
                o.KnownIPNetworks.Clear(); // the default trusts all of 127.0.0.0/8; only the named proxies are trusted now
                foreach (var a in list.Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
                    o.KnownProxies.Add(IPAddress.TryParse(a, out var ip) ? ip : throw new InvalidOperationException($"BarrierLedger:Proxy:KnownProxies: '{a}' is not an IP address."));
            }
        });
        // Secure whenever the browser spoke https (directly or through a known proxy), for the antiforgery cookie as for sign-in.
        services.AddAntiforgery(o => o.Cookie.SecurePolicy = CookieSecurePolicy.SameAsRequest);
        services.AddHsts(o =>
        {
            o.MaxAge = TimeSpan.FromDays(365);
            o.ExcludedHosts.Clear(); // sent only over https anyway; a proxy may reach us as 127.0.0.1
        });
        return services;
    }

    /// <summary>Forwarded headers first, then HSTS (https requests only) and the security headers on every response.</summary>
    public static IApplicationBuilder UseBarrierLedgerTransportSecurity(this IApplicationBuilder app)
    {
        app.UseForwardedHeaders();
        app.UseHsts();
        return app.Use(async (context, next) =>
        {
            context.Response.OnStarting(() =>
            {
                var h = context.Response.Headers;
                h.XContentTypeOptions = "nosniff";
                h["Referrer-Policy"] = "no-referrer";
                h.ContentSecurityPolicy = ContentSecurityPolicy;
                h.XFrameOptions = "DENY";
                return Task.CompletedTask;
            });
            await next();
        });
    }

    /// <summary>The data folder (database, backups) readable by the account that runs the app only: 0700 folder, 0600 database files.</summary>
    public static void MakeDataOwnerOnly(LedgerOptions options)
    {
        if (OperatingSystem.IsWindows() || options.IsPostgreSql) return;
        var dir = options.ResolvedDataDirectory;
        if (!Directory.Exists(dir)) return;
        File.SetUnixFileMode(dir, UnixFileMode.UserRead | UnixFileMode.UserWrite | UnixFileMode.UserExecute);
        foreach (var f in new[] { options.DatabasePath, options.DatabasePath + "-wal", options.DatabasePath + "-shm" })
            if (File.Exists(f)) File.SetUnixFileMode(f, UnixFileMode.UserRead | UnixFileMode.UserWrite);
    }
}
