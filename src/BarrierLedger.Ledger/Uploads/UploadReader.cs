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
        var result = XyzReader.Read(new MemoryStream(f.Content, writable: false), f.FileName, limits);
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

        var last = doc.Last;
        var geometry = last.Molecule with { Charge = charge, Multiplicity = multiplicity };
        draft.Calculations.Add(new DraftCalculation(label, species, kind, level, last.EnergyHartree, geometry,
            [], [], [], null, null, null, null, f.FileName, doc.Frames.Length > 1 ? $"last of {doc.Frames.Length} frames" : ""));
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
