using BarrierLedger.Ledger.Accounts;
using Microsoft.AspNetCore.Components.Authorization;
using Microsoft.AspNetCore.Components.Server;
using Microsoft.AspNetCore.Identity;

namespace BarrierLedger.Web.Components.Account;

/// <summary>
/// Re-checks an open page's sign-in against the store every few seconds (security stamp and lockout, the same rule as the cookie
/// check), so a removed role, a locked account or a sign-out elsewhere closes the page's access. Privileged actions on an open
/// page ask <see cref="BarrierLedger.Ledger.Accounts.AccountAccess"/> as well, so nothing is granted in between.
/// </summary>
internal sealed class IdentityRevalidatingAuthenticationStateProvider(
        ILoggerFactory loggerFactory,
        IServiceScopeFactory scopeFactory)
    : RevalidatingServerAuthenticationStateProvider(loggerFactory)
{
    protected override TimeSpan RevalidationInterval => TimeSpan.FromSeconds(5);

    protected override async Task<bool> ValidateAuthenticationStateAsync(AuthenticationState state, CancellationToken ct)
    {
        await using var scope = scopeFactory.CreateAsyncScope();
        var signIn = scope.ServiceProvider.GetRequiredService<SignInManager<LedgerUser>>();
        return await signIn.ValidateSecurityStampAsync(state.User) is not null;
    }
}
