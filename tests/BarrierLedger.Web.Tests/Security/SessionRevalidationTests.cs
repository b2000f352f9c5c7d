using System.Net;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Web.Tests.Endpoints;
using Microsoft.AspNetCore.Identity;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.Web.Tests.Security;

/// <summary>
/// Issue 19, finding 1: roles and account state come from the store on every request, not from a sign-in cookie that stays
/// trusted for half an hour; signing out, changing the password and changing roles end the sessions they should.
/// </summary>
public sealed class SessionRevalidationTests
{
    [Fact]
    public async Task RemovedAdminRole_IsRefusedOnTheVeryNextRequest()
    {
        await using var host = new ApiTestHost();
        var ada = await CookieSession.CreateUserAsync(host, "ada", Roles.Member, Roles.Admin);
        using var session = await CookieSession.SignInAsync(host, "ada");
        Assert.True(CookieSession.Opens(await session.Http.GetAsync("/admin/users")));

        await using (var scope = host.Services.CreateAsyncScope())
        {
            // What the Accounts page does when another admin clears the box.
            var users = scope.ServiceProvider.GetRequiredService<UserManager<LedgerUser>>();
            var user = (await users.FindByIdAsync(ada.Id))!;
            await users.RemoveFromRoleAsync(user, Roles.Admin);
            await users.UpdateSecurityStampAsync(user);
        }

        Assert.False(CookieSession.Opens(await session.Http.GetAsync("/admin/users")));
    }

    [Fact]
    public async Task SignOut_MakesTheSignedOutCookieWorthless()
    {
        await using var host = new ApiTestHost();
        await CookieSession.CreateUserAsync(host, "mira", Roles.Member);
        using var session = await CookieSession.SignInAsync(host, "mira");
        Assert.True(CookieSession.Opens(await session.Http.GetAsync("/")));
        var stolen = session.CookieHeader;

        var signOut = await session.PostFormAsync("/", "/Account/Logout", null, []); // the layout's sign-out button
        Assert.Equal(HttpStatusCode.Redirect, signOut.StatusCode);

        using var replay = CookieSession.Replay(host.BaseAddress, stolen);
        Assert.False(CookieSession.Opens(await replay.GetAsync("/")));
    }

    [Fact]
    public async Task PasswordChange_EndsEveryOtherSession_AndKeepsTheOneThatChangedIt()
    {
        await using var host = new ApiTestHost();
        await CookieSession.CreateUserAsync(host, "mira", Roles.Member);
        using var laptop = await CookieSession.SignInAsync(host, "mira");
        using var labPc = await CookieSession.SignInAsync(host, "mira");
        Assert.True(CookieSession.Opens(await labPc.Http.GetAsync("/")));

        var changed = await laptop.PostFormAsync("/Account/ChangePassword", "/Account/ChangePassword", "change-password", new()
        {
            ["Input.CurrentPassword"] = CookieSession.Password,
            ["Input.NewPassword"] = "Another-Horse-2027",
            ["Input.ConfirmPassword"] = "Another-Horse-2027",
        });
        Assert.Equal(HttpStatusCode.OK, changed.StatusCode);
        Assert.Contains("Your password has been changed.", await changed.Content.ReadAsStringAsync());

        Assert.False(CookieSession.Opens(await labPc.Http.GetAsync("/")));
        Assert.True(CookieSession.Opens(await laptop.Http.GetAsync("/")));
    }

    [Fact]
    public async Task LockedAccount_IsRefusedOnTheVeryNextRequest()
    {
        await using var host = new ApiTestHost();
        var mira = await CookieSession.CreateUserAsync(host, "mira", Roles.Member);
        using var session = await CookieSession.SignInAsync(host, "mira");
        Assert.True(CookieSession.Opens(await session.Http.GetAsync("/")));

        await using (var scope = host.Services.CreateAsyncScope())
        {
            // Locked out directly in the store (as too many failed sign-ins elsewhere would), without touching the security stamp.
            var users = scope.ServiceProvider.GetRequiredService<UserManager<LedgerUser>>();
            var user = (await users.FindByIdAsync(mira.Id))!;
            await users.SetLockoutEndDateAsync(user, DateTimeOffset.UtcNow.AddHours(1));
        }

        Assert.False(CookieSession.Opens(await session.Http.GetAsync("/")));
    }
}
