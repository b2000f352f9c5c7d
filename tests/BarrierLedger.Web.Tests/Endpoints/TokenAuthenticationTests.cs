using System.Net;
using System.Net.Http.Json;
using System.Security.Cryptography;
using System.Text;
using System.Text.Json;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Auditing;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Web.Tests.Endpoints;

public sealed class TokenAuthenticationTests
{
    [Fact]
    public async Task ValidToken_ActsAsItsUser_WithRolesAndScope_AndEveryUseIsAudited()
    {
        await using var host = new ApiTestHost();
        var user = await host.CreateUserAsync("mira", Roles.Member);
        var token = await host.CreateTokenAsync(user, TokenScopes.Read);
        using var client = host.Client(token);

        var me = await client.GetFromJsonAsync<JsonElement>("/api/v1/me");
        await client.GetAsync("/api/v1/me");

        Assert.Equal(user.Id, me.GetProperty("userId").GetString());
        Assert.Equal("mira", me.GetProperty("userName").GetString());
        Assert.Equal([Roles.Member], me.GetProperty("roles").EnumerateArray().Select(r => r.GetString()));
        Assert.Equal("read", me.GetProperty("scope").GetString());
        var tokenId = me.GetProperty("tokenId").GetString()!;
        var uses = (await host.Get<AuditService>().GetEventsAsync("AccessToken", tokenId)).Where(e => e.Action == "token.used").ToList();
        Assert.Equal(2, uses.Count);
        Assert.All(uses, e => Assert.Equal(user.Id, e.UserId));
        Assert.All(uses, e => Assert.Contains("GET /api/v1/me", e.Summary));
    }

    [Fact]
    public async Task Storage_HoldsOnlyTheSecretsHash_InIdentityUserTokens()
    {
        await using var host = new ApiTestHost();
        var user = await host.CreateUserAsync("mira", Roles.Member);
        var token = await host.CreateTokenAsync(user, TokenScopes.Upload);
        Assert.True(AccessTokenService.TryParse(token, out var id, out var secret));

        await using var db = await host.DbAsync();
        var row = await db.UserTokens.SingleAsync(t => t.LoginProvider == AccessTokenService.LoginProvider);
        Assert.Equal(id, row.Name);
        Assert.Equal(user.Id, row.UserId);
        Assert.DoesNotContain(secret, row.Value);
        var value = JsonDocument.Parse(row.Value!).RootElement;
        Assert.Equal(Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(secret))), value.GetProperty("sha256").GetString());
        Assert.Equal("upload", value.GetProperty("scope").GetString());
    }

    [Fact]
    public async Task MissingMalformedUnknownExpiredRevokedTokens_Get401Problems_NeverTheSignInRedirect()
    {
        await using var host = new ApiTestHost();
        var user = await host.CreateUserAsync("mira", Roles.Member);
        var good = await host.CreateTokenAsync(user, TokenScopes.Read, days: 1);
        var revoked = await host.CreateTokenAsync(user, TokenScopes.Read, days: 30);
        AccessTokenService.TryParse(revoked, out var revokedId, out _);
        Assert.True(await host.Get<AccessTokenService>().RevokeAsync(user.Id, revokedId));
        AccessTokenService.TryParse(good, out var goodId, out var goodSecret);
        var wrongSecret = $"bltk_{goodId}_{new string('A', goodSecret.Length)}";

        using (var anonymous = host.Client())
        {
            await ProblemAssert.IsProblemAsync(await anonymous.GetAsync("/api/v1/me"), HttpStatusCode.Unauthorized, "token-missing");
            await ProblemAssert.IsProblemAsync(await anonymous.PostAsync("/api/v1/uploads", ApiFiles.Form([("w.xyz", ApiFiles.WaterXyz())], ApiFiles.WaterChoices())),
                HttpStatusCode.Unauthorized, "token-missing");
        }
        using (var c = host.Client("not-a-token")) await ProblemAssert.IsProblemAsync(await c.GetAsync("/api/v1/me"), HttpStatusCode.Unauthorized, "token-malformed");
        using (var c = host.Client(wrongSecret)) await ProblemAssert.IsProblemAsync(await c.GetAsync("/api/v1/me"), HttpStatusCode.Unauthorized, "token-unknown");
        using (var c = host.Client(revoked)) await ProblemAssert.IsProblemAsync(await c.GetAsync("/api/v1/me"), HttpStatusCode.Unauthorized, "token-revoked");

        using (var c = host.Client(good))
        {
            Assert.Equal(HttpStatusCode.OK, (await c.GetAsync("/api/v1/me")).StatusCode);
            host.Clock.Offset = TimeSpan.FromDays(1) + TimeSpan.FromMinutes(1);
            var expired = await c.GetAsync("/api/v1/me");
            await ProblemAssert.IsProblemAsync(expired, HttpStatusCode.Unauthorized, "token-expired");
            Assert.Contains("Bearer", expired.Headers.WwwAuthenticate.ToString());
        }
        Assert.Equal(0, (await host.CountsAsync()).Uploads);
    }

    [Fact]
    public async Task ReadScope_CannotUpload_403ProblemAndNothingStored()
    {
        await using var host = new ApiTestHost();
        var user = await host.CreateUserAsync("mira", Roles.Member);
        using var client = host.Client(await host.CreateTokenAsync(user, TokenScopes.Read));

        var response = await client.PostAsync("/api/v1/uploads", ApiFiles.Form([("w.xyz", ApiFiles.WaterXyz())], ApiFiles.WaterChoices()));

        var problem = await ProblemAssert.IsProblemAsync(response, HttpStatusCode.Forbidden, "scope-insufficient");
        Assert.Contains("'upload'", problem.GetProperty("detail").GetString());
        Assert.Equal((0, 0, 0, 0), await host.CountsAsync());
    }

    [Fact]
    public async Task UnknownApiPath_IsAProblem_NotTheSignInPage()
    {
        await using var host = new ApiTestHost();
        using var client = host.Client();
        await ProblemAssert.IsProblemAsync(await client.GetAsync("/api/v1/no-such-thing"), HttpStatusCode.NotFound, "not-found");
        await ProblemAssert.IsProblemAsync(await client.GetAsync("/api/v2/studies"), HttpStatusCode.NotFound, "not-found");
    }

    [Fact]
    public async Task RateLimit_IsPerToken_429ProblemWithRetryAfter()
    {
        await using var host = new ApiTestHost(new Dictionary<string, string?> { ["BarrierLedger:Api:RequestsPerMinute"] = "3" });
        var user = await host.CreateUserAsync("mira", Roles.Member);
        using var first = host.Client(await host.CreateTokenAsync(user, TokenScopes.Read));
        using var second = host.Client(await host.CreateTokenAsync(user, TokenScopes.Read));

        for (var i = 0; i < 3; i++) Assert.Equal(HttpStatusCode.OK, (await first.GetAsync("/api/v1/me")).StatusCode);
        var limited = await first.GetAsync("/api/v1/me");

        await ProblemAssert.IsProblemAsync(limited, HttpStatusCode.TooManyRequests, "rate-limited");
        Assert.True(limited.Headers.RetryAfter?.Delta > TimeSpan.Zero, "Retry-After is set");
        Assert.Equal(HttpStatusCode.OK, (await second.GetAsync("/api/v1/me")).StatusCode);
    }

    [Fact]
    public async Task OpenApiDocument_IsServedAtItsStablePath_AndDescribesOnlyTheApi()
    {
        await using var host = new ApiTestHost();
        using var client = host.Client();
        var response = await client.GetAsync("/api/v1/openapi.json");
        Assert.Equal(HttpStatusCode.OK, response.StatusCode);
        var doc = JsonDocument.Parse(await response.Content.ReadAsStringAsync()).RootElement;
        var paths = doc.GetProperty("paths").EnumerateObject().Select(p => p.Name).ToList();
        Assert.Contains("/api/v1/uploads", paths);
        Assert.Contains("/api/v1/me", paths);
        Assert.All(paths, p => Assert.StartsWith("/api/v1/", p));
    }
}
