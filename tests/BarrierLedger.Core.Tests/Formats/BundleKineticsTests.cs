using System.Text.Json;
using System.Text.Json.Nodes;
using BarrierLedger.Core.Formats;
using static BarrierLedger.Core.Tests.Formats.BundleReaderTests;

namespace BarrierLedger.Core.Tests.Formats;

/// <summary>A reaction's <c>kinetics</c> in a bundle (issue 22): competing channels and run conditions, read, refused with their JSON path, written back.</summary>
public sealed class BundleKineticsTests
{
    // The sample's reaction R1 with a second saddle point "TS1b" (a copy of TS1) competing with TS1.
    private static JsonNode WithKinetics(string kineticsJson)
    {
        var node = JsonNode.Parse(SampleText())!;
        var states = node["reactions"]![0]!["states"]!.AsArray();
        var copy = states[1]!.DeepClone();
        copy["label"] = "TS1b";
        states.Insert(2, copy);
        node["reactions"]![0]!["kinetics"] = JsonNode.Parse(kineticsJson);
        return node;
    }

    private const string Full = """{ "competing_channels": ["TS1", "TS1b"], "enantiomeric": true, "temperature_kelvin": 353.15, "time_hours": 24 }""";

    [Fact]
    public void Read_Kinetics_PassesTheSchemaAndGivesChannelsAndConditions()
    {
        var node = WithKinetics(Full);
        using var schema = JsonDocument.Parse(File.ReadAllText(RepoFiles.Path("docs", "bundle.schema.json")));
        using var doc = JsonDocument.Parse(node.ToJsonString());
        var errors = new MiniJsonSchema(schema.RootElement).Validate(doc.RootElement);
        Assert.True(errors.Count == 0, string.Join("\n", errors));

        var r = ReadJson(node.ToJsonString());
        Assert.True(r.Succeeded, string.Join("\n", r.Issues));
        Assert.Empty(r.Warnings);
        var k = r.GetValueOrThrow().Reactions[0].Kinetics!;
        Assert.Equal(["TS1", "TS1b"], k.Channels);
        Assert.True(k.Enantiomeric);
        Assert.Equal(353.15, k.TemperatureKelvin);
        Assert.Equal(24, k.TimeHours);
    }

    [Fact]
    public void Read_WithoutKinetics_GivesNull() => Assert.Null(ReadJson(SampleText()).GetValueOrThrow().Reactions[0].Kinetics);

    [Fact]
    public void ToManifest_WritesKineticsBack_AndThemOnly()
    {
        var original = ReadJson(WithKinetics(Full).ToJsonString()).GetValueOrThrow();
        var again = BundleReader.Read(new MemoryStream(BundleWriter.ToZip(original)), "again.zip").GetValueOrThrow();
        var (a, b) = (original.Reactions[0].Kinetics!, again.Reactions[0].Kinetics!);
        Assert.Equal(a.Channels, b.Channels);
        Assert.Equal((a.Enantiomeric, a.TemperatureKelvin, a.TimeHours), (b.Enantiomeric, b.TemperatureKelvin, b.TimeHours));
        Assert.DoesNotContain("kinetics", System.Text.Encoding.UTF8.GetString(BundleWriter.ToManifest(ReadJson(SampleText()).GetValueOrThrow())));
    }

    public static TheoryData<string, string, string, string[]> Errors => new()
    {
        { "a minimum", """{ "competing_channels": ["TS1", "CH3 + H2"] }""", "competing_channels", ["'CH3 + H2'", "is a minimum"] },
        { "no such state", """{ "competing_channels": ["TS1", "TS9"] }""", "competing_channels", ["'TS9'", "not a state of this reaction", "'TS1', 'TS1b'"] },
        { "one channel", """{ "competing_channels": ["TS1"] }""", "competing_channels", ["names one saddle point"] },
        { "twice", """{ "competing_channels": ["TS1", "TS1"] }""", "competing_channels", ["'TS1' twice"] },
        { "not a label", """{ "competing_channels": [1, 2] }""", "competing_channels[0]", ["expected a saddle point's state label", "number"] },
        { "ee without channels", """{ "enantiomeric": true }""", "enantiomeric", ["exactly two competing channels", "found 0"] },
        { "cold", """{ "temperature_kelvin": -5 }""", "temperature_kelvin", ["is -5", "above 0"] },
        { "no time", """{ "time_hours": 0 }""", "time_hours", ["is 0", "above 0"] },
        { "temperature as text", """{ "temperature_kelvin": "hot" }""", "temperature_kelvin", ["expected a number"] },
    };

    [Theory]
    [MemberData(nameof(Errors))]
    public void Read_BadKinetics_IsAnErrorAtItsPath(string what, string kinetics, string key, string[] fragments)
    {
        var r = ReadJson(WithKinetics(kinetics).ToJsonString());
        Assert.False(r.Succeeded, what);
        var path = "$.reactions[0].kinetics." + key;
        Assert.True(r.Errors.Any(e => e.JsonPath == path && fragments.All(f => e.Message.Contains(f))),
            $"{what}: expected an error at {path} containing [{string.Join(" | ", fragments)}], got:\n{string.Join("\n", r.Issues)}");
    }

    [Fact]
    public void Read_UnknownKineticsKey_IsAWarningNamingTheKnownOnes()
    {
        var r = ReadJson(WithKinetics("""{ "temperature": 350 }""").ToJsonString());
        Assert.True(r.Succeeded, string.Join("\n", r.Issues));
        Assert.Contains(r.Warnings, w => w.JsonPath == "$.reactions[0].kinetics.temperature" && w.Message.Contains("temperature_kelvin"));
    }
}
