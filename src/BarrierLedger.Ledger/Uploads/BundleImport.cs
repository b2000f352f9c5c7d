using BarrierLedger.Core.Formats;
using BarrierLedger.Ledger.Records;

namespace BarrierLedger.Ledger.Uploads;

/// <summary>
/// Maps a BarrierLedger bundle (manifest .json with the files it names uploaded beside it, or one .zip) read by the Core
/// <see cref="BundleReader"/> into an <see cref="UploadDraft"/>. The files the manifest names are kept as originals too.
/// </summary>
internal static class BundleImport
{
    /// <summary>Reads the bundle into the draft; returns the names of the uploaded files it used.</summary>
    public static IReadOnlyCollection<string> Read(UploadFile file, IReadOnlyList<UploadFile> all, ReaderLimits? limits, UploadDraft draft)
    {
        var used = new HashSet<string>(StringComparer.Ordinal);
        // A manifest finds the files it names among the other uploaded files, by name or by the path's last part.
        Stream? Open(string path)
        {
            var match = all.FirstOrDefault(f => f.FileName == path) ?? all.FirstOrDefault(f => f.FileName == Path.GetFileName(path));
            if (match is null) return null;
            used.Add(match.FileName);
            return new MemoryStream(match.Content, writable: false);
        }
        var result = BundleReader.Read(new MemoryStream(file.Content, writable: false), file.FileName, limits, Open);
        UploadReader.AddIssues(draft, result.Issues);
        if (result.Value is { } b) Add(b, file.FileName, draft);
        return used;
    }

    /// <summary>Adds an already-read bundle to a draft; <paramref name="primaryFile"/> is the manifest or zip as uploaded.</summary>
    public static void Add(Bundle b, string primaryFile, UploadDraft draft)
    {
        draft.StudyName ??= b.Study.Name;
        if (draft.StudyDescription.Length == 0) draft.StudyDescription = b.Study.Description;
        draft.StudyEnergyModel ??= b.Study.EnergyModel;
        draft.PrimaryFile ??= primaryFile;
        // A zip's members are stored as originals under "bundle.zip!path"; a manifest's companions under their own names.
        var inZip = draft.Files.TryGetValue(primaryFile, out var primaryBytes) && primaryBytes.Length >= 2 && primaryBytes[0] == 'P' && primaryBytes[1] == 'K';
        string Key(string path) => inZip ? $"{primaryFile}!{path}" : (draft.Files.ContainsKey(path) ? path : Path.GetFileName(path));
        foreach (var (path, bytes) in b.Files)
        {
            var key = Key(path);
            if (!draft.Files.ContainsKey(key)) draft.Files[key] = [.. bytes];
        }
        string? FileKey(string? path) => path is null ? null : Key(path);

        foreach (var s in b.Species) draft.Species.Add(new DraftSpecies(s.Label, s.Charge, s.Multiplicity, s.SymmetryNumber));
        foreach (var c in b.Calculations)
            draft.Calculations.Add(new DraftCalculation(c.Label, c.Species, c.Kind, c.LevelOfTheory, c.EnergyHartree, c.Geometry,
                c.FrequenciesCm1, c.Modes, c.HessianHartreePerBohr2,
                c.ThermalCorrections?.TemperatureKelvin, c.ThermalCorrections?.ZeroPointHartree, c.ThermalCorrections?.EnthalpyHartree,
                c.ThermalCorrections?.GibbsHartree, FileKey(c.File), c.Note, c.Conformer));
        foreach (var r in b.Reactions)
            draft.Reactions.Add(new DraftReaction(r.Label, r.Description, [.. r.States.Select(s => new DraftState(s.Label,
                s.Kind,
                [.. s.Terms.Select(t => new DraftTerm(t.Species, t.Coefficient))], s.Calculation,
                [.. s.ReactionCoordinate.Select(p => (p.First, p.Second))]))], r.Kinetics));
        foreach (var s in b.Scans)
            draft.Scans.Add(new DraftScan(s.Label, s.Species, s.LevelOfTheory?.ToString() ?? "", s.Coordinate, s.Points, FileKey(s.PointsFile ?? s.GeometriesFile)));
        foreach (var i in b.Ircs)
            draft.Ircs.Add(new DraftIrc(i.Label, i.SaddlePoint, i.LevelOfTheory?.ToString(), i.Structures, FileKey(i.PathFile ?? i.ForwardFile), FileKey(i.BackwardFile)));
    }
}
