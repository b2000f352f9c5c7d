using System.Net;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Web.Tests.Endpoints;
using Microsoft.AspNetCore.Identity;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.Web.Tests.Security;

/// <summary>
/// Issue 19, finding 6: limits decided on verified identities. Each test failed on the build before the fix: the API limit was
/// keyed on the token id claimed in the header before it was verified, downloads had no limit, and failed sign-ins locked the
/// account (and with it the account's tokens) for everybody.
/// </summary>
public sealed class RequestLimitTests
{
    /// <summary>A well-formed token with the same id and a different secret (what a stranger who saw the id can send).</summary>
    private static string WrongSecret(string token) => token[..^1] + (token[^1] == 'a' ? 'b' : 'a');

    /// <summary>A well-formed token whose id exists nowhere: the real id's characters rotated by <paramref name="shift"/>.</summary>
    private static string ForgedId(string token, int shift)
    {
        var parts = token.Split('_');
        var id = parts[1][shift..] + parts[1][..shift];
        return $"{parts[0]}_{id}_{parts[2]}";
    }

    [Fact]
    public async Task ForgedTokens_AreCountedAgainstTheClientAddress_NotGivenAFreshAllowanceEach()
    {
        await using var host = new ApiTestHost(new Dictionary<string, string?> { ["BarrierLedger:Api:UnauthenticatedRequestsPerMinute"] = "3" });
        var user = await host.CreateUserAsync("mira", Roles.Member);
        var real = await host.CreateTokenAsync(user, TokenScopes.Read);

        var answers = new List<HttpStatusCode>();
        for (var shift = 1; shift <= 5; shift++)
        {
            using var forged = host.Client(ForgedId(real, shift));
            answers.Add((await forged.GetAsync("/api/v1/me")).StatusCode);
        }

        Assert.Equal([HttpStatusCode.Unauthorized, HttpStatusCode.Unauthorized, HttpStatusCode.Unauthorized, HttpStatusCode.TooManyRequests, HttpStatusCode.TooManyRequests], answers);
        using var owner = host.Client(real);
        Assert.Equal(HttpStatusCode.OK, (await owner.GetAsync("/api/v1/me")).StatusCode); // the verified token has its own allowance
    }

    [Fact]
    public async Task AStrangerWhoKnowsATokenId_CannotUseUpThatTokensAllowance()
    {
        await using var host = new ApiTestHost(new Dictionary<string, string?>
        {
            ["BarrierLedger:Api:RequestsPerMinute"] = "3",
            ["BarrierLedger:Api:UnauthenticatedRequestsPerMinute"] = "100",
        });
        var user = await host.CreateUserAsync("mira", Roles.Member);
        var real = await host.CreateTokenAsync(user, TokenScopes.Read);
        using var stranger = host.Client(WrongSecret(real));
        for (var i = 0; i < 6; i++) Assert.Equal(HttpStatusCode.Unauthorized, (await stranger.GetAsync("/api/v1/me")).StatusCode);

        using var owner = host.Client(real);
        for (var i = 0; i < 3; i++) Assert.Equal(HttpStatusCode.OK, (await owner.GetAsync("/api/v1/me")).StatusCode);
        await ProblemAssert.IsProblemAsync(await owner.GetAsync("/api/v1/me"), HttpStatusCode.TooManyRequests, "rate-limited");
    }

    [Fact]
    public async Task Downloads_AreLimitedPerSignedInAccount()
    {
        await using var host = new ApiTestHost(new Dictionary<string, string?> { ["BarrierLedger:Limits:DownloadsPerMinute"] = "2" });
        await CookieSession.CreateUserAsync(host, "mira", Roles.Member);
        await CookieSession.CreateUserAsync(host, "noor", Roles.Member);
        using var mira = await CookieSession.SignInAsync(host, "mira");
        using var noor = await CookieSession.SignInAsync(host, "noor");

        for (var i = 0; i < 2; i++) Assert.NotEqual(HttpStatusCode.TooManyRequests, (await mira.Http.GetAsync("/export/download/file/999")).StatusCode);
        var limited = await mira.Http.GetAsync("/export/download/file/999");

        await ProblemAssert.IsProblemAsync(limited, HttpStatusCode.TooManyRequests, "rate-limited");
        Assert.True(limited.Headers.RetryAfter?.Delta > TimeSpan.Zero, "Retry-After is set");
        Assert.NotEqual(HttpStatusCode.TooManyRequests, (await noor.Http.GetAsync("/export/download/file/999")).StatusCode);
    }

    [Fact]
    public async Task FailedSignIns_ThrottleTheGuessersComputer_ButNeverLockTheAccountOrItsTokens()
    {
        await using var host = new ApiTestHost(new Dictionary<string, string?> { ["BarrierLedger:Limits:SignInPostsPerMinute"] = "100" });
        var admin = await CookieSession.CreateUserAsync(host, "ada", Roles.Member, Roles.Admin);
        using var adminApi = host.Client(await host.CreateTokenAsync(admin, TokenScopes.Read));

        var messages = new List<string>();
        for (var i = 0; i < 7; i++)
        {
            var guess = await CookieSession.TryPasswordAsync(host, "ada", "Wrong-password-" + i);
            messages.Add(guess);
        }

        Assert.All(messages.Take(5), m => Assert.Contains("User name or password is wrong", m));
        Assert.All(messages.Skip(5), m => Assert.Contains("Too many failed sign-ins for this account from this computer", m));
        // Even the right password waits on this computer while the pair is throttled...
        Assert.Contains("Too many failed sign-ins", await CookieSession.TryPasswordAsync(host, "ada", CookieSession.Password));
        // ...but the account is not locked: its tokens work and an admin has nothing to unlock.
        Assert.Equal(HttpStatusCode.OK, (await adminApi.GetAsync("/api/v1/me")).StatusCode);
        await using var scope = host.Services.CreateAsyncScope();
        var users = scope.ServiceProvider.GetRequiredService<UserManager<LedgerUser>>();
        var stored = (await users.FindByNameAsync("ada"))!;
        Assert.False(await users.IsLockedOutAsync(stored));
        Assert.Equal(0, stored.AccessFailedCount);
    }

    [Fact]
    public async Task SignInPosts_AreLimitedPerClientAddress_WhateverTheAccount()
    {
        await using var host = new ApiTestHost(new Dictionary<string, string?> { ["BarrierLedger:Limits:SignInPostsPerMinute"] = "3" });
        for (var i = 0; i < 3; i++)
            Assert.Contains("User name or password is wrong", await CookieSession.TryPasswordAsync(host, "nobody" + i, "Wrong-password-x"));

        var limited = await CookieSession.TryPasswordAsync(host, "nobody9", "Wrong-password-x");

        Assert.Contains("Too many sign-in attempts from this computer", limited);
    }
}
