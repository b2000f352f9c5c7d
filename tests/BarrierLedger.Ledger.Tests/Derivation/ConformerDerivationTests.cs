using System.Globalization;
using System.Text;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Conformers;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Tests.Conformers;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Export;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;

namespace BarrierLedger.Ledger.Tests.Derivation;

/// <summary>
/// Conformers end to end (issue 21): upload → derivation → ledger → reaction → export. R (butane anti, G = −158.40 + 0.100 Eh) → TS
/// (eclipsed, G = −158.39 + 0.099) → P, all with reported thermal corrections at 298.15 K (1 atm; the model's 1 mol/L shifts every
/// state alike, so a unimolecular barrier does not move). Invented energies; structures from FlexibleMolecules (bond lengths from
/// memory). Hand arithmetic: ΔG‡ = 0.009 Eh from anti; a gauche conformer with G = −158.4025 + 0.0995 = −158.303 Eh, 0.003 Eh below
/// anti, becomes the one used and raises ΔG‡ to 0.012 Eh, by 0.003 × 627.5094740631 = 1.8825 kcal/mol (CODATA 2018). A lower
/// reactant conformer raises the barrier (G of the reactant falls, the saddle point stays): the drop the issue text expects would
/// come from a lower saddle-point conformer, checked last here (a TS conformer 0.001 Eh lower in G lowers ΔG‡).
/// </summary>
public sealed class ConformerDerivationTests
{
    private const string Level = "B3LYP-D3/def2-SVP";
    private const string Member = "member-1";
    private const string Study = "Butane conformers (end to end)";

    private static string Geometry(Molecule m) =>
        "{ \"symbols\": [" + string.Join(", ", m.Elements.Select(e => $"\"{e.Symbol}\"")) + "], \"positions_angstrom\": [" +
        string.Join(", ", m.PositionsAngstrom.Select(p => string.Format(CultureInfo.InvariantCulture, "[{0:R}, {1:R}, {2:R}]", p.X, p.Y, p.Z))) + "] }";

    private static string Calc(string label, string species, string kind, Molecule m, double e, double g) => string.Format(CultureInfo.InvariantCulture,
        "{{ \"label\": \"{0}\", \"species\": \"{1}\", \"kind\": \"{2}\", \"level_of_theory\": \"{3}\", \"energy_hartree\": {4:R}, \"geometry\": {5}, " +
        "\"thermal_corrections\": {{ \"temperature_kelvin\": 298.15, \"zero_point_hartree\": 0.13, \"enthalpy_hartree\": 0.14, \"gibbs_hartree\": {6:R} }} }}",
        label, species, kind, Level, e, Geometry(m), g);

    private static UploadFile Bundle(string name, string species, string calcs, string reactions = "") => new(name, Encoding.UTF8.GetBytes($$"""
        { "format": "barrierledger-bundle", "format_version": 1, "study": { "name": "{{Study}}", "description": "invented test data" },
          "species": [ {{species}} ], "calculations": [ {{calcs}} ]{{(reactions.Length > 0 ? $", \"reactions\": [ {reactions} ]" : "")}} }
        """));

    private static async Task<(int StudyId, int ReactionId)> StoreReactionAsync(TempLedger ledger)
    {
        var first = Bundle("reaction.json",
            """{ "label": "R", "charge": 0, "multiplicity": 1, "conformers": [ { "label": "anti", "calculations": ["R-anti"] } ] }, """ +
            """{ "label": "TS", "charge": 0, "multiplicity": 1 }, { "label": "P", "charge": 0, "multiplicity": 1 }""",
            Calc("R-anti", "R", "minimum", FlexibleMolecules.Butane(180), -158.40, 0.100) + ", " +
            Calc("ts", "TS", "saddle_point", FlexibleMolecules.Butane(0), -158.39, 0.099) + ", " +
            Calc("p", "P", "minimum", FlexibleMolecules.Butane(-65), -158.399, 0.100),
            """{ "label": "ROT", "description": "invented", "states": [ { "label": "R", "kind": "minimum", "terms": [ { "species": "R" } ] }, """ +
            """{ "label": "TS", "kind": "saddle_point", "terms": [ { "species": "TS" } ], "calculation": "ts", "reaction_coordinate": [[1, 4]] }, """ +
            """{ "label": "P", "kind": "minimum", "terms": [ { "species": "P" } ] } ] }""");
        var outcome = await ledger.Get<UploadService>().StoreAsync([first], new UploadChoices(), Member);
        Assert.True(outcome.Stored, string.Join("\n", outcome.Errors));
        return (outcome.StudyId!.Value, Assert.Single(outcome.ReactionIds));
    }

    private static async Task<LedgerRow> RowAsync(TempLedger ledger, int studyId) =>
        Assert.Single((await ledger.Get<LedgerQueryService>().GetLedgerRowsAsync(studyId)).Rows);

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task LowerReactantConformer_RaisesTheBarrierByItsGibbsDifference_OnTheLedgerTheReactionAndTheExport(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var (studyId, reactionId) = await StoreReactionAsync(ledger);
        var before = (await RowAsync(ledger, studyId)).BarrierGibbs!.Value;
        Assert.Equal(0.009, before.Hartree, 9);

        var gauche = Bundle("gauche.json", """{ "label": "R", "charge": 0, "multiplicity": 1, "conformers": [ { "label": "gauche", "calculations": ["R-gauche"] } ] }""",
            Calc("R-gauche", "R", "minimum", FlexibleMolecules.Butane(65), -158.4025, 0.0995));
        var stored = await ledger.Get<UploadService>().StoreAsync([gauche], new UploadChoices(), Member);
        Assert.True(stored.Stored, string.Join("\n", stored.Errors));

        var row = await RowAsync(ledger, studyId);
        Assert.Equal(0.012, row.BarrierGibbs!.Value.Hartree, 9);
        Assert.Equal(1.8825, (row.BarrierGibbs.Value - before).KcalPerMol, 4); // 0.003 Eh in kcal/mol (CODATA 2018)
        Assert.DoesNotContain(row.ConsistencyReasons, r => r.Code.StartsWith("conformers.", StringComparison.Ordinal));

        // The reaction page says which conformer was used, with the calculation it came from.
        var detail = (await ledger.Get<ReactionQueryService>().GetReactionAsync(reactionId))!;
        var term = Assert.Single(detail.StateEnergies.Single(s => s.Label == "R").Terms!);
        Assert.Equal("conformer gauche (lowest of 2)", term.Conformer);
        Assert.Equal(-158.4025, term.ElectronicHartree, 9);
        Assert.Null(Assert.Single(detail.StateEnergies.Single(s => s.Label == "TS").Terms!).Conformer);

        // The export states the choice in its header and carries the new barrier: 0.012 Eh = 7.530 kcal/mol, one decimal.
        var csv = Encoding.UTF8.GetString((await new ExportService(new ExportQueryService(ledger.Factory))
            .TableAsync(studyId, null, TableFormat.Csv, TableOptions.Default)).Content);
        Assert.Contains("# Conformers: lowest conformer of each species (by G)", csv);
        Assert.Contains(",7.5,", csv);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task LowerConformerWithoutThermalCorrection_IsAReasonOnTheLedgerAndAnExportFootnote(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var (studyId, reactionId) = await StoreReactionAsync(ledger);
        // A single point of a third conformer, 0.0035 Eh (2.20 kcal/mol) below anti in E, without frequencies or corrections.
        var c3 = XyzWriter.ToExtendedText(FlexibleMolecules.Butane(-65), -158.4035);
        var stored = await ledger.Get<UploadService>().StoreAsync([new UploadFile("c3.xyz", Encoding.UTF8.GetBytes(c3))],
            new UploadChoices { StudyId = studyId, SpeciesLabel = "R", Kind = CalculationKind.SinglePoint, LevelOfTheory = Level, Conformer = "c3" }, Member);
        Assert.True(stored.Stored, string.Join("\n", stored.Errors));

        var row = await RowAsync(ledger, studyId);
        Assert.Equal(0.009, row.BarrierGibbs!.Value.Hartree, 9); // c3 takes no part: it has no G
        var reason = Assert.Single(row.ConsistencyReasons, r => r.Code == ConformerSelection.LowerConformerCode);
        Assert.Equal(BarrierLedger.Core.Checks.CheckSeverity.Attention, reason.Severity);
        Assert.StartsWith("State R: a lower conformer of R exists than the one the barrier uses: c3 lies 2.20 kcal/mol below anti", reason.Message);
        Assert.Contains("lower this state's G by about 2.20 kcal/mol, raising ΔG‡", reason.Message);

        var table = BarrierTable.Build(await new ExportQueryService(ledger.Factory).GetTableSourceAsync(studyId), TableOptions.Default);
        Assert.Contains(table.Footnotes, f => f.Text.Contains("a lower conformer of R exists than the one the barrier uses", StringComparison.Ordinal));
        var diagram = DiagramExport.Text(await new ExportQueryService(ledger.Factory).GetDiagramSourceAsync(reactionId), EnergyUnit.KcalPerMol);
        Assert.Contains(diagram.Footnotes, f => f.Contains("ROT: State R: a lower conformer of R exists than the one the barrier uses", StringComparison.Ordinal));
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task EnsembleModel_WeighsTheConformers_AndALowerSaddleConformerLowersTheBarrier(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var (studyId, _) = await StoreReactionAsync(ledger);
        var gauche = Bundle("gauche.json", """{ "label": "R", "charge": 0, "multiplicity": 1, "conformers": [ { "label": "gauche", "calculations": ["R-gauche"] } ] }""",
            Calc("R-gauche", "R", "minimum", FlexibleMolecules.Butane(65), -158.4025, 0.0995));
        Assert.True((await ledger.Get<UploadService>().StoreAsync([gauche], new UploadChoices(), Member)).Stored);

        var models = ledger.Get<EnergyModelService>();
        var current = await models.GetForStudyAsync(studyId);
        var saved = await models.SaveStudyOverrideAsync(studyId, current.Settings with { Conformers = ConformerChoice.BoltzmannEnsemble }, current.Version, Member);
        Assert.True(saved.Saved, string.Join("; ", saved.Errors));
        await ledger.Get<RecomputeService>().Request(studyId).WaitAsync(TimeSpan.FromMinutes(2));

        // G_ens = G_gauche − RT ln(1 + exp(−ΔG/RT)), ΔG = 1.882528 kcal/mol, RT = 0.592485 kcal/mol (CODATA 2018 R, 298.15 K):
        // exp(−3.177338) = 0.041696, RT ln(1.041696) = 0.024203 kcal/mol; ΔG‡ = 7.530114 + 0.024203 = 7.554317 kcal/mol
        // (hand computation, checked with Python 3's math module).
        var row = await RowAsync(ledger, studyId);
        Assert.Equal(7.554317, row.BarrierGibbs!.Value.KcalPerMol, 5);
        Assert.EndsWith("conformers: Boltzmann-weighted ensemble of each species, G = −RT ln Σ exp(−G_i/RT)", (await models.GetForStudyAsync(studyId)).Description);

        // A saddle-point conformer 0.001 Eh lower in G, never checked: the barrier falls by its share and the reviewer is told.
        var ts2 = Bundle("ts2.json", """{ "label": "TS", "charge": 0, "multiplicity": 1, "conformers": [ { "label": "ts-b", "calculations": ["ts-b"] } ] }""",
            Calc("ts-b", "TS", "saddle_point", FlexibleMolecules.Butane(120), -158.391, 0.099));
        Assert.True((await ledger.Get<UploadService>().StoreAsync([ts2], new UploadChoices(), Member)).Stored);
        // G_TS,ens = G(ts-b) − RT ln(1 + exp(−0.627509/RT)) = G(ts-b) − 0.176385 kcal/mol; ΔG‡ = 0.011 Eh − 0.176385 + 0.024203
        // = 6.902604 − 0.152183 = 6.750422 kcal/mol (hand computation, Python 3 math module).
        row = await RowAsync(ledger, studyId);
        Assert.Equal(6.750422, row.BarrierGibbs!.Value.KcalPerMol, 5);
        Assert.Contains(row.ConsistencyReasons, r => r.Code == ConformerSelection.UncheckedSaddleConformerCode && r.Message.Contains("ts-b", StringComparison.Ordinal));
    }
}
