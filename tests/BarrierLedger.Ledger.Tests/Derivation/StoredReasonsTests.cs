using System.Text.RegularExpressions;
using BarrierLedger.Core.Checks;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Tests.Derivation;

/// <summary>
/// Reasons are one record (Core's <see cref="CheckReason"/>) in the checks, the derivation and the store. Rows written before
/// that, when the ledger kept its own copies with the severity as a string, must still read, and new rows keep the severity
/// as the same word, so a backup restored into either version reads.
/// </summary>
public sealed class StoredReasonsTests
{
    // Byte for byte what earlier versions wrote: a frequency check's reasons (code, severity, message) and a derivation's
    // consistency reasons, which also carried "blocking".
    private const string OldCheckReasons =
        """[{"code":"saddle.no-modes","severity":"Attention","message":"Only frequencies are stored, no normal modes."},{"code":"saddle.note","severity":"Info","message":"A note."}]""";
    private const string OldConsistencyReasons =
        """[{"code":"ledger.missing-energy","severity":"Failure","message":"State TS has no energy.","blocking":true},{"code":"ledger.conformer-left-out","severity":"Info","message":"A conformer was left out.","blocking":false}]""";

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task ReadReaction_RowsStoredWithStringSeverities_ReadAsTypedSeverities(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var outcome = await ledger.Get<UploadService>().StoreDraftAsync(H3System.Draft(), new UploadChoices(), "member-1");
        Assert.True(outcome.Stored, string.Join("\n", outcome.Errors));
        int reactionId, studyId;
        await using (var db = await ledger.DbAsync())
        {
            var check = await db.FrequencyChecks.SingleAsync();
            check.ReasonsJson = OldCheckReasons;
            var d = await db.ReactionDerivations.SingleAsync();
            d.ConsistencyJson = OldConsistencyReasons;
            reactionId = d.ReactionId;
            studyId = await db.Reactions.Where(r => r.Id == reactionId).Select(r => r.StudyId).SingleAsync();
            await db.SaveChangesAsync();
        }

        var detail = await ledger.Get<ReactionQueryService>().GetReactionAsync(reactionId);
        Assert.NotNull(detail);
        var reasons = Assert.Single(detail.SaddleChecks).Reasons;
        Assert.Equal([("saddle.no-modes", CheckSeverity.Attention), ("saddle.note", CheckSeverity.Info)], reasons.Select(r => (r.Code, r.Severity)));
        Assert.Equal([(CheckSeverity.Failure, true), (CheckSeverity.Info, false)], detail.ConsistencyReasons.Select(r => (r.Severity, r.Blocking)));
        Assert.Equal("State TS has no energy.", detail.ConsistencyReasons[0].Message);

        var row = Assert.Single((await ledger.Get<LedgerQueryService>().GetLedgerRowsAsync(studyId)).Rows);
        Assert.Equal([CheckSeverity.Failure, CheckSeverity.Info], row.ConsistencyReasons.Select(r => r.Severity));
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task StoreDraft_NewReasons_KeepTheSeverityAsAWord(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        Assert.True((await ledger.Get<UploadService>().StoreDraftAsync(H3System.Draft(), new UploadChoices(), "member-1")).Stored);
        await using var db = await ledger.DbAsync();
        var json = (await db.FrequencyChecks.SingleAsync()).ReasonsJson;
        Assert.Matches(new Regex("\"severity\":\"(Info|Attention|Failure)\""), json);
        Assert.DoesNotMatch(new Regex("\"severity\":[0-9]"), json);
    }
}
