using BarrierLedger.Core.Chemistry;

namespace BarrierLedger.Ledger.Uploads;

/// <summary>What an upload holds and what is wrong with it, before anything is stored.</summary>
public sealed record UploadPreview(
    string? StudyName,
    bool NewStudy,
    IReadOnlyList<PreviewFile> Files,
    IReadOnlyList<PreviewSpecies> Species,
    IReadOnlyList<PreviewCalculation> Calculations,
    IReadOnlyList<PreviewReaction> Reactions,
    IReadOnlyList<PreviewScan> Scans,
    IReadOnlyList<UploadIssue> Issues)
{
    public IEnumerable<UploadIssue> Errors => Issues.Where(i => i.IsError);
    public IEnumerable<UploadIssue> Warnings => Issues.Where(i => !i.IsError);
    public bool CanStore => !Issues.Any(i => i.IsError);
    /// <summary>IRC paths and endpoint pairs found, each with the saddle point it belongs to.</summary>
    public IReadOnlyList<PreviewIrc> Ircs { get; init; } = [];
}

public sealed record PreviewFile(string FileName, long SizeBytes, string Sha256);

/// <summary>A species of an upload: <paramref name="PointGroup"/> and <paramref name="DetectedSymmetryNumber"/> from the geometry its
/// thermochemistry will use (empty / null without one), <paramref name="GivenSymmetryNumber"/> the σ the upload gives (it wins).</summary>
public sealed record PreviewSpecies(string Label, int Charge, int Multiplicity, string Formula, bool Exists, string PointGroup = "",
    int? DetectedSymmetryNumber = null, int? GivenSymmetryNumber = null);

/// <summary>
/// A calculation found; <see cref="Duplicate"/> when the same file already gave this species this calculation; <see cref="Conformer"/>
/// the conformer of its species it will be stored as ("" = the species' only conformer).
/// </summary>
public sealed record PreviewCalculation(string Label, string Species, CalculationKind Kind, string LevelOfTheory, int AtomCount, string Formula,
    double? EnergyHartree, IReadOnlyList<double> FrequenciesCm1, int ImaginaryCount, bool HasHessian, bool Duplicate, string? File, string Conformer = "");

public sealed record PreviewReaction(string Label, string States, bool Exists);

/// <summary>An IRC found: its saddle point (by calculation label), "path" or "endpoint pair", its structures, and its file(s).</summary>
public sealed record PreviewIrc(string Label, string SaddlePoint, string Form, int FrameCount, bool Duplicate, string? Files);

public sealed record PreviewScan(string Label, string Species, string Coordinate, int PointCount, bool HasGeometries, bool Duplicate);

/// <summary>
/// The result of a store: <see cref="Stored"/> false with every error (nothing was written), or true with what was written
/// and which records were already there (reported, not stored twice).
/// </summary>
public sealed record UploadOutcome(
    bool Stored,
    int? UploadId,
    int? StudyId,
    IReadOnlyList<int> CalculationIds,
    IReadOnlyList<int> ReactionIds,
    IReadOnlyList<int> ScanIds,
    IReadOnlyList<string> Duplicates,
    IReadOnlyList<UploadIssue> Issues)
{
    public IEnumerable<UploadIssue> Errors => Issues.Where(i => i.IsError);
    /// <summary>The IRCs written.</summary>
    public IReadOnlyList<int> IrcIds { get; init; } = [];

    /// <summary>
    /// For each species this upload gave conformers to: how many it now has, and its duplicates and mirror-image pairs, compared on
    /// store (<see cref="Conformers.ConformerSet"/>). Empty when the upload named no conformers.
    /// </summary>
    public IReadOnlyList<string> ConformerNotes { get; init; } = [];

    /// <summary>This uploader stored the same content under the same key before; nothing new was written.</summary>
    public bool AlreadyStored { get; init; }

    /// <summary>
    /// Set (with <see cref="Stored"/> false) when this uploader's key already names an upload with other content: a key
    /// re-used by mistake, not a retry. Nothing was written.
    /// </summary>
    public string? KeyConflict { get; init; }

    /// <summary>Set (with <see cref="Stored"/> false) when the upload would take its uploader past the storage quota. Nothing was written.</summary>
    public QuotaRefusal? QuotaRefusal { get; init; }

    internal static UploadOutcome Failed(IEnumerable<UploadIssue> issues) => new(false, null, null, [], [], [], [], [.. issues]);
}
