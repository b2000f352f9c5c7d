using System.Collections.Immutable;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Scans;

namespace BarrierLedger.Ledger.Uploads;

/// <summary>
/// Turns uploaded files into an <see cref="UploadDraft"/> through the Core readers, collecting every issue with its place.
/// A bundle (manifest or zip) describes itself; a single structure file takes species, kind and level from the form.
/// </summary>
public static class UploadReader
{
    public static UploadDraft Read(IReadOnlyList<UploadFile> files, UploadChoices choices, ReaderLimits? limits = null)
    {
        ArgumentNullException.ThrowIfNull(files);
        ArgumentNullException.ThrowIfNull(choices);
        var draft = new UploadDraft { StudyName = choices.NewStudyName };
        if (files.Count == 0)
        {
            draft.Issues.Add(new UploadIssue("(upload)", null, null, "no file was given"));
            return draft;
        }
        var names = new HashSet<string>(StringComparer.Ordinal);
        var formats = new Dictionary<UploadFile, FileFormat>();
        foreach (var f in files)
        {
            if (!names.Add(f.FileName))
            {
                draft.Issues.Add(new UploadIssue(f.FileName, null, null, "the same file name is given twice in one upload"));
                continue;
            }
            draft.Files[f.FileName] = f.Content;
            formats[f] = FileFormats.Detect(f.FileName, f.Content.AsSpan(0, Math.Min(f.Content.Length, 512)));
        }
        // Bundles first: the files a manifest names are part of it, not separate uploads.
        var consumed = new HashSet<string>(StringComparer.Ordinal);
        foreach (var (f, format) in formats.Where(x => x.Value is FileFormat.Bundle or FileFormat.BundleZip))
            consumed.UnionWith(BundleImport.Read(f, files, limits, draft));
        var hasBundle = formats.Values.Any(v => v is FileFormat.Bundle or FileFormat.BundleZip);
        if (!string.IsNullOrWhiteSpace(choices.IrcOf))
            consumed.UnionWith(ReadIrc([.. formats.Where(x => x.Value == FileFormat.Xyz && !consumed.Contains(x.Key.FileName)).Select(x => x.Key)], choices, limits, draft));
        foreach (var (f, format) in formats.Where(x => x.Value is not (FileFormat.Bundle or FileFormat.BundleZip) && !consumed.Contains(x.Key.FileName)))
        {
            if (hasBundle && format == FileFormat.Unknown)
            {
                // A note beside a bundle (a README) is not data: say so, do not store it, do not refuse the upload.
                draft.Files.Remove(f.FileName);
                draft.Issues.Add(new UploadIssue(f.FileName, null, null, "not named by the bundle and not a data file; not read and not stored", IsError: false));
                continue;
            }
            if (format == FileFormat.Xyz) ReadXyz(f, choices.For(f.FileName), limits, draft);
            else SingleFileFormats.Read(f, format, choices.For(f.FileName), limits, draft);
        }
        return draft;
    }

    internal static void AddIssues(UploadDraft draft, IEnumerable<ReadIssue> issues) =>
        draft.Issues.AddRange(issues.Select(i => new UploadIssue(i.FileName, i.Line, i.JsonPath, i.Message, i.IsError)));

    private static void ReadXyz(UploadFile f, UploadChoices choices, ReaderLimits? limits, UploadDraft draft)
    {
        var result = XyzReader.Read(new MemoryStream(f.Content, 0, f.Content.Length, writable: false, publiclyVisible: true), f.FileName, limits);
        AddIssues(draft, result.Issues);
        if (result.Value is not { } doc) return;
        if (!FormChoices(f.FileName, choices, draft, out var species, out var level)) return;
        var kind = choices.Kind!.Value;
        var charge = choices.Charge ?? doc.Last.Molecule.Charge;
        var multiplicity = choices.Multiplicity ?? doc.Last.Molecule.Multiplicity;
        draft.Species.Add(new DraftSpecies(species, charge, multiplicity));
        var label = Path.GetFileNameWithoutExtension(f.FileName);

        if (kind == CalculationKind.RelaxedScan)
        {
            if (choices.ScanAtoms is not { Count: >= 2 and <= 4 } atoms)
            {
                draft.Issues.Add(new UploadIssue(f.FileName, null, null,
                    "a relaxed scan needs the scanned coordinate: give its 2 (distance), 3 (angle) or 4 (dihedral) atom numbers"));
                return;
            }
            var n = doc.Frames[0].Molecule.AtomCount;
            if (atoms.Any(a => a < 1 || a > n))
            {
                draft.Issues.Add(new UploadIssue(f.FileName, null, null,
                    $"scan atoms {string.Join(", ", atoms)} are not all between 1 and {n}, the number of atoms"));
                return;
            }
            var coordinate = new ScanCoordinate(atoms.Count switch
            {
                2 => ScanCoordinateKind.Distance,
                3 => ScanCoordinateKind.Angle,
                _ => ScanCoordinateKind.Dihedral,
            }, [.. atoms.Select(a => a - 1)]);
            var q = new InternalCoordinate(coordinate.Kind switch
            {
                ScanCoordinateKind.Distance => InternalKind.Stretch,
                ScanCoordinateKind.Angle => InternalKind.Bend,
                _ => InternalKind.Torsion,
            }, [.. coordinate.Atoms]);
            var points = new List<ScanPoint>(doc.Frames.Length);
            foreach (var frame in doc.Frames)
            {
                if (frame.EnergyHartree is not { } e)
                {
                    draft.Issues.Add(new UploadIssue(f.FileName, frame.FirstLine, null,
                        "this scan frame has no energy on its comment line (a bare number or energy=...)"));
                    continue;
                }
                var mol = frame.Molecule with { Charge = charge, Multiplicity = multiplicity };
                var converged = !frame.Keys.TryGetValue("converged", out var c) || !c.Equals("false", StringComparison.OrdinalIgnoreCase);
                points.Add(new ScanPoint(q.ValueAt(mol.PositionsAngstrom), e, converged, mol));
            }
            draft.Scans.Add(new DraftScan(label, species, level.ToString(), coordinate, points, f.FileName));
            return;
        }

        if (kind == CalculationKind.SinglePoint && doc.Frames.Length > 1)
        {
            AddConformerFrames(f, doc, species, level, charge, multiplicity, draft);
            return;
        }

        var last = doc.Last;
        var geometry = last.Molecule with { Charge = charge, Multiplicity = multiplicity };
        draft.Calculations.Add(new DraftCalculation(label, species, kind, level, last.EnergyHartree, geometry,
            [], [], [], null, null, null, null, f.FileName, doc.Frames.Length > 1 ? $"last of {doc.Frames.Length} frames" : "",
            choices.Conformer?.Trim() ?? ""));
    }

    /// <summary>
    /// A multi-frame XYZ of single points: one conformer per frame, each with its own energy (a bare number or energy=... on the
    /// comment line). The conformer's label is the frame's conformer=... key, else c1, c2 ... by frame; the calculation's label is
    /// the file's name with the conformer's.
    /// </summary>
    private static void AddConformerFrames(UploadFile f, XyzDocument doc, string species, LevelOfTheory level, int charge, int multiplicity, UploadDraft draft)
    {
        var stem = Path.GetFileNameWithoutExtension(f.FileName);
        var seen = new Dictionary<string, int>(StringComparer.Ordinal);
        for (var k = 0; k < doc.Frames.Length; k++)
        {
            var frame = doc.Frames[k];
            var conformer = frame.Keys.TryGetValue("conformer", out var named) && !string.IsNullOrWhiteSpace(named) ? named.Trim() : $"c{k + 1}";
            if (seen.TryGetValue(conformer, out var first))
            {
                draft.Issues.Add(new UploadIssue(f.FileName, frame.FirstLine, null,
                    $"conformer '{conformer}' is already the name of frame {first + 1}; each frame of a single-point file is one conformer"));
                continue;
            }
            seen[conformer] = k;
            if (frame.EnergyHartree is not { } e)
            {
                draft.Issues.Add(new UploadIssue(f.FileName, frame.FirstLine, null,
                    $"frame {k + 1} has no energy on its comment line (a bare number or energy=...); each frame of a single-point file is one conformer with its energy"));
                continue;
            }
            draft.Calculations.Add(new DraftCalculation($"{stem}-{conformer}", species, CalculationKind.SinglePoint, level, e,
                frame.Molecule with { Charge = charge, Multiplicity = multiplicity }, [], [], [], null, null, null, null, f.FileName,
                $"frame {k + 1} of {doc.Frames.Length}", conformer));
        }
    }

    /// <summary>
    /// The XYZ files of an upload that names the saddle point they are an IRC of (<see cref="UploadChoices.IrcOf"/>): one file is the
    /// path, two are the forward and backward ends (told apart by "forward" and "backward" in their names). Returns the files used.
    /// </summary>
    private static IReadOnlyCollection<string> ReadIrc(IReadOnlyList<UploadFile> xyz, UploadChoices choices, ReaderLimits? limits, UploadDraft draft)
    {
        var saddle = choices.IrcOf!.Trim();
        string? level = null;
        var levelText = xyz.Count > 0 ? choices.For(xyz[0].FileName).LevelOfTheory : choices.LevelOfTheory;
        if (!string.IsNullOrWhiteSpace(levelText))
        {
            if (LevelOfTheory.TryParse(levelText, out var lt, out var error)) level = lt.ToString();
            else
            {
                draft.Issues.Add(new UploadIssue(xyz.FirstOrDefault()?.FileName ?? "(upload)", null, null, $"level of theory: {error}"));
                return [.. xyz.Select(f => f.FileName)];
            }
        }
        XyzDocument? Read(UploadFile f)
        {
            // The IRC takes its saddle point's charge and multiplicity, so an odd electron count without charge= is no concern here.
            var r = XyzReader.Read(new MemoryStream(f.Content, 0, f.Content.Length, writable: false, publiclyVisible: true), f.FileName, limits, warnUnstatedOddElectrons: false);
            AddIssues(draft, r.Issues);
            return r.Value;
        }
        switch (xyz.Count)
        {
            case 0:
                draft.Issues.Add(new UploadIssue("(upload)", null, null, $"an IRC of '{saddle}' was asked for, but no XYZ file was given: give one multi-frame XYZ (the path) or two (the forward and backward ends)"));
                return [];
            case 1:
            {
                var f = xyz[0];
                if (Read(f) is not { } doc) break;
                var r = IrcFiles.Path(doc, f.FileName);
                AddIssues(draft, r.Issues);
                if (r.Value is { } path) draft.Ircs.Add(new DraftIrc(Path.GetFileNameWithoutExtension(f.FileName), saddle, level, path, f.FileName, null));
                break;
            }
            case 2:
            {
                static bool Has(UploadFile f, string word) => f.FileName.Contains(word, StringComparison.OrdinalIgnoreCase);
                var forward = xyz.Where(f => Has(f, "forward") && !Has(f, "backward")).ToList();
                var backward = xyz.Where(f => Has(f, "backward") && !Has(f, "forward")).ToList();
                if (forward.Count != 1 || backward.Count != 1)
                {
                    draft.Issues.Add(new UploadIssue(string.Join(", ", xyz.Select(f => f.FileName)), null, null,
                        "two XYZ files for an IRC are its two ends: name one with \"forward\" and the other with \"backward\" so they can be told apart"));
                    break;
                }
                var fd = Read(forward[0]);
                var bd = Read(backward[0]);
                if (fd is null || bd is null) break;
                var r = IrcFiles.Endpoints(fd, forward[0].FileName, bd, backward[0].FileName);
                AddIssues(draft, r.Issues);
                if (r.Value is { } ends)
                    draft.Ircs.Add(new DraftIrc($"{saddle} IRC ends", saddle, level, ends, forward[0].FileName, backward[0].FileName));
                break;
            }
            default:
                draft.Issues.Add(new UploadIssue(string.Join(", ", xyz.Select(f => f.FileName)), null, null,
                    $"{xyz.Count} XYZ files for one IRC; give one multi-frame XYZ (the path) or two (the forward and backward ends)"));
                break;
        }
        return [.. xyz.Select(f => f.FileName)];
    }

    /// <summary>The form's species and level of theory for a file that does not carry them; false with an issue when missing.</summary>
    internal static bool FormChoices(string fileName, UploadChoices choices, UploadDraft draft, out string species, out LevelOfTheory level)
    {
        species = choices.SpeciesLabel?.Trim() ?? "";
        level = null!;
        var ok = true;
        if (species.Length == 0)
        {
            draft.Issues.Add(new UploadIssue(fileName, null, null, "this file does not name its species: choose or type a species label"));
            ok = false;
        }
        else if (Core.Text.TextRules.LabelProblem(species, "species label") is { } bad)
        {
            draft.Issues.Add(new UploadIssue(fileName, null, null, bad));
            ok = false;
        }
        if (!string.IsNullOrWhiteSpace(choices.Conformer) && Core.Text.TextRules.LabelProblem(choices.Conformer, "conformer label") is { } badConformer)
        {
            draft.Issues.Add(new UploadIssue(fileName, null, null, badConformer));
            ok = false;
        }
        if (choices.Kind is null)
        {
            draft.Issues.Add(new UploadIssue(fileName, null, null, "this file does not say what it is: choose a kind (minimum, saddle point, ...)"));
            ok = false;
        }
        if (!LevelOfTheory.TryParse(choices.LevelOfTheory, out level, out var error))
        {
            draft.Issues.Add(new UploadIssue(fileName, null, null, $"level of theory: {error}"));
            ok = false;
        }
        return ok;
    }
}
