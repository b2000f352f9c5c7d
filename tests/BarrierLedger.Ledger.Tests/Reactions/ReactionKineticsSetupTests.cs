using BarrierLedger.Core.Kinetics;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Reactions;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Tests.Reactions;

/// <summary>What a reaction's definition says about its kinetics (issue 22): stored with the definition, refused with its reason, kept through an edit, carried by the bundle.</summary>
public sealed class ReactionKineticsSetupTests
{
    private static async Task<(int StudyId, ReactionDefinition Definition)> PiecesAsync(TempLedger ledger, string user)
    {
        var draft = H3System.Draft("Kinetics setup");
        draft.Reactions.Clear();
        var stored = await ledger.Get<UploadService>().StoreDraftAsync(draft, new UploadChoices(), user);
        Assert.True(stored.Stored, string.Join("\n", stored.Errors));
        var w = (await ledger.Get<WorkspaceQueryService>().GetWorkspaceAsync(stored.StudyId!.Value))!;
        int Id(string label) => w.Species.Single(s => s.Label == label).Id;
        var ts = w.Species.Single(s => s.Label == "TS").Calculations.Single().Id;
        return (stored.StudyId.Value, new ReactionDefinition("H exchange", "",
        [
            new StateDefinition("H2 + H", StateKind.Minimum, [new(Id("H2")), new(Id("H"))]),
            new StateDefinition("TS", StateKind.SaddlePoint, [new(Id("TS"))], ts, [new(1, 2), new(2, 3)]),
            new StateDefinition("H + H2", StateKind.Minimum, [new(Id("H")), new(Id("H2"))]),
        ], new KineticsSetup(TemperatureKelvin: 353.15, TimeHours: 12)));
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Create_StoresTheSetup_TheReactionPageReadsIt_AndAnEditKeepsIt(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var member = await ledger.AddUserAsync("member", Roles.Member);
        var (studyId, definition) = await PiecesAsync(ledger, member);
        var builder = ledger.Get<ReactionBuilderService>();

        var saved = await builder.CreateAsync(studyId, definition, member);
        Assert.True(saved.Saved, string.Join("\n", saved.Problems.Select(p => p.Message)));

        var detail = (await ledger.Get<ReactionQueryService>().GetReactionAsync(saved.ReactionId!.Value))!;
        Assert.Equal((353.15, 12.0), (detail.Kinetics!.TemperatureKelvin, detail.Kinetics.TimeHours));
        var stored = (await builder.GetDefinitionAsync(saved.ReactionId.Value))!;
        Assert.Equal(353.15, stored.Definition.Kinetics!.TemperatureKelvin);

        var edited = await builder.UpdateAsync(saved.ReactionId.Value, stored.Definition with { Description = "edited" }, stored.Version, member);
        Assert.True(edited.Saved, string.Join("\n", edited.Problems.Select(p => p.Message)));
        Assert.Equal(12.0, (await ledger.Get<ReactionQueryService>().GetReactionAsync(saved.ReactionId.Value))!.Kinetics!.TimeHours);
        await using var db = await ledger.DbAsync();
        var audit = await db.AuditEvents.SingleAsync(a => a.Action == "reaction.edited");
        Assert.Contains("\"temperatureKelvin\":353.15", audit.After);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Create_ChannelsNamingAMinimum_IsRefusedWithTheReason_AndStoresNothing(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var member = await ledger.AddUserAsync("member", Roles.Member);
        var (studyId, definition) = await PiecesAsync(ledger, member);

        var saved = await ledger.Get<ReactionBuilderService>().CreateAsync(studyId,
            definition with { Kinetics = new KineticsSetup(["TS", "H2 + H"]) }, member);

        Assert.False(saved.Saved);
        Assert.Contains(saved.Problems, p => p.Message == "kinetics, competing channels names 'H2 + H', which is a minimum; a competing channel is a saddle point ('TS')");
        await using var db = await ledger.DbAsync();
        Assert.Equal(0, await db.Reactions.CountAsync());
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task BundleExport_CarriesTheSetup_IntoAnotherLedger(StoreProvider store)
    {
        await using var source = await TempLedger.CreateAsync(store);
        var member = await source.AddUserAsync("member", Roles.Member);
        var (studyId, definition) = await PiecesAsync(source, member);
        var saved = await source.Get<ReactionBuilderService>().CreateAsync(studyId, definition, member);
        var bundle = (await source.Get<ReactionBundleService>().ExportAsync(saved.ReactionId!.Value))!;

        await using var target = await TempLedger.CreateAsync(store);
        var other = await target.AddUserAsync("elsewhere", Roles.Member);
        var uploaded = await target.Get<UploadService>().StoreAsync([new UploadFile(bundle.FileName, bundle.Zip)], new UploadChoices(), other);
        Assert.True(uploaded.Stored, string.Join("\n", uploaded.Issues));
        var copy = (await target.Get<ReactionQueryService>().GetReactionAsync(Assert.Single(uploaded.ReactionIds)))!;
        Assert.Equal((353.15, 12.0), (copy.Kinetics!.TemperatureKelvin, copy.Kinetics.TimeHours));
    }
}
