using System.Net;
using System.Net.Http.Json;
using System.Text;
using System.Text.Json;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Web.Tests.Endpoints;

namespace BarrierLedger.Web.Tests.Security;

/// <summary>
/// Issue 19, finding 5: a cell a spreadsheet would run as a formula (starting with =, +, -, @, tab or CR) leaves every CSV
/// writer with a leading apostrophe; a cell that is a whole number stays a number (a negative barrier is still −12.5).
/// </summary>
public sealed class CsvInjectionTests
{
    private const string Formula = "=HYPERLINK(\\\"http://evil.example\\\")+cmd";

    [Fact]
    public async Task FormulaInAReactionLabel_IsNeutralised_InTheLedgerCsvAndTheTableExportCsv()
    {
        await using var host = new ApiTestHost();
        using var client = host.Client(await host.CreateTokenAsync(await host.CreateUserAsync("mira", Roles.Member), TokenScopes.Upload));
        var bundle = Encoding.UTF8.GetString(ApiFiles.ExchangeBundle()).Replace("\"label\": \"H exchange\"", $"\"label\": \"{Formula}\"");
        var stored = await client.PostAsync("/api/v1/uploads", ApiFiles.Form([("bundle.json", Encoding.UTF8.GetBytes(bundle))]));
        Assert.Equal(HttpStatusCode.Created, stored.StatusCode);
        var studyId = (await stored.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("studyId").GetInt32();

        foreach (var path in new[] { $"/api/v1/studies/{studyId}/ledger?format=csv", $"/api/v1/studies/{studyId}/exports/table?format=csv" })
        {
            var csv = await client.GetStringAsync(path);
            Assert.Contains("'=HYPERLINK(", csv);
            foreach (var line in csv.Split('\n').Where(l => !l.StartsWith('#')))
                foreach (var field in line.Split(','))
                    Assert.False(field.TrimStart('"').StartsWith('='), $"{path}: a field starts with '=': {line}");
        }
    }

    [Theory]
    [InlineData("=1+2", "'=1+2")]
    [InlineData("+cmd|' /C calc'!A0", "'+cmd|' /C calc'!A0")]
    [InlineData("-2+3+cmd", "'-2+3+cmd")]
    [InlineData("@SUM(A1:A9)", "'@SUM(A1:A9)")]
    [InlineData("\t=1", "'\t=1")]
    [InlineData("\r=1", "'\r=1")]
    [InlineData("-", "'-")]
    [InlineData("-12.5", "-12.5")]          // numbers stay numbers
    [InlineData("+4.0", "+4.0")]
    [InlineData("-1.23E-05", "-1.23E-05")]
    [InlineData("-0.5e3", "-0.5e3")]
    [InlineData("TS1 + H2O", "TS1 + H2O")]
    [InlineData("", "")]
    public void Neutralise_PrefixesFormulaStarts_AndLeavesNumbersAlone(string cell, string written) =>
        Assert.Equal(written, BarrierLedger.Ledger.Export.CsvCells.Neutralise(cell));
}
