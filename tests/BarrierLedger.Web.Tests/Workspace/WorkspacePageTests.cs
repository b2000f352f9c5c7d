using System.Text;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Uploads;
using BarrierLedger.Web.Components.Pages.Workspace;
using BarrierLedger.Web.Tests.Endpoints;
using BarrierLedger.Web.Tests.Support;

namespace BarrierLedger.Web.Tests.Workspace;

/// <summary>The study workspace on a real ledger: what a new member sees after storing loose files, and edits made on it.</summary>
public sealed class WorkspacePageTests
{
    [Fact]
    public async Task LooseResult_IsListedAndCountedAsInNoReaction_WithItsOriginalFile()
    {
        using var l = await BunitLedger.CreateAsync();
        var stored = await l.Get<UploadService>().StoreAsync([new UploadFile("water-opt.xyz", ApiFiles.WaterXyz())],
            new UploadChoices { NewStudyName = "Loose study", SpeciesLabel = "water", Kind = CalculationKind.Minimum, LevelOfTheory = ApiFiles.Level }, l.UserId);
        Assert.True(stored.Stored, string.Join("; ", stored.Errors));

        var cut = l.Context.Render<WorkspacePage>(p => p.Add(c => c.StudyId, stored.StudyId!.Value));
        cut.WaitForAssertion(() => Assert.NotEmpty(cut.FindAll("[data-testid=unassigned]")), TimeSpan.FromSeconds(30));

        Assert.Contains("1 result is not in any reaction yet: water-opt (water).", Text(cut.Find("[data-testid=unassigned]")));
        var row = cut.Find("[data-testid=calculation-row]");
        Assert.Contains("minimum", row.TextContent);
        Assert.Contains("-76.418900", row.TextContent);
        Assert.Contains("no frequencies", row.TextContent);
        Assert.Equal("water-opt.xyz", row.QuerySelector("a[download]")!.GetAttribute("download"));
        Assert.Contains("No reactions yet — build one from the results above", cut.Find("[data-testid=empty-reactions]").TextContent);
    }

    [Fact]
    public async Task EmptyStudy_SaysToUpload_AndAnAddedSpeciesAppears()
    {
        using var l = await BunitLedger.CreateAsync();
        var id = await l.Get<RecordService>().CreateStudyAsync("Empty", "", l.UserId);
        var cut = l.Context.Render<WorkspacePage>(p => p.Add(c => c.StudyId, id));
        cut.WaitForAssertion(() => Assert.Contains("No results yet", cut.Find("[data-testid=empty-results]").TextContent), TimeSpan.FromSeconds(30));

        cut.Find("#new-species-label").Change("hydroxide");
        cut.Find("#new-species-charge").Change("-1");
        cut.Find("#new-species-label").Closest("form")!.Submit();

        cut.WaitForAssertion(() => Assert.Contains("hydroxide", cut.Find("[data-testid=species-block] h3").TextContent), TimeSpan.FromSeconds(30));
        Assert.Contains("charge -1", cut.Find("[data-testid=species-block] h3").TextContent);
        Assert.Contains("No result stored for this species yet", cut.Find("[data-testid=species-block]").TextContent);
    }

    [Fact]
    public async Task CorrectingAKind_SavesIt_AndAStaleSecondEditIsExplained()
    {
        using var l = await BunitLedger.CreateAsync();
        var stored = await l.Get<UploadService>().StoreAsync([new UploadFile("water-opt.xyz", ApiFiles.WaterXyz())],
            new UploadChoices { NewStudyName = "Kinds", SpeciesLabel = "water", Kind = CalculationKind.SinglePoint, LevelOfTheory = ApiFiles.Level }, l.UserId);
        var cut = l.Context.Render<WorkspacePage>(p => p.Add(c => c.StudyId, stored.StudyId!.Value));
        cut.WaitForAssertion(() => cut.Find("[data-testid=calculation-row]"), TimeSpan.FromSeconds(30));

        cut.FindAll("button").First(b => b.TextContent == "Correct").Click();
        var calcId = stored.CalculationIds.Single();
        cut.Find($"#c{calcId}-kind").Change(nameof(CalculationKind.Minimum));
        // Someone else saves the calculation meanwhile.
        var seen = (await l.Get<RecordService>().GetVersionAsync(RecordKind.Calculation, calcId))!.Value;
        await l.Get<RecordService>().EditCalculationAsync(calcId, "water-opt", "by a colleague", CalculationKind.SinglePoint, ApiFiles.Level, seen, "colleague");
        cut.Find($"#c{calcId}-kind").Closest("form")!.Submit();

        cut.WaitForAssertion(() => Assert.Contains("changed by someone else", cut.Find("[data-testid=edit-outcome]").TextContent), TimeSpan.FromSeconds(30));
        var w = (await l.Get<WorkspaceQueryService>().GetWorkspaceAsync(stored.StudyId!.Value))!;
        Assert.Equal(CalculationKind.SinglePoint, w.Species.Single().Calculations.Single().Kind);
        Assert.Equal("by a colleague", w.Species.Single().Calculations.Single().Note);
    }

    private static string Text(AngleSharp.Dom.IElement e) => System.Text.RegularExpressions.Regex.Replace(e.TextContent, @"\s+", " ").Trim();
}
