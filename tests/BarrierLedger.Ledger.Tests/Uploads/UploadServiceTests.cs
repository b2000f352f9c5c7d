using BarrierLedger.Core.Pathways;
using BarrierLedger.Ledger.Storage;
using System.Security.Cryptography;
using System.Text;
using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Tests.Uploads;

public sealed class UploadServiceTests
{
    private const string Member = "member-1";

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task StoreDraft_WholePathway_WritesRecordsFileCheckAndDerivation(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var draft = H3System.Draft();
        var outcome = await ledger.Get<UploadService>().StoreDraftAsync(draft, new UploadChoices(), Member);

        Assert.True(outcome.Stored, string.Join("\n", outcome.Errors));
        await using var db = await ledger.DbAsync();
        Assert.Equal(1, await db.Studies.CountAsync());
        Assert.Equal(3, await db.Species.CountAsync());
        Assert.Equal(3, await db.Calculations.CountAsync());
        var reaction = await db.Reactions.Include(r => r.States).ThenInclude(s => s.CoordinatePairs).SingleAsync();
        Assert.Equal(["H2 + H", "TS", "H + H2"], reaction.States.OrderBy(s => s.Position).Select(s => s.Label));
        Assert.Equal(2, reaction.States.Single(s => s.Kind == StateKind.SaddlePoint).CoordinatePairs.Count);

        var file = await db.StoredFiles.SingleAsync();
        Assert.Equal(Convert.ToHexStringLower(SHA256.HashData(draft.Files["h3.json"])), file.Sha256);
        Assert.Equal(draft.Files["h3.json"], file.Content);

        var check = await db.FrequencyChecks.SingleAsync();
        Assert.Equal(Verdict.Passed, check.Verdict);
        Assert.Contains(SaddleCheckCodes.ReactionMode, check.ReasonsJson);

        var d = await db.ReactionDerivations.SingleAsync();
        // ΔE‡ = E(TS) − E(H2) − E(H) = 0.015 Eh, by hand from the invented energies.
        Assert.Equal(H3System.ETs - H3System.EH2 - H3System.EH, d.BarrierElectronicHartree!.Value, 12);
        Assert.NotNull(d.BarrierGibbsHartree);
        Assert.True(d.Consistent, d.ConsistencyJson);
        Assert.Equal(0.0, d.ReactionGibbsHartree!.Value, 12);
        Assert.Equal(reaction.InputsRevision, d.InputsRevision);
        Assert.Contains(await db.AuditEvents.Select(a => a.Action).ToListAsync(), a => a == "upload.stored");
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task StoreDraft_SameFilesTwice_ReportsDuplicatesAndStoresNothingTwice(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var uploads = ledger.Get<UploadService>();
        Assert.True((await uploads.StoreDraftAsync(H3System.Draft(), new UploadChoices(), Member)).Stored);
        var second = await uploads.StoreDraftAsync(H3System.Draft(), new UploadChoices(), Member);

        Assert.True(second.Stored);
        Assert.Empty(second.CalculationIds);
        Assert.Equal(3, second.Duplicates.Count);
        Assert.All(second.Duplicates, m => Assert.Contains("already stored", m));
        await using var db = await ledger.DbAsync();
        Assert.Equal(3, await db.Calculations.CountAsync());
        Assert.Equal(1, await db.StoredFiles.CountAsync());
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task StoreDraft_WithSeveralErrors_WritesNothingAndReportsEveryError(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var draft = H3System.Draft();
        draft.Species[1] = new DraftSpecies("H", 0, 1); // an H atom has one electron: multiplicity 1 is impossible
        var r = draft.Reactions[0];
        draft.Reactions[0] = r with { States = [r.States[0], r.States[1] with { ReactionCoordinate = [(1, 7)] }, r.States[2]] };

        var outcome = await ledger.Get<UploadService>().StoreDraftAsync(draft, new UploadChoices(), Member);

        Assert.False(outcome.Stored);
        Assert.Contains(outcome.Errors, e => e.Message.Contains("cannot have spin multiplicity 1"));
        Assert.Contains(outcome.Errors, e => e.Message.Contains("pair 1–7"));
        await using var db = await ledger.DbAsync();
        Assert.Equal(0, await db.Studies.CountAsync());
        Assert.Equal(0, await db.Calculations.CountAsync());
        Assert.Equal(0, await db.StoredFiles.CountAsync());
        Assert.Equal(0, await db.AuditEvents.CountAsync());
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Preview_XyzWithoutChoices_ListsWhatIsMissing_AndWritesNothing(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var file = new UploadFile("ts.xyz", Encoding.UTF8.GetBytes(H3System.TsXyz()));

        var preview = await ledger.Get<UploadService>().PreviewAsync([file], new UploadChoices { NewStudyName = "S" });

        Assert.False(preview.CanStore);
        Assert.Contains(preview.Errors, e => e.Message.Contains("species label"));
        Assert.Contains(preview.Errors, e => e.Message.Contains("choose a kind"));
        Assert.Contains(preview.Errors, e => e.Message.Contains("level of theory"));
        await using var db = await ledger.DbAsync();
        Assert.Equal(0, await db.Studies.CountAsync());
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Preview_BrokenXyz_ReportsTheLine(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var file = new UploadFile("bad.xyz", Encoding.UTF8.GetBytes("3\nenergy=-1.6\nH 0 0 0\nH 0.9 zero 0\nH 1.8 0 0\n"));
        var preview = await ledger.Get<UploadService>().PreviewAsync([file],
            new UploadChoices { NewStudyName = "S", SpeciesLabel = "TS", Kind = CalculationKind.SaddlePoint, LevelOfTheory = H3System.Level });
        var error = Assert.Single(preview.Errors);
        Assert.Equal("bad.xyz", error.FileName);
        Assert.Equal(4, error.Line);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Store_XyzWithChoices_StoresTheCalculationWithItsFile(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var bytes = Encoding.UTF8.GetBytes(H3System.TsXyz());
        var choices = new UploadChoices { NewStudyName = "S", SpeciesLabel = "TS", Kind = CalculationKind.SaddlePoint, LevelOfTheory = "M1/B1//M2/B2" };

        var preview = await ledger.Get<UploadService>().PreviewAsync([new UploadFile("ts.xyz", bytes)], choices);
        Assert.True(preview.CanStore, string.Join("\n", preview.Errors));
        Assert.Equal("H3", Assert.Single(preview.Calculations).Formula);

        var outcome = await ledger.Get<UploadService>().StoreAsync([new UploadFile("ts.xyz", bytes)], choices, Member);
        Assert.True(outcome.Stored, string.Join("\n", outcome.Errors));
        await using var db = await ledger.DbAsync();
        var calc = await db.Calculations.Include(c => c.StoredFile).Include(c => c.Species).SingleAsync();
        Assert.Equal(H3System.ETs, calc.EnergyHartree);
        Assert.Equal("M1", calc.Method);
        Assert.Equal("M2/B2", calc.GeometryLevel);
        Assert.Equal(bytes, calc.StoredFile!.Content);
        Assert.Equal("H3", calc.Species!.Formula);
        Assert.Equal(2, calc.Species.Multiplicity);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Store_MultiFrameXyzAsScan_StoresEveryPointWithItsGeometry(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var bytes = Encoding.UTF8.GetBytes(H3System.ScanXyz(25, 6));
        var outcome = await ledger.Get<UploadService>().StoreAsync([new UploadFile("scan.xyz", bytes)], H3System.ScanChoices("S"), Member);
        Assert.True(outcome.Stored, string.Join("\n", outcome.Errors));
        await using var db = await ledger.DbAsync();
        var points = await db.ScanPoints.OrderBy(p => p.Index).ToListAsync();
        Assert.Equal(25, points.Count);
        Assert.Equal(1.5, points[0].Coordinate, 6);
        Assert.Equal(3.0, points[^1].Coordinate, 6);
        Assert.All(points, p => Assert.Equal(6 * 3 * 8, p.PositionsAngstrom!.Length));
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task ImportBundle_UnknownFormat_IsRefusedWithAReason(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var outcome = await ledger.Get<UploadService>().ImportBundleAsync(new MemoryStream([1, 2, 3]), "data.bin", Member);
        Assert.False(outcome.Stored);
        Assert.Contains(outcome.Errors, e => e.Message.Contains("unknown file type"));
    }

    [Fact]
    public void EnergyUnits_BarrierOfTheTestSystem_IsAboutNineKcal()
    {
        // 0.015 Eh × 627.5095 kcal/mol per Eh (CODATA 2018 via Core) = 9.41 kcal/mol: the invented barrier is in a plausible range.
        Assert.InRange(Energy.FromHartree(H3System.ETs - H3System.EH2 - H3System.EH).KcalPerMol, 9.40, 9.42);
    }
}

public sealed class BundleUploadTests
{
    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task ImportBundle_Manifest_StoresThePathwayAndDerivesIt(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var bytes = System.Text.Encoding.UTF8.GetBytes(H3Bundle.Manifest());
        var outcome = await ledger.Get<UploadService>().ImportBundleAsync(new MemoryStream(bytes), "h3.json", "loader");
        Assert.True(outcome.Stored, string.Join("\n", outcome.Errors));
        await using var db = await ledger.DbAsync();
        Assert.Equal("Hydrogen exchange (bundle test)", (await db.Studies.SingleAsync()).Name);
        Assert.Equal(3, await db.Calculations.CountAsync());
        Assert.Equal(Verdict.Passed, (await db.FrequencyChecks.SingleAsync()).Verdict);
        var d = await db.ReactionDerivations.SingleAsync();
        Assert.Equal(H3System.ETs - H3System.EH2 - H3System.EH, d.BarrierElectronicHartree!.Value, 9);

        // The same bundle again: everything is reported as already stored, nothing doubles.
        var again = await ledger.Get<UploadService>().ImportBundleAsync(new MemoryStream(bytes), "h3.json", "loader");
        Assert.True(again.Stored);
        Assert.Equal(3, again.Duplicates.Count);
        Assert.Equal(3, await db.Calculations.CountAsync());
        Assert.Equal(1, await db.Reactions.CountAsync());
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Store_Zip_KeepsTheZipAndItsMembersAsOriginals(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var zip = H3Bundle.Zip();
        var outcome = await ledger.Get<UploadService>().StoreAsync([new UploadFile("h3.zip", zip)], new UploadChoices(), "member");
        Assert.True(outcome.Stored, string.Join("\n", outcome.Errors));
        await using var db = await ledger.DbAsync();
        var names = await db.StoredFiles.Select(f => f.FileName).ToListAsync();
        Assert.Contains("h3.zip", names);
        Assert.Contains("h3.zip!ts.xyz", names);
        var ts = await db.Calculations.Include(c => c.StoredFile).SingleAsync(c => c.Label == "ts");
        Assert.Equal("h3.zip!ts.xyz", ts.StoredFile!.FileName);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Preview_BundleWithBrokenReference_ReportsTheJsonPathAndStoresNothing(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var text = H3Bundle.Manifest().Replace("\"calculation\": \"ts\"", "\"calculation\": \"nope\"");
        var preview = await ledger.Get<UploadService>().PreviewAsync([new UploadFile("h3.json", System.Text.Encoding.UTF8.GetBytes(text))], new UploadChoices());
        Assert.False(preview.CanStore);
        Assert.Contains(preview.Errors, e => e.FileName == "h3.json" && e.JsonPath is not null && e.Message.Contains("nope"));
        await using var db = await ledger.DbAsync();
        Assert.Equal(0, await db.Studies.CountAsync());
    }
}
