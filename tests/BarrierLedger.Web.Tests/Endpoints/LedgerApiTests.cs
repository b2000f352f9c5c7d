using System.Net;
using System.Net.Http.Json;
using System.Text.Json;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Accounts;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Web.Tests.Endpoints;

public sealed class LedgerApiTests
{
    /// <summary>Stores the exchange bundle through the API (as field 'manifest') and returns the saddle point's calculation id.</summary>
    private static async Task<(int StudyId, int ReactionId, int SaddleId)> StoreBundleAsync(ApiTestHost host, HttpClient uploader)
    {
        var form = ApiFiles.Form([]);
        var part = new ByteArrayContent(ApiFiles.ExchangeBundle());
        form.Add(part, "manifest", "exchange.json");
        var response = await uploader.PostAsync("/api/v1/uploads", form);
        var body = await response.Content.ReadFromJsonAsync<JsonElement>();
        Assert.True(HttpStatusCode.Created == response.StatusCode, body.ToString());
        await using var db = await host.DbAsync();
        var saddle = await db.Calculations.SingleAsync(c => c.Label == "ts");
        return (body.GetProperty("studyId").GetInt32(), body.GetProperty("reactionIds")[0].GetInt32(), saddle.Id);
    }

    [Fact]
    public async Task StudiesLedgerAndReaction_ReadWithAReadToken_JsonAndCsv()
    {
        await using var host = new ApiTestHost();
        var user = await host.CreateUserAsync("mira", Roles.Member);
        using var uploader = host.Client(await host.CreateTokenAsync(user, TokenScopes.Upload));
        var (studyId, reactionId, _) = await StoreBundleAsync(host, uploader);
        using var reader = host.Client(await host.CreateTokenAsync(user, TokenScopes.Read));

        var studies = await reader.GetFromJsonAsync<JsonElement>("/api/v1/studies");
        Assert.Contains(studies.EnumerateArray(), s => s.GetProperty("id").GetInt32() == studyId && s.GetProperty("reactionCount").GetInt32() == 1);

        var ledger = await reader.GetFromJsonAsync<JsonElement>($"/api/v1/studies/{studyId}/ledger");
        var row = ledger.GetProperty("rows").EnumerateArray().Single();
        Assert.Equal(reactionId, row.GetProperty("reactionId").GetInt32());
        // ΔE‡ = E(TS) − E(H2) − E(H) = −1.655 − (−1.17) − (−0.5) = 0.015 Eh, by hand from the invented energies.
        Assert.Equal(0.015, row.GetProperty("barrierElectronicHartree").GetDouble(), 9);
        Assert.Equal(Energy.FromHartree(0.015).KcalPerMol, row.GetProperty("barrierElectronicKcalPerMol").GetDouble(), 9);
        // The rate carries its 95 % interval from the energy model's σ, here the new-model default of 2 kcal/mol: bounds k e^{∓zσ/RT},
        // e^{zσ/RT} = 747.011 at 298.15 K (z = 1.959964, RT = 0.592485 kcal/mol; Python's statistics.NormalDist and math.exp).
        Assert.Contains("σ = 2.0 kcal/mol per barrier", row.GetProperty("uncertainty").GetString());
        var k = row.GetProperty("rateConstantPerSecond").GetDouble();
        Assert.Equal(k / 747.011, row.GetProperty("rateConstantLower95").GetDouble(), k / 747.011 * 1e-5);
        Assert.Equal(k * 747.011, row.GetProperty("rateConstantUpper95").GetDouble(), k * 747.011 * 1e-5);

        var csv = await reader.GetStringAsync($"/api/v1/studies/{studyId}/ledger?format=csv");
        var lines = csv.Split("\r\n", StringSplitOptions.RemoveEmptyEntries);
        Assert.StartsWith("reaction_id,label,barrier_gibbs_kcal_mol", lines[0]);
        Assert.EndsWith("rate_constant_lower_95,rate_constant_upper_95,half_life_lower_95_s,half_life_upper_95_s,uncertainty", lines[0]);
        Assert.Equal(2, lines.Length);
        Assert.StartsWith($"{reactionId},H exchange,", lines[1]);

        var reaction = await reader.GetFromJsonAsync<JsonElement>($"/api/v1/reactions/{reactionId}");
        Assert.Equal(["H2 + H", "TS", "H + H2"], reaction.GetProperty("states").EnumerateArray().Select(s => s.GetProperty("label").GetString()));
        Assert.Equal(1, reaction.GetProperty("saddleChecks").GetArrayLength());

        await ProblemAssert.IsProblemAsync(await reader.GetAsync("/api/v1/reactions/9999"), HttpStatusCode.NotFound, "not-found");
        await ProblemAssert.IsProblemAsync(await reader.GetAsync("/api/v1/studies/9999/ledger"), HttpStatusCode.NotFound, "not-found");
    }

    [Fact]
    public async Task MembersToken_CannotVerify_ReviewersUploadToken_Can()
    {
        await using var host = new ApiTestHost();
        var member = await host.CreateUserAsync("mira", Roles.Member);
        var reviewer = await host.CreateUserAsync("pi", Roles.Member, Roles.Reviewer);
        using var memberClient = host.Client(await host.CreateTokenAsync(member, TokenScopes.Upload));
        var (_, _, saddleId) = await StoreBundleAsync(host, memberClient);

        var denied = await memberClient.PostAsJsonAsync($"/api/v1/reviews/{saddleId}/verify", new { comment = "looks fine to me" });
        await ProblemAssert.IsProblemAsync(denied, HttpStatusCode.Forbidden, "role-required");

        using var reviewerReadOnly = host.Client(await host.CreateTokenAsync(reviewer, TokenScopes.Read));
        await ProblemAssert.IsProblemAsync(await reviewerReadOnly.PostAsJsonAsync($"/api/v1/reviews/{saddleId}/verify", new { comment = "" }),
            HttpStatusCode.Forbidden, "scope-insufficient");

        await using (var db = await host.DbAsync()) Assert.Equal(0, await db.Reviews.CountAsync());

        using var reviewerClient = host.Client(await host.CreateTokenAsync(reviewer, TokenScopes.Upload));
        var verified = await reviewerClient.PostAsJsonAsync($"/api/v1/reviews/{saddleId}/verify", new { comment = "one clean reaction mode" });
        Assert.Equal(HttpStatusCode.OK, verified.StatusCode);
        await using (var db = await host.DbAsync())
        {
            var review = await db.Reviews.SingleAsync();
            Assert.Equal(reviewer.Id, review.ReviewerUserId);
            Assert.Equal(saddleId, review.CalculationId);
        }
    }

    [Fact]
    public async Task Exports_OverTheApi_AreTheSameBytesAsTheExportService()
    {
        await using var host = new ApiTestHost();
        var user = await host.CreateUserAsync("mira", Roles.Member);
        using var uploader = host.Client(await host.CreateTokenAsync(user, TokenScopes.Upload));
        var (studyId, reactionId, _) = await StoreBundleAsync(host, uploader);
        using var reader = host.Client(await host.CreateTokenAsync(user, TokenScopes.Read));
        var exports = host.Get<BarrierLedger.Ledger.Export.ExportService>();

        var csv = await reader.GetAsync($"/api/v1/studies/{studyId}/exports/table?format=csv");
        Assert.Equal(HttpStatusCode.OK, csv.StatusCode);
        var expected = await exports.TableAsync(studyId, null, BarrierLedger.Ledger.Export.TableFormat.Csv, BarrierLedger.Ledger.Export.TableOptions.Default);
        Assert.Equal(expected.Content, await csv.Content.ReadAsByteArrayAsync());
        Assert.Equal(expected.FileName, csv.Content.Headers.ContentDisposition?.FileName?.Trim('"'));

        var svg = await reader.GetAsync($"/api/v1/reactions/{reactionId}/exports/diagram?format=svg&quantity=E");
        Assert.Equal(HttpStatusCode.OK, svg.StatusCode);
        Assert.Equal("image/svg+xml", svg.Content.Headers.ContentType?.MediaType);
        Assert.Contains("<svg", await svg.Content.ReadAsStringAsync());

        var coordinates = await reader.GetAsync($"/api/v1/studies/{studyId}/exports/coordinates");
        Assert.Equal(HttpStatusCode.OK, coordinates.StatusCode);
        Assert.Equal((await exports.SupportingInfoTextAsync(studyId)).Content, await coordinates.Content.ReadAsByteArrayAsync());

        await ProblemAssert.IsProblemAsync(await reader.GetAsync("/api/v1/studies/9999/exports/table"), HttpStatusCode.NotFound, "not-found");
        await ProblemAssert.IsProblemAsync(await reader.GetAsync($"/api/v1/studies/{studyId}/exports/table?format=pdf"), HttpStatusCode.BadRequest, "bad-request");
    }
}
