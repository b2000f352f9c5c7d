using System.Text.Json;
using System.Text.Json.Nodes;
using BarrierLedger.Core.Formats;
using static BarrierLedger.Core.Tests.Formats.BundleReaderTests;

namespace BarrierLedger.Core.Tests.Formats;

/// <summary>A species' <c>conformers</c> list in a bundle (issue 21): read onto the calculations, errors at their JSON path, written back.</summary>
public sealed class BundleConformerTests
{
    private static JsonNode WithConformers(string conformersJson)
    {
        var node = JsonNode.Parse(SampleText())!;
        node["species"]![2]!["conformers"] = JsonNode.Parse(conformersJson);
        return node;
    }

    private const string TwoConformers = """[ { "label": "a", "calculations": ["TS1-opt", "TS1-sp"] }, { "label": "b", "calculations": ["TS1-b"] } ]""";

    private static JsonNode WithSecondSaddle()
    {
        var node = WithConformers(TwoConformers);
        var copy = JsonNode.Parse(node["calculations"]![2]!.ToJsonString())!;
        copy["label"] = "TS1-b";
        node["calculations"]!.AsArray().Add(copy);
        return node;
    }

    [Fact]
    public void Read_SpeciesWithConformers_SetsEachListedCalculationsConformer()
    {
        var r = ReadJson(WithSecondSaddle().ToJsonString());

        Assert.True(r.Succeeded, string.Join("\n", r.Issues));
        Assert.Empty(r.Warnings);
        var calcs = r.GetValueOrThrow().Calculations.ToDictionary(c => c.Label, c => c.Conformer);
        Assert.Equal("a", calcs["TS1-opt"]);
        Assert.Equal("a", calcs["TS1-sp"]);
        Assert.Equal("b", calcs["TS1-b"]);
        Assert.Equal("", calcs["CH3-opt"]);
    }

    public static TheoryData<string, string, string, string> ConformerErrors => new()
    {
        { """[ { "label": "a", "calculations": ["TS9"] } ]""", "$.species[2].conformers[0].calculations[0]", "'TS9', which is not in $.calculations", "unknown calculation" },
        { """[ { "label": "a", "calculations": ["CH3-opt"] } ]""", "$.species[2].conformers[0].calculations[0]", "of species 'CH3', not 'TS1'", "other species" },
        { """[ { "label": "a", "calculations": ["TS1-opt"] }, { "label": "b", "calculations": ["TS1-opt"] } ]""", "$.species[2].conformers[1].calculations[0]",
            "already listed at $.species[2].conformers[0].calculations[0]", "listed twice" },
        { """[ { "label": "a", "calculations": ["TS1-opt"] }, { "label": "a", "calculations": ["TS1-sp"] } ]""", "$.species[2].conformers[1].label", "listed twice", "label twice" },
        { """[ { "label": "a", "calculations": [] } ]""", "$.species[2].conformers[0].calculations", "is empty", "no calculations" },
        { """[ { "label": "a", "calculations": [3] } ]""", "$.species[2].conformers[0].calculations[0]", "found a number", "not a label" },
        { """[ { "calculations": ["TS1-opt"] } ]""", "$.species[2].conformers[0].label", "missing", "no label" },
        { """[]""", "$.species[2].conformers", "is empty", "empty list" },
        { """{ "label": "a" }""", "$.species[2].conformers", "expected an array", "not an array" },
    };

    [Theory]
    [MemberData(nameof(ConformerErrors))]
    public void Read_BadConformerList_IsAnErrorAtItsJsonPath(string conformers, string path, string fragment, string what)
    {
        var r = ReadJson(WithConformers(conformers).ToJsonString());

        Assert.False(r.Succeeded, what);
        Assert.True(r.Errors.Any(e => e.JsonPath == path && e.Message.Contains(fragment, StringComparison.Ordinal)),
            $"{what}: expected an error at {path} containing '{fragment}', got:\n{string.Join("\n", r.Issues)}");
    }

    [Fact]
    public void ToManifest_WithConformers_PassesTheSchemaAndReadsBackToTheSameConformers()
    {
        var original = ReadJson(WithSecondSaddle().ToJsonString()).GetValueOrThrow();

        var manifest = BundleWriter.ToManifest(original);

        using var schema = JsonDocument.Parse(File.ReadAllText(RepoFiles.Path("docs", "bundle.schema.json")));
        using var doc = JsonDocument.Parse(manifest);
        var errors = new MiniJsonSchema(schema.RootElement).Validate(doc.RootElement);
        Assert.True(errors.Count == 0, string.Join("\n", errors));
        var again = BundleReader.Read(new MemoryStream(BundleWriter.ToZip(original)), "again.zip").GetValueOrThrow();
        Assert.Equal(original.Calculations.Select(c => (c.Label, c.Conformer)), again.Calculations.Select(c => (c.Label, c.Conformer)));
    }
}
