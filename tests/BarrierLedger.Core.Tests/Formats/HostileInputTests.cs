using System.Text;
using System.Text.Json.Nodes;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Text;
using static BarrierLedger.Core.Tests.Formats.FormatTestHelpers;

namespace BarrierLedger.Core.Tests.Formats;

/// <summary>
/// Issue 19, finding 9: input that once gave a server error or was stored although it cannot be right. Each reader now refuses it
/// with the file, line or JSON path and the reason, and nothing is returned to store.
/// </summary>
public sealed class HostileInputTests
{
    [Fact]
    public void InvalidUtf8InsideAJsonString_IsRefusedWithItsLine_NotThrownWhenTheStringIsRead()
    {
        var text = BundleReaderTests.SampleText();
        var bytes = Encoding.UTF8.GetBytes(text).ToList();
        var at = text.IndexOf("\"label\"", StringComparison.Ordinal) + 1; // inside the first "label" key
        bytes.InsertRange(Encoding.UTF8.GetByteCount(text[..at]), new byte[] { 0xC3, 0x28 }); // 0xC3 must be followed by 0x80–0xBF (RFC 3629)
        var line = text[..at].Count(c => c == '\n') + 1;

        var r = BundleReader.Read(new MemoryStream([.. bytes]), "bundle.json");

        Assert.False(r.Succeeded);
        var error = Assert.Single(r.Errors);
        Assert.Equal(line, error.Line);
        Assert.Contains("not UTF-8", error.Message);
    }

    [Fact]
    public void QcSchemaWithInvalidUtf8_IsRefused()
    {
        var bytes = Encoding.UTF8.GetBytes(QcSchemaReaderTests.Energy.Replace("hand-written", "hand\u00e9written")).ToList();
        var i = bytes.IndexOf(0xC3);
        bytes[i + 1] = 0x28;
        var r = QcSchemaReader.Read(new MemoryStream([.. bytes]), "w.json");
        Assert.Contains(r.Errors, e => e.Message.Contains("not UTF-8"));
    }

    [Theory]
    [InlineData("1e300")]
    [InlineData("-2.5e4")]
    public void XyzCoordinateFarBeyondAnyMolecule_IsRefusedOnItsLine(string x)
    {
        var r = XyzReader.Read(Utf8($"2\nenergy=-1.17\nH 0 0 0\nH {x} 0 0.74\n"), "h2.xyz");
        Assert.False(r.Succeeded);
        var e = Assert.Single(r.Errors);
        Assert.Equal(4, e.Line);
        Assert.Contains("beyond ±10000 Å", e.Message);
    }

    [Fact]
    public void XyzCoordinateOfALargeButRealMolecule_IsAccepted()
    {
        var r = XyzReader.Read(Utf8("2\nenergy=-1.17\nH 350.0 0 0\nH 350.74 0 0\n"), "h2.xyz");
        Assert.True(r.Succeeded, string.Join("\n", r.Issues));
    }

    [Fact]
    public void QcSchemaGeometryIn1e300Bohr_IsRefusedAtItsPath()
    {
        var node = JsonNode.Parse(QcSchemaReaderTests.Energy)!;
        node["molecule"]!["geometry"]![3] = 1e300;
        var r = QcSchemaReader.Read(Utf8(node.ToJsonString()), "w.json");
        Assert.False(r.Succeeded);
        Assert.Contains(r.Errors, e => e.JsonPath == "$.molecule.geometry" && e.Message.Contains("atom H2") && e.Message.Contains("beyond"));
    }

    [Theory]
    [InlineData("TS\n1", "line break")]
    [InlineData("TS\u00001", "U+0000")]
    [InlineData("TS1\u202E2", "bidirectional control U+202E")]
    [InlineData("TS1\u20662\u2069", "bidirectional control U+2066")]
    public void LabelsWithLineBreaksNulOrBidiControls_AreRefusedInABundle(string label, string expected)
    {
        var node = JsonNode.Parse(BundleReaderTests.SampleText())!;
        var species = node["species"]![0]!;
        species["label"] = label;

        var r = BundleReaderTests.ReadJson(node.ToJsonString());

        Assert.False(r.Succeeded);
        Assert.Contains(r.Errors, e => e.JsonPath == "$.species[0].label" && e.Message.Contains(expected));
    }

    [Fact]
    public void FreeTextMaySpanLines_ButNotHoldNulOrBidiControls()
    {
        Assert.Null(TextRules.FreeTextProblem("first line\nsecond line\twith a tab", "description"));
        Assert.Contains("U+0000", TextRules.FreeTextProblem("a\u0000b", "description"));
        Assert.Contains("U+202D", TextRules.FreeTextProblem("a\u202Db", "description"));
        Assert.Null(TextRules.LabelProblem("TS-1 (endo, Ç≠ü)", "species label")); // ordinary non-ASCII letters stay welcome
    }

    [Fact]
    public void OneErrorAfterThousandsOfWarnings_IsStillListed()
    {
        var node = JsonNode.Parse(BundleReaderTests.SampleText())!;
        var study = node["study"]!.AsObject();
        for (var i = 0; i < 3000; i++) study[$"unknown_{i}"] = i; // 3,000 warnings
        node["species"]![0]!["charge"] = 1.5;                    // then one error

        var r = BundleReaderTests.ReadJson(node.ToJsonString(), new ReaderLimits(MaxIssues: 50));

        Assert.False(r.Succeeded);
        Assert.Contains(r.Errors, e => e.JsonPath == "$.species[0].charge");
        Assert.Contains("further warning(s) not listed", r.Issues[^1].Message);
        Assert.True(r.Issues.Length <= 51);
    }

    [Theory]
    [InlineData(new byte[0], "the file is empty")]
    [InlineData(new byte[] { 0x1F, 0x8B, 0x08, 0x00, 0x11, 0x22 }, "not a zip archive")]
    public void EmptyOrRandomZip_IsCalledWhatItIs_NotInvalidJson(byte[] content, string expected)
    {
        var r = BundleReader.Read(new MemoryStream(content), "results.zip");
        var e = Assert.Single(r.Errors);
        Assert.Contains(expected, e.Message);
        Assert.DoesNotContain("JSON", e.Message);
        Assert.Equal(FileFormat.BundleZip, FileFormats.Detect("results.zip", content));
    }

    [Fact]
    public void AZipWithNoEntries_SaysItHasNoManifest()
    {
        var empty = BundleReaderTests.Zip([]);
        Assert.True(FileFormats.HasZipSignature(empty)); // an empty archive is only its end record, "PK\x05\x06" (PKWARE APPNOTE 4.3.16)
        var e = Assert.Single(BundleReader.Read(new MemoryStream(empty), "results.zip").Errors);
        Assert.Contains("no 'bundle.json'", e.Message);
    }
}
