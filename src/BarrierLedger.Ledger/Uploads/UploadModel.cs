using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Scans;
using BarrierLedger.Core.Vibrations;
using BarrierLedger.Ledger.Records;

namespace BarrierLedger.Ledger.Uploads;

/// <summary>One file as the user gave it.</summary>
public sealed record UploadFile(string FileName, byte[] Content);

/// <summary>
/// The upload form's choices, used where the files do not say: the study (an existing one, or a new one by name), and for a
/// single structure file its species, kind and level of theory. <see cref="AttachToStateId"/> makes an uploaded saddle point
/// the calculation of an existing saddle-point state (a replacement reopens its review).
/// </summary>
public sealed record UploadChoices
{
    public int? StudyId { get; init; }
    public string? NewStudyName { get; init; }
    public string? SpeciesLabel { get; init; }
    public int? Charge { get; init; }
    public int? Multiplicity { get; init; }
    public CalculationKind? Kind { get; init; }
    public string? LevelOfTheory { get; init; }
    public int? AttachToStateId { get; init; }
    /// <summary>The conformer a single structure file is (empty: the species' only conformer). A multi-frame single-point file makes one conformer per frame.</summary>
    public string? Conformer { get; init; }
    /// <summary>For a multi-frame XYZ uploaded as a relaxed scan: the scanned coordinate's atoms, 1-based (2, 3 or 4 of them).</summary>
    public IReadOnlyList<int>? ScanAtoms { get; init; }
    /// <summary>
    /// The label of the saddle-point calculation (in this upload or stored in the study) that the uploaded XYZ files are an IRC of:
    /// one file is read as the path, two as the forward and backward ends (by "forward"/"backward" in their names).
    /// </summary>
    public string? IrcOf { get; init; }
    /// <summary>A key the caller chooses so that a retried store cannot write twice; generated when null.</summary>
    public string? UploadKey { get; init; }
    /// <summary>Per-file choices by file name (the upload page's one row per file); what a row leaves empty falls back to the fields above.</summary>
    public IReadOnlyDictionary<string, FileChoices>? Files { get; init; }

    /// <summary>
    /// Several structure files for one species, each one conformer of it: a file without its own conformer label takes its file
    /// name (without extension) as the label.
    /// </summary>
    public bool ConformerPerFile { get; init; }

    /// <summary>The choices that apply to one single file: its row's values over the upload-wide ones.</summary>
    public UploadChoices For(string fileName)
    {
        var c = Files is not null && Files.TryGetValue(fileName, out var f)
            ? this with
            {
                SpeciesLabel = string.IsNullOrWhiteSpace(f.SpeciesLabel) ? SpeciesLabel : f.SpeciesLabel,
                Kind = f.Kind ?? Kind,
                LevelOfTheory = string.IsNullOrWhiteSpace(f.LevelOfTheory) ? LevelOfTheory : f.LevelOfTheory,
                Charge = f.Charge ?? Charge,
                Multiplicity = f.Multiplicity ?? Multiplicity,
                ScanAtoms = f.ScanAtoms is { Count: > 0 } ? f.ScanAtoms : ScanAtoms,
                Conformer = string.IsNullOrWhiteSpace(f.Conformer) ? Conformer : f.Conformer,
            }
            : this;
        return c.ConformerPerFile && string.IsNullOrWhiteSpace(c.Conformer) ? c with { Conformer = Path.GetFileNameWithoutExtension(fileName) } : c;
    }
}

/// <summary>
/// What one single file is: its species, kind, level of theory, charge, multiplicity, for a scan its coordinate's 1-based atoms,
/// and the conformer of the species it is (empty: the species' only conformer).
/// </summary>
public sealed record FileChoices(string? SpeciesLabel = null, CalculationKind? Kind = null, string? LevelOfTheory = null, int? Charge = null,
    int? Multiplicity = null, IReadOnlyList<int>? ScanAtoms = null, string? Conformer = null);

/// <summary>Where an issue was found: file, 1-based line or JSON path (any may be absent), and what is wrong.</summary>
public sealed record UploadIssue(string FileName, int? Line, string? JsonPath, string Message, bool IsError = true)
{
    public override string ToString()
    {
        var where = FileName;
        if (Line is { } l) where += $":{l}";
        if (!string.IsNullOrEmpty(JsonPath)) where += $" {JsonPath}";
        return $"{where}: {(IsError ? "error" : "warning")}: {Message}";
    }
}

/// <summary>The parsed content of an upload, before it is matched against the store (file-format independent).</summary>
public sealed class UploadDraft
{
    public string? StudyName { get; set; }
    public string StudyDescription { get; set; } = "";
    /// <summary>A bundle's <c>study.energy_model</c>: set as the study's own model when the upload creates the study.</summary>
    public Core.Formats.BundleEnergyModel? StudyEnergyModel { get; set; }
    public List<DraftSpecies> Species { get; } = [];
    public List<DraftCalculation> Calculations { get; } = [];
    public List<DraftReaction> Reactions { get; } = [];
    public List<DraftScan> Scans { get; } = [];
    public List<DraftIrc> Ircs { get; } = [];
    /// <summary>Every original file by its key (its name, or its path inside a bundle), bytes as given.</summary>
    public Dictionary<string, byte[]> Files { get; } = new(StringComparer.Ordinal);
    /// <summary>The file a record comes from when it names none (a bundle manifest or zip).</summary>
    public string? PrimaryFile { get; set; }
    public List<UploadIssue> Issues { get; } = [];
}

/// <summary>A species as an upload names it; <paramref name="SymmetryNumber"/> is a σ the upload gives (it wins over the detected one), or null.</summary>
public sealed record DraftSpecies(string Label, int Charge, int Multiplicity, int? SymmetryNumber = null);

public sealed record DraftCalculation(
    string Label,
    string Species,
    CalculationKind Kind,
    LevelOfTheory LevelOfTheory,
    double? EnergyHartree,
    Molecule? Geometry,
    IReadOnlyList<double> FrequenciesCm1,
    IReadOnlyList<NormalMode> Modes,
    IReadOnlyList<double> HessianHartreePerBohr2,
    double? ThermalTemperatureKelvin,
    double? ZeroPointHartree,
    double? EnthalpyCorrectionHartree,
    double? GibbsCorrectionHartree,
    string? File,
    string Note,
    string Conformer = "");

public sealed record DraftTerm(string Species, int Coefficient);

public sealed record DraftState(string Label, StateKind Kind, IReadOnlyList<DraftTerm> Terms, string? Calculation, IReadOnlyList<(int A, int B)> ReactionCoordinate);

public sealed record DraftReaction(string Label, string Description, IReadOnlyList<DraftState> States, Core.Kinetics.KineticsSetup? Kinetics = null);

public sealed record DraftScan(string Label, string Species, string LevelOfTheory, ScanCoordinate Coordinate, IReadOnlyList<ScanPoint> Points, string? File);

/// <summary>
/// An IRC of a saddle-point calculation named by its label (in this upload or stored in the study); <see cref="LevelOfTheory"/> null
/// means the saddle point's. <see cref="File"/> is the path file or the forward end's, <see cref="BackwardFile"/> the backward end's.
/// </summary>
public sealed record DraftIrc(string Label, string SaddleCalculation, string? LevelOfTheory, IrcStructures Structures, string? File, string? BackwardFile);
