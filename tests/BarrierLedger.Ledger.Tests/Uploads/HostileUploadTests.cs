using System.Text;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Tests.Uploads;

/// <summary>
/// Issue 19, finding 9, through the upload service: a coordinate of 1e300 Å without frequencies (once stored), a species label
/// or study name with a line break or a bidirectional override (once stored and later breaking the coordinates export) and a
/// bundle with invalid UTF-8 (once a server error) are refused with a located message, and the store stays empty.
/// </summary>
public sealed class HostileUploadTests
{
    private static UploadChoices Choices(string species = "TS", string study = "S") =>
        new() { NewStudyName = study, SpeciesLabel = species, Kind = CalculationKind.SaddlePoint, LevelOfTheory = H3System.Level };

    private static async Task AssertNothingStoredAsync(TempLedger ledger)
    {
        await using var db = await ledger.DbAsync();
        Assert.Equal(0, await db.Studies.CountAsync());
        Assert.Equal(0, await db.Calculations.CountAsync());
        Assert.Equal(0, await db.StoredFiles.CountAsync());
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task XyzWithA1e300Coordinate_IsRefusedOnItsLine_AndNothingIsStored(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var file = new UploadFile("far.xyz", Encoding.UTF8.GetBytes("3\nenergy=-1.6\nH 0 0 0\nH 0.9 0 0\nH 1e300 0 0\n"));

        var outcome = await ledger.Get<UploadService>().StoreAsync([file], Choices(), "member-1");

        Assert.False(outcome.Stored);
        Assert.Contains(outcome.Errors, e => e.FileName == "far.xyz" && e.Line == 5);
        await AssertNothingStoredAsync(ledger);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task LabelsWithALineBreakOrABidiOverride_AreRefused_AndNothingIsStored(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var file = new UploadFile("ts.xyz", Encoding.UTF8.GetBytes(H3System.TsXyz()));
        var uploads = ledger.Get<UploadService>();

        var brokenLine = await uploads.StoreAsync([file], Choices(species: "TS\n3 H 0 0 0"), "member-1");
        var overridden = await uploads.StoreAsync([file], Choices(study: "Study \u202Eevil"), "member-1");

        Assert.Contains(brokenLine.Errors, e => e.Message.Contains("species label contains a line break"));
        Assert.Contains(overridden.Errors, e => e.Message.Contains("study name contains the bidirectional control U+202E"));
        await AssertNothingStoredAsync(ledger);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task BundleWithInvalidUtf8_IsRefusedWithItsLine_AndNothingIsStored(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var bytes = Encoding.UTF8.GetBytes("{\n  \"format\": \"barrierledger-bundle\",\n  \"study\": { \"name\": \"S\u00e9\" }\n}\n");
        bytes[Array.IndexOf(bytes, (byte)0xC3) + 1] = 0x28;

        var outcome = await ledger.Get<UploadService>().StoreAsync([new UploadFile("bundle.json", bytes)], new UploadChoices(), "member-1");

        Assert.False(outcome.Stored);
        Assert.Contains(outcome.Errors, e => e.Line == 3 && e.Message.Contains("not UTF-8"));
        await AssertNothingStoredAsync(ledger);
    }
}
