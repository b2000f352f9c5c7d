using Microsoft.Playwright;

namespace BarrierLedger.Browser.Tests.Infrastructure;

/// <summary>
/// Debian's chromium driven by Playwright (no browser download: the executable path is given).
/// Under CI=true a missing browser fails the run; elsewhere the browser tests are skipped with how to install it.
/// </summary>
public static class Chromium
{
    public const string ExecutablePath = "/usr/bin/chromium";

    public static void SkipIfMissing()
    {
        if (File.Exists(ExecutablePath)) return;
        if (string.Equals(Environment.GetEnvironmentVariable("CI"), "true", StringComparison.OrdinalIgnoreCase))
            throw new InvalidOperationException($"CI=true but {ExecutablePath} is missing: .ci/run must install Debian's chromium.");
        Skip.If(true, $"{ExecutablePath} not found: install it with 'sudo apt-get install -y chromium' to run the browser tests.");
    }

    public static async Task<(IPlaywright Playwright, IBrowser Browser)> LaunchAsync()
    {
        var playwright = await Playwright.CreateAsync();
        var browser = await playwright.Chromium.LaunchAsync(new()
        {
            ExecutablePath = ExecutablePath,
            Headless = true,
            Args = ["--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update",
                    "--disable-sync", "--no-first-run", "--disable-quic"],
        });
        return (playwright, browser);
    }
}
