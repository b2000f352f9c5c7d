using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Web.Tests.Endpoints;
using Xunit.Abstractions;

namespace BarrierLedger.Web.Tests.Security;

/// <summary>
/// Issue 19, finding 8: behind a TLS proxy (simulated by X-Forwarded-Proto: https from loopback, the default known proxy)
/// cookies are Secure and HSTS is sent; every response has the usual security headers; the data folder is owner-only.
/// </summary>
public sealed class TransportHeadersTests(ITestOutputHelper output)
{
    private static HttpRequestMessage ViaTlsProxy(string path)
    {
        var request = new HttpRequestMessage(HttpMethod.Get, path);
        request.Headers.Add("X-Forwarded-Proto", "https");
        request.Headers.Add("X-Forwarded-For", "192.0.2.10");
        return request;
    }

    [Fact]
    public async Task PageBehindATlsProxy_HasHsts_SecureCookies_AndTheSecurityHeaders()
    {
        await using var host = new ApiTestHost();
        using var client = host.Client();

        using var response = await client.SendAsync(ViaTlsProxy("/Account/Login"));

        output.WriteLine($"{(int)response.StatusCode} {response.StatusCode}");
        foreach (var (k, v) in response.Headers.Concat(response.Content.Headers)) output.WriteLine($"{k}: {string.Join(" | ", v)}");
        Assert.StartsWith("max-age=31536000", response.Headers.GetValues("Strict-Transport-Security").Single());
        Assert.Equal("nosniff", response.Headers.GetValues("X-Content-Type-Options").Single());
        Assert.Equal("no-referrer", response.Headers.GetValues("Referrer-Policy").Single());
        var csp = response.Headers.GetValues("Content-Security-Policy").Single();
        Assert.Contains("frame-ancestors 'none'", csp);
        Assert.Contains("default-src 'self'", csp);
        Assert.DoesNotContain("'unsafe-inline'", csp.Split(';').Single(d => d.Trim().StartsWith("script-src", StringComparison.Ordinal)));
        var cookies = response.Headers.GetValues("Set-Cookie").Where(c => !c.Contains("expires=Thu, 01 Jan 1970", StringComparison.Ordinal)).ToList();
        Assert.NotEmpty(cookies);
        Assert.All(cookies, c => Assert.Contains("secure", c, StringComparison.OrdinalIgnoreCase));
    }

    [Fact]
    public async Task ForwardedProto_FromAProxyThatIsNotKnown_IsIgnored()
    {
        await using var host = new ApiTestHost(new Dictionary<string, string?> { ["BarrierLedger:Proxy:KnownProxies"] = "192.0.2.1" });
        using var client = host.Client();

        using var response = await client.SendAsync(ViaTlsProxy("/Account/Login"));

        Assert.False(response.Headers.Contains("Strict-Transport-Security"));
        Assert.All(response.Headers.GetValues("Set-Cookie"), c => Assert.DoesNotContain("secure", c, StringComparison.OrdinalIgnoreCase));
        Assert.Equal("nosniff", response.Headers.GetValues("X-Content-Type-Options").Single()); // on every response regardless
    }

    [Fact, System.Runtime.Versioning.UnsupportedOSPlatform("windows")] // Unix file modes
    public async Task DataFolderAndDatabase_AreReadableByTheOwnerOnly()
    {
        await using var host = new ApiTestHost();
        await host.CreateUserAsync("mira", Roles.Member); // something written

        Assert.Equal(UnixFileMode.UserRead | UnixFileMode.UserWrite | UnixFileMode.UserExecute, File.GetUnixFileMode(host.DataDirectory));
        Assert.Equal(UnixFileMode.UserRead | UnixFileMode.UserWrite, File.GetUnixFileMode(Path.Combine(host.DataDirectory, "barrierledger.db")));
    }
}
