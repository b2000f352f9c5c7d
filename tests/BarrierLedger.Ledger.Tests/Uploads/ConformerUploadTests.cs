using System.Text;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Tests.Conformers;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Tests.Uploads;

/// <summary>
/// Conformers through the upload (issue 21): a multi-frame single-point file, several files for one species, a bundle listing
/// conformers; duplicates and mirror images reported on store. The structures are butane built from internal coordinates
/// (FlexibleMolecules; bond lengths and angles from memory), so what is a duplicate and what a mirror image is known by
/// construction: a rotated and moved copy has RMSD 0 (rigid motion, analytic), gauche +65° and −65° are mirror images
/// (reflection through the plane of C1–C2–C3, analytic).
/// </summary>
public sealed class ConformerUploadTests
{
    private const string Member = "member-1";
    private const string Level = "B3LYP-D3/def2-SVP";

    private static Molecule Moved(Molecule m)
    {
        // A proper rotation (90° about z) and a translation: the same structure elsewhere.
        return new Molecule(m.Elements, [.. m.PositionsAngstrom.Select(p => new Vec3(-p.Y + 3.0, p.X - 1.0, p.Z + 2.0))], m.Charge, m.Multiplicity);
    }

    private static byte[] Frames(params (Molecule M, double E, string? Label)[] frames) => Encoding.UTF8.GetBytes(string.Concat(frames.Select(f =>
        XyzWriter.ToExtendedText(f.M, f.E, f.Label is null ? null : [new KeyValuePair<string, string>("conformer", f.Label)]))));

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Store_MultiFrameSinglePoints_OneConformerPerFrameWithDuplicateAndMirrorImageReported(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var anti = FlexibleMolecules.Butane(180);
        var file = Frames((anti, -158.4000, null), (FlexibleMolecules.Butane(65), -158.3985, null), (FlexibleMolecules.Butane(-65), -158.3985, null),
            (Moved(anti), -158.4000, null));
        var choices = new UploadChoices { NewStudyName = "Butane", SpeciesLabel = "butane", Kind = CalculationKind.SinglePoint, LevelOfTheory = Level };

        var outcome = await ledger.Get<UploadService>().StoreAsync([new UploadFile("butane.xyz", file)], choices, Member);

        Assert.True(outcome.Stored, string.Join("\n", outcome.Errors));
        await using var db = await ledger.DbAsync();
        var calcs = await db.Calculations.OrderBy(c => c.Id).ToListAsync();
        Assert.Equal(["c1", "c2", "c3", "c4"], calcs.Select(c => c.Conformer));
        Assert.Equal(["butane-c1", "butane-c2", "butane-c3", "butane-c4"], calcs.Select(c => c.Label));
        Assert.All(calcs, c => Assert.Equal(CalculationKind.SinglePoint, c.Kind));
        Assert.Equal(-158.3985, calcs[1].EnergyHartree!.Value, 10);
        Assert.Contains(outcome.ConformerNotes, n => n.StartsWith("species butane: conformer c4 duplicates c1 (RMSD 0.000 Å, ΔE 0.00 kcal/mol)", StringComparison.Ordinal));
        Assert.Contains(outcome.ConformerNotes, n => n.StartsWith("species butane: conformers c2 and c3 are mirror images", StringComparison.Ordinal));
        Assert.DoesNotContain(outcome.ConformerNotes, n => n.Contains("c1 and c2", StringComparison.Ordinal));
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Store_MultiFrameSinglePoints_FrameWithoutEnergyIsRefusedWithItsLineAndNothingStored(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var text = Encoding.UTF8.GetString(Frames((FlexibleMolecules.Butane(180), -158.4, "anti"))) + XyzWriter.ToText(FlexibleMolecules.Butane(65), null, "gauche");
        var choices = new UploadChoices { NewStudyName = "Butane", SpeciesLabel = "butane", Kind = CalculationKind.SinglePoint, LevelOfTheory = Level };

        var outcome = await ledger.Get<UploadService>().StoreAsync([new UploadFile("b.xyz", Encoding.UTF8.GetBytes(text))], choices, Member);

        Assert.False(outcome.Stored);
        var error = Assert.Single(outcome.Errors);
        Assert.Equal(17, error.Line); // the second frame's count line: 14 atoms + 2 lines of the first frame, then this one
        Assert.Contains("frame 2 has no energy", error.Message, StringComparison.Ordinal);
        await using var db = await ledger.DbAsync();
        Assert.Equal(0, await db.Calculations.CountAsync());
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Store_SeveralFilesOneSpecies_EachFileIsTheConformerOfItsName(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var files = new[]
        {
            new UploadFile("anti.xyz", Encoding.UTF8.GetBytes(XyzWriter.ToText(FlexibleMolecules.Butane(180), -158.4000))),
            new UploadFile("gauche.xyz", Encoding.UTF8.GetBytes(XyzWriter.ToText(FlexibleMolecules.Butane(65), -158.3985))),
            new UploadFile("anti-again.xyz", Encoding.UTF8.GetBytes(XyzWriter.ToText(FlexibleMolecules.Butane(180), -158.4000))),
        };
        var choices = new UploadChoices
        {
            NewStudyName = "Butane", SpeciesLabel = "butane", Kind = CalculationKind.Minimum, LevelOfTheory = Level, ConformerPerFile = true,
            Files = new Dictionary<string, FileChoices> { ["anti-again.xyz"] = new(Conformer: "a2") },
        };

        var outcome = await ledger.Get<UploadService>().StoreAsync(files, choices, Member);

        Assert.True(outcome.Stored, string.Join("\n", outcome.Errors));
        await using var db = await ledger.DbAsync();
        Assert.Equal(["anti", "gauche", "a2"], await db.Calculations.OrderBy(c => c.Id).Select(c => c.Conformer).ToListAsync());
        Assert.Equal(1, await db.Species.CountAsync());
        Assert.Contains(outcome.ConformerNotes, n => n.StartsWith("species butane: conformer a2 duplicates anti", StringComparison.Ordinal));
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Store_BundleListingConformers_LabelsEachCalculationWithItsConformer(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        string Geometry(Molecule m) => "{ \"symbols\": [" + string.Join(",", m.Elements.Select(e => $"\"{e.Symbol}\"")) + "], \"positions_angstrom\": [" +
            string.Join(",", m.PositionsAngstrom.Select(p => FormattableString.Invariant($"[{p.X},{p.Y},{p.Z}]"))) + "] }";
        var manifest = $$"""
        { "format": "barrierledger-bundle", "format_version": 1, "study": { "name": "Butane" },
          "species": [ { "label": "butane", "charge": 0, "multiplicity": 1,
                         "conformers": [ { "label": "anti", "calculations": ["b-anti"] }, { "label": "gauche", "calculations": ["b-gauche", "b-gauche-sp"] } ] } ],
          "calculations": [
            { "label": "b-anti", "species": "butane", "kind": "minimum", "level_of_theory": "{{Level}}", "energy_hartree": -158.4, "geometry": {{Geometry(FlexibleMolecules.Butane(180))}} },
            { "label": "b-gauche", "species": "butane", "kind": "minimum", "level_of_theory": "{{Level}}", "energy_hartree": -158.3985, "geometry": {{Geometry(FlexibleMolecules.Butane(65))}} },
            { "label": "b-gauche-sp", "species": "butane", "kind": "single_point", "level_of_theory": "DLPNO-CCSD(T)/def2-TZVP//{{Level}}", "energy_hartree": -158.9 } ] }
        """;

        var outcome = await ledger.Get<UploadService>().StoreAsync([new UploadFile("bundle.json", Encoding.UTF8.GetBytes(manifest))], new UploadChoices(), Member);

        Assert.True(outcome.Stored, string.Join("\n", outcome.Errors));
        await using var db = await ledger.DbAsync();
        var byLabel = await db.Calculations.ToDictionaryAsync(c => c.Label, c => c.Conformer);
        Assert.Equal("anti", byLabel["b-anti"]);
        Assert.Equal("gauche", byLabel["b-gauche"]);
        Assert.Equal("gauche", byLabel["b-gauche-sp"]);
        Assert.Contains(outcome.ConformerNotes, n => n.StartsWith("species butane: 2 conformer(s); 2 conformers, no duplicates", StringComparison.Ordinal));
    }
}
