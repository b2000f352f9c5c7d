using System.Collections.Immutable;
using System.Diagnostics.CodeAnalysis;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Scans;

/// <summary>
/// A relaxed scan written as a multi-frame XYZ file: one frame per point, in scan order, each with its energy on the
/// comment line (<c>energy=…</c>) and optionally <c>converged=yes|no</c>. The scanned coordinate is measured on each
/// frame's geometry, so the file needs no coordinate column.
/// </summary>
public static class XyzScan
{
    /// <summary>
    /// Builds the scan points. Dihedrals are unwrapped along the scan (a step across ±180° continues past it) so that a
    /// scan through 180° stays monotonic. Fails, with one plain sentence naming the frame, when a frame has no energy,
    /// a different atom count, an unreadable converged flag, or the coordinate names an atom the frames do not have.
    /// </summary>
    public static bool TryBuild(XyzDocument document, ScanCoordinate coordinate, string fileName,
        out ImmutableArray<ScanPoint> points, [NotNullWhen(false)] out string? problem)
    {
        ArgumentNullException.ThrowIfNull(document);
        ArgumentNullException.ThrowIfNull(coordinate);
        points = [];
        if (document.Frames.Length < 2)
        {
            problem = $"{fileName} has {document.Frames.Length} frame(s); a scan needs one frame per point and at least 2 points";
            return false;
        }
        var atomCount = document.Frames[0].Molecule.AtomCount;
        if (coordinate.Atoms.Max() >= atomCount)
        {
            problem = $"{fileName}: atom {coordinate.Atoms.Max() + 1} does not exist; the frames have {atomCount} atoms";
            return false;
        }
        var result = ImmutableArray.CreateBuilder<ScanPoint>(document.Frames.Length);
        double? previous = null;
        for (var i = 0; i < document.Frames.Length; i++)
        {
            var frame = document.Frames[i];
            var where = $"{fileName}:{frame.FirstLine}: frame {i + 1}";
            if (frame.Molecule.AtomCount != atomCount)
            {
                problem = $"{where} has {frame.Molecule.AtomCount} atoms, the first frame {atomCount}; every point of a scan is the same molecule";
                return false;
            }
            if (frame.EnergyHartree is not { } energy)
            {
                problem = $"{where} has no energy on its comment line; expected energy=VALUE (hartree unless energy_unit says otherwise)";
                return false;
            }
            var converged = true;
            if (frame.Keys.TryGetValue("converged", out var flag))
            {
                switch (flag.Trim().ToLowerInvariant())
                {
                    case "true" or "yes" or "y" or "t" or "1": converged = true; break;
                    case "false" or "no" or "n" or "f" or "0": converged = false; break;
                    default:
                        problem = $"{where}: converged='{flag}' is not yes/no, true/false or 1/0";
                        return false;
                }
            }
            var value = Measure(frame.Molecule, coordinate);
            if (coordinate.Kind == ScanCoordinateKind.Dihedral && previous is { } p)
                value = p + InternalCoordinates.WrapDegrees(value - p);
            previous = value;
            result.Add(new ScanPoint(value, energy, converged, frame.Molecule));
        }
        points = result.MoveToImmutable();
        problem = null;
        return true;
    }

    /// <summary>The coordinate's value on one geometry: Å for a distance, degrees for an angle or dihedral.</summary>
    public static double Measure(Molecule molecule, ScanCoordinate coordinate)
    {
        ArgumentNullException.ThrowIfNull(molecule);
        ArgumentNullException.ThrowIfNull(coordinate);
        var r = molecule.PositionsAngstrom;
        var a = coordinate.Atoms;
        return coordinate.Kind switch
        {
            ScanCoordinateKind.Distance => InternalCoordinates.Distance(r[a[0]], r[a[1]]),
            ScanCoordinateKind.Angle => InternalCoordinates.AngleDegrees(r[a[0]], r[a[1]], r[a[2]]),
            ScanCoordinateKind.Dihedral => InternalCoordinates.DihedralDegrees(r[a[0]], r[a[1]], r[a[2]], r[a[3]]),
            _ => throw new ArgumentOutOfRangeException(nameof(coordinate), $"unknown coordinate kind {coordinate.Kind}"),
        };
    }
}
