using BarrierLedger.Core.Chemistry;
using BarrierLedger.Ledger.Uploads;
using BarrierLedger.Web.Components.Pages.Upload;

namespace BarrierLedger.Web.Tests.Upload;

public class UploadPreviewViewTests
{
    private const string Sha = "3f9a1c0d5be2e47a9c6d0b1e2f3a4b5c6d7e8f90112233445566778899aabbcc";

    private static UploadPreview Preview(params UploadIssue[] issues) => new(
        "Exchange study", NewStudy: true,
        Files: [new PreviewFile("bundle.json", 1536, Sha), new PreviewFile("ts.json", 3 * 1024 * 1024, Sha)],
        Species: [new PreviewSpecies("H2", 0, 1, "H2", Exists: true, "D∞h", 2, GivenSymmetryNumber: 1), new PreviewSpecies("TS", 0, 2, "H3", Exists: false, "D∞h", 2)],
        Calculations:
        [
            new PreviewCalculation("ts", "TS", CalculationKind.SaddlePoint, "MODEL-A/basis-1", 3, "H3", -1.655,
                [-1500, 900, 900, 2000], ImaginaryCount: 1, HasHessian: false, Duplicate: false, File: "ts.json"),
            new PreviewCalculation("h2", "H2", CalculationKind.Minimum, "MODEL-A/basis-1", 2, "H2", null,
                [], ImaginaryCount: 0, HasHessian: true, Duplicate: true, File: "bundle.json"),
        ],
        Reactions: [new PreviewReaction("H exchange", "H2 + H → TS → H + H2", Exists: false)],
        Scans: [],
        Issues: issues);

    [Fact]
    public void EveryErrorIsListedWithWhereItIs_AndNothingCanBeStored()
    {
        using var ctx = new BunitContext();
        var cut = ctx.Render<UploadPreviewView>(p => p.Add(c => c.Preview, Preview(
            new UploadIssue("bundle.json", null, "$.calculations[0].energy_hartree", "expected a number"),
            new UploadIssue("scan.xyz", 7, null, "expected 3 coordinates, found 2"),
            new UploadIssue("bundle.json", null, null, "no scans", IsError: false))));

        var errors = cut.Find("[data-testid=upload-errors]");
        Assert.StartsWith("2 errors: nothing can be stored until they are fixed.", errors.QuerySelector("strong")!.TextContent);
        Assert.Equal(["bundle.json, $.calculations[0].energy_hartree", "scan.xyz, line 7"], errors.QuerySelectorAll("code").Select(c => c.TextContent));
        Assert.Contains("1 warning", cut.Find(".alert-warn").TextContent);
    }

    [Fact]
    public void OneError_IsSaidInTheSingular_AndACleanUploadShowsNoAlert()
    {
        using var ctx = new BunitContext();
        var one = ctx.Render<UploadPreviewView>(p => p.Add(c => c.Preview, Preview(new UploadIssue("a.xyz", 1, null, "empty file"))));
        Assert.StartsWith("1 error: nothing can be stored until it is fixed.", one.Find("[data-testid=upload-errors] strong").TextContent);

        var clean = ctx.Render<UploadPreviewView>(p => p.Add(c => c.Preview, Preview()));
        Assert.Empty(clean.FindAll("[role=alert]"));
    }

    [Fact]
    public void FilesSpeciesCalculationsAndReactions_AreListedAsRead()
    {
        using var ctx = new BunitContext();
        var cut = ctx.Render<UploadPreviewView>(p => p.Add(c => c.Preview, Preview()));

        Assert.Contains("Exchange study", cut.Find("p strong").TextContent);
        Assert.Contains("new study", cut.Markup);
        var files = Rows(cut, "Files read");
        Assert.Equal(["bundle.json", "1.5 KiB", "3f9a1c0d5be2…"], files[0]);   // 1536 B = 1.5 × 1024 B
        Assert.Equal(["ts.json", "3.0 MiB", "3f9a1c0d5be2…"], files[1]);
        Assert.Equal([["H2", "H2", "0", "1", "D∞h", "1 (given; geometry gives 2)", "already there"], ["TS", "H3", "0", "2", "D∞h", "2 (detected)", "new"]],
            Rows(cut, "Species"));

        var calcs = Rows(cut, "Calculations");
        Assert.Equal("—", calcs[0][2]); // no conformer named: the species' only one
        Assert.Equal("-1.655000", calcs[0][7]);
        Assert.Equal("4 modes; imaginary 1500i; lowest 900, 900, 2000 cm⁻¹", calcs[0][8]);
        Assert.Equal("", calcs[0][9]);
        Assert.Equal("—", calcs[1][7]);
        Assert.Equal("from Hessian", calcs[1][8]);
        Assert.Equal("already stored: will not be stored again", calcs[1][9]);
        Assert.Equal([["H exchange", "H2 + H → TS → H + H2", "new"]], Rows(cut, "Reactions"));
        Assert.Empty(cut.FindAll("table[aria-label=Scans]"));
    }

    private static List<List<string>> Rows(IRenderedComponent<UploadPreviewView> cut, string table) =>
        [.. cut.FindAll($"table[aria-label='{table}'] tbody tr").Select(r => r.QuerySelectorAll("td").Select(td => td.TextContent.Trim()).ToList())];
}
