using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Scans;

namespace BarrierLedger.Ledger.Uploads;

/// <summary>Single QCSchema results and CSV scan tables, with the form's choices for what the file does not say.</summary>
internal static class SingleFileFormats
{
    public static void Read(UploadFile file, FileFormat format, UploadChoices choices, ReaderLimits? limits, UploadDraft draft)
    {
        switch (format)
        {
            case FileFormat.QcSchema:
                ReadQcSchema(file, choices, limits, draft);
                break;
            case FileFormat.CsvScan:
                ReadScanTable(file, choices, limits, draft);
                break;
            default:
                draft.Issues.Add(new UploadIssue(file.FileName, null, null,
                    "unknown file type: expected .xyz/.extxyz, .csv, a QCSchema .json, or a BarrierLedger bundle (.json or .zip)"));
                break;
        }
    }

    private static void ReadQcSchema(UploadFile file, UploadChoices choices, ReaderLimits? limits, UploadDraft draft)
    {
        var result = QcSchemaReader.Read(new MemoryStream(file.Content, writable: false), file.FileName, limits);
        UploadReader.AddIssues(draft, result.Issues);
        if (result.Value is not { } r) return;
        // The file's own model gives the level of theory when the form does not.
        var level = r.LevelOfTheory;
        if (!string.IsNullOrWhiteSpace(choices.LevelOfTheory))
        {
            if (!LevelOfTheory.TryParse(choices.LevelOfTheory, out var chosen, out var error))
            {
                draft.Issues.Add(new UploadIssue(file.FileName, null, null, $"level of theory: {error}"));
                return;
            }
            level = chosen;
        }
        var species = choices.SpeciesLabel?.Trim() ?? "";
        if (species.Length == 0) draft.Issues.Add(new UploadIssue(file.FileName, null, null, "this file does not name its species: choose or type a species label"));
        if (level is null) draft.Issues.Add(new UploadIssue(file.FileName, null, null, "the file gives no model and no level of theory was chosen"));
        var kind = choices.Kind ?? (r.Driver == QcDriver.Hessian ? CalculationKind.Frequencies : (CalculationKind?)null);
        if (kind is null) draft.Issues.Add(new UploadIssue(file.FileName, null, null, "this file does not say what it is: choose a kind (minimum, saddle point, ...)"));
        if (species.Length == 0 || level is null || kind is null) return;
        var mol = r.Molecule with { Charge = choices.Charge ?? r.Molecule.Charge, Multiplicity = choices.Multiplicity ?? r.Molecule.Multiplicity };
        draft.Species.Add(new DraftSpecies(species, mol.Charge, mol.Multiplicity));
        draft.Calculations.Add(new DraftCalculation(Path.GetFileNameWithoutExtension(file.FileName), species, kind.Value, level, r.EnergyHartree, mol,
            [], [], r.HessianHartreePerBohr2, null, null, null, null, file.FileName, r.Program is null ? "" : $"program: {r.Program}",
            choices.Conformer?.Trim() ?? ""));
    }

    private static void ReadScanTable(UploadFile file, UploadChoices choices, ReaderLimits? limits, UploadDraft draft)
    {
        var result = ScanTableReader.Read(new MemoryStream(file.Content, writable: false), file.FileName, null, limits);
        UploadReader.AddIssues(draft, result.Issues);
        if (result.Value is not { } table) return;
        if (!UploadReader.FormChoices(file.FileName, choices with { Kind = choices.Kind ?? CalculationKind.RelaxedScan }, draft, out var species, out var level)) return;
        if (choices.ScanAtoms is not { Count: >= 2 and <= 4 } atoms)
        {
            draft.Issues.Add(new UploadIssue(file.FileName, null, null,
                "a scan table needs the scanned coordinate: give its 2 (distance), 3 (angle) or 4 (dihedral) atom numbers"));
            return;
        }
        draft.Species.Add(new DraftSpecies(species, choices.Charge ?? 0, choices.Multiplicity ?? 1));
        var coordinate = new ScanCoordinate(atoms.Count switch
        {
            2 => ScanCoordinateKind.Distance,
            3 => ScanCoordinateKind.Angle,
            _ => ScanCoordinateKind.Dihedral,
        }, [.. atoms.Select(a => a - 1)]);
        draft.Scans.Add(new DraftScan(Path.GetFileNameWithoutExtension(file.FileName), species, level.ToString(), coordinate, table.Points, file.FileName));
    }
}
