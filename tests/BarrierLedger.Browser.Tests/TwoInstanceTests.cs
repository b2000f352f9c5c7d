using BarrierLedger.Browser.Tests.Infrastructure;
using Microsoft.Playwright;

namespace BarrierLedger.Browser.Tests;

/// <summary>
/// Two instances of the real app on two loopback ports against one PostgreSQL database, as a department runs them behind a
/// reverse proxy (README, "Deployment for a department"): a sign-in cookie from one is accepted by the other, an edit made on
/// one is seen on the other, and an edit made on a stale page is refused as a conflict (the records' Version token).
/// </summary>
public sealed class TwoInstanceTests
{
    [SkippableFact]
    public async Task TwoInstancesOnOnePostgreSql_ShareSignIn_SeeEachOthersEdits_AndReportAConflictingEdit()
    {
        Chromium.SkipIfMissing();
        await using var database = await PostgresDatabase.CreateAsync();
        // The key ring in the database is encrypted under a key-encryption key that is not in it; instances that share the
        // database are given the same one, as the README's deployment section says (here one file both are pointed at).
        var keyFile = Path.Combine(Path.GetTempPath(), "bl-kek-" + Guid.NewGuid().ToString("N")[..10]);
        await File.WriteAllTextAsync(keyFile, Convert.ToBase64String(System.Security.Cryptography.RandomNumberGenerator.GetBytes(32)));
        using var removeKey = new DeleteOnDispose(keyFile);
        string[] store = ["--BarrierLedger:Database:Provider=PostgreSQL", $"--BarrierLedger:Database:ConnectionString={database.ConnectionString}",
            "--BarrierLedger:LoadDemo=true", // on PostgreSQL the demo (with its public passwords) is loaded only when asked for
            $"--BarrierLedger:KeyRing:KeyFile={keyFile}"];
        // The first instance migrates the empty database and loads the demo study; the second finds the store ready.
        await using var one = await AppProcess.StartAsync(store);
        await using var two = await AppProcess.StartAsync(store);
        Assert.NotEqual(one.BaseUrl, two.BaseUrl);
        Assert.DoesNotContain("one-time password", two.Output);

        var (playwright, browser) = await Chromium.LaunchAsync();
        using var _ = playwright;
        await using var __ = browser;

        // Signed in on instance one; the cookie carried to a fresh browser context that only ever talks to instance two.
        var contextOne = await browser.NewContextAsync();
        var pageOne = await contextOne.NewPageAsync();
        await Flows.SignInAsync(pageOne, one.BaseUrl, "demo-reviewer", "Demo-reviewer-2026");
        var cookies = await contextOne.CookiesAsync();
        Assert.Contains(cookies, c => c.Name == "BarrierLedger.Auth");
        var contextTwo = await browser.NewContextAsync();
        await contextTwo.AddCookiesAsync(cookies.Where(c => c.Name == "BarrierLedger.Auth").Select(c => new Cookie
        {
            Name = c.Name, Value = c.Value, Domain = c.Domain, Path = c.Path, HttpOnly = c.HttpOnly, Secure = c.Secure, SameSite = c.SameSite,
        }));
        var pageTwo = await contextTwo.NewPageAsync();
        await Flows.OpenAsync(pageTwo, two.BaseUrl + "/settings");
        Assert.DoesNotContain("/Account/Login", pageTwo.Url);
        await Assertions.Expect(pageTwo.GetByRole(AriaRole.Heading, new() { Name = "Settings", Level = 1 })).ToBeVisibleAsync();
        var statusBefore = await pageTwo.GetByTestId("recompute-status").TextContentAsync();

        // Both open the group's energy model at the same version.
        await Flows.OpenAsync(pageOne, one.BaseUrl + "/settings");
        var temperature = pageOne.Locator("#m-t");
        var before = double.Parse(await temperature.InputValueAsync(), System.Globalization.CultureInfo.InvariantCulture);
        Assert.Equal(before.ToString(System.Globalization.CultureInfo.InvariantCulture), await pageTwo.Locator("#m-t").InputValueAsync());

        // Instance one saves first.
        await temperature.FillAsync("310");
        await pageOne.GetByRole(AriaRole.Button, new() { Name = "Save and recompute" }).ClickAsync();
        await Assertions.Expect(pageOne.GetByRole(AriaRole.Alert)).ToContainTextAsync("Saved.");

        // Instance two, still showing the old version, saves a different value: refused, and the person is told why.
        await pageTwo.Locator("#m-t").FillAsync("320");
        await pageTwo.GetByRole(AriaRole.Button, new() { Name = "Save and recompute" }).ClickAsync();
        await Assertions.Expect(pageTwo.GetByRole(AriaRole.Alert)).ToContainTextAsync("Someone else saved this energy model");
        await Assertions.Expect(pageTwo.GetByRole(AriaRole.Alert)).ToContainTextAsync("Your change was not saved");
        await Flows.ScreenshotAsync(pageTwo, "two-instances-conflict");

        // Reloaded on instance two: the edit made on instance one, and the recompute it started (run by whichever instance
        // held the lease) reported from the database.
        await Flows.OpenAsync(pageTwo, two.BaseUrl + "/settings");
        Assert.Equal("310", await pageTwo.Locator("#m-t").InputValueAsync());
        await Assertions.Expect(pageTwo.GetByTestId("recompute-status")).ToContainTextAsync("Up to date", new() { Timeout = 60_000 });
        Assert.NotEqual(statusBefore, await pageTwo.GetByTestId("recompute-status").TextContentAsync());
        await Flows.OpenAsync(pageOne, one.BaseUrl + "/settings");
        Assert.Equal("310", await pageOne.Locator("#m-t").InputValueAsync());
    }
}

internal sealed class DeleteOnDispose(string path) : IDisposable
{
    public void Dispose() => File.Delete(path);
}
