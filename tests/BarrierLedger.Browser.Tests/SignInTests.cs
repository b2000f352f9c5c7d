using BarrierLedger.Browser.Tests.Infrastructure;
using Microsoft.Playwright;

namespace BarrierLedger.Browser.Tests;

public class SignInTests
{
    [SkippableFact]
    public async Task FirstAdmin_SignsInWithPrintedPassword_MustChangeIt_ThenReachesLedger()
    {
        Chromium.SkipIfMissing();
        await using var app = await AppProcess.StartAsync();
        var oneTime = await app.FirstAdminPassword.WaitAsync(TimeSpan.FromSeconds(10));
        var (playwright, browser) = await Chromium.LaunchAsync();
        using var _ = playwright;
        await using var __ = browser;
        var page = await browser.NewPageAsync();

        await page.GotoAsync(app.BaseUrl + "/");
        Assert.Contains("/Account/Login", page.Url);

        await Flows.SignInAsync(page, app.BaseUrl, "admin", oneTime);
        Assert.Contains("/Account/ChangePassword", page.Url);
        // The forced change cannot be skipped: asking for the ledger sends the user back.
        await page.GotoAsync(app.BaseUrl + "/");
        Assert.Contains("/Account/ChangePassword", page.Url);

        await page.GetByLabel("Current password").FillAsync(oneTime);
        await page.GetByLabel("New password (at least").FillAsync(Flows.AdminNewPassword);
        await page.GetByLabel("Repeat the new password").FillAsync(Flows.AdminNewPassword);
        await page.GetByRole(AriaRole.Button, new() { Name = "Change password" }).ClickAsync();
        await page.WaitForLoadStateAsync(LoadState.NetworkIdle);

        await Assertions.Expect(page.GetByRole(AriaRole.Heading, new() { Name = "Ledger", Level = 1 })).ToBeVisibleAsync();
        await Assertions.Expect(page.GetByRole(AriaRole.Link, new() { Name = "Accounts" })).ToBeVisibleAsync();
        await Flows.ScreenshotAsync(page, "first-admin-ledger");

        // The one-time password no longer works.
        var other = await browser.NewPageAsync();
        await Flows.SignInAsync(other, app.BaseUrl, "admin", oneTime);
        await Assertions.Expect(other.GetByRole(AriaRole.Alert)).ToContainTextAsync("User name or password is wrong");
    }
}
