using System.Net;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Accounts;

namespace BarrierLedger.Web.Tests.Endpoints;

/// <summary>
/// The two HTTP export surfaces (the Export screen's downloads and the API) read the unit with Core's one parser
/// (<see cref="BarrierUnits"/>): the same texts are accepted, the same are refused with the same sentence, and an accepted
/// unit gives the same bytes from both. The command line's side is ExportCommandTests.ExportTable_Unit_*.
/// </summary>
public sealed class ExportUnitsTests
{
    [Fact]
    public async Task TableAndDiagram_BothSurfaces_AcceptAndRefuseTheSameUnits()
    {
        await using var host = new ApiTestHost();
        var user = await host.CreateUserAsync("ines", Roles.Member);
        using var client = host.Client(await host.CreateTokenAsync(user, TokenScopes.Read));
        var (studyId, reactionId) = await ExportEndpointsTests.StoreDemoAsync(host);

        foreach (var text in new[] { "cm-1", "Wavenumber", "furlongs" })
        {
            Assert.False(BarrierUnits.TryParse(text, out _, out var why));
            foreach (var url in new[]
            {
                $"/export/download/table?study={studyId}&format=csv&unit={Uri.EscapeDataString(text)}",
                $"/api/v1/studies/{studyId}/exports/table?format=csv&unit={Uri.EscapeDataString(text)}",
                $"/export/download/diagram/{reactionId}.svg?unit={Uri.EscapeDataString(text)}",
                $"/api/v1/reactions/{reactionId}/exports/diagram?format=svg&unit={Uri.EscapeDataString(text)}",
            })
            {
                var problem = await ProblemAssert.IsProblemAsync(await client.GetAsync(url), HttpStatusCode.BadRequest, "bad-request");
                Assert.Equal($"unit: {why}", problem.GetProperty("detail").GetString());
            }
        }

        foreach (var text in new[] { "eV", "kJ/mol", "ElectronVolt", "hartree" })
        {
            var download = await client.GetAsync($"/export/download/table?study={studyId}&format=csv&unit={Uri.EscapeDataString(text)}");
            var api = await client.GetAsync($"/api/v1/studies/{studyId}/exports/table?format=csv&unit={Uri.EscapeDataString(text)}");
            Assert.Equal(HttpStatusCode.OK, download.StatusCode);
            Assert.Equal(HttpStatusCode.OK, api.StatusCode);
            var bytes = await download.Content.ReadAsByteArrayAsync();
            Assert.Equal(bytes, await api.Content.ReadAsByteArrayAsync());
            Assert.True(BarrierUnits.TryParse(text, out var unit, out _));
            Assert.Contains($"ΔG‡ ({Energy.Symbol(unit)})", System.Text.Encoding.UTF8.GetString(bytes));
        }
    }
}
