using System.Text;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Tests.Uploads;

/// <summary>
/// Issue 19, finding 7: a per-user storage quota. An upload that would take its uploader past the quota is refused whole, and the
/// refusal names the quota, the user's usage and the upload's size. The expected sizes are the byte lengths of the files the test
/// itself wrote (counted here, independently of the store).
/// </summary>
public sealed class StorageQuotaTests
{
    private const long MiB = 1024 * 1024;

    /// <summary>Water (geometry close to the textbook 0.957 Å / 104.5°, from memory; invented energy), padded with a blank tail to <paramref name="bytes"/>.</summary>
    private static UploadFile PaddedWater(string name, string energy, long bytes)
    {
        var text = $"3\nenergy={energy}\nO 0.000000 0.000000 0.117300\nH 0.000000 0.757200 -0.469200\nH 0.000000 -0.757200 -0.469200\n";
        var head = Encoding.UTF8.GetBytes(text);
        var content = new byte[bytes];
        head.CopyTo(content, 0);
        content.AsSpan(head.Length, content.Length - head.Length - 1).Fill((byte)' ');
        content[^1] = (byte)'\n';
        return new UploadFile(name, content);
    }

    private static UploadChoices Water(string species) =>
        new() { NewStudyName = "Quota study", SpeciesLabel = species, Kind = CalculationKind.Minimum, LevelOfTheory = H3System.Level };

    private static async Task<(int, int, int, int, int, int)> CountsAsync(TempLedger ledger)
    {
        await using var db = await ledger.DbAsync();
        return (await db.Studies.CountAsync(), await db.Species.CountAsync(), await db.Calculations.CountAsync(),
            await db.StoredFiles.CountAsync(), await db.Uploads.CountAsync(), await db.AuditEvents.CountAsync());
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task UploadPastTheQuota_IsRefusedWhole_NamingQuotaUsageAndSize_AndTheStoreIsUnchanged(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        ledger.Get<UploadReadOptions>().UserQuotaMiB = 1;
        var uploads = ledger.Get<UploadService>();
        var first = PaddedWater("first.xyz", "-76.4189", 700 * 1024);
        var second = PaddedWater("second.xyz", "-76.4200", 400 * 1024);

        Assert.True((await uploads.StoreAsync([first], Water("H2O"), "mira")).Stored);
        var before = await CountsAsync(ledger);

        var refused = await uploads.StoreAsync([second], Water("H2O-b"), "mira");

        Assert.False(refused.Stored);
        var q = Assert.IsType<QuotaRefusal>(refused.QuotaRefusal);
        Assert.Equal((1 * MiB, 700 * 1024L, 400 * 1024L), (q.QuotaBytes, q.UsedBytes, q.UploadBytes));
        Assert.Equal("Storage quota reached: your quota is 1 MiB, you have stored 700 KiB, and this upload would add 400 KiB of new files " +
                     "(76 KiB too much); nothing was stored. An admin can raise BarrierLedger:Uploads:UserQuotaMiB.", q.Message);
        Assert.Equal(before, await CountsAsync(ledger));

        // The quota is each user's own: another user stores the same file.
        Assert.True((await uploads.StoreAsync([second], Water("H2O-b"), "tomas")).Stored);
        // A file already in the ledger is stored once and costs nothing: the first user may now name it under another species.
        var again = await uploads.StoreAsync([second], Water("H2O-c"), "mira");
        Assert.True(again.Stored, string.Join("; ", again.Errors.Select(e => e.Message)) + again.QuotaRefusal?.Message);
        await using var db = await ledger.DbAsync();
        Assert.Equal(2, await db.StoredFiles.CountAsync());
        Assert.Equal(700 * 1024L, await StorageQuota.UsedBytesAsync(db, "mira", default));
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task UploadThatFillsTheQuotaExactly_IsStored_AndNoQuotaMeansNoLimit(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var options = ledger.Get<UploadReadOptions>();
        options.UserQuotaMiB = 1;
        var uploads = ledger.Get<UploadService>();

        Assert.True((await uploads.StoreAsync([PaddedWater("a.xyz", "-76.41", 1 * MiB)], Water("A"), "mira")).Stored);
        Assert.NotNull((await uploads.StoreAsync([PaddedWater("b.xyz", "-76.42", 1024)], Water("B"), "mira")).QuotaRefusal);

        options.UserQuotaMiB = 0;
        Assert.Null(ledger.Get<StorageQuota>().QuotaBytes);
        Assert.True((await uploads.StoreAsync([PaddedWater("b.xyz", "-76.42", 1024)], Water("B"), "mira")).Stored);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task UsagePerUser_CountsEachAccountsFiles_MostFirst_AndNamesADeletedAccountByItsId(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var mira = await ledger.AddUserAsync("mira", "Member");
        var tomas = await ledger.AddUserAsync("tomas", "Member");
        var uploads = ledger.Get<UploadService>();
        Assert.True((await uploads.StoreAsync([PaddedWater("a.xyz", "-76.41", 3000), PaddedWater("b.xyz", "-76.42", 5000)], Water("A"), mira)).Stored);
        Assert.True((await uploads.StoreAsync([PaddedWater("c.xyz", "-76.43", 20000)], Water("C"), tomas)).Stored);
        Assert.True((await uploads.StoreAsync([PaddedWater("d.xyz", "-76.44", 200)], Water("D"), "gone-user")).Stored);

        var usage = await ledger.Get<StorageQuota>().PerUserAsync();

        Assert.Equal(
            [new StorageUsage(tomas, "tomas", 1, 20000), new StorageUsage(mira, "mira", 2, 8000), new StorageUsage("gone-user", null, 1, 200)],
            usage);
    }

    [Fact]
    public void Sizes_AreWrittenInBinaryUnits()
    {
        // 1 KiB = 1024 bytes, 1 MiB = 1024 KiB, 1 GiB = 1024 MiB (IEC 80000-13 binary prefixes).
        Assert.Equal(["512 bytes", "1.5 KiB", "700 KiB", "1 MiB", "2.5 MiB", "2 GiB", "1.25 GiB"],
            new[] { 512L, 1536, 700 * 1024, MiB, 5 * MiB / 2, 2048 * MiB, 1280 * MiB }.Select(StorageQuota.Format));
    }
}
