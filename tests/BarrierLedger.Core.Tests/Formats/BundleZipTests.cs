using System.Text;
using BarrierLedger.Core.Formats;
using static BarrierLedger.Core.Tests.Formats.BundleReaderTests;
using static BarrierLedger.Core.Tests.Formats.FormatTestHelpers;

namespace BarrierLedger.Core.Tests.Formats;

/// <summary>Zip safety of a bundle archive: climbing names, a missing manifest, a zip bomb, a missing entry, a corrupt archive.</summary>
public class BundleZipTests
{
    [Fact]
    public void Zip_with_a_climbing_entry_name_is_refused()
    {
        var zip = Zip([("bundle.json", Encoding.UTF8.GetBytes(SampleText())), ("../evil.xyz", "1\n\nH 0 0 0\n"u8.ToArray())]);
        SingleError(BundleReader.Read(new MemoryStream(zip), "up.zip"), null, null, "'../evil.xyz'", "unsafe path");
        zip = Zip([("bundle.json", Encoding.UTF8.GetBytes(SampleText())), ("/etc/passwd", "x"u8.ToArray())]);
        SingleError(BundleReader.Read(new MemoryStream(zip), "up.zip"), null, null, "unsafe path");
    }

    [Fact]
    public void Zip_without_manifest_lists_what_it_found()
    {
        var zip = Zip([("manifest.json", "{}"u8.ToArray()), ("a.xyz", "1\n\nH 0 0 0\n"u8.ToArray())]);
        SingleError(BundleReader.Read(new MemoryStream(zip), "up.zip"), null, null, "no 'bundle.json'", "manifest.json", "a.xyz");
    }

    [Fact]
    public void Zip_bomb_is_stopped_by_the_uncompressed_budget()
    {
        // 50 MB of zeros compresses to ~50 KB; the budget of 1 MB stops it while decompressing, whatever the header claims.
        var bomb = new byte[50_000_000];
        var zip = Zip([("bundle.json", Encoding.UTF8.GetBytes(SampleText().Replace("\"h2.xyz\"", "\"h2-big.xyz\""))), ("h2-big.xyz", bomb)]);
        Assert.True(zip.Length < 1_000_000);
        var r = BundleReader.Read(new MemoryStream(zip), "bomb.zip", new ReaderLimits(MaxBytes: 1_000_000));
        Assert.False(r.Succeeded);
        Assert.Contains(r.Errors, e => e.Message.Contains("zip bomb"));
    }

    [Fact]
    public void Referenced_file_absent_from_zip_is_named()
    {
        var zip = Zip([("bundle.json", Encoding.UTF8.GetBytes(SampleText()))]);
        var r = BundleReader.Read(new MemoryStream(zip), "up.zip");
        Assert.Contains(r.Errors, e => e.FileName == "up.zip!bundle.json" && e.JsonPath == "$.calculations[1].file" && e.Message.Contains("'h2.xyz' is not in the zip"));
    }

    [Fact]
    public void Corrupt_zip_is_an_error_not_an_exception()
    {
        var zip = SampleZip();
        for (var i = 30; i < zip.Length; i += 7) zip[i] ^= 0x5A;
        var r = BundleReader.Read(new MemoryStream(zip), "broken.zip");
        Assert.False(r.Succeeded);
    }
}
