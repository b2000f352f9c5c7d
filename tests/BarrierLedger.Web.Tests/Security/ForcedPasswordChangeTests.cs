using System.Net;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Web.Tests.Endpoints;
using Microsoft.AspNetCore.Identity;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.Web.Tests.Security;

/// <summary>
/// Issue 19, finding 9: an account with a one-time password is held at the change-password page. Before the fix, any URL that
/// ended in a file extension (every diagram download, "/export/download/diagram/1.svg") went through without the change.
/// </summary>
public sealed class ForcedPasswordChangeTests
{
    [Theory]
    [InlineData("/export/download/diagram/1.svg")]
    [InlineData("/export/download/diagram/1.png")]
    [InlineData("/studies")]
    [InlineData("/reactions/1")]
    public async Task AnAccountThatMustChangeItsPassword_IsHeldAtTheChangePage_WhateverTheUrlLooksLike(string path)
    {
        await using var host = new ApiTestHost();
        var mira = await CookieSession.CreateUserAsync(host, "mira", Roles.Member);
        await using (var scope = host.Services.CreateAsyncScope())
        {
            var users = scope.ServiceProvider.GetRequiredService<UserManager<LedgerUser>>();
            var stored = (await users.FindByIdAsync(mira.Id))!;
            stored.MustChangePassword = true;
            Assert.True((await users.UpdateAsync(stored)).Succeeded);
        }
        using var session = await CookieSession.SignInAsync(host, "mira");

        var response = await session.Http.GetAsync(path);

        Assert.Equal(HttpStatusCode.Redirect, response.StatusCode);
        Assert.EndsWith("/Account/ChangePassword", response.Headers.Location?.ToString());
        // What anyone may fetch still answers.
        Assert.Equal(HttpStatusCode.OK, (await session.Http.GetAsync("/health")).StatusCode);
    }
}
