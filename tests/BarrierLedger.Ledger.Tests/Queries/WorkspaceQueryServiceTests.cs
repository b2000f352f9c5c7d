using System.Security.Cryptography;
using System.Text;
using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;

namespace BarrierLedger.Ledger.Tests.Queries;

/// <summary>The study workspace and species page read what was stored, and say which results no reaction uses yet.</summary>
public sealed class WorkspaceQueryServiceTests
{
    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task GetWorkspaceAsync_LooseResultBesideAReaction_IsCountedAsNotInAnyReaction(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var member = await ledger.AddUserAsync("new member", Roles.Member);
        var uploads = ledger.Get<UploadService>();
        var stored = await uploads.StoreDraftAsync(H3System.Draft(), new UploadChoices(), member);
        Assert.True(stored.Stored, string.Join("\n", stored.Errors));
        var studyId = stored.StudyId!.Value;
        var loose = Encoding.UTF8.GetBytes(H3System.TsXyz(-1.6549));
        var single = await uploads.StoreAsync([new UploadFile("ts-second-guess.xyz", loose)],
            new UploadChoices { StudyId = studyId, SpeciesLabel = "TS guess", Kind = CalculationKind.SaddlePoint, LevelOfTheory = H3System.Level }, member);
        Assert.True(single.Stored, string.Join("\n", single.Errors));

        var w = (await ledger.Get<WorkspaceQueryService>().GetWorkspaceAsync(studyId))!;

        Assert.Equal(1, w.Unassigned);
        var guess = Assert.Single(w.Species, s => s.Label == "TS guess");
        Assert.False(guess.InReaction);
        var c = Assert.Single(guess.Calculations);
        Assert.Equal(CalculationKind.SaddlePoint, c.Kind);
        Assert.Equal(-1.6549, c.EnergyHartree);
        Assert.Equal("new member", c.UploadedByName);
        Assert.Equal("ts-second-guess.xyz", c.FileName);
        Assert.Equal(Convert.ToHexStringLower(SHA256.HashData(loose)), c.SourceSha256);
        Assert.Null(c.CheckVerdict); // checked only once a reaction uses it

        // The saddle point the reaction uses carries its imaginary mode and its check.
        var ts = Assert.Single(Assert.Single(w.Species, s => s.Label == "TS").Calculations);
        Assert.True(ts.InReaction);
        Assert.Equal([-1500.0], ts.ImaginaryCm1);
        Assert.Equal(Verdict.Passed, ts.CheckVerdict);
        Assert.True(ts.HasModes);

        var r = Assert.Single(w.Reactions);
        Assert.Equal("H2 + H → TS → H + H2", r.Pathway);
        Assert.NotNull(r.BarrierGibbsHartree);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task GetSpeciesAsync_SaddlePoint_GivesItsStructureReactionsAndOriginalFile(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var stored = await ledger.Get<UploadService>().StoreDraftAsync(H3System.Draft(), new UploadChoices(), "member");
        var query = ledger.Get<WorkspaceQueryService>();
        var w = (await query.GetWorkspaceAsync(stored.StudyId!.Value))!;
        var tsId = w.Species.Single(s => s.Label == "TS").Id;

        var d = (await query.GetSpeciesAsync(tsId))!;

        Assert.Equal(3, d.Structure!.AtomCount);
        Assert.Equal(2, d.Structure.Multiplicity);
        Assert.Equal("H3", d.Species.Formula);
        Assert.Equal("H exchange", Assert.Single(d.Reactions).Label);
        var fileId = Assert.Single(d.Species.Calculations).StoredFileId!.Value;
        var file = (await query.GetStoredFileAsync(fileId))!;
        Assert.Equal("h3.json", file.FileName);
        Assert.Equal(file.Sha256, Convert.ToHexStringLower(SHA256.HashData(file.Content)));
        Assert.Null(await query.GetSpeciesAsync(tsId + 1000));
        Assert.Null(await query.GetWorkspaceAsync(stored.StudyId.Value + 1000));
    }
}
