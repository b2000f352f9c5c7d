using System.Collections.Immutable;
using System.Globalization;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Scans;

namespace BarrierLedger.Core.Paths;

/// <summary>What a path is.</summary>
public enum PathKind
{
    /// <summary>A relaxed scan: each frame optimised with one coordinate held at a value.</summary>
    RelaxedScan,
    /// <summary>An intrinsic reaction coordinate followed down from a saddle point, both ways or one.</summary>
    Irc,
}

/// <summary>Bonds that appear (Formed) or vanish (Broken) between two neighbouring frames of a path.</summary>
/// <param name="FromFrame">0-based index of the earlier frame.</param>
/// <param name="ToFrame">0-based index of the later frame.</param>
/// <param name="Coordinate">The path coordinate halfway between the two frames.</param>
/// <param name="Formed">Bonds of the later frame that the earlier one lacks.</param>
/// <param name="Broken">Bonds of the earlier frame that the later one lacks.</param>
public sealed record PathBondEvent(int FromFrame, int ToFrame, double Coordinate, ImmutableArray<Bond> Formed, ImmutableArray<Bond> Broken);

/// <summary>
/// A path: frames in order, each with a coordinate along the path and an energy (hartree). Relaxed scans and IRC paths are
/// both paths; they differ in what the coordinate means (<see cref="CoordinateName"/>, <see cref="Unit"/>).
/// </summary>
/// <param name="Kind">Relaxed scan or IRC.</param>
/// <param name="CoordinateName">What the coordinate is, in words ("path length from the saddle point", "C1–C6 distance").</param>
/// <param name="Unit">"Å" or "°".</param>
/// <param name="Frames">The frames in path order.</param>
/// <param name="SaddleFrame">0-based index of the frame at the saddle point (IRC), or null.</param>
public sealed record ReactionPath(PathKind Kind, string CoordinateName, string Unit, ImmutableArray<PathFrame> Frames, int? SaddleFrame = null)
{
    public PathFrame First => Frames[0];
    public PathFrame Last => Frames[^1];

    /// <summary>0-based index of the converged frame with the highest energy (the first such frame on a tie).</summary>
    public int HighestFrame
    {
        get
        {
            var best = -1;
            for (var i = 0; i < Frames.Length; i++)
                if (Frames[i].Converged && (best < 0 || Frames[i].EnergyHartree > Frames[best].EnergyHartree)) best = i;
            return best < 0 ? 0 : best;
        }
    }

    /// <summary>True when every frame carries a geometry.</summary>
    public bool HasGeometries => Frames.All(f => f.Geometry is not null);

    /// <summary>A relaxed scan as a path (the scanned coordinate is the path coordinate).</summary>
    public static ReactionPath FromScan(IReadOnlyList<ScanPoint> points, ScanCoordinate? coordinate, Func<int, string>? atomLabel = null)
    {
        ArgumentNullException.ThrowIfNull(points);
        if (points.Count == 0) throw new ArgumentException("A path needs at least one frame.", nameof(points));
        var name = coordinate is null ? "scanned coordinate"
            : $"{coordinate.Kind.ToString().ToLowerInvariant()} {string.Join("–", coordinate.Atoms.Select(a => atomLabel?.Invoke(a) ?? (a + 1).ToString(CultureInfo.InvariantCulture)))}";
        return new ReactionPath(PathKind.RelaxedScan, name, coordinate?.Unit ?? "Å", [.. points]);
    }

    /// <summary>
    /// Bonds that form or break between neighbouring frames that carry geometries (<see cref="Connectivity"/>). For a path of
    /// F frames of N atoms this costs F·N(N−1)/2 distances.
    /// </summary>
    public ImmutableArray<PathBondEvent> BondEvents(ConnectivityOptions? options = null)
    {
        var events = ImmutableArray.CreateBuilder<PathBondEvent>();
        Connectivity? previous = null;
        var previousIndex = -1;
        for (var i = 0; i < Frames.Length; i++)
        {
            if (Frames[i].Geometry is not { } g) continue;
            var current = Connectivity.Of(g, options);
            if (previous is not null && previous.AtomCount == current.AtomCount)
            {
                var (formed, broken) = previous.Compare(current);
                if (formed.Length > 0 || broken.Length > 0)
                    events.Add(new PathBondEvent(previousIndex, i, 0.5 * (Frames[previousIndex].Coordinate + Frames[i].Coordinate), formed, broken));
            }
            previous = current;
            previousIndex = i;
        }
        return events.ToImmutable();
    }
}

/// <summary>
/// Builds IRC paths from structures. The path coordinate is the path length in Å: the sum of the Cartesian distances between
/// neighbouring frames (√Σᵢ|Δrᵢ|², unweighted, after superposing each frame on its predecessor by <see cref="Kabsch"/> so that an
/// overall turn of the frame does not count as motion), zero at the saddle frame, negative before it and positive after it.
/// The saddle frame is the frame closest to the saddle geometry (Kabsch RMSD) when that is given, else the highest-energy frame.
/// </summary>
public static class IrcPath
{
    /// <summary>
    /// An IRC path from frames in order (one end, …, saddle point, …, other end). Throws <see cref="ArgumentException"/> when
    /// frames differ in atoms, when an energy is not finite, or when the saddle geometry has other atoms than the frames.
    /// </summary>
    public static ReactionPath FromFrames(IReadOnlyList<Molecule> frames, IReadOnlyList<double> energiesHartree, Molecule? saddle = null)
    {
        ArgumentNullException.ThrowIfNull(frames);
        ArgumentNullException.ThrowIfNull(energiesHartree);
        if (frames.Count < 2) throw new ArgumentException($"An IRC path needs at least 2 frames, got {frames.Count}.", nameof(frames));
        if (energiesHartree.Count != frames.Count)
            throw new ArgumentException($"{frames.Count} frames but {energiesHartree.Count} energies.", nameof(energiesHartree));
        var first = frames[0];
        for (var i = 0; i < frames.Count; i++)
        {
            SameAtoms(first, frames[i], $"frame {i + 1}", nameof(frames));
            if (!double.IsFinite(energiesHartree[i]))
                throw new ArgumentException($"Frame {i + 1}: the energy is not a finite number ({energiesHartree[i]}).", nameof(energiesHartree));
        }
        if (saddle is not null) SameAtoms(first, saddle, "the saddle geometry", nameof(saddle));

        var cumulative = new double[frames.Count];
        for (var i = 1; i < frames.Count; i++)
            cumulative[i] = cumulative[i - 1] + StepLength(frames[i - 1], frames[i]);

        int origin;
        if (saddle is not null)
        {
            origin = 0;
            var best = double.PositiveInfinity;
            for (var i = 0; i < frames.Count; i++)
            {
                var r = Kabsch.Rmsd(frames[i], saddle);
                if (r < best) { best = r; origin = i; }
            }
        }
        else
        {
            origin = 0;
            for (var i = 1; i < frames.Count; i++)
                if (energiesHartree[i] > energiesHartree[origin]) origin = i;
        }
        var builder = ImmutableArray.CreateBuilder<PathFrame>(frames.Count);
        for (var i = 0; i < frames.Count; i++)
            builder.Add(new PathFrame(cumulative[i] - cumulative[origin], energiesHartree[i], true, frames[i]));
        return new ReactionPath(PathKind.Irc, "path length from the saddle point", "Å", builder.MoveToImmutable(), origin);
    }

    /// <summary>√Σᵢ|rᵢ(b) − rᵢ(a)|² in Å after superposing <paramref name="b"/> on <paramref name="a"/>.</summary>
    public static double StepLength(Molecule a, Molecule b)
    {
        var r = Kabsch.Rmsd(b, a);
        return r * Math.Sqrt(a.AtomCount);
    }

    private static void SameAtoms(Molecule reference, Molecule other, string what, string parameter)
    {
        if (other.AtomCount != reference.AtomCount)
            throw new ArgumentException($"{Cap(what)} has {other.AtomCount} atoms but the first frame has {reference.AtomCount}; every frame of a path is the same molecule.", parameter);
        for (var a = 0; a < reference.AtomCount; a++)
            if (other.Elements[a].AtomicNumber != reference.Elements[a].AtomicNumber)
                throw new ArgumentException(
                    $"Atom {a + 1} is {other.Elements[a].Symbol} in {what} but {reference.Elements[a].Symbol} in the first frame; every frame must list the same atoms in the same order.", parameter);
    }

    private static string Cap(string s) => s.Length == 0 ? s : char.ToUpperInvariant(s[0]) + s[1..];
}
