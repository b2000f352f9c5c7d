using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Paths;

namespace BarrierLedger.Core.Scans;

/// <summary>What a relaxed scan varies.</summary>
public enum ScanCoordinateKind
{
    Distance,
    Angle,
    Dihedral,
}

/// <summary>
/// The scanned coordinate: its kind and its 0-based atom indices (2 for a distance, 3 for an angle, 4 for a dihedral).
/// Distances are in Å, angles and dihedrals in degrees.
/// </summary>
public sealed record ScanCoordinate(ScanCoordinateKind Kind, IReadOnlyList<int> Atoms)
{
    public string Unit => Kind == ScanCoordinateKind.Distance ? "Å" : "°";
}

/// <summary>
/// One point of a relaxed scan: coordinate value, electronic energy in hartree, whether it converged, and its geometry if known.
/// A scan point is a <see cref="PathFrame"/> whose coordinate is the scanned one.
/// </summary>
public sealed record ScanPoint(double Coordinate, double EnergyHartree, bool Converged = true, Molecule? Geometry = null)
    : PathFrame(Coordinate, EnergyHartree, Converged, Geometry);
