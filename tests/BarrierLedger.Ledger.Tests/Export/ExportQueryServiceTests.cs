using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Export;

namespace BarrierLedger.Ledger.Tests.Export;

public class ExportQueryServiceTests
{
    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task DemoStudy_TableHasAStepPerSaddlePoint_MarkingUnverifiedAndInconsistentRows(StoreProvider store)
    {
        var (ledger, studyId) = await DemoLedger.CreateAsync(store);
        await using var _ = ledger;
        var query = new ExportQueryService(ledger.Factory);
        var source = await query.GetTableSourceAsync(studyId);

        Assert.NotEmpty(source.Rows);
        Assert.All(source.Rows, r => Assert.NotEqual("—", r.Step));
        // Nothing is reviewed in a fresh ledger: every row is marked as unverified.
        Assert.All(source.Rows, r => Assert.False(r.IsVerified));
        // The demo's KE reaction mixes levels of theory (bundle description): its rows carry a consistency problem.
        Assert.Contains(source.Rows, r => !r.IsConsistent);
        Assert.Contains(source.Rows, r => r.IsConsistent);

        var table = BarrierTable.Build(source, TableOptions.Default);
        Assert.All(table.Rows, row => Assert.NotEmpty(row.Marks));
        Assert.Contains(table.Footnotes, f => f.Text.Contains("consistency rule"));
        Assert.Contains(table.ModelLines, l => l.Contains("K; standard state"));
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task DemoStudy_DiagramAndSupportingInformation_ComeOutOfTheLedger(StoreProvider store)
    {
        var (ledger, studyId) = await DemoLedger.CreateAsync(store);
        await using var _ = ledger;
        var query = new ExportQueryService(ledger.Factory);
        var studies = await query.ListStudiesAsync();
        var reaction = studies.Single(s => s.Id == studyId).Reactions.First(r => r.HasDerivedValues);

        var diagram = await query.GetDiagramSourceAsync(reaction.Id);
        Assert.Equal(0, diagram.States[0].Relative.Hartree);
        Assert.Contains(diagram.States, s => s.IsSaddle);
        var files = DiagramExport.Build(diagram, EnergyUnit.KcalPerMol);
        Assert.Contains("<svg", files.Svg);

        var (study, model, structures) = await query.GetSupportingInfoAsync(studyId);
        Assert.NotEmpty(structures);
        Assert.Contains(structures, s => s.Role == "saddle point" && s.ImaginaryFrequenciesCm1.Count >= 1);
        Assert.All(structures, s => Assert.NotNull(s.ElectronicEnergyHartree));
        Assert.Contains(structures, s => s.LevelOfTheory.Contains("//"));
        Assert.Contains(structures, s => s.GibbsCorrectionHartree is not null);
        var text = SupportingInfoWriter.WriteText(study, model, structures);
        Assert.Contains("Imaginary frequencies: 1 (", text);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task UnknownStudyOrReaction_IsAClearError(StoreProvider store)
    {
        await using var ledger = await Support.TempLedger.CreateAsync(store);
        var query = new ExportQueryService(ledger.Factory);
        var e = await Assert.ThrowsAsync<ArgumentException>(() => query.GetTableSourceAsync(999));
        Assert.Contains("no study with id 999", e.Message);
        await Assert.ThrowsAsync<ArgumentException>(() => query.GetDiagramSourceAsync(999));
    }
}
