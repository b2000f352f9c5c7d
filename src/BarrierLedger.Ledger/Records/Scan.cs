using BarrierLedger.Core.Scans;

namespace BarrierLedger.Ledger.Records;

/// <summary>A relaxed scan of one species along one coordinate.</summary>
public class Scan : IVersioned, IRetirable
{
    public int Id { get; set; }
    public int SpeciesId { get; set; }
    public Species? Species { get; set; }
    public int UploadId { get; set; }
    public string Label { get; set; } = "";
    public string LevelOfTheory { get; set; } = "";
    public ScanCoordinateKind CoordinateKind { get; set; }
    /// <summary>1-based atom numbers, comma-separated ("3,11").</summary>
    public string CoordinateAtoms { get; set; } = "";
    /// <summary>Atomic numbers of the point geometries (one byte each), when points carry geometries.</summary>
    public byte[]? AtomicNumbers { get; set; }
    public int? StoredFileId { get; set; }
    public string SourceSha256 { get; set; } = "";
    public string UploadedByUserId { get; set; } = "";
    public DateTimeOffset UploadedAt { get; set; }
    public bool Retired { get; set; }
    public DateTimeOffset? RetiredAt { get; set; }
    public string? RetiredByUserId { get; set; }
    public long Version { get; set; }

    public List<ScanPointRecord> Points { get; set; } = [];
}

/// <summary>One point of a scan: coordinate (Å or degrees), energy, converged, optional positions (3N doubles, Å).</summary>
public class ScanPointRecord
{
    public int Id { get; set; }
    public int ScanId { get; set; }
    public int Index { get; set; }
    public double Coordinate { get; set; }
    public double EnergyHartree { get; set; }
    public bool Converged { get; set; } = true;
    public byte[]? PositionsAngstrom { get; set; }
}
