using BarrierLedger.Core.Formats;

namespace BarrierLedger.Ledger.Records;

/// <summary>
/// An IRC of one saddle-point calculation: the path (frames in order, each with its energy and its path length) or the two
/// endpoints (forward, backward). Positions are stored per frame; atoms once (the saddle point's, in its order).
/// </summary>
public class Irc : IVersioned, IRetirable
{
    public int Id { get; set; }
    /// <summary>The saddle-point calculation this IRC was followed from.</summary>
    public int SaddleCalculationId { get; set; }
    public Calculation? SaddleCalculation { get; set; }
    public int UploadId { get; set; }
    public string Label { get; set; } = "";
    public string LevelOfTheory { get; set; } = "";
    public IrcForm Form { get; set; }
    public int AtomCount { get; set; }
    /// <summary>Atomic numbers, one byte each, in the saddle point's order.</summary>
    public byte[] AtomicNumbers { get; set; } = [];
    /// <summary>0-based index of the frame nearest the saddle geometry (path length 0), for a path.</summary>
    public int? SaddleFrame { get; set; }
    /// <summary>The path file, or the forward end's file.</summary>
    public int? StoredFileId { get; set; }
    /// <summary>The backward end's file, for an endpoint pair.</summary>
    public int? BackwardStoredFileId { get; set; }
    /// <summary>SHA-256 of the path file, or of the two endpoint files' SHA-256s joined: with the saddle point and label, what makes an upload a duplicate.</summary>
    public string SourceSha256 { get; set; } = "";
    public string UploadedByUserId { get; set; } = "";
    public DateTimeOffset UploadedAt { get; set; }
    public bool Retired { get; set; }
    public DateTimeOffset? RetiredAt { get; set; }
    public string? RetiredByUserId { get; set; }
    public long Version { get; set; }

    public List<IrcFrameRecord> Frames { get; set; } = [];
}

/// <summary>Which structure of an IRC a frame is.</summary>
public enum IrcFrameRole
{
    /// <summary>A frame of a path.</summary>
    Path,
    /// <summary>The end reached forward from the saddle point.</summary>
    Forward,
    /// <summary>The end reached backward.</summary>
    Backward,
}

/// <summary>One frame of an IRC: its place, role, path length (Å, for a path), energy (hartree, when given) and positions (3N doubles, Å).</summary>
public class IrcFrameRecord
{
    public int Id { get; set; }
    public int IrcId { get; set; }
    public int Index { get; set; }
    public IrcFrameRole Role { get; set; }
    public double? PathLengthAngstrom { get; set; }
    public double? EnergyHartree { get; set; }
    public byte[] PositionsAngstrom { get; set; } = [];
}
