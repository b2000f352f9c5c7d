using System.Text;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Tests.Conformers;
using BarrierLedger.Ledger.Uploads;
using BarrierLedger.Web.Components.Pages.Species;
using BarrierLedger.Web.Components.Shared.Charts;
using BarrierLedger.Web.Tests.Support;

namespace BarrierLedger.Web.Tests.Species;

/// <summary>
/// The species page's conformer table on a real ledger (issue 21). Four butane conformers stored as single points: anti, gauche
/// +65° and −65° 0.0015 Eh above it, and anti again turned and moved. What each is, is known by construction (FlexibleMolecules;
/// bond lengths from memory): the moved copy is a duplicate (rigid motion, analytic), the two gauche forms are mirror images
/// (reflection, analytic).
/// </summary>
public sealed class ConformerTableTests
{
    private static readonly TimeSpan Wait = TimeSpan.FromSeconds(60);

    private static byte[] Frames(params (Molecule M, double E)[] frames) =>
        Encoding.UTF8.GetBytes(string.Concat(frames.Select(f => XyzWriter.ToExtendedText(f.M, f.E, null))));

    private static Molecule Moved(Molecule m) =>
        new(m.Elements, [.. m.PositionsAngstrom.Select(p => new Vec3(-p.Y + 3.0, p.X - 1.0, p.Z + 2.0))], m.Charge, m.Multiplicity);

    private static async Task<int> StoreButaneAsync(BunitLedger l)
    {
        var anti = FlexibleMolecules.Butane(180);
        var file = Frames((anti, -158.4000), (FlexibleMolecules.Butane(65), -158.3985), (FlexibleMolecules.Butane(-65), -158.3985), (Moved(anti), -158.4000));
        var outcome = await l.Get<UploadService>().StoreAsync([new UploadFile("butane.xyz", file)],
            new UploadChoices { NewStudyName = "Butane", SpeciesLabel = "butane", Kind = CalculationKind.SinglePoint, LevelOfTheory = "B3LYP-D3/def2-SVP" }, l.UserId);
        Assert.True(outcome.Stored, string.Join("; ", outcome.Errors));
        return (await l.Get<BarrierLedger.Ledger.Queries.WorkspaceQueryService>().GetWorkspaceAsync(outcome.StudyId!.Value))!.Species.Single().Id;
    }

    private static async Task<IRenderedComponent<SpeciesPage>> OpenButaneAsync(BunitLedger l)
    {
        var id = await StoreButaneAsync(l);
        var cut = l.Context.Render<SpeciesPage>(p => p.Add(c => c.Id, id));
        cut.WaitForAssertion(() => Assert.Equal(4, cut.FindAll("[data-testid=conformer-row]").Count), Wait);
        return cut;
    }

    private static AngleSharp.Dom.IElement Row(IRenderedComponent<SpeciesPage> cut, string label) =>
        cut.FindAll("[data-testid=conformer-row]").Single(r => r.GetAttribute("data-conformer") == label);

    [Fact]
    public async Task SpeciesPage_ListsConformersWithEnergyPopulationAndMarks()
    {
        using var l = await BunitLedger.CreateAsync();
        var cut = await OpenButaneAsync(l);


        // ΔE = 0.0015 Eh × 627.509474 kcal/mol per Eh (CODATA 2018) = 0.941264 kcal/mol.
        Assert.Equal(["0.00", "0.94", "0.94", "0.00"], cut.FindAll("[data-testid=conformer-de]").Select(e => e.TextContent));
        // Populations at 298.15 K (the default model temperature), hand computation: RT = 8.314462618 × 298.15 / 4184 = 0.592485 kcal/mol
        // (CODATA 2018 R); x = exp(−0.941264/0.592485) = 0.204197; p(anti) = 1/(2 + 2x) = 0.415215, p(gauche) = x/(2 + 2x) = 0.084785
        // (independent check: Python 3 math module). Every listed conformer counts, the duplicate too, as the basis line says.
        Assert.Equal(["41.5 %", "8.5 %", "8.5 %", "41.5 %"], cut.FindAll("[data-testid=conformer-population]").Select(e => e.TextContent));
        Assert.Contains("298.15 K", cut.Find("[data-testid=conformer-basis]").TextContent);
        Assert.Contains("duplicates included", cut.Find("[data-testid=conformer-basis]").TextContent);

        Assert.Equal("duplicate of c1", Row(cut, "c4").QuerySelector("[data-testid=conformer-marks]")!.TextContent.Trim());
        Assert.Equal("mirror image of c3", Row(cut, "c2").QuerySelector("[data-testid=conformer-marks]")!.TextContent.Trim());
        Assert.Equal("mirror image of c2", Row(cut, "c3").QuerySelector("[data-testid=conformer-marks]")!.TextContent.Trim());
        // The default model takes the lowest conformer (c1 and its duplicate c4 tie; the first listed is taken), by E here: no frequencies.
        Assert.Equal("used", Row(cut, "c1").QuerySelector("[data-testid=conformer-marks]")!.TextContent.Trim());
        Assert.Contains("The model uses: conformer c1 (lowest of 4)", cut.Find("[data-testid=conformer-basis]").TextContent);
        Assert.Contains("4 conformers, 1 duplicate, 1 mirror-image pair", cut.Find("[data-testid=conformer-summary]").TextContent);
        Assert.Equal("butane-c2", Row(cut, "c2").Children[3].TextContent);
    }

    [Fact]
    public async Task Overlay_ShowsTheTwoTickedConformersWithTheirRmsd()
    {
        using var l = await BunitLedger.CreateAsync();
        var cut = await OpenButaneAsync(l);

        // The first two are superposed at once: anti against gauche +65°, carbon RMSD 0.6807687 Å (ConformerReference: NumPy 1.24.2
        // Kabsch on the same construction, both carbon numberings tried).
        var view = cut.FindComponents<MoleculeView>().Single(v => v.Instance.Id == "conformer-overlay");
        Assert.NotNull(view.Instance.Overlay);
        Assert.StartsWith("c2 (orange) superposed on c1 (element colours): RMSD 0.681 Å over heavy atoms", cut.Find("[data-testid=conformer-overlay] figcaption").TextContent);

        // c2 off, c4 on: anti and its moved copy superpose exactly (rigid motion, analytic), atom for atom.
        Row(cut, "c2").QuerySelector("input[type=checkbox]")!.Change(false);
        Row(cut, "c4").QuerySelector("input[type=checkbox]")!.Change(true);
        cut.WaitForAssertion(() => Assert.StartsWith("c4 (orange) superposed on c1 (element colours): RMSD 0.000 Å",
            cut.Find("[data-testid=conformer-overlay] figcaption").TextContent), Wait);
        view = cut.FindComponents<MoleculeView>().Single(v => v.Instance.Id == "conformer-overlay");
        var (first, second) = (view.Instance.Molecule, view.Instance.Overlay!);
        Assert.All(Enumerable.Range(0, 4), i => Assert.True((first.PositionsAngstrom[i] - second.PositionsAngstrom[i]).Length < 1e-9));
    }

    [Fact]
    public async Task OneUnlabelledConformer_ShowsNoConformerTable()
    {
        using var l = await BunitLedger.CreateAsync();
        var outcome = await l.Get<UploadService>().StoreAsync([new UploadFile("water-opt.xyz", Endpoints.ApiFiles.WaterXyz())],
            new UploadChoices { NewStudyName = "Water", SpeciesLabel = "water", Kind = CalculationKind.Minimum, LevelOfTheory = Endpoints.ApiFiles.Level }, l.UserId);
        var id = (await l.Get<BarrierLedger.Ledger.Queries.WorkspaceQueryService>().GetWorkspaceAsync(outcome.StudyId!.Value))!.Species.Single().Id;

        var cut = l.Context.Render<SpeciesPage>(p => p.Add(c => c.Id, id));
        cut.WaitForAssertion(() => Assert.NotEmpty(cut.FindAll("table.results")), Wait);
        Assert.Empty(cut.FindAll("[data-testid=conformers]"));
    }
}
