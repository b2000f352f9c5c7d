using System.Security.Claims;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Storage;
using Microsoft.AspNetCore.Authorization;
using Microsoft.AspNetCore.Components.Authorization;
using Microsoft.AspNetCore.Identity;
using Microsoft.AspNetCore.Mvc;

namespace BarrierLedger.Web.Components.Account;

public static class AuthExtensions
{
    public const string MustChangePasswordClaim = "barrierledger:must-change-password";
    public const string ChangePasswordPath = "/Account/ChangePassword";

    /// <summary>
    /// Identity on the ledger database with roles; every endpoint requires a signed-in user unless it opts out
    /// (sign-in, static assets, /health).
    /// </summary>
    public static IServiceCollection AddBarrierLedgerAuth(this IServiceCollection services)
    {
        services.AddCascadingAuthenticationState();
        services.AddScoped<IdentityRedirectManager>();
        services.AddScoped<AuthenticationStateProvider, IdentityRevalidatingAuthenticationStateProvider>();
        services.AddScoped<AccountBootstrap>();
        services.AddSingleton<UserAdminService>();

        services.AddAuthentication(o =>
            {
                o.DefaultScheme = IdentityConstants.ApplicationScheme;
                o.DefaultSignInScheme = IdentityConstants.ExternalScheme;
            })
            .AddIdentityCookies();
        services.ConfigureApplicationCookie(o =>
        {
            o.LoginPath = "/Account/Login";
            o.AccessDeniedPath = "/Account/AccessDenied";
            o.Cookie.Name = "BarrierLedger.Auth";
        });

        services.AddIdentityCore<LedgerUser>(o =>
            {
                o.SignIn.RequireConfirmedAccount = false;
                o.User.RequireUniqueEmail = false;
                o.Password.RequiredLength = 10;
                o.Password.RequireNonAlphanumeric = false;
            })
            .AddRoles<IdentityRole>()
            .AddEntityFrameworkStores<LedgerDbContext>()
            .AddSignInManager<LedgerSignInManager>()
            .AddClaimsPrincipalFactory<LedgerClaimsFactory>()
            .AddDefaultTokenProviders();
        // Every request with a sign-in cookie checks the account in the store (security stamp, lockout) and rebuilds its roles
        // from the store: a removed role, a locked account, a password change or a sign-out elsewhere takes effect at once.
        services.Configure<SecurityStampValidatorOptions>(o => o.ValidationInterval = TimeSpan.Zero);

        services.AddAuthorizationBuilder()
            .SetFallbackPolicy(new AuthorizationPolicyBuilder().RequireAuthenticatedUser().Build())
            .AddPolicy(Policies.Reviewer, p => p.RequireRole(Policies.RolesFor(Policies.Reviewer)))
            .AddPolicy(Policies.Admin, p => p.RequireRole(Policies.RolesFor(Policies.Admin)));
        return services;
    }

    /// <summary>
    /// An account with a one-time password reaches nothing but the change-password page until it is changed: only what anyone may
    /// reach passes (decided by the endpoint's own rule, not by how its URL looks, so a download ending in ".svg" is held too).
    /// </summary>
    public static IApplicationBuilder UseMustChangePassword(this IApplicationBuilder app) =>
        app.Use(async (context, next) =>
        {
            var path = context.Request.Path;
            if (context.User.HasClaim(MustChangePasswordClaim, "true")
                && !path.StartsWithSegments("/Account")
                && !path.StartsWithSegments("/_framework")
                && !path.StartsWithSegments("/_content")
                && context.GetEndpoint()?.Metadata.GetMetadata<IAllowAnonymous>() is null) // static assets, sign-in, /health
            {
                context.Response.Redirect(ChangePasswordPath);
                return;
            }
            await next();
        });

    public static IEndpointConventionBuilder MapAccountEndpoints(this IEndpointRouteBuilder endpoints)
    {
        var group = endpoints.MapGroup("/Account");
        group.MapPost("/Logout", async (ClaimsPrincipal principal, [FromServices] SignInManager<LedgerUser> signIn) =>
        {
            // A new security stamp makes the cookie just removed (and any copy of it) worthless on the server, not only in this browser.
            if (await signIn.UserManager.GetUserAsync(principal) is { } user) await signIn.UserManager.UpdateSecurityStampAsync(user);
            await signIn.SignOutAsync();
            return TypedResults.LocalRedirect("~/Account/Login");
        });
        return group;
    }
}

public static class Policies
{
    public const string Reviewer = "Reviewer";
    public const string Admin = "Admin";

    /// <summary>The roles that satisfy a policy: one rule for the cookie check, the API and the store check of an open page.</summary>
    public static string[] RolesFor(string policy) => policy switch
    {
        Reviewer => Roles.MayReview,
        Admin => [Roles.Admin],
        _ => throw new ArgumentException($"Unknown policy '{policy}'.", nameof(policy)),
    };
}

/// <summary>
/// A session stays valid only while its account does: the security stamp matches (no sign-out, password or role change since)
/// and the account is not locked out. Used by the cookie check on every request and by the open-page revalidation.
/// </summary>
internal sealed class LedgerSignInManager(
    UserManager<LedgerUser> users,
    IHttpContextAccessor contextAccessor,
    IUserClaimsPrincipalFactory<LedgerUser> claimsFactory,
    Microsoft.Extensions.Options.IOptions<IdentityOptions> optionsAccessor,
    ILogger<SignInManager<LedgerUser>> logger,
    Microsoft.AspNetCore.Authentication.IAuthenticationSchemeProvider schemes,
    IUserConfirmation<LedgerUser> confirmation)
    : SignInManager<LedgerUser>(users, contextAccessor, claimsFactory, optionsAccessor, logger, schemes, confirmation)
{
    public override async Task<bool> ValidateSecurityStampAsync(LedgerUser? user, string? securityStamp) =>
        user is not null && !await UserManager.IsLockedOutAsync(user) && await base.ValidateSecurityStampAsync(user, securityStamp);
}

/// <summary>Adds the must-change-password flag to the sign-in cookie so the middleware needs no database call.</summary>
internal sealed class LedgerClaimsFactory(
    Microsoft.AspNetCore.Identity.UserManager<LedgerUser> users,
    RoleManager<IdentityRole> roles,
    Microsoft.Extensions.Options.IOptions<IdentityOptions> options)
    : UserClaimsPrincipalFactory<LedgerUser, IdentityRole>(users, roles, options)
{
    protected override async Task<ClaimsIdentity> GenerateClaimsAsync(LedgerUser user)
    {
        var identity = await base.GenerateClaimsAsync(user);
        if (user.MustChangePassword) identity.AddClaim(new Claim(AuthExtensions.MustChangePasswordClaim, "true"));
        if (!string.IsNullOrEmpty(user.DisplayName)) identity.AddClaim(new Claim("barrierledger:display-name", user.DisplayName));
        return identity;
    }
}
