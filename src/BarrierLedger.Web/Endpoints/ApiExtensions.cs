using System.Security.Claims;
using System.Text.Json.Serialization;
using BarrierLedger.Ledger.Accounts;
using Microsoft.AspNetCore.Authentication;
using Microsoft.AspNetCore.Authentication.Cookies;
using Microsoft.AspNetCore.Identity;

namespace BarrierLedger.Web.Endpoints;

/// <summary>Who a token acts as (GET /api/v1/me).</summary>
public sealed record MeResponse(string UserId, string UserName, string? DisplayName, IReadOnlyList<string> Roles, string Scope, string TokenId);

/// <summary>
/// The HTTP API under /api/v1: personal-access-token authentication, per-token rate limiting (see Hosting/RequestLimits), problem-details errors and an
/// OpenAPI document at /api/v1/openapi.json. Described for users in docs/api.md.
/// </summary>
public static class ApiExtensions
{
    public const string Prefix = "/api/v1";

    public static IServiceCollection AddBarrierLedgerApi(this IServiceCollection services, IConfiguration configuration)
    {
        var options = new ApiOptions();
        configuration.GetSection(ApiOptions.SectionName).Bind(options);
        services.AddSingleton(options);
        services.AddSingleton<AccessTokenService>();

        services.AddAuthentication()
            .AddScheme<AuthenticationSchemeOptions, AccessTokenAuthenticationHandler>(AccessTokenAuthenticationHandler.SchemeName, null);
        ApiPolicies.Add(services.AddAuthorizationBuilder());

        // A cookie challenge on an /api path (e.g. a path no endpoint matches) answers with a problem, not the sign-in page.
        services.PostConfigure<CookieAuthenticationOptions>(IdentityConstants.ApplicationScheme, o =>
        {
            var toLogin = o.Events.OnRedirectToLogin;
            var toDenied = o.Events.OnRedirectToAccessDenied;
            o.Events.OnRedirectToLogin = c => c.Request.Path.StartsWithSegments("/api")
                ? ApiProblems.WriteAsync(c.HttpContext, StatusCodes.Status401Unauthorized, "token-missing", "Not authenticated", "The API needs a personal access token (Authorization: Bearer bltk_…).")
                : toLogin(c);
            o.Events.OnRedirectToAccessDenied = c => c.Request.Path.StartsWithSegments("/api")
                ? ApiProblems.WriteAsync(c.HttpContext, StatusCodes.Status403Forbidden, "forbidden", "Forbidden", "The API is reached with a personal access token, not a browser sign-in.")
                : toDenied(c);
        });

        services.ConfigureHttpJsonOptions(o => o.SerializerOptions.Converters.Add(new JsonStringEnumConverter()));
        services.AddProblemDetails();

        services.AddOpenApi("v1", o =>
        {
            o.ShouldInclude = d => d.RelativePath?.StartsWith("api/v1/", StringComparison.Ordinal) == true;
            o.AddDocumentTransformer((doc, _, _) =>
            {
                doc.Info.Title = "BarrierLedger API";
                doc.Info.Version = "v1";
                doc.Info.Description = "Upload results and read the ledger with a personal access token: 'Authorization: Bearer bltk_<id>_<secret>'. " +
                    "Scopes: read (every GET and the upload preview), upload (read plus uploads, and verify/return for reviewers). Errors are application/problem+json.";
                return Task.CompletedTask;
            });
        });
        return services;
    }

    /// <summary>Maps every /api/v1 endpoint, the OpenAPI document and a problem-document 404 for unknown /api paths.</summary>
    public static RouteGroupBuilder MapBarrierLedgerApi(this IEndpointRouteBuilder endpoints)
    {
        var options = endpoints.ServiceProvider.GetRequiredService<ApiOptions>();
        endpoints.MapOpenApi(Prefix + "/openapi.json").AllowAnonymous().RequireRateLimiting(BarrierLedger.Web.Hosting.RequestLimits.ApiPolicy);

        var api = endpoints.MapGroup(Prefix).RequireRateLimiting(BarrierLedger.Web.Hosting.RequestLimits.ApiPolicy).AddEndpointFilter(ProblemOnException);
        api.MapGet("/me", (ClaimsPrincipal user) => TypedResults.Ok(new MeResponse(
                user.FindFirstValue(ClaimTypes.NameIdentifier)!, user.Identity!.Name!, user.FindFirstValue("barrierledger:display-name"),
                [.. user.FindAll(ClaimTypes.Role).Select(c => c.Value)], user.FindFirstValue(ApiClaims.Scope)!, user.FindFirstValue(ApiClaims.TokenId)!)))
            .RequireApi(ApiPolicies.Read)
            .WithName("Me")
            .WithSummary("The account, roles and scope this token acts with");
        UploadEndpoints.Map(api, options);
        LedgerEndpoints.Map(api);
        ReactionEndpoints.Map(api);
        ExportApiEndpoints.Map(api);
        IsotopeEffectEndpoints.Map(api);

        endpoints.MapFallback("/api/{**rest}", (HttpContext c) => ApiProblems.NotFound($"No API endpoint at {c.Request.Method} {c.Request.Path}; see {Prefix}/openapi.json."))
            .AllowAnonymous().ExcludeFromDescription();
        return api;
    }

    private static async ValueTask<object?> ProblemOnException(EndpointFilterInvocationContext context, EndpointFilterDelegate next)
    {
        try
        {
            return await next(context);
        }
        catch (Exception ex) when (ex is not OperationCanceledException)
        {
            context.HttpContext.RequestServices.GetRequiredService<ILoggerFactory>().CreateLogger("BarrierLedger.Api").LogError(ex, "API request failed");
            return ApiProblems.Problem(StatusCodes.Status500InternalServerError, "internal-error", "Server error",
                "The server could not finish this request; nothing partial was stored. The error is in the server log.");
        }
    }
}
