using System.Net;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Uploads;
using BarrierLedger.Web.Components.Pages.Admin;
using BarrierLedger.Web.Components.Pages.Upload;
using BarrierLedger.Web.Tests.Endpoints;
using BarrierLedger.Web.Tests.Support;
using Microsoft.AspNetCore.Components.Forms;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Web.Tests.Security;

/// <summary>
/// Issue 19, finding 7: the per-user storage quota through the API and the upload page, and the admins' view of each account's
/// usage. The expected sizes are the byte lengths of the files the test itself made (counted here, independently of the store).
/// </summary>
public sealed class StorageQuotaTests
{
    private const long MiB = 1024 * 1024;

    /// <summary>The invented water file of <see cref="ApiFiles.WaterXyz"/> padded with a blank tail to <paramref name="bytes"/>.</summary>
    private static byte[] PaddedWater(double energy, long bytes)
    {
        var head = ApiFiles.WaterXyz(energy);
        var content = new byte[bytes];
        head.CopyTo(content, 0);
        content.AsSpan(head.Length, content.Length - head.Length - 1).Fill((byte)' ');
        content[^1] = (byte)'\n';
        return content;
    }

    [Fact]
    public async Task ApiUploadPastTheQuota_Is413StorageQuotaExceeded_NamingQuotaUsageAndSize_AndStoresNothing()
    {
        await using var host = new ApiTestHost(new Dictionary<string, string?> { ["BarrierLedger:Uploads:UserQuotaMiB"] = "1" });
        var user = await host.CreateUserAsync("mira", Roles.Member);
        using var client = host.Client(await host.CreateTokenAsync(user, TokenScopes.Upload));
        var first = await client.PostAsync("/api/v1/uploads", ApiFiles.Form([("a.xyz", PaddedWater(-76.41, 600 * 1024))], ApiFiles.WaterChoices("A")));
        Assert.Equal(HttpStatusCode.Created, first.StatusCode);
        var before = await host.CountsAsync();

        var refused = await client.PostAsync("/api/v1/uploads", ApiFiles.Form([("b.xyz", PaddedWater(-76.42, 500 * 1024))], ApiFiles.WaterChoices("B")));

        var problem = await ProblemAssert.IsProblemAsync(refused, HttpStatusCode.RequestEntityTooLarge, "storage-quota-exceeded");
        Assert.Equal((MiB, 600 * 1024L, 500 * 1024L),
            (problem.GetProperty("quotaBytes").GetInt64(), problem.GetProperty("usedBytes").GetInt64(), problem.GetProperty("uploadBytes").GetInt64()));
        var detail = problem.GetProperty("detail").GetString()!;
        Assert.Contains("your quota is 1 MiB, you have stored 600 KiB, and this upload would add 500 KiB", detail);
        Assert.Contains("nothing was stored", detail);
        Assert.Equal(before, await host.CountsAsync());
    }

    [Fact]
    public async Task UploadPageStorePastTheQuota_SaysQuotaUsageAndSize_AndStoresNothing()
    {
        using var l = await BunitLedger.CreateAsync();
        l.Get<UploadReadOptions>().UserQuotaMiB = 1;
        var ethylene = File.ReadAllBytes(Path.Combine(ExportEndpointsTests.DemoFolder, "structures", "ethylene.json"));
        var used = MiB - ethylene.Length / 2;
        var earlier = await l.Get<UploadService>().StoreAsync([new UploadFile("earlier.xyz", PaddedWater(-76.41, used))],
            new UploadChoices { NewStudyName = "Quota", SpeciesLabel = "H2O", Kind = CalculationKind.Minimum, LevelOfTheory = ApiFiles.Level }, l.UserId);
        Assert.True(earlier.Stored);
        var before = await CountsAsync(l);

        var cut = l.Context.Render<UploadPage>();
        cut.Find("#study").Change("Quota");
        cut.FindComponent<InputFile>().UploadFiles(InputFileContent.CreateFromBinary(ethylene, "ethylene.json"));
        cut.WaitForAssertion(() => Assert.NotEmpty(cut.FindAll("table[aria-label=Calculations]")), TimeSpan.FromSeconds(60));
        cut.Find("button.btn-primary").Click();

        cut.WaitForAssertion(() => Assert.Contains("Storage quota reached", cut.Find("[data-testid=upload-message]").TextContent), TimeSpan.FromSeconds(60));
        var message = cut.Find("[data-testid=upload-message]").TextContent;
        Assert.Contains($"your quota is 1 MiB, you have stored {StorageQuota.Format(used)}, and this upload would add {StorageQuota.Format(ethylene.Length)}", message);
        Assert.Contains("nothing was stored", message);
        Assert.Equal(before, await CountsAsync(l));
    }

    [Fact]
    public async Task AccountsPageStorageTable_ListsEachAccountsFilesAndShareOfTheQuota_AndADeletedAccountByItsId()
    {
        using var l = await BunitLedger.CreateAsync();
        l.Get<UploadReadOptions>().UserQuotaMiB = 4;
        await using (var db = await l.Get<IDbContextFactory<LedgerDbContext>>().CreateDbContextAsync())
        {
            db.Users.Add(new LedgerUser { Id = "u-mira", UserName = "mira", NormalizedUserName = "MIRA", DisplayName = "Mira" });
            await db.SaveChangesAsync();
        }
        var uploads = l.Get<UploadService>();
        UploadChoices Water(string species) => new() { NewStudyName = "Quota", SpeciesLabel = species, Kind = CalculationKind.Minimum, LevelOfTheory = ApiFiles.Level };
        Assert.True((await uploads.StoreAsync([new UploadFile("a.xyz", PaddedWater(-76.41, MiB))], Water("A"), "u-mira")).Stored);
        Assert.True((await uploads.StoreAsync([new UploadFile("b.xyz", PaddedWater(-76.42, 2048))], Water("B"), "u-gone")).Stored);

        var cut = l.Context.Render<StorageUsageTable>();

        cut.WaitForAssertion(() => Assert.Equal(2, cut.FindAll("[data-testid=storage-usage] tbody tr").Count));
        Assert.Contains("Quota: 4 MiB per account", cut.Find("[data-testid=storage-usage]").TextContent);
        var rows = cut.FindAll("[data-testid=storage-usage] tbody tr").Select(r => r.Children.Select(c => c.TextContent.Trim()).ToArray()).ToList();
        // 1 MiB of a 4 MiB quota is 25 %; 2 KiB of 4 MiB is 0.049 %, which one decimal shows as 0 %.
        Assert.Equal(["mira", "1", "1 MiB", "25 %"], rows[0]);
        Assert.Equal(["deleted account u-gone", "1", "2 KiB", "0 %"], rows[1]);
    }

    private static async Task<(int, int, int, int)> CountsAsync(BunitLedger l)
    {
        await using var db = await l.Get<IDbContextFactory<LedgerDbContext>>().CreateDbContextAsync();
        return (await db.Studies.CountAsync(), await db.Calculations.CountAsync(), await db.StoredFiles.CountAsync(), await db.Uploads.CountAsync());
    }
}
