using System.IO.Compression;
using System.Text;
using System.Text.RegularExpressions;
using SkiaSharp;

namespace BarrierLedger.Cli.Tests;

/// <summary>
/// docs/examples is what the README promises an export looks like. It is regenerated here with the command the README names
/// and compared with the committed files, so the two can never drift apart again. Only timestamps are normalised (and the PNG is
/// compared pixel by pixel, allowing the last bit of anti-aliasing a different CPU may round differently).
/// To refresh the folder after a change to the demo or the exports:
/// <c>dotnet run --project src/BarrierLedger.Cli -- export examples --bundle seed-data --out docs/examples</c>.
/// </summary>
public partial class DocsExamplesTests
{
    private const string Regenerate = "dotnet run --project src/BarrierLedger.Cli -- export examples --bundle seed-data --out docs/examples";

    private static string RepoRoot
    {
        get
        {
            for (var d = new DirectoryInfo(AppContext.BaseDirectory); d is not null; d = d.Parent)
                if (File.Exists(Path.Combine(d.FullName, "BarrierLedger.sln"))) return d.FullName;
            throw new DirectoryNotFoundException("BarrierLedger.sln not found above the test folder.");
        }
    }

    [GeneratedRegex(@"\d{4}-\d\d-\d\d[T ]\d\d:\d\d(:\d\d(\.\d+)?)?(Z|[+-]\d\d:?\d\d)?")]
    private static partial Regex Timestamp();

    private static string Normalise(string text) => Timestamp().Replace(text.Replace("\r\n", "\n"), "<time>");

    [Fact]
    public void DocsExamples_EqualWhatTheReadmeCommandWritesToday()
    {
        var committed = Path.Combine(RepoRoot, "docs", "examples");
        using var temp = new TempDir();
        var (code, _, err) = CliRunner.Run("export", "examples", "--bundle", Path.Combine(RepoRoot, "seed-data"), "--out", temp.Path);
        Assert.True(code == 0, err);

        var fresh = Directory.GetFiles(temp.Path).Select(Path.GetFileName).Order(StringComparer.Ordinal).ToList();
        var kept = Directory.GetFiles(committed).Select(Path.GetFileName).Where(f => f != "README.md").Order(StringComparer.Ordinal).ToList();
        Assert.True(fresh.SequenceEqual(kept), $"docs/examples holds [{string.Join(", ", kept)}] but the export writes [{string.Join(", ", fresh)}]; run: {Regenerate}");

        var stale = new List<string>();
        foreach (var name in fresh)
        {
            var a = File.ReadAllBytes(Path.Combine(committed, name!));
            var b = File.ReadAllBytes(Path.Combine(temp.Path, name!));
            var same = Path.GetExtension(name) switch
            {
                ".xlsx" => SameZip(a, b),
                ".png" => SamePicture(a, b),
                _ => Normalise(Encoding.UTF8.GetString(a)) == Normalise(Encoding.UTF8.GetString(b)),
            };
            if (!same) stale.Add(name!);
        }
        Assert.True(stale.Count == 0, $"docs/examples is out of date ({string.Join(", ", stale)} differ from a fresh export); run: {Regenerate}");
    }

    [Fact]
    public void DocsExamples_Comparison_NoticesAHandEditedFile()
    {
        // The comparison itself must be able to fail: a changed number in the table text is seen, a changed timestamp is not.
        const string table = "| DA | 36.6 |\n# exported 2026-12-04T10:00:00Z\n";
        Assert.NotEqual(Normalise(table), Normalise(table.Replace("36.6", "36.7")));
        Assert.Equal(Normalise(table), Normalise(table.Replace("2026-12-04T10:00:00Z", "2027-01-01T00:00:00Z")));
        var picture = File.ReadAllBytes(Path.Combine(RepoRoot, "docs", "examples", "diagram.png"));
        using var bitmap = SKBitmap.Decode(picture);
        bitmap.SetPixel(bitmap.Width / 2, bitmap.Height / 2, SKColors.Red);
        bitmap.SetPixel(bitmap.Width / 3, bitmap.Height / 3, SKColors.Red);
        using var data = bitmap.Encode(SKEncodedImageFormat.Png, 100);
        Assert.False(SamePicture(picture, data.ToArray()));
        Assert.True(SamePicture(picture, picture));
    }

    /// <summary>Same entries with the same content once timestamps are normalised (a workbook records when it was written).</summary>
    private static bool SameZip(byte[] a, byte[] b)
    {
        static Dictionary<string, string> Entries(byte[] bytes)
        {
            using var zip = new ZipArchive(new MemoryStream(bytes), ZipArchiveMode.Read);
            return zip.Entries.ToDictionary(e => e.FullName, e =>
            {
                using var r = new StreamReader(e.Open(), Encoding.UTF8);
                return Normalise(r.ReadToEnd());
            });
        }
        var x = Entries(a);
        var y = Entries(b);
        return x.Count == y.Count && x.All(kv => y.TryGetValue(kv.Key, out var v) && v == kv.Value);
    }

    /// <summary>
    /// Same size and the same pixels, allowing a difference of at most 8 levels in a channel (anti-aliased edges) on at most 0.5 %
    /// of the pixels; one changed label or line changes far more, and any pixel off by more than 8 levels fails.
    /// </summary>
    private static bool SamePicture(byte[] a, byte[] b)
    {
        using var x = SKBitmap.Decode(a);
        using var y = SKBitmap.Decode(b);
        if (x is null || y is null || x.Width != y.Width || x.Height != y.Height) return false;
        var soft = 0;
        for (var row = 0; row < x.Height; row++)
            for (var col = 0; col < x.Width; col++)
            {
                var p = x.GetPixel(col, row);
                var q = y.GetPixel(col, row);
                var d = Math.Max(Math.Max(Math.Abs(p.Red - q.Red), Math.Abs(p.Green - q.Green)), Math.Max(Math.Abs(p.Blue - q.Blue), Math.Abs(p.Alpha - q.Alpha)));
                if (d > 8) return false;
                if (d > 0) soft++;
            }
        return soft <= 0.005 * x.Width * x.Height;
    }
}
