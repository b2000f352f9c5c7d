using System.Net;
using System.Net.Http.Json;
using System.Text.Json;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Web.Tests.Endpoints;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Web.Tests.Security;

/// <summary>
/// Issue 19, finding 2: an Idempotency-Key belongs to the user who sent it and to the content it was sent with. Another user's
/// key is no key of yours; the same key with other content is a 409, never a silent "already stored".
/// </summary>
public sealed class UploadIdempotencyTests
{
    private static async Task<HttpResponseMessage> PushAsync(HttpClient client, string key, byte[] xyz, string species = "H2O")
    {
        using var request = new HttpRequestMessage(HttpMethod.Post, "/api/v1/uploads") { Content = ApiFiles.Form([("water.xyz", xyz)], ApiFiles.WaterChoices(species)) };
        request.Headers.Add("Idempotency-Key", key);
        return await client.SendAsync(request);
    }

    [Fact]
    public async Task SameKey_FromAnotherUser_StoresTheirFiles_AndNeverAnswersWithTheFirstUsersUpload()
    {
        await using var host = new ApiTestHost();
        using var mira = host.Client(await host.CreateTokenAsync(await host.CreateUserAsync("mira", Roles.Member), TokenScopes.Upload));
        using var theo = host.Client(await host.CreateTokenAsync(await host.CreateUserAsync("theo", Roles.Member), TokenScopes.Upload));

        var first = await PushAsync(mira, "nightly-1", ApiFiles.WaterXyz(-76.4189));
        Assert.Equal(HttpStatusCode.Created, first.StatusCode);
        var miraUpload = (await first.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("uploadId").GetInt32();

        var second = await PushAsync(theo, "nightly-1", ApiFiles.WaterXyz(-76.4011), species: "H2O theo");
        Assert.Equal(HttpStatusCode.Created, second.StatusCode);
        var body = await second.Content.ReadFromJsonAsync<JsonElement>();
        Assert.False(body.GetProperty("alreadyStored").GetBoolean());
        Assert.NotEqual(miraUpload, body.GetProperty("uploadId").GetInt32());
        await using var db = await host.DbAsync();
        Assert.Equal(2, await db.Calculations.CountAsync());
    }

    [Fact]
    public async Task SameKey_SameUser_OtherContent_Is409_AndStoresNothing()
    {
        await using var host = new ApiTestHost();
        using var mira = host.Client(await host.CreateTokenAsync(await host.CreateUserAsync("mira", Roles.Member), TokenScopes.Upload));
        Assert.Equal(HttpStatusCode.Created, (await PushAsync(mira, "nightly-1", ApiFiles.WaterXyz(-76.4189))).StatusCode);
        var counts = await host.CountsAsync();

        var clash = await PushAsync(mira, "nightly-1", ApiFiles.WaterXyz(-76.4011));

        var problem = await ProblemAssert.IsProblemAsync(clash, HttpStatusCode.Conflict, "idempotency-key-reused");
        Assert.Contains("nightly-1", problem.GetProperty("detail").GetString());
        Assert.Equal(counts, await host.CountsAsync());
    }

    [Fact]
    public async Task SameKey_SameUser_SameContent_IsStillTheFirstUpload()
    {
        await using var host = new ApiTestHost();
        using var mira = host.Client(await host.CreateTokenAsync(await host.CreateUserAsync("mira", Roles.Member), TokenScopes.Upload));
        var first = await (await PushAsync(mira, "nightly-1", ApiFiles.WaterXyz())).Content.ReadFromJsonAsync<JsonElement>();

        var again = await PushAsync(mira, "nightly-1", ApiFiles.WaterXyz());

        Assert.Equal(HttpStatusCode.OK, again.StatusCode);
        var body = await again.Content.ReadFromJsonAsync<JsonElement>();
        Assert.True(body.GetProperty("alreadyStored").GetBoolean());
        Assert.Equal(first.GetProperty("uploadId").GetInt32(), body.GetProperty("uploadId").GetInt32());
    }
}
