using System.Text.Json;
using System.Text.Json.Nodes;
using BarrierLedger.Core.Formats;
using static BarrierLedger.Core.Tests.Formats.BundleReaderTests;

namespace BarrierLedger.Core.Tests.Formats;

/// <summary>The reader and docs/bundle.schema.json describe the same manifest.</summary>
public class BundleSchemaTests
{
    [Fact]
    public void Schema_and_reader_know_the_same_keys_and_kinds()
    {
        using var schema = JsonDocument.Parse(File.ReadAllText(RepoFiles.Path("docs", "bundle.schema.json")));
        var defs = schema.RootElement.GetProperty("$defs");
        var schemaDefs = defs.EnumerateObject().Select(d => d.Name).Order().ToList();
        Assert.Equal(BundleSchema.KnownKeys.Keys.Order(), schemaDefs);
        foreach (var def in defs.EnumerateObject())
        {
            var keys = def.Value.GetProperty("properties").EnumerateObject().Select(p => p.Name).Order();
            Assert.Equal(BundleSchema.KnownKeys[def.Name].Order(), keys);
            Assert.False(def.Value.GetProperty("additionalProperties").GetBoolean());
        }
        var kinds = defs.GetProperty("calculation").GetProperty("properties").GetProperty("kind").GetProperty("enum").EnumerateArray().Select(e => e.GetString()!);
        Assert.Equal(BundleSchema.KindNames.Keys.Order(), kinds.Order());
        Assert.Equal(BundleSchema.FormatName, defs.GetProperty("bundle").GetProperty("properties").GetProperty("format").GetProperty("const").GetString());
    }

    /// <summary>Where each $defs object first occurs in the sample, to remove its required keys one at a time.</summary>
    private static readonly (string Def, Func<JsonNode, JsonObject> Find)[] s_instances =
    [
        ("bundle", n => n.AsObject()),
        ("study", n => n["study"]!.AsObject()),
        ("species", n => n["species"]![0]!.AsObject()),
        ("calculation", n => n["calculations"]![0]!.AsObject()),
        ("geometry", n => n["calculations"]![0]!["geometry"]!.AsObject()),
        ("thermal_corrections", n => n["calculations"]![0]!["thermal_corrections"]!.AsObject()),
        ("mode", n => n["calculations"]![2]!["modes"]![0]!.AsObject()),
        ("reaction", n => n["reactions"]![0]!.AsObject()),
        ("state", n => n["reactions"]![0]!["states"]![1]!.AsObject()),
        ("term", n => n["reactions"]![0]!["states"]![0]!["terms"]![0]!.AsObject()),
        ("scan", n => n["scans"]![0]!.AsObject()),
        ("coordinate", n => n["scans"]![0]!["coordinate"]!.AsObject()),
        ("point", n => n["scans"]![0]!["points"]![0]!.AsObject()),
        ("irc", n => n["ircs"]![0]!.AsObject()),
    ];

    [Fact]
    public void Every_key_the_schema_requires_is_required_by_the_reader()
    {
        using var schema = JsonDocument.Parse(File.ReadAllText(RepoFiles.Path("docs", "bundle.schema.json")));
        var defs = schema.RootElement.GetProperty("$defs");
        var checkedKeys = 0;
        foreach (var (def, find) in s_instances)
        {
            foreach (var key in defs.GetProperty(def).GetProperty("required").EnumerateArray().Select(k => k.GetString()!))
            {
                var node = JsonNode.Parse(SampleText())!;
                Assert.True(find(node).Remove(key), $"{def}.{key} is not in the sample");
                var r = ReadJson(node.ToJsonString());
                Assert.False(r.Succeeded, $"reader accepted {def} without '{key}'");
                Assert.Contains(r.Errors, e => (e.JsonPath ?? "").EndsWith("." + key) || e.Message.Contains($"'{key}'"));
                checkedKeys++;
            }
        }
        Assert.True(checkedKeys >= 25, $"only {checkedKeys} required keys checked");
    }
}
