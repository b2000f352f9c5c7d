using System.Net;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Auditing;
using BarrierLedger.Web.Endpoints;
using BarrierLedger.Web.Tests.Endpoints;

namespace BarrierLedger.Web.Tests.Security;

/// <summary>
/// Issue 19: a backup holds the whole ledger, so every admin download of one is audited (who, when, the archive's size) and listed
/// with the other administration entries on the Accounts page. The expected size is the length of the body the test received.
/// </summary>
public sealed class BackupAuditTests
{
    [Fact]
    public async Task BackupDownload_IsAuditedWithWhoWhenAndSize_AndListedOnTheAccountsPage()
    {
        await using var host = new ApiTestHost();
        var admin = await CookieSession.CreateUserAsync(host, "ada", Roles.Admin);
        await CookieSession.CreateUserAsync(host, "mira", Roles.Member);
        using var session = await CookieSession.SignInAsync(host, "ada");
        using var member = await CookieSession.SignInAsync(host, "mira");
        var audit = host.Get<AuditService>();

        // A member is refused the backup, and a refusal is no download.
        Assert.NotEqual(HttpStatusCode.OK, (await member.Http.GetAsync(ExportEndpoints.Prefix + "/backup")).StatusCode);
        Assert.Empty(await audit.GetEventsAsync(["Backup"], 10));

        var from = host.Clock.GetUtcNow().AddSeconds(-1);
        var response = await session.Http.GetAsync(ExportEndpoints.Prefix + "/backup");
        var to = host.Clock.GetUtcNow().AddSeconds(1);
        Assert.Equal(HttpStatusCode.OK, response.StatusCode);
        var body = await response.Content.ReadAsByteArrayAsync();
        var name = response.Content.Headers.ContentDisposition!.FileNameStar ?? response.Content.Headers.ContentDisposition.FileName!.Trim('"');

        var entry = Assert.Single(await audit.GetEventsAsync(["Backup"], 10));
        Assert.Equal((admin.Id, ExportEndpoints.BackupDownloaded, name), (entry.UserId, entry.Action, entry.EntityId));
        Assert.InRange(entry.At, from, to);
        Assert.Contains($"{body.Length} bytes", entry.Summary);

        var page = await session.Http.GetStringAsync("/admin/users");
        Assert.Contains("Administration log", page);
        Assert.Contains(ExportEndpoints.BackupDownloaded, page);
        Assert.Contains($"Backup {name} downloaded: {body.Length} bytes", page);
    }
}
