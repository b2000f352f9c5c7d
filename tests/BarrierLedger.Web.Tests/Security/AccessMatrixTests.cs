using System.Net;
using System.Text;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Web.Tests.Endpoints;
using Microsoft.AspNetCore.Http;
using Microsoft.AspNetCore.Routing;
using Microsoft.Extensions.DependencyInjection;
using Xunit.Abstractions;

namespace BarrierLedger.Web.Tests.Security;

/// <summary>
/// Issue 19: the access-control matrix (in the manner of OWASP ASVS V4, "access control"), generated from the app's own route
/// table. Every route the app maps must have a rule here, so a new page or endpoint without one fails this test; each rule is
/// then probed over HTTP for a signed-out visitor, a member, a reviewer and an admin (browser sign-ins) and for read and upload
/// tokens of a member and an upload token of a reviewer.
/// </summary>
public sealed class AccessMatrixTests(ITestOutputHelper output)
{
    /// <summary>Who may pass a route's access check.</summary>
    public enum Rule
    {
        Anyone,           // sign-in page, error pages, /health, the OpenAPI document
        SignedIn,         // every page a member uses
        SignedInOrToken,  // file downloads: a browser sign-in or a token of either scope (scripts fetch files too)
        Reviewer,         // the review queue (docs/ledger.md, "Who reviews": the Reviewer role; Admin alone does not review)
        Admin,            // accounts page, backup download
        ApiRead,          // a token of either scope
        ApiUpload,        // an upload token
        ApiReview,        // an upload token of a reviewer or admin
        SignedInNotProbed, // signing out would end the probing session; SessionRevalidationTests cover it
    }

    /// <summary>The rule for each route, keyed "METHOD pattern" as the route table spells it.</summary>
    private static readonly Dictionary<string, Rule> s_rules = new(StringComparer.Ordinal)
    {
        ["GET /"] = Rule.SignedIn,
        ["GET /Account/Login"] = Rule.Anyone,
        ["GET /Account/AccessDenied"] = Rule.SignedIn,
        ["GET /Account/ChangePassword"] = Rule.SignedIn,
        ["GET /Error"] = Rule.Anyone,
        ["GET /not-found"] = Rule.Anyone,
        ["GET /admin/users"] = Rule.Admin,
        ["GET /export"] = Rule.SignedIn,
        ["GET /profile/tokens"] = Rule.SignedIn,
        ["GET /reactions/{Id:int}"] = Rule.SignedIn,
        ["GET /reactions/{ReactionId:int}/edit"] = Rule.SignedIn,
        ["GET /review"] = Rule.Reviewer,
        ["GET /settings"] = Rule.SignedIn,
        ["GET /species/{Id:int}"] = Rule.SignedIn,
        ["GET /studies"] = Rule.SignedIn,
        ["GET /studies/{StudyId:int}"] = Rule.SignedIn,
        ["GET /studies/{StudyId:int}/reactions/new"] = Rule.SignedIn,
        ["GET /studies/{StudyId:int}/workspace"] = Rule.SignedIn,
        ["GET /upload"] = Rule.SignedIn,
        ["POST /Account/Logout"] = Rule.SignedInNotProbed,
        ["GET /health"] = Rule.Anyone,
        ["GET /export/download/table"] = Rule.SignedInOrToken,
        ["GET /export/download/diagram/{reactionId:int}.{format}"] = Rule.SignedInOrToken,
        ["GET /export/download/coordinates"] = Rule.SignedInOrToken,
        ["GET /export/download/file/{fileId:int}"] = Rule.SignedInOrToken,
        ["GET /export/download/bundle/{reactionId:int}"] = Rule.SignedInOrToken,
        ["GET /export/download/isotope-effects/{reactionId:int}"] = Rule.SignedInOrToken,
        ["GET /export/download/backup"] = Rule.Admin,
        ["GET /api/v1/openapi.json"] = Rule.Anyone,
        ["GET /api/v1/me"] = Rule.ApiRead,
        ["GET /api/v1/studies"] = Rule.ApiRead,
        ["GET /api/v1/studies/{studyId:int}/ledger"] = Rule.ApiRead,
        ["GET /api/v1/reactions/{reactionId:int}"] = Rule.ApiRead,
        ["GET /api/v1/reactions/{reactionId:int}/definition"] = Rule.ApiRead,
        ["GET /api/v1/reactions/{reactionId:int}/bundle"] = Rule.ApiRead,
        ["GET /api/v1/reactions/{reactionId:int}/isotope-effects"] = Rule.ApiRead,
        ["GET /api/v1/reactions/{reactionId:int}/exports/diagram"] = Rule.ApiRead,
        ["GET /api/v1/studies/{studyId:int}/exports/table"] = Rule.ApiRead,
        ["GET /api/v1/studies/{studyId:int}/exports/coordinates"] = Rule.ApiRead,
        ["GET /api/v1/studies/{studyId:int}/workspace"] = Rule.ApiRead,
        ["POST /api/v1/studies/{studyId:int}/reactions/preview"] = Rule.ApiRead,
        ["POST /api/v1/uploads/preview"] = Rule.ApiRead,
        ["POST /api/v1/uploads"] = Rule.ApiUpload,
        ["POST /api/v1/studies/{studyId:int}/reactions"] = Rule.ApiUpload,
        ["PUT /api/v1/reactions/{reactionId:int}"] = Rule.ApiUpload,
        ["POST /api/v1/reviews/{calculationId:int}/verify"] = Rule.ApiReview,
        ["POST /api/v1/reviews/{calculationId:int}/return"] = Rule.ApiReview,
        ["GET /{**path:file}"] = Rule.SignedIn, // a file path no static asset matches (the sign-in page's own assets are anonymous static assets)
        ["* /api/{**rest}"] = Rule.Anyone, // answers every unknown /api path with a 404 problem, never the sign-in page
    };

    /// <summary>Framework routes that are not ours to rule: static files and the Blazor circuit (which needs a signed-in page).</summary>
    private static bool IsFramework(RouteEndpoint e) =>
        e.Metadata.Any(m => m.GetType().Name.Contains("StaticAsset", StringComparison.Ordinal))
        || e.RoutePattern.RawText is { } raw && (raw.StartsWith("/_blazor", StringComparison.Ordinal) || raw.StartsWith("_blazor", StringComparison.Ordinal)
            || raw.StartsWith("_framework", StringComparison.Ordinal) || raw.StartsWith("/_framework", StringComparison.Ordinal));

    private static IEnumerable<string> RouteKeys(IServiceProvider services)
    {
        var endpoints = services.GetRequiredService<EndpointDataSource>().Endpoints.OfType<RouteEndpoint>().Where(e => !IsFramework(e));
        foreach (var e in endpoints)
        {
            var raw = "/" + (e.RoutePattern.RawText ?? "").TrimStart('/');
            var methods = e.Metadata.GetMetadata<HttpMethodMetadata>()?.HttpMethods;
            if (methods is null || methods.Count == 0) yield return "* " + raw;
            else if (methods.Contains("GET")) yield return "GET " + raw; // pages take GET and their form POSTs; GET is the one a visitor opens
            else foreach (var m in methods) yield return m + " " + raw;
        }
    }

    [Fact]
    public async Task EveryRouteOfTheApp_HasARule_AndEveryRuleNamesARouteThatExists()
    {
        await using var host = new ApiTestHost();
        var routes = RouteKeys(host.Services).Distinct().ToHashSet();

        var unruled = routes.Where(r => !s_rules.ContainsKey(r)).Order().ToList();
        var stale = s_rules.Keys.Where(k => !routes.Contains(k)).Order().ToList();

        Assert.True(unruled.Count == 0, "Routes without an access rule (add one to AccessMatrixTests): " + string.Join(", ", unruled));
        Assert.True(stale.Count == 0, "Rules for routes the app no longer maps: " + string.Join(", ", stale));
    }

    private sealed record Actor(string Name, CookieSession? Session, string? Token, bool Signed, bool Reviewer, bool Admin, string? Scope);

    [Fact]
    public async Task EveryRule_LetsThroughExactlyTheActorsItNames()
    {
        await using var host = new ApiTestHost(new Dictionary<string, string?>
        {
            ["BarrierLedger:Limits:SignInPostsPerMinute"] = "1000",
            ["BarrierLedger:Limits:DownloadsPerMinute"] = "1000",
            ["BarrierLedger:Api:RequestsPerMinute"] = "1000",
            ["BarrierLedger:Api:UnauthenticatedRequestsPerMinute"] = "1000",
        });
        var member = await CookieSession.CreateUserAsync(host, "mira", Roles.Member);
        var reviewer = await CookieSession.CreateUserAsync(host, "rhea", Roles.Member, Roles.Reviewer);
        await CookieSession.CreateUserAsync(host, "ada", Roles.Member, Roles.Admin);
        using var memberSession = await CookieSession.SignInAsync(host, "mira");
        using var reviewerSession = await CookieSession.SignInAsync(host, "rhea");
        using var adminSession = await CookieSession.SignInAsync(host, "ada");
        Actor[] actors =
        [
            new("signed out", null, null, false, false, false, null),
            new("member", memberSession, null, true, false, false, null),
            new("reviewer", reviewerSession, null, true, true, false, null),
            new("admin", adminSession, null, true, false, true, null), // an admin without the Reviewer role
            new("member read token", null, await host.CreateTokenAsync(member, TokenScopes.Read), false, false, false, TokenScopes.Read),
            new("member upload token", null, await host.CreateTokenAsync(member, TokenScopes.Upload), false, false, false, TokenScopes.Upload),
            new("reviewer upload token", null, await host.CreateTokenAsync(reviewer, TokenScopes.Upload), false, true, false, TokenScopes.Upload),
        ];

        var wrong = new List<string>();
        var table = new StringBuilder("route | " + string.Join(" | ", actors.Select(a => a.Name)) + "\n");
        foreach (var (route, rule) in s_rules.OrderBy(r => r.Key, StringComparer.Ordinal))
        {
            if (rule == Rule.SignedInNotProbed) continue;
            table.Append(route);
            foreach (var actor in actors)
            {
                var expected = Allows(rule, actor);
                var passed = await PassesAsync(host, actor, route);
                table.Append(passed ? " | pass" : " | stop");
                if (passed != expected) wrong.Add($"{route} for {actor.Name}: expected {(expected ? "allowed" : "refused")}, was {(passed ? "allowed" : "refused")}");
            }
            table.Append('\n');
        }
        output.WriteLine(table.ToString());

        Assert.True(wrong.Count == 0, string.Join("\n", wrong));
    }

    private static bool Allows(Rule rule, Actor a) => rule switch
    {
        Rule.Anyone => true,
        Rule.SignedIn => a.Signed,
        Rule.SignedInOrToken => a.Signed || a.Scope is not null,
        Rule.Reviewer => a.Signed && a.Reviewer,
        Rule.Admin => a.Signed && a.Admin,
        Rule.ApiRead => a.Scope is not null,
        Rule.ApiUpload => a.Scope == TokenScopes.Upload,
        Rule.ApiReview => a.Scope == TokenScopes.Upload && a.Reviewer,
        _ => throw new ArgumentOutOfRangeException(nameof(rule)),
    };

    /// <summary>
    /// True when the request got past the access check: anything but 401, 403 or a redirect to the sign-in or access-denied
    /// page. A 404 for an id that does not exist, a 400 for a missing field or a 415 for a missing upload all count as passed.
    /// </summary>
    private static async Task<bool> PassesAsync(ApiTestHost host, Actor actor, string route)
    {
        var space = route.IndexOf(' ');
        var method = route[..space] == "*" ? "GET" : route[..space];
        var path = route[(space + 1)..]
            .Replace("{**rest}", "no-such-thing")
            .Replace(".{format}", ".svg");
        path = System.Text.RegularExpressions.Regex.Replace(path, @"\{[^}]+\}", "1");
        using var request = new HttpRequestMessage(new HttpMethod(method), path);
        // Uploads take multipart only (another content type would be refused by routing before any access check is asked).
        if (path.StartsWith("/api/v1/uploads", StringComparison.Ordinal)) request.Content = new MultipartFormDataContent();
        else if (method is "POST" or "PUT") request.Content = new StringContent("{}", Encoding.UTF8, "application/json");
        if (actor.Token is not null) request.Headers.Authorization = new System.Net.Http.Headers.AuthenticationHeaderValue("Bearer", actor.Token);
        using var anonymous = actor.Session is null ? host.Client() : null;
        using var response = await (actor.Session?.Http ?? anonymous!).SendAsync(request);
        if (response.StatusCode is HttpStatusCode.Unauthorized or HttpStatusCode.Forbidden) return false;
        if (response.StatusCode is HttpStatusCode.Redirect or HttpStatusCode.Found or HttpStatusCode.SeeOther)
        {
            var to = response.Headers.Location?.ToString() ?? "";
            return !to.Contains("/Account/Login", StringComparison.OrdinalIgnoreCase) && !to.Contains("/Account/AccessDenied", StringComparison.OrdinalIgnoreCase);
        }
        return true;
    }
}
