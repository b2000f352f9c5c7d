using System.Net;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Uploads;
using BarrierLedger.Web.Tests.Endpoints;

namespace BarrierLedger.Web.Tests.Security;

/// <summary>
/// Issue 19, finding 7: uploads are read a bounded number at a time (reading a large file holds hundreds of MiB), and one that
/// finds no turn is answered "busy, try again" (503 with Retry-After) with nothing read or stored, instead of piling up in memory.
/// </summary>
public sealed class UploadConcurrencyTests
{
    [Fact]
    public async Task UploadWhileTheOnlyReadingTurnIsTaken_Is503BusyWithRetryAfter_StoresNothing_AndGoesThroughOnceFree()
    {
        await using var host = new ApiTestHost(new Dictionary<string, string?>
        {
            ["BarrierLedger:Uploads:ConcurrentReads"] = "1",
            ["BarrierLedger:Uploads:WaitSeconds"] = "0",
        });
        var user = await host.CreateUserAsync("mira", Roles.Member);
        using var client = host.Client(await host.CreateTokenAsync(user, TokenScopes.Upload));
        var before = await host.CountsAsync();

        var gate = host.Get<UploadGate>();
        using (await gate.EnterAsync()) // another upload being read
        {
            foreach (var route in new[] { "/api/v1/uploads/preview", "/api/v1/uploads" })
            {
                var busy = await client.PostAsync(route, ApiFiles.Form([("water.xyz", ApiFiles.WaterXyz())], ApiFiles.WaterChoices()));
                var problem = await ProblemAssert.IsProblemAsync(busy, HttpStatusCode.ServiceUnavailable, "uploads-busy");
                Assert.Contains("try again", problem.GetProperty("detail").GetString(), StringComparison.OrdinalIgnoreCase);
                Assert.Equal(TimeSpan.FromSeconds(30), busy.Headers.RetryAfter?.Delta);
            }
            Assert.Equal(before, await host.CountsAsync());
        }

        var preview = await client.PostAsync("/api/v1/uploads/preview", ApiFiles.Form([("water.xyz", ApiFiles.WaterXyz())], ApiFiles.WaterChoices()));
        Assert.Equal(HttpStatusCode.OK, preview.StatusCode);
        var stored = await client.PostAsync("/api/v1/uploads", ApiFiles.Form([("water.xyz", ApiFiles.WaterXyz())], ApiFiles.WaterChoices()));
        Assert.Equal(HttpStatusCode.Created, stored.StatusCode);
    }
}
