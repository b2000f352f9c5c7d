using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Tests.Records;

/// <summary>Creating and correcting species and calculations: audited, versioned, re-derived where the numbers depend on it.</summary>
public sealed class RecordServiceTests
{
    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task CreateSpeciesAsync_NewLabel_IsStoredAuditedAndAStaleDuplicateRefused(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var records = ledger.Get<RecordService>();
        var studyId = await records.CreateStudyAsync("Empty study", "", "member");

        var id = await records.CreateSpeciesAsync(studyId, " water dimer ", 0, 1, "hydrogen-bonded", "member");

        var w = (await ledger.Get<WorkspaceQueryService>().GetWorkspaceAsync(studyId))!;
        var s = Assert.Single(w.Species);
        Assert.Equal((id, "water dimer", "hydrogen-bonded", ""), (s.Id, s.Label, s.Description, s.Formula));
        var again = await Assert.ThrowsAsync<ArgumentException>(() => records.CreateSpeciesAsync(studyId, "water dimer", 0, 1, "", "member"));
        Assert.Contains("already has a species labelled 'water dimer'", again.Message);
        await Assert.ThrowsAsync<ArgumentException>(() => records.CreateSpeciesAsync(studyId, "radical", 0, 0, "", "member"));
        await Assert.ThrowsAsync<ArgumentException>(() => records.CreateSpeciesAsync(studyId, "two\nlines", 0, 1, "", "member"));
        await using var db = await ledger.DbAsync();
        Assert.Equal(1, await db.AuditEvents.CountAsync(a => a.Action == "species.created"));
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task EditSpeciesDetailsAsync_RenameThenStaleRename_SecondIsRefusedWithTheConflictExplained(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var stored = await ledger.Get<UploadService>().StoreDraftAsync(H3System.Draft(), new UploadChoices(), "member");
        var records = ledger.Get<RecordService>();
        await using var db0 = await ledger.DbAsync();
        var h = await db0.Species.SingleAsync(s => s.Label == "H");

        var first = await records.EditSpeciesDetailsAsync(h.Id, "H atom", "doublet", h.Version, "alice");
        var second = await records.EditSpeciesDetailsAsync(h.Id, "hydrogen atom", "", h.Version, "bob");
        var clash = await records.EditSpeciesDetailsAsync(h.Id, "H2", "", first.Version, "alice");

        Assert.True(first.Saved);
        Assert.Contains("changed by someone else", second.Conflict);
        Assert.Contains("already has a species labelled 'H2'", Assert.Single(clash.Errors));
        var detail = (await ledger.Get<ReactionQueryService>().GetReactionAsync(stored.ReactionIds.Single()))!;
        Assert.Contains(detail.States[0].Terms, t => t.SpeciesLabel == "H atom");
        await using var db = await ledger.DbAsync();
        Assert.Equal("doublet", (await db.Species.SingleAsync(s => s.Id == h.Id)).Description);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task EditCalculationAsync_LevelChanged_RederivesAndTheBarrierSaysItMixesLevels(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var stored = await ledger.Get<UploadService>().StoreDraftAsync(H3System.Draft(), new UploadChoices(), "member");
        var records = ledger.Get<RecordService>();
        var studyId = stored.StudyId!.Value;
        await using var db0 = await ledger.DbAsync();
        var h2 = await db0.Calculations.SingleAsync(c => c.Label == "h2");

        var result = await records.EditCalculationAsync(h2.Id, "h2 tight", "reoptimised", CalculationKind.Minimum, "MODEL-B/basis-2", h2.Version, "member");

        Assert.True(result.Saved, string.Join("; ", result.Errors));
        var row = Assert.Single((await ledger.Get<LedgerQueryService>().GetLedgerRowsAsync(studyId)).Rows);
        Assert.False(row.Stale);
        Assert.False(row.Consistent);
        Assert.Contains(row.ConsistencyReasons, r => r.Code == ConsistencyCodes.MixedElectronicLevels);
        await using var db = await ledger.DbAsync();
        var c = await db.Calculations.SingleAsync(x => x.Id == h2.Id);
        Assert.Equal(("h2 tight", "reoptimised", "MODEL-B/basis-2", "model-b/basis-2"), (c.Label, c.Note, c.LevelOfTheory, c.EnergyLevelKey));
        Assert.Equal(1, await db.AuditEvents.CountAsync(a => a.Action == "calculation.edited" && a.EntityId == h2.Id.ToString()));
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task EditCalculationAsync_SaddlePointInUseMadeAMinimum_IsRefusedNamingTheState(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        await ledger.Get<UploadService>().StoreDraftAsync(H3System.Draft(), new UploadChoices(), "member");
        await using var db = await ledger.DbAsync();
        var ts = await db.Calculations.SingleAsync(c => c.Label == "ts");

        var result = await ledger.Get<RecordService>().EditCalculationAsync(ts.Id, "ts", "", CalculationKind.Minimum, H3System.Level, ts.Version, "member");

        Assert.False(result.Saved);
        Assert.Contains("saddle point of state 'TS' of reaction 'H exchange'", Assert.Single(result.Errors));
    }
}
