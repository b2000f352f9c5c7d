using System.CommandLine;
using System.Diagnostics;
using System.Globalization;
using System.Text;
using BarrierLedger.Demo;

namespace BarrierLedger.Cli.Commands;

/// <summary>
/// <c>barrierledger demo generate [--out DIR] [--reactions N]</c>: writes the invented demo study (the contents of
/// <c>seed-data/</c>) or, with <c>--reactions</c>, a large varied ledger for benchmarks and load tests.
/// </summary>
internal static class DemoCommand
{
    /// <summary>Where the demo study goes when no --out is given.</summary>
    public const string DefaultShowcaseFolder = "seed-data";

    /// <summary>Where the scale ledger goes when no --out is given (never the demo folder).</summary>
    public const string DefaultScaleFolder = "demo-ledger";

    public static Command Create(CliContext ctx)
    {
        var output = new Option<string?>("--out") { Description = $"Output folder (default {DefaultShowcaseFolder}, or {DefaultScaleFolder} with --reactions)" };
        var reactions = new Option<int?>("--reactions")
        {
            Description = $"Write a large invented ledger of N reactions ({DemoData.ReactionsPerScaleStudy} per study, one bundle per study folder) instead of the demo study",
        };
        reactions.Validators.Add(r =>
        {
            // A token that is no number at all is reported by the parser itself.
            if (r.Tokens.Count == 1 && int.TryParse(r.Tokens[0].Value, NumberStyles.Integer, CultureInfo.InvariantCulture, out var n)
                && (n < 1 || n > DemoData.MaxScaleReactions))
                r.AddError($"--reactions must be between 1 and {DemoData.MaxScaleReactions}, got {n}");
        });
        var generate = new Command("generate",
            "Write the invented demo study (bundle.json, QCSchema Hessians, XYZ single points and scans) so that it rebuilds seed-data/ exactly; " +
            "files this generator owns that are no longer produced are removed.") { output, reactions };
        generate.SetAction(pr =>
        {
            var n = pr.GetValue(reactions);
            var folder = pr.GetValue(output) ?? (n is null ? DefaultShowcaseFolder : DefaultScaleFolder);
            var clock = Stopwatch.StartNew();
            var files = n is { } count ? DemoData.Scale(count) : DemoData.Showcase();
            var generated = clock.Elapsed;
            var (written, bytes, removed) = WriteAll(folder, files);
            foreach (var r in removed) ctx.Out.WriteLine($"removed stale {r}");
            ctx.Out.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"wrote {written} files ({bytes / 1048576.0:0.0} MiB) to {folder}: {(n is null ? "demo study" : $"{n} reactions in {(n.Value + DemoData.ReactionsPerScaleStudy - 1) / DemoData.ReactionsPerScaleStudy} studies")}, " +
                $"generated in {generated.TotalSeconds:0.00} s, written in {(clock.Elapsed - generated).TotalSeconds:0.00} s"));
            return ExitCodes.Ok;
        });
        return new Command("demo", "Invented demo data for first start, screenshots, benchmarks and load tests.") { generate };
    }

    /// <summary>
    /// Writes every file (UTF-8 without BOM, content as given). Files under the top-level entries the generator writes
    /// (bundle.json, structures/, scans/, study-NNNN/) that it did not produce this time are removed, so the folder equals the output.
    /// </summary>
    private static (int Written, long Bytes, List<string> Removed) WriteAll(string folder, IReadOnlyList<DemoFile> files)
    {
        var root = Path.GetFullPath(folder);
        Directory.CreateDirectory(root);
        var encoding = new UTF8Encoding(false);
        var keep = new HashSet<string>(StringComparer.Ordinal);
        long bytes = 0;
        foreach (var f in files)
        {
            var path = Path.Combine(root, f.RelativePath.Replace('/', Path.DirectorySeparatorChar));
            Directory.CreateDirectory(Path.GetDirectoryName(path)!);
            var data = encoding.GetBytes(f.Content);
            File.WriteAllBytes(path, data);
            bytes += data.Length;
            keep.Add(Path.GetFullPath(path));
        }
        var owned = files.Select(f => f.RelativePath.Split('/')[0]).Distinct(StringComparer.Ordinal)
            .Where(top => top != DemoWriter.ManifestName)
            .Select(top => Path.Combine(root, top))
            .Where(Directory.Exists);
        var removed = new List<string>();
        foreach (var dir in owned)
            foreach (var file in Directory.EnumerateFiles(dir, "*", SearchOption.AllDirectories).Order(StringComparer.Ordinal))
                if (!keep.Contains(Path.GetFullPath(file)))
                {
                    File.Delete(file);
                    removed.Add(Path.GetRelativePath(root, file));
                }
        return (files.Count, bytes, removed);
    }
}
