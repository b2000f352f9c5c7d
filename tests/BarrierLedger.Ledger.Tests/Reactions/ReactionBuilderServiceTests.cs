using BarrierLedger.Core.Pathways;
using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Scans;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Auditing;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Reactions;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Reviews;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Tests.Reactions;

/// <summary>Reactions built from stored results: preview, create, versioned edit, review reopening, retire and restore, on both engines.</summary>
public sealed class ReactionBuilderServiceTests
{
    /// <summary>The H + H2 pieces stored as loose results (no reaction), and the ids a builder would pick.</summary>
    private static async Task<(int StudyId, int H2, int H, int Ts, int TsCalc)> LoosePiecesAsync(TempLedger ledger, string user, string study = "Built by hand")
    {
        var draft = H3System.Draft(study);
        draft.Reactions.Clear();
        var stored = await ledger.Get<UploadService>().StoreDraftAsync(draft, new UploadChoices(), user);
        Assert.True(stored.Stored, string.Join("\n", stored.Errors));
        var w = (await ledger.Get<WorkspaceQueryService>().GetWorkspaceAsync(stored.StudyId!.Value))!;
        int Id(string label) => w.Species.Single(s => s.Label == label).Id;
        return (stored.StudyId.Value, Id("H2"), Id("H"), Id("TS"), w.Species.Single(s => s.Label == "TS").Calculations.Single().Id);
    }

    private static ReactionDefinition Exchange(int h2, int h, int ts, int tsCalc, params AtomPair[] pairs) => new("H exchange", "built in the test",
    [
        new StateDefinition("H2 + H", StateKind.Minimum, [new(h2), new(h)]),
        new StateDefinition("TS", StateKind.SaddlePoint, [new(ts)], tsCalc, pairs.Length > 0 ? pairs : [new(1, 2), new(2, 3)]),
        new StateDefinition("H + H2", StateKind.Minimum, [new(h), new(h2)]),
    ]);

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task CreateAsync_FromLooseResults_GivesTheNumbersOfTheSameReactionUploadedAsABundle(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var member = await ledger.AddUserAsync("member", Roles.Member);
        var (studyId, h2, h, ts, tsCalc) = await LoosePiecesAsync(ledger, member);
        var builder = ledger.Get<ReactionBuilderService>();

        var preview = await builder.PreviewAsync(studyId, Exchange(h2, h, ts, tsCalc));
        var saved = await builder.CreateAsync(studyId, Exchange(h2, h, ts, tsCalc), member);

        Assert.True(saved.Saved, string.Join("\n", saved.Problems.Select(p => p.Message)));
        var uploaded = await ledger.Get<UploadService>().StoreDraftAsync(H3System.Draft("Uploaded as a bundle"), new UploadChoices(), member);
        var query = ledger.Get<LedgerQueryService>();
        var built = Assert.Single((await query.GetLedgerRowsAsync(studyId)).Rows);
        var bundle = Assert.Single((await query.GetLedgerRowsAsync(uploaded.StudyId!.Value)).Rows);
        Assert.False(built.Stale);
        Assert.Equal(bundle.BarrierGibbs!.Value.Hartree, built.BarrierGibbs!.Value.Hartree);
        Assert.Equal(bundle.ReactionGibbs!.Value.Hartree, built.ReactionGibbs!.Value.Hartree);
        Assert.Equal(bundle.RateConstantPerSecond, built.RateConstantPerSecond);
        Assert.Equal(bundle.Verdict, built.Verdict);
        // The preview showed what was then stored.
        Assert.Equal(built.BarrierGibbs.Value.Hartree, preview.Derived!.BarrierGibbsHartree);
        // ΔE‡ by hand: E(TS) − E(H2) − E(H) = −1.655 + 1.170 + 0.500 = 0.015 Eh (the invented energies of H3System).
        Close.Absolute(0.015, built.BarrierElectronic!.Value.Hartree, 1e-12, "ΔE‡ of the built reaction (Eh)",
            "by hand from the invented energies: −1.655 − (−1.170) − (−0.500)");
        Close.Relative(0.015 * 627.5094740631, built.BarrierElectronic.Value.KcalPerMol, 1e-10, "ΔE‡ (kcal/mol)",
            "CODATA 2018: 1 Eh = 4.3597447222071e-18 J × N_A 6.02214076e23 / (4184 J/kcal) = 627.5094740631 kcal/mol");
        Assert.Equal(ReviewState.AwaitingReview, built.ReviewStatus);
        Assert.Contains(await ledger.Get<ReviewService>().QueueAsync(studyId), q => q.CalculationId == tsCalc);
        await using var db = await ledger.DbAsync();
        var created = await db.AuditEvents.SingleAsync(a => a.Action == "reaction.created" && a.EntityId == saved.ReactionId!.Value.ToString());
        Assert.Contains("\"label\":\"H exchange\"", created.After);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task PreviewAsync_ProductsMissingAnAtom_SaysSoPerStateBeforeAnythingIsStored(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var (studyId, h2, h, ts, tsCalc) = await LoosePiecesAsync(ledger, "member");
        var builder = ledger.Get<ReactionBuilderService>();
        var d = Exchange(h2, h, ts, tsCalc);
        d = d with { States = [d.States[0], d.States[1], d.States[2] with { Terms = [new(h2)] }] };

        var preview = await builder.PreviewAsync(studyId, d);

        Assert.True(preview.CanSave); // the shape is fine; the balance is what is wrong, and it is said
        Assert.Equal(["H3", "H3", "H2"], preview.Balance.Select(b => b.Formula));
        Assert.Equal([3, 3, 2], preview.Balance.Select(b => b.Electrons));
        var reason = Assert.Single(preview.Derived!.Consistency, r => r.Code == ConsistencyCodes.FormulaDiffers);
        Assert.Contains("State 'H + H2' is H2 but the first state 'H2 + H' is H3", reason.Message);
        Assert.False(preview.Derived.Consistent);
        await using var db = await ledger.DbAsync();
        Assert.Equal(0, await db.Reactions.CountAsync());
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task PreviewAsync_BadShape_ListsEveryProblemWithItsStateAndCreateStoresNothing(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var (studyId, h2, h, ts, tsCalc) = await LoosePiecesAsync(ledger, "member");
        var builder = ledger.Get<ReactionBuilderService>();
        var d = new ReactionDefinition("", "", [
            new StateDefinition("A", StateKind.Minimum, [new(h2), new(h)], ReactionCoordinate: [new(1, 2)]),
            new StateDefinition("A", StateKind.SaddlePoint, [new(h2)], tsCalc, [new(1, 4)]),
            new StateDefinition("C", StateKind.SaddlePoint, []),
        ]);

        var preview = await builder.PreviewAsync(studyId, d);
        var saved = await builder.CreateAsync(studyId, d, "member");

        Assert.False(saved.Saved);
        var messages = preview.Problems.Select(p => (p.State, p.Message)).ToList();
        Assert.Contains(messages, m => m.State is null && m.Message == "the reaction label is empty");
        Assert.Contains(messages, m => m.State == 0 && m.Message.EndsWith("state 'A' is a minimum; only a saddle point has forming or breaking bonds"));
        Assert.Contains(messages, m => m.State == 1 && m.Message.EndsWith("another state has the same label; give each state its own"));
        Assert.Contains(messages, m => m.State == 1 && m.Message.EndsWith("calculation 'ts' is of species 'TS', which is not in this state"));
        Assert.Contains(messages, m => m.State == 1 && m.Message.EndsWith("reaction-coordinate pair 1–4 is not two different atoms between 1 and 3"));
        Assert.Contains(messages, m => m.State == 2 && m.Message.EndsWith("state 'C' has no species"));
        Assert.Contains(messages, m => m.State == 2 && m.Message.EndsWith("saddle-point state 'C' names no calculation"));
        Assert.Null(preview.Derived);
        Assert.Equal(messages.Count, saved.Problems.Count);
        await using var db = await ledger.DbAsync();
        Assert.Equal(0, await db.Reactions.CountAsync());
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task UpdateAsync_ChangedBonds_IsANewAuditedVersionAndTheVerifiedSaddlePointAwaitsReviewAgain(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var member = await ledger.AddUserAsync("member", Roles.Member);
        var reviewer = await ledger.AddUserAsync("pi", Roles.Reviewer);
        var (studyId, h2, h, ts, tsCalc) = await LoosePiecesAsync(ledger, member);
        var builder = ledger.Get<ReactionBuilderService>();
        var reviews = ledger.Get<ReviewService>();
        var created = await builder.CreateAsync(studyId, Exchange(h2, h, ts, tsCalc), member);
        await reviews.VerifyAsync(tsCalc, reviewer, "both H–H bonds move");
        var v1 = (await builder.GetDefinitionAsync(created.ReactionId!.Value))!;

        // A description only: no evidence changed, the sign-off stands.
        var described = await builder.UpdateAsync(v1.ReactionId, v1.Definition with { Description = "collinear approach" }, v1.Version, member);
        Assert.True(described.Saved);
        Assert.Equal(v1.Version + 1, described.Version);
        Assert.Empty(await reviews.QueueAsync(studyId));

        // Other bonds: the check rests on other evidence, so the saddle point goes back to the queue.
        var rebonded = await builder.UpdateAsync(v1.ReactionId, Exchange(h2, h, ts, tsCalc, new AtomPair(1, 2)), described.Version, member);
        Assert.True(rebonded.Saved, string.Join("\n", rebonded.Problems.Select(p => p.Message)));
        Assert.Equal(v1.Version + 2, rebonded.Version);
        Assert.Contains(await reviews.QueueAsync(studyId), q => q.CalculationId == tsCalc && q.PreviouslyReviewed);
        var row = Assert.Single((await ledger.Get<LedgerQueryService>().GetLedgerRowsAsync(studyId)).Rows);
        Assert.Equal(ReviewState.Reopened, row.ReviewStatus); // waiting again, and the ledger says it was decided before (docs/ledger.md, "Review states")
        var v3 = (await builder.GetDefinitionAsync(v1.ReactionId))!;
        Assert.Equal([new AtomPair(1, 2)], v3.Definition.States[1].Pairs);
        var history = await ledger.Get<AuditService>().GetEventsAsync(nameof(Reaction), v1.ReactionId.ToString());
        var edits = history.Where(e => e.Action == "reaction.edited").ToList();
        Assert.Equal(2, edits.Count);
        Assert.Contains("{\"a\":2,\"b\":3}", edits[0].Before); // newest first: the bond 2–3 was there before the last edit, not after
        Assert.DoesNotContain("{\"a\":2,\"b\":3}", edits[0].After);
        Assert.Equal(edits[1].After, edits[0].Before);
        await using var db = await ledger.DbAsync();
        Assert.Equal(ReviewOutcome.Reopened, (await db.Reviews.Where(r => r.CalculationId == tsCalc).OrderByDescending(r => r.Id).FirstAsync()).Outcome);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task UpdateAsync_StaleVersion_IsRefusedAndNothingChanges(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var (studyId, h2, h, ts, tsCalc) = await LoosePiecesAsync(ledger, "member");
        var builder = ledger.Get<ReactionBuilderService>();
        var created = await builder.CreateAsync(studyId, Exchange(h2, h, ts, tsCalc), "member");
        var seen = (await builder.GetDefinitionAsync(created.ReactionId!.Value))!;

        var first = await builder.UpdateAsync(seen.ReactionId, seen.Definition with { Label = "H exchange (alice)" }, seen.Version, "alice");
        var second = await builder.UpdateAsync(seen.ReactionId, seen.Definition with { Label = "H exchange (bob)" }, seen.Version, "bob");

        Assert.True(first.Saved);
        Assert.False(second.Saved);
        Assert.Contains("was saved by someone else after you opened it", second.Conflict);
        Assert.Equal("H exchange (alice)", (await builder.GetDefinitionAsync(seen.ReactionId))!.Definition.Label);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task RetireAndRestore_ABuiltReaction_LeavesAndReturnsToTheLedgerAndQueue(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var (studyId, h2, h, ts, tsCalc) = await LoosePiecesAsync(ledger, "member");
        var builder = ledger.Get<ReactionBuilderService>();
        var records = ledger.Get<RecordService>();
        var created = await builder.CreateAsync(studyId, Exchange(h2, h, ts, tsCalc), "member");
        var id = created.ReactionId!.Value;

        Assert.True((await records.RetireAsync(RecordKind.Reaction, id, created.Version, "member", "built twice")).Saved);
        Assert.Empty((await ledger.Get<LedgerQueryService>().GetLedgerRowsAsync(studyId)).Rows);
        Assert.Empty(await ledger.Get<ReviewService>().QueueAsync(studyId));
        var edit = await builder.UpdateAsync(id, Exchange(h2, h, ts, tsCalc), created.Version + 1, "member");
        Assert.Contains("is retired; restore it before editing it", Assert.Single(edit.Problems).Message);
        // While it is retired its label is free for a new reaction.
        Assert.True((await builder.PreviewAsync(studyId, Exchange(h2, h, ts, tsCalc))).CanSave);

        Assert.True((await records.RestoreAsync(RecordKind.Reaction, id, created.Version + 1, "member")).Saved);
        Assert.Single((await ledger.Get<LedgerQueryService>().GetLedgerRowsAsync(studyId)).Rows);
        Assert.Single(await ledger.Get<ReviewService>().QueueAsync(studyId));
        // A retired species cannot be put into a reaction.
        var hv = (await records.GetVersionAsync(RecordKind.Species, h))!.Value;
        Assert.True((await records.RetireAsync(RecordKind.Species, h, hv, "member", "")).Saved);
        var refused = await builder.PreviewAsync(studyId, Exchange(h2, h, ts, tsCalc) with { Label = "again" });
        Assert.Contains(refused.Problems, p => p.State == 0 && p.Message.EndsWith("species 'H' is retired; restore it or choose another"));
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task CreateAsync_ScanAttachedToTheSaddleState_BecomesItsSpeciesScanAndTheCheckUsesIt(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var (studyId, h2, h, ts, tsCalc) = await LoosePiecesAsync(ledger, "member");
        // A scan along H1–H2 stored under a species of its own (as a loose CSV upload would be): invented points with a maximum at 0.93 Å.
        var scanDraft = new UploadDraft { PrimaryFile = "h3-scan.csv" };
        scanDraft.Files["h3-scan.csv"] = "r,E\n"u8.ToArray();
        scanDraft.Species.Add(new DraftSpecies("h3-scan", 0, 2));
        double[] r = [0.80, 0.85, 0.90, 0.93, 0.96, 1.00, 1.05];
        scanDraft.Scans.Add(new DraftScan("h3-scan", "h3-scan", H3System.Level, new ScanCoordinate(ScanCoordinateKind.Distance, [0, 1]),
            [.. r.Select(x => new ScanPoint(x, H3System.ETs - 0.02 * (x - 0.93) * (x - 0.93)))], "h3-scan.csv"));
        var stored = await ledger.Get<UploadService>().StoreDraftAsync(scanDraft, new UploadChoices { StudyId = studyId }, "member");
        var scanId = stored.ScanIds.Single();
        var builder = ledger.Get<ReactionBuilderService>();
        var d = Exchange(h2, h, ts, tsCalc);
        d = d with { States = [d.States[0], d.States[1] with { ScanIds = [scanId] }, d.States[2]] };

        var preview = await builder.PreviewAsync(studyId, d);
        var saved = await builder.CreateAsync(studyId, d, "member");

        Assert.Equal(scanId, Assert.Single(preview.Saddles).ScanId);
        Assert.True(saved.Saved, string.Join("\n", saved.Problems.Select(p => p.Message)));
        var w = (await ledger.Get<WorkspaceQueryService>().GetWorkspaceAsync(studyId))!;
        Assert.Equal("TS", Assert.Single(w.Scans).SpeciesLabel);
        var detail = (await ledger.Get<ReactionQueryService>().GetReactionAsync(saved.ReactionId!.Value))!;
        Assert.Equal(scanId, Assert.Single(detail.SaddleChecks).Evidence!.Scan!.ScanId);
        Assert.Equal([scanId], (await builder.GetDefinitionAsync(saved.ReactionId.Value))!.Definition.States[1].Scans);
    }
}
