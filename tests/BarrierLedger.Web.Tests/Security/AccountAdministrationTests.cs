using System.Net;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Auditing;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Web.Components.Account;
using BarrierLedger.Web.Hosting;
using BarrierLedger.Web.Tests.Endpoints;
using Microsoft.AspNetCore.Identity;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.Web.Tests.Security;

/// <summary>Issue 19, finding 3: the Accounts page's disable, unlock, password reset and delete, each audited and each effective at once.</summary>
public sealed class AccountAdministrationTests
{
    private static async Task<IReadOnlyList<string>> AuditActionsAsync(ApiTestHost host, string userId) =>
        [.. (await host.Get<AuditService>().GetEventsAsync("Account", userId)).Select(e => e.Action)];

    [Fact]
    public async Task Disable_EndsTheSessionAndTheTokens_RefusesSignIn_AndEnableRestores()
    {
        await using var host = new ApiTestHost();
        var admin = await CookieSession.CreateUserAsync(host, "ada", Roles.Member, Roles.Admin);
        var mira = await CookieSession.CreateUserAsync(host, "mira", Roles.Member);
        using var session = await CookieSession.SignInAsync(host, "mira");
        using var api = host.Client(await host.CreateTokenAsync(mira, TokenScopes.Read));
        var accounts = host.Get<UserAdminService>();

        Assert.True((await accounts.SetDisabledAsync(admin.Id, mira.Id, true)).Ok);

        Assert.False(CookieSession.Opens(await session.Http.GetAsync("/")));
        Assert.Equal(HttpStatusCode.Unauthorized, (await api.GetAsync("/api/v1/me")).StatusCode);
        Assert.True((await accounts.ListAsync()).Single(r => r.UserName == "mira").Disabled);
        await Assert.ThrowsAnyAsync<Exception>(() => CookieSession.SignInAsync(host, "mira"));
        Assert.False((await accounts.SetDisabledAsync(admin.Id, admin.Id, true)).Ok); // not yourself

        Assert.True((await accounts.SetDisabledAsync(admin.Id, mira.Id, false)).Ok);
        using var again = await CookieSession.SignInAsync(host, "mira");
        Assert.True(CookieSession.Opens(await again.Http.GetAsync("/")));
        Assert.Equal(["account.enabled", "account.disabled"], (await AuditActionsAsync(host, mira.Id)).Take(2));
    }

    [Fact]
    public async Task Unlock_EndsALockoutAfterFailedSignIns()
    {
        await using var host = new ApiTestHost();
        var admin = await CookieSession.CreateUserAsync(host, "ada", Roles.Member, Roles.Admin);
        var mira = await CookieSession.CreateUserAsync(host, "mira", Roles.Member);
        await using (var scope = host.Services.CreateAsyncScope())
        {
            var users = scope.ServiceProvider.GetRequiredService<UserManager<LedgerUser>>();
            await users.SetLockoutEndDateAsync((await users.FindByIdAsync(mira.Id))!, DateTimeOffset.UtcNow.AddMinutes(5));
        }
        Assert.True((await host.Get<UserAdminService>().ListAsync()).Single(r => r.UserName == "mira").LockedOut);

        Assert.True((await host.Get<UserAdminService>().UnlockAsync(admin.Id, mira.Id)).Ok);

        using var session = await CookieSession.SignInAsync(host, "mira");
        Assert.True(CookieSession.Opens(await session.Http.GetAsync("/")));
        Assert.Contains("account.unlocked", await AuditActionsAsync(host, mira.Id));
    }

    [Fact]
    public async Task ResetPassword_EndsTheSessions_AndTheOneTimePasswordLeadsToTheForcedChange()
    {
        await using var host = new ApiTestHost();
        var admin = await CookieSession.CreateUserAsync(host, "ada", Roles.Member, Roles.Admin);
        var mira = await CookieSession.CreateUserAsync(host, "mira", Roles.Member);
        using var session = await CookieSession.SignInAsync(host, "mira");

        var (ok, _, oneTime) = await host.Get<UserAdminService>().ResetPasswordAsync(admin.Id, mira.Id);

        Assert.True(ok);
        Assert.False(CookieSession.Opens(await session.Http.GetAsync("/")));
        await Assert.ThrowsAnyAsync<Exception>(() => CookieSession.SignInAsync(host, "mira")); // the old password is gone
        using var fresh = await CookieSession.SignInAsync(host, "mira", oneTime!);
        var home = await fresh.Http.GetAsync("/");
        Assert.Equal(HttpStatusCode.Redirect, home.StatusCode);
        Assert.Equal(AuthExtensions.ChangePasswordPath, home.Headers.Location!.OriginalString);
        Assert.Contains("account.password-reset", await AuditActionsAsync(host, mira.Id));
    }

    [Fact]
    public async Task Delete_RemovesTheAccountAndItsTokens_ButNotYourselfNorTheLastAdmin()
    {
        await using var host = new ApiTestHost();
        var admin = await CookieSession.CreateUserAsync(host, "ada", Roles.Member, Roles.Admin);
        var mira = await CookieSession.CreateUserAsync(host, "mira", Roles.Member);
        using var api = host.Client(await host.CreateTokenAsync(mira, TokenScopes.Read));
        var accounts = host.Get<UserAdminService>();

        Assert.False((await accounts.DeleteAsync(admin.Id, admin.Id)).Ok);
        Assert.True((await accounts.DeleteAsync(admin.Id, mira.Id)).Ok);

        Assert.DoesNotContain(await accounts.ListAsync(), r => r.UserName == "mira");
        Assert.Equal(HttpStatusCode.Unauthorized, (await api.GetAsync("/api/v1/me")).StatusCode);
        Assert.Contains("account.deleted", await AuditActionsAsync(host, mira.Id));
    }

    [Fact]
    public async Task RemoveDemo_RetiresTheDemoStudy_DeletesBothDemoAccounts_AndTheSignInHintGoes()
    {
        await using var host = new ApiTestHost(new Dictionary<string, string?> { ["BarrierLedger:LoadDemo"] = "true" });
        var admin = await CookieSession.CreateUserAsync(host, "ada", Roles.Member, Roles.Admin);
        var accounts = host.Get<UserAdminService>();
        using var anonymous = host.Client();
        Assert.True(await accounts.DemoPresentAsync());
        Assert.Contains(DemoAccounts.ReviewerPassword, await anonymous.GetStringAsync("/Account/Login"));

        var (ok, message) = await accounts.RemoveDemoAsync(admin.Id);

        Assert.True(ok, message);
        Assert.False(await accounts.DemoPresentAsync());
        Assert.DoesNotContain(await accounts.ListAsync(), r => r.UserName.StartsWith("demo-", StringComparison.Ordinal));
        Assert.Empty(await host.Get<LedgerQueryService>().GetStudiesAsync(includeRetired: false));
        Assert.NotEmpty(await host.Get<LedgerQueryService>().GetStudiesAsync(includeRetired: true)); // retired, restorable
        Assert.DoesNotContain(DemoAccounts.ReviewerPassword, await anonymous.GetStringAsync("/Account/Login"));
    }
}
