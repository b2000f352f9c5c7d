using BarrierLedger.Browser.Tests.Infrastructure;
using Microsoft.Playwright;

namespace BarrierLedger.Browser.Tests;

/// <summary>A newcomer's first start: the demo study is loaded, its checks show every status, and a reviewer can sign off.</summary>
public class DemoLedgerTests
{
    [SkippableFact]
    public async Task FreshStart_ShowsDemoStudy_WithEveryStatus_ThenReviewerVerifies_AndMemberIsRefusedTheQueue()
    {
        Chromium.SkipIfMissing();
        await using var app = await AppProcess.StartAsync();
        var (playwright, browser) = await Chromium.LaunchAsync();
        using var _ = playwright;
        await using var __ = browser;

        // The sign-in page offers the demo accounts while the demo study is loaded.
        var reviewerContext = await browser.NewContextAsync(new() { ViewportSize = new() { Width = 1400, Height = 900 } });
        var page = await reviewerContext.NewPageAsync();
        await page.GotoAsync(app.BaseUrl + "/Account/Login");
        await Assertions.Expect(page.GetByRole(AriaRole.Note, new() { Name = "Demo accounts" })).ToContainTextAsync("demo-reviewer");

        await Flows.SignInAsync(page, app.BaseUrl, "demo-reviewer", "Demo-reviewer-2026");
        await page.WaitForSelectorAsync("#circuit-ready", new() { State = WaitForSelectorState.Attached });
        await Assertions.Expect(page.GetByRole(AriaRole.Heading, new() { Name = "Ledger", Level = 1 })).ToBeVisibleAsync();
        var table = page.Locator("table.ledger");
        await Assertions.Expect(table).ToContainTextAsync("DA");
        foreach (var status in new[] { "Passed", "Needs attention", "Failed", "Awaiting review", "inconsistent" })
            await Assertions.Expect(table.GetByText(status).First).ToBeVisibleAsync();
        await Assertions.Expect(page.GetByRole(AriaRole.Note, new() { Name = "Energy model in force" })).ToContainTextAsync("298.15 K");
        await Flows.ScreenshotAsync(page, "demo-ledger");

        // The reaction page draws its diagram with Plotly (an SVG with line paths, not only the component).
        await page.GetByRole(AriaRole.Link, new() { Name = "DA", Exact = true }).ClickAsync();
        await page.WaitForSelectorAsync("figure.chart svg.main-svg");
        Assert.True(await page.Locator(".scatterlayer path.js-line").CountAsync() > 0, "the energy diagram has no drawn lines");
        await Assertions.Expect(page.GetByRole(AriaRole.Note).Filter(new() { HasText = "Caution" })).ToBeVisibleAsync();
        await Flows.ScreenshotAsync(page, "demo-reaction-da");

        // The reviewer verifies DA's saddle point from the queue.
        await Flows.OpenAsync(page, app.BaseUrl + "/review");
        var item = page.Locator("article.panel").Filter(new() { HasText = "DA" }).First;
        await item.GetByRole(AriaRole.Button, new() { Name = "Verify" }).ClickAsync();
        await Assertions.Expect(page.GetByTestId("review-message")).ToContainTextAsync("verified");
        await Flows.ScreenshotAsync(page, "demo-review-queue");

        await Flows.OpenAsync(page, app.BaseUrl + "/");
        var daRow = page.Locator("table.ledger tbody tr").Filter(new() { Has = page.GetByRole(AriaRole.Link, new() { Name = "DA", Exact = true }) });
        await Assertions.Expect(daRow).ToContainTextAsync("Verified");

        // A member sees the status but cannot open the queue, even by address.
        var memberContext = await browser.NewContextAsync();
        var member = await memberContext.NewPageAsync();
        await Flows.SignInAsync(member, app.BaseUrl, "demo-member", "Demo-member-2026");
        var refused = await memberContext.APIRequest.GetAsync(app.BaseUrl + "/review", new() { MaxRedirects = 0 });
        Assert.Equal(302, refused.Status);
        Assert.Contains("/Account/AccessDenied", refused.Headers["location"]);
    }

    [SkippableFact]
    public async Task BrokenUpload_ShowsTheLocatedError_AndStoresNothing()
    {
        Chromium.SkipIfMissing();
        await using var app = await AppProcess.StartAsync();
        var (playwright, browser) = await Chromium.LaunchAsync();
        using var _ = playwright;
        await using var __ = browser;
        var page = await browser.NewPageAsync();
        await Flows.SignInAsync(page, app.BaseUrl, "demo-member", "Demo-member-2026");
        await Flows.OpenAsync(page, app.BaseUrl + "/");
        var before = await page.Locator("table.ledger tbody tr:has(a)").CountAsync();

        var broken = Path.Combine(app.DataDirectory, "broken.xyz");
        await File.WriteAllTextAsync(broken, "3\nenergy=-76.4\nO 0.0 0.0 0.0\nH 0.0 0.76\nH 0.0 -0.76 0.59\n");
        await Flows.OpenAsync(page, app.BaseUrl + "/upload");
        await page.GetByLabel("Study").FillAsync("Broken upload study");
        await page.Locator("#files").SetInputFilesAsync(broken);
        await page.GetByLabel("Kind of broken.xyz").SelectOptionAsync("Minimum");
        await page.GetByLabel("Level of theory of broken.xyz").FillAsync("wB97X-D/def2-SVP");
        await page.GetByLabel("Species label for broken.xyz").FillAsync("water");
        var errors = page.GetByTestId("upload-errors");
        await Assertions.Expect(errors).ToContainTextAsync("broken.xyz, line 4");
        await Assertions.Expect(page.GetByRole(AriaRole.Button, new() { Name = "Store" })).ToBeDisabledAsync();
        await Flows.ScreenshotAsync(page, "upload-broken-file");

        await Flows.OpenAsync(page, app.BaseUrl + "/");
        Assert.Equal(before, await page.Locator("table.ledger tbody tr:has(a)").CountAsync());
        await Assertions.Expect(page.Locator("#study")).Not.ToContainTextAsync("Broken upload study");
    }
}
