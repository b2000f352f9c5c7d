using System.Net;
using System.Net.Http.Json;
using System.Security.Cryptography;
using System.Text.Json;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Uploads;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Web.Tests.Endpoints;

public sealed class UploadApiTests
{
    [Fact]
    public async Task Upload_ThroughTheApi_LandsExactlyAsThroughUploadServiceDirectly()
    {
        await using var host = new ApiTestHost();
        var user = await host.CreateUserAsync("mira", Roles.Member);
        using var client = host.Client(await host.CreateTokenAsync(user, TokenScopes.Upload));
        var water = ApiFiles.WaterXyz();
        var fields = ApiFiles.WaterChoices();
        fields["study"] = "via API";

        var response = await client.PostAsync("/api/v1/uploads", ApiFiles.Form([("water.xyz", water)], fields));
        Assert.Equal(HttpStatusCode.Created, response.StatusCode);
        var body = await response.Content.ReadFromJsonAsync<JsonElement>();
        Assert.False(body.GetProperty("alreadyStored").GetBoolean());
        Assert.Equal(Convert.ToHexStringLower(SHA256.HashData(water)), body.GetProperty("files")[0].GetProperty("sha256").GetString());

        var direct = await host.Get<UploadService>().StoreAsync([new UploadFile("water.xyz", water)], new UploadChoices
        {
            NewStudyName = "direct", SpeciesLabel = "H2O", Kind = CalculationKind.Minimum, LevelOfTheory = ApiFiles.Level, Charge = 0, Multiplicity = 1,
        }, user.Id);
        Assert.True(direct.Stored, string.Join("\n", direct.Errors));

        await using var db = await host.DbAsync();
        var apiStudyId = body.GetProperty("studyId").GetInt32();
        Assert.Equal("via API", (await db.Studies.SingleAsync(s => s.Id == apiStudyId)).Name);
        var calcs = await db.Calculations.Include(c => c.Species).OrderBy(c => c.Id).ToListAsync();
        Assert.Equal(2, calcs.Count);
        var (viaApi, viaService) = (calcs[0], calcs[1]);
        Assert.Equal(body.GetProperty("calculationIds")[0].GetInt32(), viaApi.Id);
        Assert.Equal(apiStudyId, viaApi.Species!.StudyId);
        // Everything but identity, study and time is the same record.
        Assert.Equal(
            (viaService.Label, viaService.Kind, viaService.LevelOfTheory, viaService.EnergyHartree, viaService.AtomCount, viaService.UploadedByUserId,
             viaService.SourceSha256, viaService.StoredFileId, viaService.Species!.Label, viaService.Species.Formula, viaService.Species.Charge, viaService.Species.Multiplicity),
            (viaApi.Label, viaApi.Kind, viaApi.LevelOfTheory, viaApi.EnergyHartree, viaApi.AtomCount, viaApi.UploadedByUserId,
             viaApi.SourceSha256, viaApi.StoredFileId, viaApi.Species.Label, viaApi.Species.Formula, viaApi.Species.Charge, viaApi.Species.Multiplicity));
        Assert.Equal(viaService.PositionsAngstrom, viaApi.PositionsAngstrom);
        var file = await db.StoredFiles.SingleAsync();
        Assert.Equal(water, file.Content);
        Assert.Equal(2, await db.Uploads.CountAsync());
        Assert.Equal(2, await db.AuditEvents.CountAsync(a => a.Action == "upload.stored" && a.UserId == user.Id));
    }

    [Fact]
    public async Task Upload_WithErrors_Is422ProblemListingEveryError_AndStoresNothing()
    {
        await using var host = new ApiTestHost();
        var user = await host.CreateUserAsync("mira", Roles.Member);
        using var client = host.Client(await host.CreateTokenAsync(user, TokenScopes.Upload));
        var broken = "3\nenergy=-76.4\nO 0 0 0\nH 0 0.75 -0.47\n"u8.ToArray(); // one atom line short

        var response = await client.PostAsync("/api/v1/uploads",
            ApiFiles.Form([("good.xyz", ApiFiles.WaterXyz()), ("broken.xyz", broken)], ApiFiles.WaterChoices()));

        var problem = await ProblemAssert.IsProblemAsync(response, HttpStatusCode.UnprocessableEntity, "upload-rejected");
        var errors = problem.GetProperty("errors").EnumerateArray().ToList();
        Assert.Contains(errors, e => e.GetProperty("file").GetString() == "broken.xyz");
        Assert.Equal((0, 0, 0, 0), await host.CountsAsync());
    }

    [Fact]
    public async Task SameFilePushedTwice_WithItsKey_IsStoredOnce()
    {
        await using var host = new ApiTestHost();
        var user = await host.CreateUserAsync("mira", Roles.Member);
        using var client = host.Client(await host.CreateTokenAsync(user, TokenScopes.Upload));
        var water = ApiFiles.WaterXyz();
        var key = "push-" + Convert.ToHexStringLower(SHA256.HashData(water));

        async Task<HttpResponseMessage> PushAsync()
        {
            using var request = new HttpRequestMessage(HttpMethod.Post, "/api/v1/uploads") { Content = ApiFiles.Form([("water.xyz", water)], ApiFiles.WaterChoices()) };
            request.Headers.Add("Idempotency-Key", key);
            return await client.SendAsync(request);
        }

        var first = await PushAsync();
        Assert.Equal(HttpStatusCode.Created, first.StatusCode);
        var counts = await host.CountsAsync();
        var second = await PushAsync();

        Assert.Equal(HttpStatusCode.OK, second.StatusCode);
        var body = await second.Content.ReadFromJsonAsync<JsonElement>();
        Assert.True(body.GetProperty("alreadyStored").GetBoolean());
        Assert.Equal(0, body.GetProperty("calculationIds").GetArrayLength());
        Assert.Equal((1, 1, 1, 1), counts);
        Assert.Equal(counts, await host.CountsAsync());
    }

    [Fact]
    public async Task SameFileTwice_WithoutKey_StoresNoSecondCalculationAndSaysSo()
    {
        await using var host = new ApiTestHost();
        var user = await host.CreateUserAsync("mira", Roles.Member);
        using var client = host.Client(await host.CreateTokenAsync(user, TokenScopes.Upload));

        Assert.Equal(HttpStatusCode.Created, (await client.PostAsync("/api/v1/uploads", ApiFiles.Form([("water.xyz", ApiFiles.WaterXyz())], ApiFiles.WaterChoices()))).StatusCode);
        var second = await client.PostAsync("/api/v1/uploads", ApiFiles.Form([("water.xyz", ApiFiles.WaterXyz())], ApiFiles.WaterChoices()));

        var body = await second.Content.ReadFromJsonAsync<JsonElement>();
        Assert.Equal(0, body.GetProperty("calculationIds").GetArrayLength());
        Assert.Contains(body.GetProperty("duplicates").EnumerateArray(), d => d.GetString()!.Contains("already stored"));
        var counts = await host.CountsAsync();
        Assert.Equal(1, counts.Calculations);
        Assert.Equal(1, counts.Files);
    }

    [Fact]
    public async Task OversizeUpload_Is413Problem_AndNothingIsStored()
    {
        const int limit = 64 * 1024;
        await using var host = new ApiTestHost(new Dictionary<string, string?> { ["BarrierLedger:Api:MaxUploadBytes"] = limit.ToString() });
        var user = await host.CreateUserAsync("mira", Roles.Member);
        using var client = host.Client(await host.CreateTokenAsync(user, TokenScopes.Upload));
        // A valid file padded with comment-free trailing blank lines beyond the limit.
        var big = ApiFiles.WaterXyz().Concat(Enumerable.Repeat((byte)'\n', 2 * limit)).ToArray();

        // The server answers 413 before it has read the body and may close the connection while the client still sends
        // (a broken pipe on a loaded machine): the client then sees no answer, and what matters is that nothing was stored.
        if (await AnswerUnlessClosedAsync(() => client.PostAsync("/api/v1/uploads", ApiFiles.Form([("big.xyz", big)], ApiFiles.WaterChoices()))) is { } declared)
        {
            var problem = await ProblemAssert.IsProblemAsync(declared, HttpStatusCode.RequestEntityTooLarge, "upload-too-large");
            Assert.Equal(limit, problem.GetProperty("limitBytes").GetInt64());
        }
        Assert.Equal((0, 0, 0, 0), await host.CountsAsync());

        // The same body sent chunked (no Content-Length): the limit is enforced while reading.
        var form = ApiFiles.Form([("big.xyz", big)], ApiFiles.WaterChoices());
        var chunked = new StreamContent(await form.ReadAsStreamAsync());
        chunked.Headers.ContentType = form.Headers.ContentType;
        using var request = new HttpRequestMessage(HttpMethod.Post, "/api/v1/uploads") { Content = chunked };
        request.Headers.TransferEncodingChunked = true;
        if (await AnswerUnlessClosedAsync(() => client.SendAsync(request)) is { } chunkedAnswer)
            await ProblemAssert.IsProblemAsync(chunkedAnswer, HttpStatusCode.RequestEntityTooLarge, "upload-too-large");

        Assert.Equal((0, 0, 0, 0), await host.CountsAsync());
        // Under the limit the same file goes through.
        var small = await client.PostAsync("/api/v1/uploads", ApiFiles.Form([("small.xyz", ApiFiles.WaterXyz())], ApiFiles.WaterChoices()));
        Assert.Equal(HttpStatusCode.Created, small.StatusCode);
    }

    /// <summary>The server's answer, or null when it closed the connection while the request body was still being sent.</summary>
    private static async Task<HttpResponseMessage?> AnswerUnlessClosedAsync(Func<Task<HttpResponseMessage>> send)
    {
        try { return await send(); }
        catch (HttpRequestException e) when (e.InnerException is IOException) { return null; }
    }
}
