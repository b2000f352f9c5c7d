using Microsoft.Playwright;

namespace BarrierLedger.Browser.Tests.Infrastructure;

/// <summary>What a person does in the browser, step by step, reused by the tests.</summary>
public static class Flows
{
    public const string AdminNewPassword = "Ledger-admin-2026";

    public static async Task SignInAsync(IPage page, string baseUrl, string user, string password)
    {
        await page.GotoAsync(baseUrl + "/Account/Login");
        await page.GetByLabel("User name").FillAsync(user);
        await page.GetByLabel("Password", new() { Exact = true }).FillAsync(password);
        await page.GetByRole(AriaRole.Button, new() { Name = "Sign in" }).ClickAsync();
        await page.WaitForLoadStateAsync(LoadState.NetworkIdle);
    }

    /// <summary>Signs in with a one-time password and sets <paramref name="newPassword"/> on the forced change page.</summary>
    public static async Task FirstSignInAsync(IPage page, string baseUrl, string user, string oneTimePassword, string newPassword)
    {
        await SignInAsync(page, baseUrl, user, oneTimePassword);
        if (!page.Url.Contains("/Account/ChangePassword", StringComparison.Ordinal))
            throw new InvalidOperationException($"Expected the forced password change after a one-time password, got {page.Url}");
        await page.GetByLabel("Current password").FillAsync(oneTimePassword);
        await page.GetByLabel("New password (at least").FillAsync(newPassword);
        await page.GetByLabel("Repeat the new password").FillAsync(newPassword);
        await page.GetByRole(AriaRole.Button, new() { Name = "Change password" }).ClickAsync();
        await page.WaitForLoadStateAsync(LoadState.NetworkIdle);
    }

    /// <summary>Navigates and waits until the page is interactive (the circuit is connected).</summary>
    public static async Task OpenAsync(IPage page, string url)
    {
        await page.GotoAsync(url);
        await page.WaitForSelectorAsync("#circuit-ready", new() { State = WaitForSelectorState.Attached });
    }

    public static async Task ScreenshotAsync(IPage page, string name) =>
        await page.ScreenshotAsync(new() { Path = Path.Combine(RepoPaths.ScreenshotDirectory, name + ".png"), FullPage = true });
}
