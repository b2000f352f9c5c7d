using System.Text;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Tests.Export;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Reactions;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Tests.Reactions;

/// <summary>The round trip: a reaction built from loose files, downloaded as a bundle, uploaded into an empty ledger.</summary>
public sealed class ReactionBundleServiceTests
{
    /// <summary>
    /// Four demo QCSchema Hessian results (seed-data/structures) and an invented relaxed scan along C1–C6 whose maximum (2.3 Å)
    /// lies near the saddle point's C1–C6 distance.
    /// </summary>
    internal static List<UploadFile> LooseFiles() =>
    [
        .. new[] { "butadiene.json", "ethylene.json", "ts-da.json", "cyclohexene.json" }
            .Select(n => new UploadFile(n, File.ReadAllBytes(Path.Combine(DemoLedger.DemoFolder, "structures", n)))),
        new("ts-da-scan.csv", Encoding.UTF8.GetBytes("r,energy\n3.0,-233.470\n2.8,-233.465\n2.6,-233.458\n2.4,-233.452\n2.3,-233.450\n2.2,-233.451\n2.0,-233.460\n1.8,-233.480\n1.6,-233.510\n")),
    ];

    /// <summary>Stores the loose files with the upload page's guesses (scan along atoms 1 and 6) and builds the reaction from them.</summary>
    internal static async Task<(int StudyId, int ReactionId)> BuildFromLooseFilesAsync(TempLedger ledger, string user)
    {
        var files = LooseFiles();
        var choices = new UploadChoices
        {
            NewStudyName = "Cycloaddition by hand",
            Files = UploadSuggestions.For(files).ToDictionary(s => s.FileName, s => s.ToChoices() with { ScanAtoms = s.IsScan ? [1, 6] : null }),
        };
        var stored = await ledger.Get<UploadService>().StoreAsync(files, choices, user);
        Assert.True(stored.Stored, string.Join("\n", stored.Issues));
        var w = (await ledger.Get<WorkspaceQueryService>().GetWorkspaceAsync(stored.StudyId!.Value))!;
        var draft = ReactionSuggestion.FromResults(w, stored.CalculationIds, stored.ScanIds);
        // The bonds that form at the saddle point (seed-data/README.md: C1–C6 and C4–C5).
        var definition = draft with
        {
            Label = "Cycloaddition",
            States = [.. draft.States.Select(s => s.SaddleCalculationId is null ? s : s with { ReactionCoordinate = [new AtomPair(1, 6), new AtomPair(4, 5)] })],
        };
        var saved = await ledger.Get<ReactionBuilderService>().CreateAsync(w.Id, definition, user);
        Assert.True(saved.Saved, string.Join("\n", saved.Problems.Select(p => p.Message)));
        return (w.Id, saved.ReactionId!.Value);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Export_OfABuiltReaction_UploadsIntoAnEmptyLedgerWithTheSameNumbersAndFiles(StoreProvider store)
    {
        await using var source = await TempLedger.CreateAsync(store);
        var member = await source.AddUserAsync("member", Roles.Member);
        var (_, reactionId) = await BuildFromLooseFilesAsync(source, member);

        var bundle = (await source.Get<ReactionBundleService>().ExportAsync(reactionId))!;
        Assert.Equal("Cycloaddition.zip", bundle.FileName);
        Assert.Empty(bundle.NotCarried);

        await using var target = await TempLedger.CreateAsync(store);
        var other = await target.AddUserAsync("elsewhere", Roles.Member);
        var uploaded = await target.Get<UploadService>().StoreAsync([new UploadFile(bundle.FileName, bundle.Zip)], new UploadChoices(), other);
        Assert.True(uploaded.Stored, string.Join("\n", uploaded.Issues));
        Assert.DoesNotContain(uploaded.Issues, i => !i.IsError);
        var copyId = Assert.Single(uploaded.ReactionIds);

        var (a, b) = (await DerivationAsync(source, reactionId), await DerivationAsync(target, copyId));
        Assert.NotNull(a.BarrierGibbsHartree);
        Assert.NotNull(a.RateConstantPerSecond);
        Assert.Equal((a.BarrierGibbsHartree, a.ReactionGibbsHartree, a.BarrierElectronicHartree, a.RateConstantPerSecond, a.HalfLifeSeconds, a.TemperatureKelvin),
            (b.BarrierGibbsHartree, b.ReactionGibbsHartree, b.BarrierElectronicHartree, b.RateConstantPerSecond, b.HalfLifeSeconds, b.TemperatureKelvin));
        Assert.Equal((a.LevelOfTheory, a.Consistent, a.ConsistencyJson, a.StepsJson), (b.LevelOfTheory, b.Consistent, b.ConsistencyJson, b.StepsJson));
        Assert.Equal(await CheckAsync(source), await CheckAsync(target));
        Assert.Equal(await DefinitionTextAsync(source, reactionId), await DefinitionTextAsync(target, copyId));

        // The five original files, byte for byte (SHA-256), behind the same calculations and scan.
        var (sa, sb) = (await FileShasAsync(source), await FileShasAsync(target));
        Assert.Equal(5, sa.Count);
        Assert.Equal(sa, sb);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Export_CarriesAHandSetSymmetryNumber_AndSaysNothingIsLeftOut(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var member = await ledger.AddUserAsync("member", Roles.Member);
        var (_, reactionId) = await BuildFromLooseFilesAsync(ledger, member);
        await using (var db = await ledger.DbAsync())
        {
            await db.Species.Where(s => s.Label == "ethylene").ExecuteUpdateAsync(u => u.SetProperty(s => s.SymmetryNumberOverride, 4));
        }

        var bundle = (await ledger.Get<ReactionBundleService>().ExportAsync(reactionId))!;

        // A σ set by hand is written as the species' symmetry_number (docs/formats.md); a detected one is found again on upload.
        Assert.DoesNotContain(bundle.NotCarried, n => n.Contains("σ"));
        var read = Core.Formats.BundleReader.Read(new MemoryStream(bundle.Zip), bundle.FileName).GetValueOrThrow();
        Assert.Equal(4, read.Species.Single(s => s.Label == "ethylene").SymmetryNumber);
        Assert.Null(read.Species.Single(s => s.Label == "butadiene").SymmetryNumber);
        Assert.Null(await ledger.Get<ReactionBundleService>().ExportAsync(9999));
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Export_OfAStudyWithItsOwnModel_CarriesIt_SoTheUploadElsewhereDerivesTheSameNumbers(StoreProvider store)
    {
        await using var source = await TempLedger.CreateAsync(store);
        var member = await source.AddUserAsync("member", Roles.Member);
        var (studyId, reactionId) = await BuildFromLooseFilesAsync(source, member);
        var models = source.Get<BarrierLedger.Ledger.Derivation.EnergyModelService>();
        var own = (await models.GetForStudyAsync(studyId)).Settings with
        {
            TemperatureKelvin = 350, StandardState = Core.Thermochemistry.StandardState.Gas1Bar,
            Treatment = Core.Thermochemistry.ThermoTreatment.QuasiRrhoEntropyAndEnthalpy, QuasiRrhoCutoffCm1 = 80,
            Tunnelling = BarrierLedger.Ledger.Records.TunnellingCorrection.Wigner,
        };
        Assert.True((await models.SaveStudyOverrideAsync(studyId, own, 0, member)).Saved);
        await source.Get<BarrierLedger.Ledger.Derivation.RecomputeService>().WhenIdleAsync();

        var bundle = (await source.Get<ReactionBundleService>().ExportAsync(reactionId))!;
        Assert.DoesNotContain(bundle.NotCarried, n => n.Contains("energy model"));
        Assert.Equal(own.ToBundle(), Core.Formats.BundleReader.Read(new MemoryStream(bundle.Zip), bundle.FileName).GetValueOrThrow().Study.EnergyModel);

        // Another ledger, whose group default is not the study's model: the upload creates the study under the carried model.
        await using var target = await TempLedger.CreateAsync(store);
        var other = await target.AddUserAsync("elsewhere", Roles.Member);
        var uploaded = await target.Get<UploadService>().StoreAsync([new UploadFile(bundle.FileName, bundle.Zip)], new UploadChoices(), other);
        Assert.True(uploaded.Stored, string.Join("\n", uploaded.Issues));
        Assert.Equal(own.Fingerprint, (await target.Get<BarrierLedger.Ledger.Derivation.EnergyModelService>().GetForStudyAsync(uploaded.StudyId!.Value)).Settings.Fingerprint);
        var (a, b) = (await DerivationAsync(source, reactionId), await DerivationAsync(target, Assert.Single(uploaded.ReactionIds)));
        Assert.Equal(350, a.TemperatureKelvin);
        Assert.NotNull(a.RateConstantPerSecond);
        Assert.Equal((a.BarrierGibbsHartree, a.ReactionGibbsHartree, a.RateConstantPerSecond, a.TemperatureKelvin, a.ModelFingerprint, a.StepsJson),
            (b.BarrierGibbsHartree, b.ReactionGibbsHartree, b.RateConstantPerSecond, b.TemperatureKelvin, b.ModelFingerprint, b.StepsJson));
    }

    private static async Task<BarrierLedger.Ledger.Records.ReactionDerivation> DerivationAsync(TempLedger l, int reactionId)
    {
        await using var db = await l.DbAsync();
        return await db.ReactionDerivations.AsNoTracking().SingleAsync(d => d.ReactionId == reactionId);
    }

    private static async Task<(Core.Checks.Verdict, string)> CheckAsync(TempLedger l)
    {
        await using var db = await l.DbAsync();
        var c = await db.FrequencyChecks.AsNoTracking().SingleAsync();
        return (c.Verdict, c.ReasonsJson);
    }

    /// <summary>The definition with species and calculations named by label (ids differ between ledgers).</summary>
    private static async Task<string> DefinitionTextAsync(TempLedger l, int reactionId)
    {
        var d = (await l.Get<ReactionBuilderService>().GetDefinitionAsync(reactionId))!.Definition;
        var w = (await l.Get<WorkspaceQueryService>().GetWorkspaceAsync((await l.Get<ReactionBuilderService>().GetDefinitionAsync(reactionId))!.StudyId))!;
        string Sp(int id) => w.Species.Single(s => s.Id == id).Label;
        string Calc(int? id) => id is null ? "" : w.Species.SelectMany(s => s.Calculations).Single(c => c.Id == id).Label;
        string Scan(int id) => w.Scans.Single(s => s.Id == id).Label;
        return d.Label + ": " + string.Join(" | ", d.States.Select(s => $"{s.Label} {s.Kind} {string.Join("+", s.Terms.Select(t => $"{t.Coefficient} {Sp(t.SpeciesId)}"))} " +
            $"{Calc(s.SaddleCalculationId)} {string.Join(",", s.Pairs)} {string.Join(",", s.Scans.Select(Scan))}"));
    }

    private static async Task<List<(string, string)>> FileShasAsync(TempLedger l)
    {
        await using var db = await l.DbAsync();
        var calcs = await db.Calculations.AsNoTracking().Where(c => c.StoredFileId != null).Select(c => new { c.Label, Sha = c.StoredFile!.Sha256 }).ToListAsync();
        var scans = await db.Scans.AsNoTracking().Where(c => c.StoredFileId != null)
            .Join(db.StoredFiles, s => s.StoredFileId, f => f.Id, (s, f) => new { s.Label, Sha = f.Sha256 }).ToListAsync();
        return [.. calcs.Concat(scans).Select(x => (x.Label, x.Sha)).Order()];
    }
}
