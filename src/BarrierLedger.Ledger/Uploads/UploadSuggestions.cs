using System.Globalization;
using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Vibrations;

namespace BarrierLedger.Ledger.Uploads;

/// <summary>
/// A first guess of what one loose file is, for the upload page's row of that file: the species label from the file name, the
/// kind from the number of imaginary frequencies (a Hessian is analysed for it), the level of theory, charge and multiplicity
/// from the file where its format carries them. Each guess says where it comes from; the member corrects what is wrong.
/// </summary>
/// <param name="Format">How the file was recognised.</param>
/// <param name="KindReason">Why this kind: "one imaginary frequency (1432i cm⁻¹)", "a coordinate–energy table", ...</param>
/// <param name="LevelSource">"from the file", "as in ts.json" or "" when nothing gave it.</param>
/// <param name="ImaginaryCount">Significant imaginary frequencies when a Hessian or frequencies were read; null otherwise.</param>
/// <param name="IsScan">True for a scan table: the row also needs the scanned coordinate's atoms.</param>
public sealed record FileSuggestion(string FileName, FileFormat Format, string SpeciesLabel, string SpeciesReason, CalculationKind? Kind, string KindReason,
    string? LevelOfTheory, string LevelSource, int Charge, int Multiplicity, int AtomCount, int? ImaginaryCount, bool IsScan)
{
    /// <summary>The guess as the choices of this file's row.</summary>
    public FileChoices ToChoices() => new(SpeciesLabel, Kind, LevelOfTheory, Charge, Multiplicity);
}

public static class UploadSuggestions
{
    /// <summary>Words a file name often carries beside the species (job steps, not chemistry); dropped from the end of a guessed label.</summary>
    private static readonly string[] JobWords = ["opt", "optimized", "optimised", "freq", "freqs", "frequencies", "hess", "hessian", "sp", "scan", "final", "out", "result", "qcschema"];

    /// <summary>
    /// One suggestion per loose file in upload order; bundles and the files a bundle names describe themselves and get none.
    /// An imaginary frequency counts when |ν̃| ≥ <paramref name="significantImaginaryCm1"/> (the saddle-point check's threshold).
    /// </summary>
    public static IReadOnlyList<FileSuggestion> For(IReadOnlyList<UploadFile> files, double significantImaginaryCm1 = 100.0, ReaderLimits? limits = null)
    {
        ArgumentNullException.ThrowIfNull(files);
        var formats = files.Select(f => (File: f, Format: FileFormats.Detect(f.FileName, f.Content.AsSpan(0, Math.Min(f.Content.Length, 512))))).ToList();
        var consumed = new HashSet<string>(StringComparer.Ordinal);
        foreach (var (f, _) in formats.Where(x => x.Format is FileFormat.Bundle or FileFormat.BundleZip))
        {
            consumed.Add(f.FileName);
            consumed.UnionWith(BundleImport.Read(f, files, limits, new UploadDraft()));
        }
        var loose = formats.Where(x => !consumed.Contains(x.File.FileName) && x.Format != FileFormat.Unknown)
            .Select(x => Read(x.File, x.Format, significantImaginaryCm1, limits)).ToList();

        // What one file says, the files that do not say it share: one level of theory, and a scan belongs to the one saddle point.
        var levels = loose.Where(s => s.LevelSource == "from the file").GroupBy(s => s.LevelOfTheory).ToList();
        var saddles = loose.Where(s => s.Kind == CalculationKind.SaddlePoint).ToList();
        return [.. loose.Select(s =>
        {
            if (s.LevelOfTheory is null && levels.Count == 1) s = s with { LevelOfTheory = levels[0].Key, LevelSource = $"as in {levels[0].First().FileName}" };
            if (s.IsScan && saddles.Count == 1)
                s = s with { SpeciesLabel = saddles[0].SpeciesLabel, SpeciesReason = $"the saddle point's species ({saddles[0].FileName}): a scan belongs to its step",
                    Charge = saddles[0].Charge, Multiplicity = saddles[0].Multiplicity };
            return s;
        })];
    }

    /// <summary>"TS1-freq.json" → "TS1", "butadiene.sp.xyz" → "butadiene": the name before its first dot, without trailing job words.</summary>
    public static string SpeciesFromFileName(string fileName)
    {
        var name = Path.GetFileName(fileName);
        var label = name.Split('.')[0].Trim();
        while (true)
        {
            var cut = label.LastIndexOfAny(['-', '_', ' ']);
            if (cut <= 0 || !JobWords.Contains(label[(cut + 1)..], StringComparer.OrdinalIgnoreCase)) break;
            label = label[..cut].TrimEnd('-', '_', ' ');
        }
        return label.Length > 0 ? label : Path.GetFileNameWithoutExtension(name);
    }

    private static FileSuggestion Read(UploadFile f, FileFormat format, double threshold, ReaderLimits? limits)
    {
        var species = SpeciesFromFileName(f.FileName);
        const string fromName = "from the file name";
        var unread = new FileSuggestion(f.FileName, format, species, fromName, null, "the file could not be read: see the errors below", null, "", 0, 1, 0, null, format == FileFormat.CsvScan);
        switch (format)
        {
            case FileFormat.QcSchema:
            {
                var r = QcSchemaReader.Read(new MemoryStream(f.Content, writable: false), f.FileName, limits).Value;
                if (r is null) return unread;
                var level = r.LevelOfTheory?.ToString();
                var (kind, reason, imaginary) = r.Driver == QcDriver.Hessian ? FromHessian(r, threshold)
                    : (CalculationKind.SinglePoint, $"{DriverText(r.Driver)} only, no frequencies: taken as a single point", (int?)null);
                return new FileSuggestion(f.FileName, format, species, fromName, kind, reason, level, level is null ? "" : "from the file",
                    r.Molecule.Charge, r.Molecule.Multiplicity, r.Molecule.AtomCount, imaginary, false);
            }
            case FileFormat.Xyz:
            {
                var doc = XyzReader.Read(new MemoryStream(f.Content, writable: false), f.FileName, limits).Value;
                if (doc is null) return unread;
                var frames = doc.Frames.Length;
                var reason = "an XYZ file has no frequencies: taken as a minimum" + (frames > 1 ? $" (its last of {frames} frames)" : "") + "; change it if it is not";
                return new FileSuggestion(f.FileName, format, species, fromName, CalculationKind.Minimum, reason, null, "",
                    doc.Last.Molecule.Charge, doc.Last.Molecule.Multiplicity, doc.Last.Molecule.AtomCount, null, false);
            }
            case FileFormat.CsvScan:
                return unread with { Kind = CalculationKind.RelaxedScan, KindReason = "a table of coordinate and energy: a relaxed scan; give the scanned coordinate's atoms" };
            default:
                return unread;
        }
    }

    private static (CalculationKind, string, int?) FromHessian(QcSchemaResult r, double threshold)
    {
        if (!FrequencyAnalysis.TryFromHessian(r.Molecule, [.. r.HessianHartreePerBohr2], out var analysis, out var error))
            return (CalculationKind.Frequencies, $"the Hessian cannot be analysed ({error}): choose the kind", null);
        var imaginary = analysis.FrequenciesCm1.Where(v => v < 0).Select(v => -v).OrderDescending().ToList();
        var significant = imaginary.Where(v => v >= threshold).ToList();
        var soft = imaginary.Count - significant.Count;
        var softText = soft == 0 ? "" : $"; {soft} small imaginary below {threshold.ToString("F0", CultureInfo.InvariantCulture)}i not counted";
        string List(IEnumerable<double> v) => string.Join(", ", v.Select(x => x.ToString("F0", CultureInfo.InvariantCulture) + "i")) + " cm⁻¹";
        return significant.Count switch
        {
            0 => (CalculationKind.Minimum, $"no imaginary frequency among {analysis.Modes.Length} modes: a minimum{softText}", 0),
            1 => (CalculationKind.SaddlePoint, $"one imaginary frequency ({List(significant)}): a saddle point{softText}", 1),
            var n => (CalculationKind.SaddlePoint, $"{n} imaginary frequencies ({List(significant)}): a saddle point of higher order? The check will say{softText}", n),
        };
    }

    private static string DriverText(QcDriver d) => d == QcDriver.Gradient ? "an energy and gradient" : "an energy";
}
