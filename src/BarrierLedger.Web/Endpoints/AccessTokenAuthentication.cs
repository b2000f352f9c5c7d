using System.Security.Claims;
using System.Text.Encodings.Web;
using BarrierLedger.Ledger.Accounts;
using Microsoft.AspNetCore.Authentication;
using Microsoft.Extensions.Options;

namespace BarrierLedger.Web.Endpoints;

/// <summary>Claims a token-authenticated request carries beside the user's name, id and roles.</summary>
public static class ApiClaims
{
    public const string Scope = "barrierledger:token-scope";
    public const string TokenId = "barrierledger:token-id";
}

/// <summary>
/// Authenticates <c>Authorization: Bearer bltk_…</c> against <see cref="AccessTokenService"/>: the request then acts as the
/// token's user with that user's roles plus a scope claim. Challenges and refusals are problem documents, never a redirect.
/// </summary>
public sealed class AccessTokenAuthenticationHandler(
    IOptionsMonitor<AuthenticationSchemeOptions> options, ILoggerFactory logger, UrlEncoder encoder, AccessTokenService tokens)
    : AuthenticationHandler<AuthenticationSchemeOptions>(options, logger, encoder)
{
    public const string SchemeName = "BarrierLedgerToken";
    private const string RejectionKey = "barrierledger:token-rejection";

    protected override async Task<AuthenticateResult> HandleAuthenticateAsync()
    {
        string header = Request.Headers.Authorization.ToString();
        if (string.IsNullOrWhiteSpace(header)) return AuthenticateResult.NoResult();
        if (!header.StartsWith("Bearer ", StringComparison.OrdinalIgnoreCase))
        {
            Context.Items[RejectionKey] = TokenRejection.Malformed;
            return AuthenticateResult.Fail("The Authorization header is not a bearer token.");
        }
        var check = await tokens.AuthenticateAsync(header["Bearer ".Length..].Trim(), $"{Request.Method} {Request.Path}", Context.RequestAborted);
        if (!check.Accepted)
        {
            Context.Items[RejectionKey] = check.Rejection;
            return AuthenticateResult.Fail($"Access token refused: {check.Rejection}.");
        }
        List<Claim> claims =
        [
            new(ClaimTypes.NameIdentifier, check.UserId!),
            new(ClaimTypes.Name, check.UserName ?? check.UserId!),
            new(ApiClaims.Scope, check.Token!.Scope),
            new(ApiClaims.TokenId, check.Token.Id),
        ];
        if (!string.IsNullOrEmpty(check.DisplayName)) claims.Add(new Claim("barrierledger:display-name", check.DisplayName));
        claims.AddRange(check.Roles.Select(r => new Claim(ClaimTypes.Role, r)));
        var principal = new ClaimsPrincipal(new ClaimsIdentity(claims, SchemeName, ClaimTypes.Name, ClaimTypes.Role));
        return AuthenticateResult.Success(new AuthenticationTicket(principal, SchemeName));
    }

    protected override Task HandleChallengeAsync(AuthenticationProperties properties)
    {
        var why = Context.Items.TryGetValue(RejectionKey, out var r) && r is TokenRejection t ? t : (TokenRejection?)null;
        var (code, detail) = why switch
        {
            null => ("token-missing", "This endpoint needs a personal access token: send 'Authorization: Bearer bltk_…' (create one on your profile page)."),
            TokenRejection.Malformed => ("token-malformed", "The Authorization header does not hold a BarrierLedger access token ('Bearer bltk_<id>_<secret>')."),
            TokenRejection.Expired => ("token-expired", "This access token has expired; create a new one on your profile page."),
            TokenRejection.Revoked => ("token-revoked", "This access token was revoked by its owner."),
            TokenRejection.AccountUnavailable => ("account-unavailable", "The account this token belongs to is locked or no longer exists."),
            _ => ("token-unknown", "This access token is not known (wrong id or secret)."),
        };
        Response.Headers.WWWAuthenticate = $"Bearer realm=\"BarrierLedger\", error=\"invalid_token\"";
        return ApiProblems.WriteAsync(Context, StatusCodes.Status401Unauthorized, code, "Not authenticated", detail);
    }

    protected override Task HandleForbiddenAsync(AuthenticationProperties properties)
    {
        var needs = Context.GetEndpoint()?.Metadata.GetMetadata<ApiAccess>();
        var scope = Context.User.FindFirst(ApiClaims.Scope)?.Value ?? "none";
        if (needs is not null && !TokenScopes.Allows(scope, needs.Scope))
            return ApiProblems.WriteAsync(Context, StatusCodes.Status403Forbidden, "scope-insufficient", "Forbidden",
                $"This request needs a token with scope '{needs.Scope}'; this token has scope '{scope}'.");
        var roles = needs?.Roles is { Count: > 0 } rs ? string.Join(" or ", rs) : "another role";
        return ApiProblems.WriteAsync(Context, StatusCodes.Status403Forbidden, "role-required", "Forbidden",
            $"This request needs the {roles} role; the token's account does not have it.");
    }
}

/// <summary>Endpoint metadata: the token scope and (optionally) the roles an API endpoint needs. Read by the 403 message.</summary>
public sealed record ApiAccess(string Scope, IReadOnlyList<string> Roles);

/// <summary>The API's authorization policies: token scheme only (cookies do not reach the API), scope claim, roles.</summary>
public static class ApiPolicies
{
    public const string Read = "api:read";
    public const string Upload = "api:upload";
    public const string Review = "api:review";

    internal static void Add(Microsoft.AspNetCore.Authorization.AuthorizationBuilder auth)
    {
        auth.AddPolicy(Read, p => Scope(p, TokenScopes.Read));
        auth.AddPolicy(Upload, p => Scope(p, TokenScopes.Upload));
        auth.AddPolicy(Review, p => Scope(p, TokenScopes.Upload).RequireRole(Roles.MayReview));
    }

    private static Microsoft.AspNetCore.Authorization.AuthorizationPolicyBuilder Scope(Microsoft.AspNetCore.Authorization.AuthorizationPolicyBuilder p, string needed) =>
        p.AddAuthenticationSchemes(AccessTokenAuthenticationHandler.SchemeName)
            .RequireAuthenticatedUser()
            .RequireAssertion(c => c.User.FindFirst(ApiClaims.Scope)?.Value is { } s && TokenScopes.Allows(s, needed));

    /// <summary>Requires the policy and records what it needs for the 403 message.</summary>
    public static TBuilder RequireApi<TBuilder>(this TBuilder builder, string policy) where TBuilder : IEndpointConventionBuilder
    {
        var access = policy switch
        {
            Read => new ApiAccess(TokenScopes.Read, []),
            Upload => new ApiAccess(TokenScopes.Upload, []),
            Review => new ApiAccess(TokenScopes.Upload, Roles.MayReview),
            _ => throw new ArgumentException($"Unknown API policy '{policy}'.", nameof(policy)),
        };
        return builder.RequireAuthorization(policy).WithMetadata(access);
    }
}
