using System.Net;
using BarrierLedger.Browser.Tests.Infrastructure;
using Microsoft.Playwright;

namespace BarrierLedger.Browser.Tests;

public class AccessTests
{
    public static TheoryData<string> Pages => ["/", "/upload", "/review", "/export", "/settings", "/admin/users", "/Account/ChangePassword"];

    [Fact]
    public async Task EveryPage_RedirectsSignedOutVisitorToSignIn()
    {
        await using var app = await AppProcess.StartAsync();
        using var http = new HttpClient(new HttpClientHandler { AllowAutoRedirect = false }) { BaseAddress = new Uri(app.BaseUrl) };
        foreach (var path in Pages)
        {
            using var response = await http.GetAsync(path);
            Assert.True(response.StatusCode == HttpStatusCode.Redirect, $"{path}: expected a redirect, got {(int)response.StatusCode}");
            Assert.StartsWith("/Account/Login", response.Headers.Location!.PathAndQuery, StringComparison.Ordinal);
        }
        // What stays open: sign-in, static assets, health.
        Assert.Equal(HttpStatusCode.OK, (await http.GetAsync("/Account/Login")).StatusCode);
        Assert.Equal(HttpStatusCode.OK, (await http.GetAsync("/app.css")).StatusCode);
        Assert.Equal(HttpStatusCode.OK, (await http.GetAsync("/health")).StatusCode);
    }

    [SkippableFact]
    public async Task Member_CannotOpenAdminPage_EvenByAddress()
    {
        Chromium.SkipIfMissing();
        await using var app = await AppProcess.StartAsync();
        var oneTime = await app.FirstAdminPassword.WaitAsync(TimeSpan.FromSeconds(10));
        var (playwright, browser) = await Chromium.LaunchAsync();
        using var _ = playwright;
        await using var __ = browser;

        // The admin creates a member account and reads its one-time password off the page.
        var adminContext = await browser.NewContextAsync();
        var admin = await adminContext.NewPageAsync();
        await Flows.FirstSignInAsync(admin, app.BaseUrl, "admin", oneTime, Flows.AdminNewPassword);
        await Flows.OpenAsync(admin, app.BaseUrl + "/admin/users");
        await admin.GetByLabel("User name").FillAsync("mira");
        await admin.GetByLabel("Display name").FillAsync("Mira Testova");
        await admin.GetByRole(AriaRole.Button, new() { Name = "Create" }).ClickAsync();
        var memberOneTime = (await admin.GetByTestId("one-time-password").TextContentAsync())!.Trim();
        await Assertions.Expect(admin.GetByRole(AriaRole.Cell, new() { Name = "mira", Exact = true })).ToBeVisibleAsync();

        var memberContext = await browser.NewContextAsync();
        var member = await memberContext.NewPageAsync();
        await Flows.FirstSignInAsync(member, app.BaseUrl, "mira", memberOneTime, "Member-pass-2026");
        await Assertions.Expect(member.GetByRole(AriaRole.Heading, new() { Name = "Ledger", Level = 1 })).ToBeVisibleAsync();
        await Assertions.Expect(member.GetByRole(AriaRole.Link, new() { Name = "Accounts" })).ToHaveCountAsync(0);

        // Server side, not only a hidden link: a direct request with the member's cookie is refused.
        var response = await memberContext.APIRequest.GetAsync(app.BaseUrl + "/admin/users", new() { MaxRedirects = 0 });
        Assert.Equal(302, response.Status);
        Assert.Contains("/Account/AccessDenied", response.Headers["location"]);

        await member.GotoAsync(app.BaseUrl + "/admin/users");
        await Assertions.Expect(member.GetByRole(AriaRole.Heading, new() { Name = "Not allowed" })).ToBeVisibleAsync();
        await Flows.ScreenshotAsync(member, "member-refused-admin");
    }
}
