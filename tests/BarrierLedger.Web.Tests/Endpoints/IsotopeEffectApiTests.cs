using System.Net;
using System.Net.Http.Json;
using System.Text.Json;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Export;
using BarrierLedger.Ledger.IsotopeEffects;

namespace BarrierLedger.Web.Tests.Endpoints;

public sealed class IsotopeEffectApiTests
{
    // The exchange bundle's saddle point carries normal modes but no Cartesian Hessian: the API lists the set, offers no number and says
    // why; the CSV table carries the model header, the row's reason and the export caution.
    [Fact]
    public async Task IsotopeEffects_ReadWithAReadToken_JsonAndCsv_OfferNothingWithoutAHessian()
    {
        await using var host = new ApiTestHost();
        var user = await host.CreateUserAsync("mira", Roles.Member);
        using var uploader = host.Client(await host.CreateTokenAsync(user, TokenScopes.Upload));
        var form = ApiFiles.Form([]);
        form.Add(new ByteArrayContent(ApiFiles.ExchangeBundle()), "manifest", "exchange.json");
        var stored = await (await uploader.PostAsync("/api/v1/uploads", form)).Content.ReadFromJsonAsync<JsonElement>();
        var reactionId = stored.GetProperty("reactionIds")[0].GetInt32();
        var saved = await host.Get<IsotopeEffectService>().CreateAsync(reactionId, 1, "D in the middle", "2=D", null, user.Id);
        Assert.True(saved.Saved, string.Join("; ", saved.Errors));

        using var reader = host.Client(await host.CreateTokenAsync(user, TokenScopes.Read));
        var json = await reader.GetFromJsonAsync<JsonElement>($"/api/v1/reactions/{reactionId}/isotope-effects");
        var effect = json.GetProperty("effects").EnumerateArray().Single();
        Assert.Equal("D in the middle", effect.GetProperty("name").GetString());
        Assert.Equal(JsonValueKind.Null, effect.GetProperty("kie").ValueKind);
        Assert.Contains("no Cartesian Hessian", effect.GetProperty("unavailable").GetString());
        Assert.Equal(ExportCaution.Text, json.GetProperty("caution").GetString());

        var csv = await reader.GetStringAsync($"/api/v1/reactions/{reactionId}/isotope-effects?format=csv");
        var lines = csv.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.StartsWith("# Kinetic isotope effects of H exchange", lines[0]);
        Assert.StartsWith("# Energy model: ", lines[1]);
        Assert.Contains(lines, l => l == "# " + ExportCaution.Text);
        Assert.Contains(lines, l => l.StartsWith("D in the middle,", StringComparison.Ordinal) && l.Contains("No KIE:", StringComparison.Ordinal));

        await ProblemAssert.IsProblemAsync(await reader.GetAsync($"/api/v1/reactions/{reactionId}/isotope-effects?format=pdf"), HttpStatusCode.BadRequest, "bad-request");
        await ProblemAssert.IsProblemAsync(await reader.GetAsync("/api/v1/reactions/9999/isotope-effects"), HttpStatusCode.NotFound, "not-found");
        using var anonymous = host.Client();
        Assert.Equal(HttpStatusCode.Unauthorized, (await anonymous.GetAsync($"/api/v1/reactions/{reactionId}/isotope-effects")).StatusCode);
    }
}
