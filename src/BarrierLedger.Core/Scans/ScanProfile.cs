using System.Collections.Immutable;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Scans;

/// <summary>Stable codes of scan flags (stored and compared; the messages may be reworded).</summary>
public static class ScanFlagCodes
{
    /// <summary>The optimisation at this point did not converge; the point is left out of the spline.</summary>
    public const string NotConverged = "scan.not-converged";
    /// <summary>The energy departs from what the neighbouring points predict by more than the threshold.</summary>
    public const string Jump = "scan.jump";
    /// <summary>The coordinate step to this point is far larger or smaller than the scan's typical step.</summary>
    public const string IrregularStep = "scan.irregular-step";
    /// <summary>A bond other than the scanned one appears or vanishes between this point and the previous one.</summary>
    public const string BondChange = "scan.bond-change";
    /// <summary>The profile has no interior maximum (it rises or falls to an end of the scan).</summary>
    public const string NoInteriorMaximum = "scan.no-interior-maximum";
    /// <summary>Fewer than two converged points: nothing can be interpolated.</summary>
    public const string TooFewPoints = "scan.too-few-points";
}

/// <summary>A flagged scan point: a stable code, the 0-based point index (in input order) and a sentence for the user.</summary>
public sealed record ScanFlag(string Code, int PointIndex, string Message);

/// <summary>One sample of the interpolated profile, for plotting.</summary>
public sealed record ScanSample(double Coordinate, Energy Energy);

/// <summary>A local maximum of the interpolated profile.</summary>
/// <param name="Coordinate">Interpolated coordinate of the maximum (Å or degrees).</param>
/// <param name="Energy">Interpolated electronic energy at the maximum.</param>
/// <param name="NearestPointIndex">0-based input index of the converged point nearest to the maximum.</param>
public sealed record ScanMaximum(double Coordinate, Energy Energy, int NearestPointIndex);

/// <summary>Bonds that appear (Formed) or vanish (Broken) between two neighbouring converged frames, other than the scanned pair.</summary>
public sealed record ScanBondChange(int FromPointIndex, int ToPointIndex, ImmutableArray<Bond> Formed, ImmutableArray<Bond> Broken, string Message);

/// <summary>
/// The analysed relaxed scan.
/// </summary>
/// <param name="Coordinate">The scanned coordinate, when known.</param>
/// <param name="Points">The points as given.</param>
/// <param name="Interpolation">Which interpolant was used: "Akima", "natural cubic" or "linear" (see <see cref="ScanAnalysis"/>).</param>
/// <param name="Samples">The interpolated profile over the converged points' range, ascending in coordinate.</param>
/// <param name="Maxima">Interior local maxima of the interpolant, ascending in coordinate.</param>
/// <param name="HighestMaximum">The highest of <see cref="Maxima"/>, or null when there is none.</param>
/// <param name="BarrierFromFirst">Highest maximum minus the first converged point (in scan order), or null.</param>
/// <param name="BarrierFromLowestBefore">Highest maximum minus the lowest converged point before it in scan order, or null.</param>
/// <param name="LowestBeforeIndex">0-based index of that lowest point, or null.</param>
/// <param name="TypicalStep">Median |Δ coordinate| between neighbouring points (Å or degrees).</param>
/// <param name="Flags">Every flagged point with code and sentence.</param>
/// <param name="BondChanges">Bond changes between neighbouring frames that carry geometries.</param>
public sealed record ScanProfile(
    ScanCoordinate? Coordinate,
    ImmutableArray<ScanPoint> Points,
    string Interpolation,
    ImmutableArray<ScanSample> Samples,
    ImmutableArray<ScanMaximum> Maxima,
    ScanMaximum? HighestMaximum,
    Energy? BarrierFromFirst,
    Energy? BarrierFromLowestBefore,
    int? LowestBeforeIndex,
    double TypicalStep,
    ImmutableArray<ScanFlag> Flags,
    ImmutableArray<ScanBondChange> BondChanges)
{
    /// <summary>The unit of the coordinate ("Å" or "°"); "Å" when the coordinate is not known.</summary>
    public string Unit => Coordinate?.Unit ?? "Å";
}

/// <summary>
/// Settings for <see cref="ScanAnalysis.Analyze"/>.
/// </summary>
/// <param name="JumpThresholdKcalPerMol">
/// A point is flagged as a jump when its energy differs by more than this from the value its neighbours predict
/// (a cubic through up to two converged neighbours on each side, the point itself left out). Default 2 kcal/mol:
/// common practice, no source — twice the 1 kcal/mol usually called chemical accuracy, so that loose-optimisation noise
/// (a few tenths of a kcal/mol) and the curvature of a smooth profile sampled at ordinary steps (far below 1 kcal/mol
/// for a cubic predictor) pass, while a rearrangement of the chemical model (several kcal/mol) does not.
/// </param>
/// <param name="IrregularStepFactor">
/// A step larger than this factor times the median step, or smaller than the median divided by it, is flagged.
/// Default 2.5: common practice, no source (a scan is normally run at one fixed step).
/// </param>
/// <param name="SamplesPerInterval">Interpolated samples per interval between neighbouring points, for plotting.</param>
/// <param name="Connectivity">How bonds are found when comparing neighbouring frames.</param>
public sealed record ScanOptions(
    double JumpThresholdKcalPerMol = 2.0,
    double IrregularStepFactor = 2.5,
    int SamplesPerInterval = 20,
    ConnectivityOptions? Connectivity = null)
{
    public static ScanOptions Default { get; } = new();
}
