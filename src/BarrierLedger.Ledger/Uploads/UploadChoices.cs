using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Scans;
using BarrierLedger.Core.Vibrations;
using BarrierLedger.Ledger.Records;

namespace BarrierLedger.Ledger.Uploads;

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
