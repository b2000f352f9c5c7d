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
        // Every reaction of the study has its rows; a step row per saddle point, except where no barrier could be formed under
        // the study's model: the demo's KE (vinyl alcohol has no single point at the model's level), whose one row says why.
        var studies = await query.ListStudiesAsync();
        Assert.Equal(studies.Single(s => s.Id == studyId).Reactions.Select(r => r.Label).Order(), source.Rows.Select(r => r.Reaction).Distinct().Order());
        var placeholder = Assert.Single(source.Rows, r => r.Step == "—");
        Assert.Equal("KE", placeholder.Reaction);
        Assert.False(placeholder.HasSaddle);
        Assert.Null(placeholder.BarrierGibbs);
        Assert.Contains(placeholder.ConsistencyProblems, p => p.Contains("vinyl alcohol has no electronic energy"));
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
        // Every structure quotes its energy, except vinyl alcohol, which has no single point at the model's level (its own is on a
        // def2-TZVP geometry): the supporting information says "not available" rather than quoting another level's energy.
        Assert.All(structures.Where(s => s.Label != "vinyl alcohol"), s => Assert.NotNull(s.ElectronicEnergyHartree));
        Assert.Null(structures.Single(s => s.Label == "vinyl alcohol").ElectronicEnergyHartree);
        Assert.Contains(structures, s => s.LevelOfTheory.Contains("//"));
        Assert.Contains(structures, s => s.GibbsCorrectionHartree is not null);
        var text = SupportingInfoWriter.WriteText(study, model, structures);
        Assert.Contains("Imaginary frequencies: 1 (", text);
        Assert.Contains("vinyl alcohol\nRole: minimum\n", text);
        Assert.Contains("Electronic energy (Eh): not available", text);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task DemoStudy_SupportingInformation_QuotesTheValuesTheStoredBarriersWereDerivedFrom(StoreProvider store)
    {
        var (ledger, studyId) = await DemoLedger.CreateAsync(store);
        await using var _ = ledger;
        var (_, _, structures) = await new ExportQueryService(ledger.Factory).GetSupportingInfoAsync(studyId);
        var byLabel = structures.ToDictionary(s => s.Label);
        var detail = new Ledger.Queries.ReactionQueryService(ledger.Factory);
        var ids = (await new ExportQueryService(ledger.Factory).ListStudiesAsync()).Single(s => s.Id == studyId).Reactions.Select(r => r.Id).ToList();
        var checkedSteps = 0;
        foreach (var id in ids)
        {
            var r = (await detail.GetReactionAsync(id))!;
            // A state without terms had no energies to derive from (the demo's KE under its model): then no step has a ΔG‡.
            if (r.StateEnergies.Any(st => st.Terms is null)) Assert.DoesNotContain(r.Steps, st => st.BarrierGHartree is not null);
            foreach (var state in r.StateEnergies.Where(st => st.Terms is not null))
            foreach (var term in state.Terms!)
            {
                // Every species a barrier was derived from is listed with exactly the values the derivation used.
                var si = byLabel[term.Label];
                Assert.Equal(term.ElectronicHartree, si.ElectronicEnergyHartree);
                Assert.Equal(term.GibbsCorrectionHartree, si.GibbsCorrectionHartree);
                Assert.Equal(term.EnthalpyCorrectionHartree, si.EnthalpyCorrectionHartree);
                Assert.Equal(term.SymmetryNumber, si.SymmetryNumber);
            }
            // A reader of the supporting information recomputes each step's ΔG‡ by hand: G = Σ coefficient × (E + G correction)
            // over the state's species (the definition in DESIGN.md), saddle point minus the minimum before it.
            foreach (var step in r.Steps.Where(s => s.BarrierGHartree is not null))
            {
                var saddle = r.StateEnergies.Single(s => s.Position == step.SaddlePosition);
                var from = r.StateEnergies.Where(s => s.Position < step.SaddlePosition).MaxBy(s => s.Position)!;
                double G(BarrierLedger.Ledger.Derivation.DerivedState s) => s.Terms!.Sum(t => t.Coefficient * (byLabel[t.Label].ElectronicEnergyHartree!.Value + byLabel[t.Label].GibbsCorrectionHartree!.Value));
                Close(step.BarrierGHartree!.Value, G(saddle) - G(from), 1e-9, $"{r.Label} {step.Label}: ΔG‡ from the supporting information by hand");
                checkedSteps++;
            }
        }
        Assert.True(checkedSteps >= 5, $"only {checkedSteps} steps had a ΔG‡ to check");
    }

    private static void Close(double expected, double actual, double tolerance, string what) =>
        Assert.True(Math.Abs(expected - actual) <= tolerance, $"{what}: expected {expected:R}, got {actual:R} (tolerance {tolerance})");

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
