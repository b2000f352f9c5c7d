using System.Text;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Tests.Derivation;

/// <summary>
/// Point group and σ kept on each species from the geometry its thermochemistry uses, a bundle's <c>symmetry_number</c>, and a
/// member's correction re-deriving the reactions. σ references: a homonuclear diatomic and a symmetric linear molecule (D∞h) have
/// σ = 2, an atom σ = 1 (D. A. McQuarrie, Statistical Mechanics, 2000, ch. 6 and 8, the rotational partition function
/// q_rot = T/(σ Θ_rot) for linear molecules).
/// </summary>
public sealed class SpeciesSymmetryTests
{
    /// <summary>k_B in hartree per kelvin, CODATA 2018 (k_B / E_h = 3.1668115634556e-6 K⁻¹).</summary>
    private const double BoltzmannHartreePerKelvin = 3.1668115634556e-6;

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task StoreDraftAsync_H3Pathway_EverySpeciesGetsItsPointGroupAndSigmaFromItsGeometry(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var stored = await ledger.Get<UploadService>().StoreDraftAsync(H3System.Draft(), new UploadChoices(), "member");

        await using var db = await ledger.DbAsync();
        var species = await db.Species.AsNoTracking().OrderBy(s => s.Label).ToListAsync();
        Assert.Equal([("H", "Kh", 1, 1), ("H2", "D∞h", 2, 2), ("TS", "D∞h", 2, 2)],
            species.Select(s => (s.Label, s.PointGroup, s.DetectedSymmetryNumber!.Value, s.SymmetryNumber)).ToList());
        Assert.All(species, s => Assert.Null(s.SymmetryNumberOverride));
        var detail = (await ledger.Get<ReactionQueryService>().GetReactionAsync(stored.ReactionIds.Single()))!;
        var h2 = detail.States[0].Terms.Single(t => t.SpeciesLabel == "H2");
        Assert.Equal(("D∞h", 2, false), (h2.PointGroup, h2.SymmetryNumber, h2.SymmetryGivenByHand));
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task EditSpeciesAsync_SigmaOfH2Halved_BarrierRisesByRTln2AndIsAuditedAndClearingRestoresIt(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var stored = await ledger.Get<UploadService>().StoreDraftAsync(H3System.Draft(), new UploadChoices(), "member");
        var records = ledger.Get<RecordService>();
        var reactionId = stored.ReactionIds.Single();
        async Task<double> BarrierAsync()
        {
            await using var d = await ledger.DbAsync();
            return (await d.ReactionDerivations.AsNoTracking().SingleAsync(x => x.ReactionId == reactionId)).BarrierGibbsHartree!.Value;
        }
        await using var db0 = await ledger.DbAsync();
        var h2 = await db0.Species.AsNoTracking().SingleAsync(s => s.Label == "H2");
        var before = await BarrierAsync();

        var set = await records.EditSpeciesAsync(h2.Id, 1, 0, 1, h2.Version, "member");
        var after = await BarrierAsync();
        var stale = await records.EditSpeciesAsync(h2.Id, 3, 0, 1, h2.Version, "other");
        var impossible = await records.EditSpeciesAsync(h2.Id, 1, 0, 2, set.Version, "member");
        var cleared = await records.EditSpeciesAsync(h2.Id, null, 0, 1, set.Version, "member");
        var restored = await BarrierAsync();

        Assert.True(set.Saved, string.Join("; ", set.Errors));
        // G_rot = −RT ln q_rot with q_rot ∝ 1/σ: σ 2 → 1 lowers G(H2) by RT ln 2, so ΔG‡ = G(TS) − G(H2) − G(H) rises by RT ln 2
        // (McQuarrie, Statistical Mechanics, 2000, ch. 8; k_B from CODATA 2018).
        Assert.Equal(BoltzmannHartreePerKelvin * 298.15 * Math.Log(2), after - before, 9);
        Assert.Contains("changed by someone else", stale.Conflict);
        Assert.Contains("cannot have spin multiplicity 2", Assert.Single(impossible.Errors));
        Assert.True(cleared.Saved);
        Assert.Equal(before, restored, 12);
        await using var db = await ledger.DbAsync();
        var events = await db.AuditEvents.AsNoTracking().Where(a => a.Action == "species.corrected").OrderBy(a => a.Id).ToListAsync();
        Assert.Equal(2, events.Count);
        Assert.Contains("σ = 2 (detected, D∞h)", events[0].Summary);
        Assert.Contains("σ = 1 (set by hand)", events[0].Summary);
        var now = await db.Species.AsNoTracking().SingleAsync(s => s.Id == h2.Id);
        Assert.Equal((null, 2), (now.SymmetryNumberOverride, now.SymmetryNumber));
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task PreviewAsync_BundleGivesSigmaOtherThanDetected_WarnsAndStoringUsesTheGivenOne(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var manifest = H3Bundle.Manifest().Replace("""{ "label": "H2", "charge": 0, "multiplicity": 1 }""",
            """{ "label": "H2", "charge": 0, "multiplicity": 1, "symmetry_number": 1 }""", StringComparison.Ordinal);
        Assert.Contains("symmetry_number", manifest);
        var files = new[] { new UploadFile("h3.json", Encoding.UTF8.GetBytes(manifest)) };
        var uploads = ledger.Get<UploadService>();

        var preview = await uploads.PreviewAsync(files, new UploadChoices());
        var outcome = await uploads.StoreAsync(files, new UploadChoices(), "member");

        var warning = Assert.Single(preview.Issues, i => i.Message.Contains("symmetry_number"));
        Assert.False(warning.IsError);
        Assert.Contains("species 'H2': symmetry_number 1 is given, but its geometry (calculation 'h2') is D∞h, σ = 2", warning.Message);
        var row = preview.Species.Single(s => s.Label == "H2");
        Assert.Equal(("D∞h", 2, 1), (row.PointGroup, row.DetectedSymmetryNumber!.Value, row.GivenSymmetryNumber!.Value));
        Assert.True(outcome.Stored);
        await using var db = await ledger.DbAsync();
        var h2 = await db.Species.AsNoTracking().SingleAsync(s => s.Label == "H2");
        Assert.Equal(("D∞h", 2, 1, 1), (h2.PointGroup, h2.DetectedSymmetryNumber!.Value, h2.SymmetryNumberOverride!.Value, h2.SymmetryNumber));
    }
}

/// <summary>The demo's Diels–Alder species get the σ a chemist would give them, found from their geometries (none is given in the bundle).</summary>
public sealed class DemoSymmetryTests
{
    [Fact]
    public async Task DemoStudy_DielsAlderSpecies_GetTheirSymmetryNumbersFromTheGeometry()
    {
        var (ledger, _) = await Export.DemoLedger.CreateAsync();
        await using var _ledger = ledger;
        await using var db = await ledger.DbAsync();
        var species = await db.Species.AsNoTracking().Where(s => s.Label == "butadiene" || s.Label == "ethylene" || s.Label == "TS-DA" || s.Label == "cyclohexene")
            .ToDictionaryAsync(s => s.Label);

        // σ from the point group: C2h 2, D2h 4, Cs 1, C2 2 (the σ table of D. A. McQuarrie, Statistical Mechanics, 2000, ch. 8;
        // s-trans butadiene C2h, ethylene D2h, the Diels–Alder saddle point Cs, half-chair cyclohexene C2).
        Assert.Equal(("C2h", 2), (species["butadiene"].PointGroup, species["butadiene"].SymmetryNumber));
        Assert.Equal(("D2h", 4), (species["ethylene"].PointGroup, species["ethylene"].SymmetryNumber));
        Assert.Equal(("Cs", 1), (species["TS-DA"].PointGroup, species["TS-DA"].SymmetryNumber));
        Assert.Equal(("C2", 2), (species["cyclohexene"].PointGroup, species["cyclohexene"].SymmetryNumber));
        Assert.All(species.Values, s => Assert.Null(s.SymmetryNumberOverride));
    }
}
