using System.Net;
using System.Text.RegularExpressions;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Web.Tests.Endpoints;
using Microsoft.AspNetCore.Identity;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.Web.Tests.Security;

/// <summary>
/// A browser's sign-in session over plain HTTP against the real app: the sign-in form is fetched, its antiforgery token read and
/// posted back with the user's name and password, and the cookies kept as a browser keeps them.
/// </summary>
public sealed partial class CookieSession : IDisposable
{
    public const string Password = "Correct-Horse-2026";

    private CookieSession(Uri baseAddress)
    {
        BaseAddress = baseAddress;
        Http = new HttpClient(new SocketsHttpHandler { AllowAutoRedirect = false, CookieContainer = Cookies, UseCookies = true }) { BaseAddress = baseAddress };
    }

    public Uri BaseAddress { get; }
    public CookieContainer Cookies { get; } = new();
    public HttpClient Http { get; }

    /// <summary>The Cookie header this session sends now (to replay it later, as a thief would).</summary>
    public string CookieHeader => Cookies.GetCookieHeader(BaseAddress);

    /// <summary>Creates an account with <see cref="Password"/> and the given roles (no one-time password to change).</summary>
    public static async Task<LedgerUser> CreateUserAsync(ApiTestHost host, string userName, params string[] roles)
    {
        await using var scope = host.Services.CreateAsyncScope();
        var users = scope.ServiceProvider.GetRequiredService<UserManager<LedgerUser>>();
        var user = new LedgerUser { UserName = userName, DisplayName = userName };
        var created = await users.CreateAsync(user, Password);
        Assert.True(created.Succeeded, string.Join("; ", created.Errors.Select(e => e.Description)));
        if (roles.Length > 0) await users.AddToRolesAsync(user, roles);
        return user;
    }

    public static async Task<CookieSession> SignInAsync(ApiTestHost host, string userName, string password = Password)
    {
        var session = new CookieSession(host.BaseAddress);
        var response = await session.PostFormAsync("/Account/Login", "/Account/Login", "signin", new()
        {
            ["Input.UserName"] = userName,
            ["Input.Password"] = password,
        });
        Assert.True(response.StatusCode == HttpStatusCode.Redirect, $"sign-in of {userName}: expected a redirect, got {(int)response.StatusCode}");
        Assert.Contains("BarrierLedger.Auth=", session.CookieHeader);
        return session;
    }

    /// <summary>One sign-in attempt from a fresh browser: the text the server answers with (the page, or a refusal).</summary>
    public static async Task<string> TryPasswordAsync(ApiTestHost host, string userName, string password)
    {
        using var session = new CookieSession(host.BaseAddress);
        var response = await session.PostFormAsync("/Account/Login", "/Account/Login", "signin", new()
        {
            ["Input.UserName"] = userName,
            ["Input.Password"] = password,
        });
        return WebUtility.HtmlDecode(await response.Content.ReadAsStringAsync());
    }

    /// <summary>GETs the page holding a server-rendered form, then posts the form (named for Blazor, or not) with its antiforgery token.</summary>
    public async Task<HttpResponseMessage> PostFormAsync(string pagePath, string action, string? formName, Dictionary<string, string> fields)
    {
        var page = await Http.GetStringAsync(pagePath);
        var token = AntiforgeryField().Match(page);
        Assert.True(token.Success, $"{pagePath} holds no antiforgery token");
        var body = new Dictionary<string, string>(fields) { ["__RequestVerificationToken"] = WebUtility.HtmlDecode(token.Groups[1].Value) };
        if (formName is not null) body["_handler"] = formName;
        return await Http.PostAsync(action, new FormUrlEncodedContent(body));
    }

    /// <summary>A client that sends exactly <paramref name="cookieHeader"/> and keeps nothing.</summary>
    public static HttpClient Replay(Uri baseAddress, string cookieHeader)
    {
        var client = new HttpClient(new SocketsHttpHandler { AllowAutoRedirect = false, UseCookies = false }) { BaseAddress = baseAddress };
        client.DefaultRequestHeaders.Add("Cookie", cookieHeader);
        return client;
    }

    /// <summary>True when the response lets the page through (200), false when it sends the visitor to sign in.</summary>
    public static bool Opens(HttpResponseMessage response)
    {
        if (response.StatusCode == HttpStatusCode.OK) return true;
        Assert.True(response.StatusCode == HttpStatusCode.Redirect, $"expected 200 or a redirect, got {(int)response.StatusCode}");
        return false;
    }

    public void Dispose() => Http.Dispose();

    [GeneratedRegex("name=\"__RequestVerificationToken\" value=\"([^\"]+)\"")]
    private static partial Regex AntiforgeryField();
}
