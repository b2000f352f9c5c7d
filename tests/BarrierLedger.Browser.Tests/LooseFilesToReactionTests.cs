using System.IO.Compression;
using System.Text;
using BarrierLedger.Browser.Tests.Infrastructure;
using Microsoft.Playwright;

namespace BarrierLedger.Browser.Tests;

/// <summary>A new member goes from five loose files to a reaction on the ledger, only by clicking and typing in the real app.</summary>
public class LooseFilesToReactionTests
{
    private const string Study = "Cycloaddition (new member)";
    private const string BundleStudy = "Cycloaddition (bundle)";
    private static readonly string[] Structures = ["butadiene.json", "ethylene.json", "ts-da.json", "cyclohexene.json"];

    /// <summary>An invented relaxed scan along C1–C6 (distance in Å, energy in hartree) with its maximum near the saddle point's 2.3 Å.</summary>
    private const string ScanCsv = "r,energy\n3.0,-233.470\n2.8,-233.465\n2.6,-233.458\n2.4,-233.452\n2.3,-233.450\n2.2,-233.451\n2.0,-233.460\n1.8,-233.480\n1.6,-233.510\n";

    /// <summary>The five loose files: four demo QCSchema Hessian results (seed-data/structures) and the scan table.</summary>
    private static List<string> LooseFiles(string folder)
    {
        var paths = Structures.Select(n =>
        {
            var target = Path.Combine(folder, n);
            File.Copy(Path.Combine(RepoPaths.Root, "seed-data", "structures", n), target, overwrite: true);
            return target;
        }).ToList();
        var scan = Path.Combine(folder, "ts-da-scan.csv");
        File.WriteAllText(scan, ScanCsv);
        paths.Add(scan);
        return paths;
    }

    /// <summary>The same reaction written by hand as a bundle zip (docs/formats.md) over the same five files.</summary>
    private static string BundleZip(string folder)
    {
        const string level = "wB97X-D/def2-SVP";
        var calcs = string.Join(",\n", Structures.Select(n => Path.GetFileNameWithoutExtension(n)).Select(s =>
            $$"""{ "label": "{{s}}", "species": "{{s}}", "kind": "{{(s == "ts-da" ? "saddle_point" : "minimum")}}", "level_of_theory": "{{level}}", "file": "structures/{{s}}.json" }"""));
        var manifest = $$"""
            { "format": "barrierledger-bundle", "format_version": 1,
              "study": { "name": "{{BundleStudy}}", "description": "the same files, described by hand" },
              "species": [ { "label": "butadiene", "charge": 0, "multiplicity": 1 }, { "label": "ethylene", "charge": 0, "multiplicity": 1 },
                           { "label": "ts-da", "charge": 0, "multiplicity": 1 }, { "label": "cyclohexene", "charge": 0, "multiplicity": 1 } ],
              "calculations": [ {{calcs}} ],
              "reactions": [ { "label": "Cycloaddition (bundle)", "description": "",
                "states": [
                  { "label": "butadiene + ethylene", "kind": "minimum", "terms": [ { "species": "butadiene" }, { "species": "ethylene" } ] },
                  { "label": "TS", "kind": "saddle_point", "terms": [ { "species": "ts-da" } ], "calculation": "ts-da", "reacting_bonds": [[1, 6], [4, 5]] },
                  { "label": "cyclohexene", "kind": "minimum", "terms": [ { "species": "cyclohexene" } ] } ] } ],
              "scans": [ { "label": "ts-da-scan", "species": "ts-da", "level_of_theory": "{{level}}", "coordinate": { "kind": "distance", "atoms": [1, 6] },
                           "points_file": "scans/ts-da-scan.csv" } ]
            }
            """;
        var path = Path.Combine(folder, "cycloaddition-bundle.zip");
        using var zip = ZipFile.Open(path, ZipArchiveMode.Create);
        void Add(string name, byte[] bytes) { using var s = zip.CreateEntry(name).Open(); s.Write(bytes); }
        Add("bundle.json", Encoding.UTF8.GetBytes(manifest));
        foreach (var n in Structures) Add("structures/" + n, File.ReadAllBytes(Path.Combine(RepoPaths.Root, "seed-data", "structures", n)));
        Add("scans/ts-da-scan.csv", Encoding.UTF8.GetBytes(ScanCsv));
        return path;
    }

    private static async Task<string> BarrierOnLedgerAsync(IPage page, string baseUrl, string study, string reaction)
    {
        await Flows.OpenAsync(page, baseUrl + "/");
        await page.Locator("#study").SelectOptionAsync(new SelectOptionValue { Label = $"{study} (1)" });
        var row = page.Locator("table.ledger tbody tr", new() { Has = page.GetByRole(AriaRole.Link, new() { Name = reaction, Exact = true }) });
        await Assertions.Expect(row).ToHaveCountAsync(1);
        return (await row.Locator("td").Nth(2).InnerTextAsync()).Trim();
    }

    [SkippableFact]
    public async Task NewMember_BuildsTheReactionFromLooseFiles_ItsBarrierEqualsTheBundles_AndTheSaddlePointAwaitsReview()
    {
        Chromium.SkipIfMissing();
        // Each step waits on the server's derivation; on the shared 2-core machine that takes longer than Playwright's 5 s default.
        Assertions.SetDefaultExpectTimeout(30_000);
        await using var app = await AppProcess.StartAsync();
        var oneTime = await app.FirstAdminPassword.WaitAsync(TimeSpan.FromSeconds(30));
        var (playwright, browser) = await Chromium.LaunchAsync();
        using var _ = playwright;
        await using var __ = browser;
        var folder = Directory.CreateDirectory(Path.Combine(app.DataDirectory, "loose")).FullName;

        // The admin makes an account for the new member.
        var admin = await (await browser.NewContextAsync(new() { ViewportSize = new() { Width = 1400, Height = 1000 } })).NewPageAsync();
        await Flows.FirstSignInAsync(admin, app.BaseUrl, "admin", oneTime, Flows.AdminNewPassword);
        await Flows.OpenAsync(admin, app.BaseUrl + "/admin/users");
        await admin.Locator("#new-user").FillAsync("noor");
        await admin.Locator("#new-name").FillAsync("Noor, new member");
        await admin.GetByRole(AriaRole.Button, new() { Name = "Create" }).ClickAsync();
        var memberPassword = (await admin.GetByTestId("one-time-password").InnerTextAsync()).Trim();

        var page = await (await browser.NewContextAsync(new() { ViewportSize = new() { Width = 1400, Height = 1000 } })).NewPageAsync();
        await Flows.FirstSignInAsync(page, app.BaseUrl, "noor", memberPassword, "Noor-member-2026");

        // Five loose files: one row each, guessed from the files; only the scan's atoms are typed.
        await Flows.OpenAsync(page, app.BaseUrl + "/upload");
        await page.GetByLabel("Study").FillAsync(Study);
        await page.Locator("#files").SetInputFilesAsync(LooseFiles(folder));
        await Assertions.Expect(page.GetByTestId("file-row")).ToHaveCountAsync(5);
        await Assertions.Expect(page.Locator("[data-testid=file-row][data-file='ts-da.json'] [data-testid=kind-reason]")).ToContainTextAsync("one imaginary frequency");
        await Assertions.Expect(page.GetByLabel("Kind of butadiene.json")).ToHaveValueAsync("Minimum");
        await Assertions.Expect(page.GetByLabel("Species label for ts-da-scan.csv")).ToHaveValueAsync("ts-da");
        await page.GetByLabel("Scanned atoms of ts-da-scan.csv").FillAsync("1 6");
        await page.GetByLabel("Scanned atoms of ts-da-scan.csv").PressAsync("Tab");
        await Assertions.Expect(page.GetByTestId("upload-errors")).ToHaveCountAsync(0);
        await Flows.ScreenshotAsync(page, "loose-upload-rows");
        await page.GetByRole(AriaRole.Button, new() { Name = "Store" }).ClickAsync();
        await Assertions.Expect(page.GetByTestId("upload-message")).ToContainTextAsync("Stored 4 calculations, 0 reactions, 1 scans and 0 IRCs.");

        // The workspace lists what is in no reaction yet.
        await page.GetByRole(AriaRole.Link, new() { Name = "Open the study's workspace" }).ClickAsync();
        await page.WaitForSelectorAsync("#circuit-ready", new() { State = WaitForSelectorState.Attached });
        await Assertions.Expect(page.GetByTestId("unassigned")).ToContainTextAsync("not in any reaction yet");
        await Flows.ScreenshotAsync(page, "loose-workspace-unassigned");

        // The builder, from a blank pathway: species typed, the saddle point chosen, bonds clicked and typed.
        await page.GetByRole(AriaRole.Link, new() { Name = "Build a reaction", Exact = true }).ClickAsync();
        await page.WaitForSelectorAsync("#circuit-ready", new() { State = WaitForSelectorState.Attached });
        await Assertions.Expect(page.GetByTestId("state-editor")).ToHaveCountAsync(3);
        await page.Locator("#reaction-label").FillAsync("Cycloaddition (built)");
        await page.Locator("#state-1-terms-add").FillAsync("butadiene");
        await page.Locator("#state-1-terms-add").PressAsync("Enter");
        var saddle = await page.Locator("#state-2-calc option", new() { HasText = "ts-da" }).First.GetAttributeAsync("value");
        await page.Locator("#state-2-calc").SelectOptionAsync(saddle!);
        await page.Locator("#state-3-terms-add").FillAsync("cyclohexene");
        await page.Locator("#state-3-terms-add").PressAsync("Enter");
        // Mid-way: the reactants lack ethylene, so the saddle point and the products do not balance with them.
        await Assertions.Expect(page.Locator("[data-testid=builder-preview] svg.main-svg").First).ToBeAttachedAsync();
        await Assertions.Expect(page.Locator(".balance-off").First).ToContainTextAsync("not the same as state 1");
        await Flows.ScreenshotAsync(page, "loose-builder-midway");

        await page.Locator("#state-1-terms-add").FillAsync("ethylene");
        await page.Locator("#state-1-terms-add").PressAsync("Enter");
        await page.Locator(".atom-list summary").ClickAsync();
        await page.GetByRole(AriaRole.Group, new() { Name = "Atoms of the saddle point" }).GetByRole(AriaRole.Button, new() { Name = "C1", Exact = true }).ClickAsync();
        await page.GetByRole(AriaRole.Group, new() { Name = "Atoms of the saddle point" }).GetByRole(AriaRole.Button, new() { Name = "C6", Exact = true }).ClickAsync();
        await page.Locator("#state-2-bonds-text").FillAsync("C4–C5");
        await page.GetByRole(AriaRole.Button, new() { Name = "Add bonds" }).ClickAsync();
        await Assertions.Expect(page.GetByRole(AriaRole.List, new() { Name = "Bonds that form or break" }).Locator("li")).ToHaveCountAsync(2);
        await Assertions.Expect(page.Locator(".balance-off")).ToHaveCountAsync(0);
        await Assertions.Expect(page.Locator(".scan-choice input[type=checkbox]")).ToBeCheckedAsync();
        var save = page.GetByRole(AriaRole.Button, new() { Name = "Save reaction" });
        await Assertions.Expect(save).ToBeEnabledAsync();
        await save.ClickAsync();
        await page.WaitForURLAsync(new System.Text.RegularExpressions.Regex(@"/reactions/\d+$"));
        await Assertions.Expect(page.GetByRole(AriaRole.Heading, new() { Name = "Cycloaddition (built)", Level = 1 })).ToBeVisibleAsync();

        // The same reaction uploaded as a bundle into another study.
        await Flows.OpenAsync(page, app.BaseUrl + "/upload");
        await page.Locator("#files").SetInputFilesAsync(BundleZip(folder));
        await Assertions.Expect(page.GetByTestId("file-row")).ToHaveCountAsync(0);
        var store = page.GetByRole(AriaRole.Button, new() { Name = "Store" });
        await Assertions.Expect(store).ToBeEnabledAsync();
        await store.ClickAsync();
        await Assertions.Expect(page.GetByTestId("upload-message")).ToContainTextAsync("Stored 4 calculations, 1 reactions, 1 scans and 0 IRCs.");

        var fromBundle = await BarrierOnLedgerAsync(page, app.BaseUrl, BundleStudy, "Cycloaddition (bundle)");
        var built = await BarrierOnLedgerAsync(page, app.BaseUrl, Study, "Cycloaddition (built)");
        Assert.Matches(@"^\d+\.\d$", built);
        Assert.Equal(fromBundle, built);
        await Flows.ScreenshotAsync(page, "loose-reaction-on-ledger");

        // The built reaction's saddle point awaits a reviewer.
        await Flows.OpenAsync(admin, app.BaseUrl + "/review");
        var item = admin.Locator("article", new() { Has = admin.GetByRole(AriaRole.Link, new() { Name = "Cycloaddition (built)", Exact = true }) });
        await Assertions.Expect(item).ToHaveCountAsync(1);
        await Assertions.Expect(item).ToContainTextAsync("calculation ts-da");
        await Assertions.Expect(item).ToContainTextAsync(Study);
    }
}
