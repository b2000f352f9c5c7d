using System.Text;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Web.Components.Pages.Builder;
using BarrierLedger.Web.Components.Pages.Upload;
using BarrierLedger.Web.Tests.Endpoints;
using BarrierLedger.Web.Tests.Support;
using Microsoft.AspNetCore.Components.Forms;

namespace BarrierLedger.Web.Tests.Upload;

/// <summary>The upload page with several loose files on a real ledger: one row per file, re-checked on every change, then on to the builder.</summary>
public sealed class UploadPageTests
{
    private static readonly TimeSpan Wait = TimeSpan.FromSeconds(60);

    /// <summary>Four demo structures (QCSchema Hessians) and an invented scan table along C1–C6.</summary>
    private static InputFileContent[] LooseFiles() =>
    [
        .. new[] { "butadiene.json", "ethylene.json", "ts-da.json", "cyclohexene.json" }
            .Select(n => InputFileContent.CreateFromBinary(File.ReadAllBytes(Path.Combine(ExportEndpointsTests.DemoFolder, "structures", n)), n)),
        InputFileContent.CreateFromBinary(Encoding.UTF8.GetBytes("r,energy\n3.0,-234.10\n2.6,-234.09\n2.2,-234.08\n1.9,-234.09\n1.6,-234.12\n"), "ts-da-scan.csv"),
    ];

    private static IRenderedComponent<UploadPage> Upload(BunitLedger l)
    {
        var cut = l.Context.Render<UploadPage>();
        cut.Find("#study").Change("Loose files");
        cut.FindComponent<InputFile>().UploadFiles(LooseFiles());
        cut.WaitForAssertion(() => Assert.Equal(5, cut.FindAll("[data-testid=file-row]").Count), Wait);
        cut.WaitForAssertion(() => Assert.NotEmpty(cut.FindAll("table[aria-label=Calculations]")), Wait);
        return cut;
    }

    private static AngleSharp.Dom.IElement Row(IRenderedComponent<UploadPage> cut, string file) =>
        cut.FindAll("[data-testid=file-row]").Single(r => r.GetAttribute("data-file") == file);

    [Fact]
    public async Task SeveralLooseFiles_EachGetsItsOwnGuessedRow_AndAChangedFieldIsCheckedAgain()
    {
        using var l = await BunitLedger.CreateAsync();
        var cut = Upload(l);

        var ts = Row(cut, "ts-da.json");
        Assert.Equal("ts-da", ts.QuerySelector("input[id$=-species]")!.GetAttribute("value"));
        Assert.Equal(nameof(CalculationKind.SaddlePoint), ts.QuerySelector("select[id$=-kind]")!.GetAttribute("value"));
        Assert.StartsWith("one imaginary frequency (", ts.QuerySelector("[data-testid=kind-reason]")!.TextContent);
        // The demo files state their model (seed-data/README.md: wB97X-D/def2-SVP geometries and Hessians).
        Assert.Equal("wB97X-D/def2-SVP", ts.QuerySelector("input[id$=-level]")!.GetAttribute("value"));
        var butadiene = Row(cut, "butadiene.json");
        Assert.Equal(("butadiene", nameof(CalculationKind.Minimum)),
            (butadiene.QuerySelector("input[id$=-species]")!.GetAttribute("value"), butadiene.QuerySelector("select[id$=-kind]")!.GetAttribute("value")));
        var scan = Row(cut, "ts-da-scan.csv");
        Assert.Equal("ts-da", scan.QuerySelector("input[id$=-species]")!.GetAttribute("value"));
        Assert.Equal("wB97X-D/def2-SVP", scan.QuerySelector("input[id$=-level]")!.GetAttribute("value"));
        // The scan has no atoms yet: that is the one error, where it is.
        var errors = cut.Find("[data-testid=upload-errors]");
        Assert.Contains("ts-da-scan.csv", errors.TextContent);
        Assert.Contains("scanned coordinate", errors.TextContent);

        scan.QuerySelector("input[id$=-atoms]")!.Change("C1–C6");
        Row(cut, "ts-da.json").QuerySelector("input[id$=-species]")!.Change("TS-DA");

        cut.WaitForAssertion(() => Assert.Empty(cut.FindAll("[data-testid=upload-errors]")), Wait);
        Assert.Contains(cut.FindAll("table[aria-label=Calculations] tbody tr"), r => r.Children[1].TextContent == "TS-DA" && r.Children[0].TextContent == "ts-da");
        Assert.Contains("Distance 1–6", cut.Find("table[aria-label=Scans] tbody tr").TextContent);
        Assert.False(cut.Find("button.btn-primary").HasAttribute("disabled"));
    }

    [Fact]
    public async Task AfterStoring_AddTheseToAReaction_OpensTheBuilderWithTheResultsInPlace()
    {
        using var l = await BunitLedger.CreateAsync();
        var cut = Upload(l);
        Row(cut, "ts-da-scan.csv").QuerySelector("input[id$=-atoms]")!.Change("1 6");
        cut.WaitForAssertion(() => Assert.Empty(cut.FindAll("[data-testid=upload-errors]")), Wait);

        cut.Find("button.btn-primary").Click();
        cut.WaitForAssertion(() => Assert.NotEmpty(cut.FindAll("[data-testid=add-to-reaction]")), Wait);

        Assert.Contains("Stored 4 calculations, 0 reactions, 1 scans and 0 IRCs.", cut.Find("[data-testid=upload-message]").TextContent);
        var href = cut.Find("[data-testid=add-to-reaction]").GetAttribute("href")!;
        var query = Microsoft.AspNetCore.WebUtilities.QueryHelpers.ParseQuery(href[href.IndexOf('?')..]);
        var studyId = int.Parse(href.Split('/')[1], System.Globalization.CultureInfo.InvariantCulture);
        var w = (await l.Get<WorkspaceQueryService>().GetWorkspaceAsync(studyId))!;
        Assert.Equal(w.Species.SelectMany(s => s.Calculations).Select(c => c.Id).Order(), query["calcs"].ToString().Split(',').Select(int.Parse).Order());
        Assert.Equal([w.Scans.Single().Id], query["scans"].ToString().Split(',').Select(int.Parse));

        l.Get<Microsoft.AspNetCore.Components.NavigationManager>().NavigateTo(href);
        var builder = l.Context.Render<ReactionBuilderPage>(p => p.Add(c => c.StudyId, studyId));
        builder.WaitForAssertion(() => Assert.Equal(3, builder.FindAll("[data-testid=state-editor]").Count), Wait);
        var legends = builder.FindAll("[data-testid=state-editor] > legend").Select(e => e.TextContent).ToList();
        Assert.Equal(["State 1: reactants", "State 2: TS", "State 3: products"], legends);
        // Reactants and products split so that each side has the saddle point's formula, C6H10 (butadiene + ethylene | cyclohexene).
        builder.WaitForAssertion(() => Assert.All(builder.FindAll("[data-testid=balance]"), b => Assert.Contains("C6H10", b.TextContent)), Wait);
        // The scan stored with the saddle point (the same species, guessed for it) belongs to its step.
        Assert.True(builder.Find(".scan-choice input[type=checkbox]").HasAttribute("checked"));
    }

    [Fact]
    public async Task EachFileIsAConformer_NamesEachAfterItsFile_AndARowCanNameItsOwn()
    {
        using var l = await BunitLedger.CreateAsync();
        var cut = l.Context.Render<UploadPage>();
        cut.Find("#study").Change("Butane conformers");
        // Two butane structures with energies (FlexibleMolecules, bond lengths from memory): anti and gauche.
        cut.FindComponent<InputFile>().UploadFiles(
            InputFileContent.CreateFromBinary(Encoding.UTF8.GetBytes(BarrierLedger.Core.Formats.XyzWriter.ToExtendedText(BarrierLedger.Core.Tests.Conformers.FlexibleMolecules.Butane(180), -158.4)), "anti.xyz"),
            InputFileContent.CreateFromBinary(Encoding.UTF8.GetBytes(BarrierLedger.Core.Formats.XyzWriter.ToExtendedText(BarrierLedger.Core.Tests.Conformers.FlexibleMolecules.Butane(65), -158.3985)), "gauche.xyz"));
        cut.WaitForAssertion(() => Assert.Equal(2, cut.FindAll("[data-testid=file-row]").Count), Wait);
        foreach (var file in new[] { "anti.xyz", "gauche.xyz" })
        {
            Row(cut, file).QuerySelector("input[id$=-species]")!.Change("butane");
            Row(cut, file).QuerySelector("select[id$=-kind]")!.Change(nameof(CalculationKind.SinglePoint));
            Row(cut, file).QuerySelector("input[id$=-level]")!.Change("B3LYP-D3/def2-SVP");
        }
        cut.WaitForAssertion(() => Assert.Empty(cut.FindAll("[data-testid=upload-errors]")), Wait);
        Assert.All(cut.FindAll("[data-testid=preview-conformer]"), c => Assert.Equal("—", c.TextContent));

        cut.Find("#conformer-per-file").Change(true);
        cut.WaitForAssertion(() => Assert.Equal(["anti", "gauche"], cut.FindAll("[data-testid=preview-conformer]").Select(c => c.TextContent)), Wait);
        Assert.Equal("gauche", Row(cut, "gauche.xyz").QuerySelector("input[id$=-conformer]")!.GetAttribute("placeholder"));

        Row(cut, "gauche.xyz").QuerySelector("input[id$=-conformer]")!.Change("g+");
        cut.WaitForAssertion(() => Assert.Equal(["anti", "g+"], cut.FindAll("[data-testid=preview-conformer]").Select(c => c.TextContent)), Wait);

        cut.Find("button.btn-primary").Click();
        cut.WaitForAssertion(() => Assert.Contains("Stored 2 calculations", cut.Find("[data-testid=upload-message]").TextContent), Wait);
        Assert.Contains("species butane: 2 conformer(s)", cut.Find("[data-testid=upload-message]").TextContent);
    }
}
