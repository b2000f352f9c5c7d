using System.Net;
using System.Xml.Linq;
using BarrierLedger.Core.Diagrams;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Uploads;
using BarrierLedger.Web.Components.Shared.Charts;

namespace BarrierLedger.Web.Tests.Endpoints;

public sealed class ExportEndpointsTests
{
    /// <summary>Input formats only (a folder's README or notes are not part of the upload).</summary>
    private static bool IsDataFile(string path) => Path.GetExtension(path).ToLowerInvariant() is ".json" or ".xyz" or ".extxyz" or ".csv" or ".zip";

    internal static string DemoFolder
    {
        get
        {
            for (var d = new DirectoryInfo(AppContext.BaseDirectory); d is not null; d = d.Parent)
                if (File.Exists(Path.Combine(d.FullName, "seed-data", "bundle.json"))) return Path.Combine(d.FullName, "seed-data");
            throw new DirectoryNotFoundException("seed-data/bundle.json not found above the test folder.");
        }
    }

    internal static async Task<(int StudyId, int ReactionId)> StoreDemoAsync(ApiTestHost host)
    {
        var root = DemoFolder;
        var files = Directory.EnumerateFiles(root, "*", SearchOption.AllDirectories).Where(IsDataFile).Order(StringComparer.Ordinal)
            .Select(p => new UploadFile(Path.GetRelativePath(root, p).Replace('\\', '/'), File.ReadAllBytes(p))).ToList();
        var outcome = await host.Get<UploadService>().StoreAsync(files, new UploadChoices(), "test");
        Assert.True(outcome.Stored, string.Join("; ", outcome.Issues));
        return (outcome.StudyId!.Value, outcome.ReactionIds[0]);
    }

    [Fact]
    public async Task Downloads_NeedASignedInUser()
    {
        await using var host = new ApiTestHost();
        using var anonymous = host.Client();
        var response = await anonymous.GetAsync("/export/download/table?study=1&format=csv");
        Assert.NotEqual(HttpStatusCode.OK, response.StatusCode);
        Assert.True(response.StatusCode is HttpStatusCode.Unauthorized or HttpStatusCode.Redirect or HttpStatusCode.Found, response.StatusCode.ToString());
    }

    [Fact]
    public async Task TableDiagramAndCoordinates_DownloadWithTheModelMarksAndCaution()
    {
        await using var host = new ApiTestHost();
        var user = await host.CreateUserAsync("ines", Roles.Member);
        using var client = host.Client(await host.CreateTokenAsync(user, TokenScopes.Read));
        var (studyId, reactionId) = await StoreDemoAsync(host);

        var csv = await client.GetAsync($"/export/download/table?study={studyId}&format=csv&columns=Reaction,Step,BarrierGibbs,ReviewStatus");
        Assert.Equal(HttpStatusCode.OK, csv.StatusCode);
        Assert.Equal("text/csv", csv.Content.Headers.ContentType!.MediaType);
        var text = await csv.Content.ReadAsStringAsync();
        Assert.Contains("Reaction,Step,ΔG‡ (kcal/mol),Review,Note,Note text", text);
        Assert.Contains("saddle point not verified by a reviewer", text);
        Assert.Contains("thermal-hazard testing", text);

        var xlsx = await client.GetAsync($"/export/download/table?study={studyId}&format=xlsx");
        Assert.Equal(HttpStatusCode.OK, xlsx.StatusCode);
        var bytes = await xlsx.Content.ReadAsByteArrayAsync();
        Assert.Equal((byte)'P', bytes[0]); // a zip container
        Assert.Equal((byte)'K', bytes[1]);

        var svg = await client.GetAsync($"/export/download/diagram/{reactionId}.svg");
        Assert.Equal(HttpStatusCode.OK, svg.StatusCode);
        Assert.Equal("image/svg+xml", svg.Content.Headers.ContentType!.MediaType);
        var doc = XDocument.Parse(await svg.Content.ReadAsStringAsync());
        Assert.Contains(doc.Descendants().Where(e => e.Name.LocalName == "text"), t => t.Value.StartsWith("Caution:", StringComparison.Ordinal));

        var png = await client.GetByteArrayAsync($"/export/download/diagram/{reactionId}.png?unit=kJ/mol&decimals=0");
        Assert.Equal([0x89, (byte)'P', (byte)'N', (byte)'G'], png.Take(4));

        var coordinates = await client.GetStringAsync($"/export/download/coordinates?study={studyId}");
        Assert.Contains("Imaginary frequencies: 1 (", coordinates);
    }

    [Fact]
    public async Task BadChoices_AreProblemsWithTheReason()
    {
        await using var host = new ApiTestHost();
        var user = await host.CreateUserAsync("ines", Roles.Member);
        using var client = host.Client(await host.CreateTokenAsync(user, TokenScopes.Read));
        var (studyId, reactionId) = await StoreDemoAsync(host);

        await ProblemAssert.IsProblemAsync(await client.GetAsync($"/export/download/table?study={studyId}&format=pdf"), HttpStatusCode.BadRequest, "bad-request");
        await ProblemAssert.IsProblemAsync(await client.GetAsync($"/export/download/table?study={studyId}&columns=Speed"), HttpStatusCode.BadRequest, "bad-request");
        await ProblemAssert.IsProblemAsync(await client.GetAsync($"/export/download/table?study={studyId}&decimals=12"), HttpStatusCode.BadRequest, "bad-request");
        await ProblemAssert.IsProblemAsync(await client.GetAsync("/export/download/table?study=9999"), HttpStatusCode.NotFound, "not-found");
        await ProblemAssert.IsProblemAsync(await client.GetAsync($"/export/download/diagram/{reactionId}.gif"), HttpStatusCode.BadRequest, "bad-request");
        await ProblemAssert.IsProblemAsync(await client.GetAsync("/export/download/diagram/9999.svg"), HttpStatusCode.NotFound, "not-found");
    }

    [Fact]
    public void ScreenChartAndExportedFigure_UseTheSameColours()
    {
        Assert.Equal(DiagramStyle.MinimumColour, EnergyDiagramTraces.MinimumColour);
        Assert.Equal(DiagramStyle.SaddleColour, EnergyDiagramTraces.SaddleColour);
        Assert.Equal(DiagramStyle.ConnectorColour, EnergyDiagramTraces.ConnectorColour);
    }
}
