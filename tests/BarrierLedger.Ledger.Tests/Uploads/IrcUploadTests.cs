using System.Globalization;
using System.Text;
using BarrierLedger.Core.Formats;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Tests.Uploads;

/// <summary>IRC paths and endpoint pairs attached to a saddle point: read, checked against it, stored all or nothing with their files.</summary>
public sealed class IrcUploadTests
{
    private const string Member = "member-1";
    private const string Study = "Hydrogen exchange (test)";

    /// <summary>H–H–H with the middle atom at <paramref name="x"/> Å (outer atoms at 0 and 1.86 Å, as in the saddle point).</summary>
    private static string Frame(double x, double? energy, string first = "H") =>
        $"3\n{(energy is { } e ? "energy=" + e.ToString("R", CultureInfo.InvariantCulture) : "end")}\n{first} 0 0 0\nH {x.ToString("R", CultureInfo.InvariantCulture)} 0 0\nH 1.86 0 0\n";

    /// <summary>Five frames, the middle atom moving 0.73 → 1.13 Å in steps of 0.1 Å through the saddle point's 0.93 Å.</summary>
    private static byte[] PathXyz(string first = "H") => Encoding.UTF8.GetBytes(string.Concat(
        new[] { 0.73, 0.83, 0.93, 1.03, 1.13 }.Select((x, k) => Frame(x, H3System.ETs - 0.004 * Math.Abs(k - 2), k == 3 ? first : "H"))));

    private static async Task<TempLedger> WithStoredPathwayAsync(StoreProvider store)
    {
        var ledger = await TempLedger.CreateAsync(store);
        Assert.True((await ledger.Get<UploadService>().StoreDraftAsync(H3System.Draft(Study), new UploadChoices(), Member)).Stored);
        return ledger;
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task PathFile_ForAStoredSaddlePoint_IsStoredWithItsFramesPathLengthsAndFile(StoreProvider store)
    {
        await using var ledger = await WithStoredPathwayAsync(store);
        var uploads = ledger.Get<UploadService>();
        var files = new[] { new UploadFile("ts-irc.xyz", PathXyz()) };
        var choices = new UploadChoices { NewStudyName = Study, IrcOf = "ts" };

        var preview = await uploads.PreviewAsync(files, choices);
        Assert.True(preview.CanStore, string.Join("\n", preview.Errors));
        var p = Assert.Single(preview.Ircs);
        Assert.Equal(("ts", "path", 5, false), (p.SaddlePoint, p.Form, p.FrameCount, p.Duplicate));

        var outcome = await uploads.StoreAsync(files, choices, Member);
        Assert.True(outcome.Stored, string.Join("\n", outcome.Errors));
        await using var db = await ledger.DbAsync();
        var irc = await db.Ircs.Include(i => i.Frames).Include(i => i.SaddleCalculation).SingleAsync();
        Assert.Equal(outcome.IrcIds.Single(), irc.Id);
        Assert.Equal(("ts", IrcForm.Path, 3, 2), (irc.SaddleCalculation!.Label, irc.Form, irc.AtomCount, irc.SaddleFrame!.Value));
        Assert.Equal(H3System.Level, irc.LevelOfTheory); // the saddle point's, as none was given
        var frames = irc.Frames.OrderBy(f => f.Index).ToList();
        Assert.All(frames, f => Assert.Equal(IrcFrameRole.Path, f.Role));
        Assert.Equal(H3System.ETs, frames[2].EnergyHartree);
        // By hand: the middle atom moves by d = 0.1 Å per frame; after superposition (centroids matched, the line stays put) the
        // three atoms move by −d/3, 2d/3, −d/3, so each step is d·√(1/9 + 4/9 + 1/9) = d·√6/3 Å.
        var step = 0.1 * Math.Sqrt(6) / 3;
        for (var k = 0; k < 5; k++) Assert.Equal((k - 2) * step, frames[k].PathLengthAngstrom!.Value, 9);
        var file = await db.StoredFiles.SingleAsync(f => f.Id == irc.StoredFileId);
        Assert.Equal(files[0].Content, file.Content);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task EndpointPair_IsToldApartByItsFileNames_AndKeepsBothFiles(StoreProvider store)
    {
        await using var ledger = await WithStoredPathwayAsync(store);
        var fwd = new UploadFile("ts-forward.xyz", Encoding.UTF8.GetBytes(Frame(1.12, null)));
        var bwd = new UploadFile("ts-backward.xyz", Encoding.UTF8.GetBytes(Frame(0.74, -1.67)));
        var outcome = await ledger.Get<UploadService>().StoreAsync([bwd, fwd], new UploadChoices { NewStudyName = Study, IrcOf = "ts" }, Member);

        Assert.True(outcome.Stored, string.Join("\n", outcome.Errors));
        await using var db = await ledger.DbAsync();
        var irc = await db.Ircs.Include(i => i.Frames).SingleAsync();
        Assert.Equal(IrcForm.Endpoints, irc.Form);
        var frames = irc.Frames.OrderBy(f => f.Index).ToList();
        Assert.Equal([IrcFrameRole.Forward, IrcFrameRole.Backward], frames.Select(f => f.Role));
        Assert.Equal([null, -1.67], frames.Select(f => f.EnergyHartree));
        Assert.All(frames, f => Assert.Null(f.PathLengthAngstrom));
        Assert.Equal(fwd.Content, (await db.StoredFiles.SingleAsync(f => f.Id == irc.StoredFileId)).Content);
        Assert.Equal(bwd.Content, (await db.StoredFiles.SingleAsync(f => f.Id == irc.BackwardStoredFileId)).Content);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task IrcOfOtherAtoms_OrAnUnknownSaddlePoint_StoresNothing_AndSaysWhere(StoreProvider store)
    {
        await using var ledger = await WithStoredPathwayAsync(store);
        var uploads = ledger.Get<UploadService>();
        var wrongAtoms = await uploads.StoreAsync([new UploadFile("ts-irc.xyz", PathXyz(first: "Li"))], new UploadChoices { NewStudyName = Study, IrcOf = "ts" }, Member);
        Assert.False(wrongAtoms.Stored);
        // Frame 4 starts at line 16 (5 lines per frame); its first atom is Li where frame 1 has H.
        Assert.Contains(wrongAtoms.Errors, e => e.FileName == "ts-irc.xyz" && e.Line == 16 && e.Message.Contains("frame 4 has Li as atom 1, not H as in frame 1"));

        var unknown = await uploads.StoreAsync([new UploadFile("ts-irc.xyz", PathXyz())], new UploadChoices { NewStudyName = Study, IrcOf = "ts9" }, Member);
        Assert.False(unknown.Stored);
        Assert.Contains(unknown.Errors, e => e.Message.Contains("saddle point 'ts9', which is neither a saddle-point calculation in this upload nor one stored in study"));

        var unnamedPair = await uploads.StoreAsync([new UploadFile("a.xyz", Encoding.UTF8.GetBytes(Frame(1.1, null))), new UploadFile("b.xyz", Encoding.UTF8.GetBytes(Frame(0.8, null)))],
            new UploadChoices { NewStudyName = Study, IrcOf = "ts" }, Member);
        Assert.Contains(unnamedPair.Errors, e => e.Message.Contains("\"forward\"") && e.Message.Contains("\"backward\""));

        await using var db = await ledger.DbAsync();
        Assert.Equal(0, await db.Ircs.CountAsync());
        Assert.Equal(1, await db.Uploads.CountAsync()); // only the pathway's
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task IrcInTheSameDraftAsItsSaddlePoint_IsStoredWithIt_AndTwiceIsADuplicate(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        UploadDraft Draft()
        {
            var d = H3System.Draft(Study);
            var path = IrcFiles.Path(XyzReader.ReadText(Encoding.UTF8.GetString(PathXyz()), "irc/ts.xyz").GetValueOrThrow(), "irc/ts.xyz").GetValueOrThrow();
            d.Files["irc/ts.xyz"] = PathXyz();
            d.Ircs.Add(new DraftIrc("TS IRC", "ts", "OTHER/level", path, "irc/ts.xyz", null));
            return d;
        }
        var uploads = ledger.Get<UploadService>();
        var first = await uploads.StoreDraftAsync(Draft(), new UploadChoices(), Member);
        Assert.True(first.Stored, string.Join("\n", first.Errors));
        var second = await uploads.StoreDraftAsync(Draft(), new UploadChoices(), Member);
        Assert.True(second.Stored);
        Assert.Empty(second.IrcIds);
        Assert.Contains(second.Duplicates, d => d.Contains("IRC 'TS IRC'") && d.Contains("already stored"));
        await using var db = await ledger.DbAsync();
        var irc = await db.Ircs.SingleAsync();
        Assert.Equal("OTHER/level", irc.LevelOfTheory);
        Assert.Equal(5, await db.IrcFrames.CountAsync(f => f.IrcId == irc.Id));
    }
}

/// <summary>The connection check joins the saddle point's check (issue 20): verdict, evidence and a reopened review.</summary>
public sealed class IrcCheckTests
{
    private const string Member = "member-1";
    private const string Study = "Hydrogen exchange (test)";

    private static string Frame(double x1, double x2, double x3, double energy) => string.Create(CultureInfo.InvariantCulture,
        $"3\nenergy={energy:R}\nH {x1:R} 0 0\nH {x2:R} 0 0\nH {x3:R} 0 0\n");

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task IrcThatFallsApartOnOneSide_FailsTheCheck_NamesIt_AndReopensTheReview(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var uploads = ledger.Get<UploadService>();
        Assert.True((await uploads.StoreDraftAsync(H3System.Draft(Study), new UploadChoices(), Member)).Stored);
        await using (var db = await ledger.DbAsync())
        {
            var check = await db.FrequencyChecks.SingleAsync();
            Assert.Equal(Core.Checks.Verdict.Passed, check.Verdict);
            // Without an IRC the mode's bond-change prediction is made: displaced along the antisymmetric stretch, H1–H2 one way and
            // H2–H3 the other, which are the bonds of the states before and after (H2 + H, H + H2).
            var evidence = BarrierLedger.Ledger.Derivation.DerivedJson.Read<BarrierLedger.Ledger.Derivation.CheckEvidence>(check.EvidenceJson);
            Assert.Null(evidence.Connection);
            Assert.Equal("Agrees", evidence.ModePrediction!.Outcome);
        }
        var reviews = ledger.Get<Ledger.Reviews.ReviewService>();
        var reviewer = await ledger.AddUserAsync("pi", Accounts.Roles.Reviewer);
        var calcId = (await reviews.QueueAsync()).Single().CalculationId;
        await reviews.VerifyAsync(calcId, reviewer, "clean mode");

        // One end is H2 + H; the other three separate atoms (2.5 Å apart), which is no state: it connects one side only.
        var irc = Frame(0, 0.74, 3.0, -1.67) + Frame(0, 0.93, 1.86, H3System.ETs) + Frame(0, 2.5, 5.0, -1.50);
        var outcome = await uploads.StoreAsync([new UploadFile("ts-irc.xyz", Encoding.UTF8.GetBytes(irc))], new UploadChoices { NewStudyName = Study, IrcOf = "ts" }, Member);
        Assert.True(outcome.Stored, string.Join("\n", outcome.Errors));

        await using var db2 = await ledger.DbAsync();
        var after = await db2.FrequencyChecks.SingleAsync();
        Assert.Equal(Core.Checks.Verdict.Failed, after.Verdict);
        Assert.Contains(Core.Checks.ConnectionCheckCodes.OneSide, after.ReasonsJson);
        var ev = BarrierLedger.Ledger.Derivation.DerivedJson.Read<BarrierLedger.Ledger.Derivation.CheckEvidence>(after.EvidenceJson);
        Assert.Equal(("OneSide", "path"), (ev.Connection!.Connection, ev.Connection.Form));
        Assert.Equal(2, ev.Connection.Ends.Count);
        Assert.Contains(ev.Connection.Ends, e => e.Reached is null);
        Assert.Equal(ReviewOutcome.Reopened, (await db2.Reviews.OrderByDescending(r => r.Id).FirstAsync(r => r.CalculationId == calcId)).Outcome);
        var item = Assert.Single(await reviews.QueueAsync());
        Assert.Equal("OneSide", item.Evidence!.Connection!.Connection);
    }
}
