using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Paths;

/// <summary>
/// One frame of a path (a relaxed scan or an IRC): where it lies along the path, its electronic energy in hartree, whether its
/// optimisation converged, and its geometry when known. <see cref="Scans.ScanPoint"/> is the relaxed-scan kind of frame.
/// </summary>
/// <param name="Coordinate">Position along the path: the scanned coordinate (Å or degrees) or the IRC path length (Å).</param>
/// <param name="EnergyHartree">Electronic energy, hartree.</param>
/// <param name="Converged">False for a frame whose optimisation did not converge.</param>
/// <param name="Geometry">The frame's structure, when the path carries structures.</param>
public record PathFrame(double Coordinate, double EnergyHartree, bool Converged = true, Molecule? Geometry = null);
