using System.IO.Compression;
using System.Net;
using System.Net.Http.Json;
using System.Text.Json;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Uploads;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Web.Tests.Endpoints;

/// <summary>Reactions built and edited over the API (the builder's service), by role and token scope, and a reaction as a bundle.</summary>
public sealed class ReactionApiTests
{
    /// <summary>Stores the exchange bundle (species H2, H, TS and the saddle point 'ts') and returns the study and the ids a definition names.</summary>
    private static async Task<(int StudyId, int H2, int H, int Ts, int TsCalc)> PiecesAsync(ApiTestHost host, HttpClient reader)
    {
        var stored = await host.Get<UploadService>().StoreAsync([new UploadFile("exchange.json", ApiFiles.ExchangeBundle())], new UploadChoices(), "someone");
        Assert.True(stored.Stored, string.Join("; ", stored.Issues));
        var w = await reader.GetFromJsonAsync<JsonElement>($"/api/v1/studies/{stored.StudyId}/workspace");
        int Species(string label) => w.GetProperty("species").EnumerateArray().Single(s => s.GetProperty("label").GetString() == label).GetProperty("id").GetInt32();
        var ts = w.GetProperty("species").EnumerateArray().Single(s => s.GetProperty("label").GetString() == "TS");
        return (stored.StudyId!.Value, Species("H2"), Species("H"), Species("TS"), ts.GetProperty("calculations")[0].GetProperty("id").GetInt32());
    }

    private static object Definition((int StudyId, int H2, int H, int Ts, int TsCalc) p, string label = "H exchange (API)", string first = "H2 + H") => new
    {
        label, description = "built by a script",
        states = new object[]
        {
            new { label = first, kind = "Minimum", terms = new[] { new { speciesId = p.H2, coefficient = 1 }, new { speciesId = p.H, coefficient = 1 } } },
            new { label = "TS", kind = "SaddlePoint", terms = new[] { new { speciesId = p.Ts, coefficient = 1 } }, saddleCalculationId = p.TsCalc,
                reactionCoordinate = new[] { new { a = 1, b = 2 }, new { a = 2, b = 3 } } },
            new { label = "H + H2", kind = "Minimum", terms = new[] { new { speciesId = p.H, coefficient = 1 }, new { speciesId = p.H2, coefficient = 1 } } },
        },
    };

    [Theory]
    [InlineData(Roles.Member)]
    [InlineData(Roles.Reviewer)]
    [InlineData(Roles.Admin)]
    public async Task UploadToken_OfEveryRole_CreatesAndEditsAReaction_DerivedLikeAnUploadedOne(string role)
    {
        await using var host = new ApiTestHost();
        var user = await host.CreateUserAsync("user-" + role.ToLowerInvariant(), role);
        using var writer = host.Client(await host.CreateTokenAsync(user, TokenScopes.Upload));
        var p = await PiecesAsync(host, writer);

        var created = await writer.PostAsJsonAsync($"/api/v1/studies/{p.StudyId}/reactions", Definition(p));
        var body = await created.Content.ReadFromJsonAsync<JsonElement>();
        Assert.True(HttpStatusCode.Created == created.StatusCode, body.ToString());
        var id = body.GetProperty("reactionId").GetInt32();
        Assert.Equal($"/api/v1/reactions/{id}", created.Headers.Location!.OriginalString);

        var reaction = await writer.GetFromJsonAsync<JsonElement>($"/api/v1/reactions/{id}");
        // ΔE‡ = E(TS) − E(H2) − E(H) = −1.655 − (−1.17) − (−0.5) = 0.015 Eh, by hand from the bundle's invented energies.
        Assert.Equal(["H2 + H", "TS", "H + H2"], reaction.GetProperty("states").EnumerateArray().Select(s => s.GetProperty("label").GetString()));
        var uploaded = await writer.GetFromJsonAsync<JsonElement>($"/api/v1/reactions/{(await host.DbAsync()).Reactions.Single(r => r.Label == "H exchange").Id}");
        Assert.Equal(uploaded.GetProperty("barrierGibbsHartree").GetDouble(), reaction.GetProperty("barrierGibbsHartree").GetDouble());
        await using (var db = await host.DbAsync())
            Assert.Equal(0.015, (await db.ReactionDerivations.SingleAsync(d => d.ReactionId == id)).BarrierElectronicHartree!.Value, 9);

        var stored = await writer.GetFromJsonAsync<JsonElement>($"/api/v1/reactions/{id}/definition");
        var version = stored.GetProperty("version").GetInt64();
        var edited = await writer.PutAsJsonAsync($"/api/v1/reactions/{id}", new { definition = Definition(p, first: "H + H2 (start)"), expectedVersion = version });
        var editBody = await edited.Content.ReadFromJsonAsync<JsonElement>();
        Assert.True(HttpStatusCode.OK == edited.StatusCode, editBody.ToString());
        Assert.NotEqual(version, editBody.GetProperty("version").GetInt64());
        Assert.Equal("H + H2 (start)", (await writer.GetFromJsonAsync<JsonElement>($"/api/v1/reactions/{id}")).GetProperty("states")[0].GetProperty("label").GetString());

        // A second edit on the old version was made without seeing the first: refused, nothing saved.
        var stale = await writer.PutAsJsonAsync($"/api/v1/reactions/{id}", new { definition = Definition(p, first: "lost"), expectedVersion = version });
        await ProblemAssert.IsProblemAsync(stale, HttpStatusCode.Conflict, "version-conflict");
        await using (var db = await host.DbAsync())
            Assert.Contains(await db.AuditEvents.Where(a => a.EntityType == "Reaction" && a.EntityId == id.ToString(System.Globalization.CultureInfo.InvariantCulture)).Select(a => a.Action).ToListAsync(), a => a == "reaction.edited");
    }

    [Fact]
    public async Task ReadToken_ReadsPreviewsAndDownloads_ButCannotCreateOrEdit()
    {
        await using var host = new ApiTestHost();
        var user = await host.CreateUserAsync("reader", Roles.Admin);
        using var reader = host.Client(await host.CreateTokenAsync(user, TokenScopes.Read));
        var p = await PiecesAsync(host, reader);
        var existing = (await host.DbAsync()).Reactions.Single().Id;

        var preview = await reader.PostAsJsonAsync($"/api/v1/studies/{p.StudyId}/reactions/preview", Definition(p));
        var previewBody = await preview.Content.ReadFromJsonAsync<JsonElement>();
        Assert.True(preview.IsSuccessStatusCode, previewBody.ToString());
        Assert.Equal(0, previewBody.GetProperty("problems").GetArrayLength());
        Assert.Equal(0.015, previewBody.GetProperty("derived").GetProperty("barrierElectronicHartree").GetDouble(), 9);

        await ProblemAssert.IsProblemAsync(await reader.PostAsJsonAsync($"/api/v1/studies/{p.StudyId}/reactions", Definition(p)), HttpStatusCode.Forbidden, "scope-insufficient");
        await ProblemAssert.IsProblemAsync(await reader.PutAsJsonAsync($"/api/v1/reactions/{existing}", new { definition = Definition(p), expectedVersion = 1 }),
            HttpStatusCode.Forbidden, "scope-insufficient");
        Assert.Equal(1, await (await host.DbAsync()).Reactions.CountAsync());

        var zip = await reader.GetAsync($"/api/v1/reactions/{existing}/bundle");
        Assert.Equal(HttpStatusCode.OK, zip.StatusCode);
        Assert.Equal("application/zip", zip.Content.Headers.ContentType!.MediaType);
        using var archive = new ZipArchive(await zip.Content.ReadAsStreamAsync());
        Assert.Contains(archive.Entries, e => e.FullName == "bundle.json");

        using var anonymous = host.Client();
        await ProblemAssert.IsProblemAsync(await anonymous.PostAsJsonAsync($"/api/v1/studies/{p.StudyId}/reactions", Definition(p)), HttpStatusCode.Unauthorized, "token-missing");
        await ProblemAssert.IsProblemAsync(await reader.GetAsync("/api/v1/reactions/9999/bundle"), HttpStatusCode.NotFound, "not-found");
    }

    [Fact]
    public async Task Create_WithProblems_Is422WithEveryProblem_AndAnUnknownStudyIs404()
    {
        await using var host = new ApiTestHost();
        var user = await host.CreateUserAsync("mira", Roles.Member);
        using var writer = host.Client(await host.CreateTokenAsync(user, TokenScopes.Upload));
        var p = await PiecesAsync(host, writer);

        // Atom 7 does not exist in the three-atom saddle point, and the last state names a species of no study.
        var bad = new
        {
            label = "broken", description = "",
            states = new object[]
            {
                new { label = "H2 + H", kind = "Minimum", terms = new[] { new { speciesId = p.H2, coefficient = 1 }, new { speciesId = p.H, coefficient = 1 } } },
                new { label = "TS", kind = "SaddlePoint", terms = new[] { new { speciesId = p.Ts, coefficient = 1 } }, saddleCalculationId = p.TsCalc,
                    reactionCoordinate = new[] { new { a = 1, b = 7 } } },
                new { label = "P", kind = "Minimum", terms = new[] { new { speciesId = 9999, coefficient = 1 } } },
            },
        };
        var response = await writer.PostAsJsonAsync($"/api/v1/studies/{p.StudyId}/reactions", bad);
        var problem = await ProblemAssert.IsProblemAsync(response, HttpStatusCode.UnprocessableEntity, "reaction-invalid");
        var messages = problem.GetProperty("problems").EnumerateArray().Select(x => x.GetProperty("message").GetString()!).ToList();
        Assert.Contains(messages, m => m.Contains("species 9999 is not in this study"));
        Assert.Contains(messages, m => m.Contains('7'));
        Assert.Equal(1, await (await host.DbAsync()).Reactions.CountAsync());

        await ProblemAssert.IsProblemAsync(await writer.PostAsJsonAsync("/api/v1/studies/9999/reactions", Definition(p)), HttpStatusCode.NotFound, "not-found");
    }

    [Fact]
    public async Task OpenApi_DescribesTheReactionOperations()
    {
        await using var host = new ApiTestHost();
        using var anonymous = host.Client();
        var doc = await anonymous.GetFromJsonAsync<JsonElement>("/api/v1/openapi.json");
        var paths = doc.GetProperty("paths");

        Assert.True(paths.GetProperty("/api/v1/studies/{studyId}/reactions").TryGetProperty("post", out var post));
        Assert.Equal("CreateReaction", post.GetProperty("operationId").GetString());
        Assert.True(paths.GetProperty("/api/v1/reactions/{reactionId}").TryGetProperty("put", out var put));
        Assert.Equal("EditReaction", put.GetProperty("operationId").GetString());
        Assert.True(paths.TryGetProperty("/api/v1/reactions/{reactionId}/bundle", out _));
        Assert.True(paths.TryGetProperty("/api/v1/studies/{studyId}/workspace", out _));
        Assert.True(paths.TryGetProperty("/api/v1/reactions/{reactionId}/definition", out _));
    }
}
