using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Core.Scans;
using BarrierLedger.Core.Vibrations;
using BarrierLedger.Ledger.Records;

namespace BarrierLedger.Ledger.Uploads;

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
