using System.Collections.Immutable;
using System.Globalization;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Scans;
using BarrierLedger.Core.Vibrations;

namespace BarrierLedger.Core.Checks;

/// <summary>Stable codes of the saddle-point frequency check.</summary>
public static class SaddleCheckCodes
{
    public const string NoImaginaryMode = "saddle.no-imaginary-mode";
    public const string NoSignificantImaginaryMode = "saddle.no-significant-imaginary-mode";
    public const string SeveralSignificantImaginaryModes = "saddle.several-significant-imaginary-modes";
    public const string ModeMissesReactionBond = "saddle.mode-misses-reaction-bond";
    public const string ReactionMode = "saddle.reaction-mode";
    public const string SoftImaginaryMode = "saddle.soft-imaginary-mode";
    public const string NoReactionBondDeclared = "saddle.no-reaction-bond-declared";
    public const string FarFromScanMaximum = "saddle.far-from-scan-maximum";
    public const string NearScanMaximum = "saddle.near-scan-maximum";
    public const string ScanWithoutMaximum = "saddle.scan-without-maximum";
    public const string ScanCoordinateUnknown = "saddle.scan-coordinate-unknown";
    public const string ModeCharacterUnknown = "saddle.mode-character-unknown";
}

/// <summary>
/// What the saddle-point check looks at.
/// </summary>
/// <param name="Geometry">The optimised saddle-point geometry.</param>
/// <param name="Modes">Its normal modes (any order; imaginary modes have negative wavenumbers).</param>
/// <param name="ReactionBonds">0-based atom pairs that form or break at this saddle point (may be empty: then the check says so).</param>
/// <param name="Scan">A relaxed scan along the reaction, if there is one.</param>
public sealed record SaddleCheckInput(
    Molecule Geometry,
    IReadOnlyList<NormalMode> Modes,
    IReadOnlyList<(int A, int B)>? ReactionBonds = null,
    ScanProfile? Scan = null)
{
    /// <summary>
    /// The input from a Cartesian Hessian (row-major 3N×3N, hartree/bohr²): the modes come from
    /// <see cref="FrequencyAnalysis.FromHessian"/> (translations and rotations projected out). Throws
    /// <see cref="HessianException"/> when the Hessian is malformed.
    /// </summary>
    public static SaddleCheckInput FromHessian(
        Molecule geometry, double[] hessianHartreePerBohr2, IReadOnlyList<(int A, int B)>? reactionBonds = null,
        ScanProfile? scan = null, HessianOptions? hessianOptions = null) =>
        new(geometry, FrequencyAnalysis.FromHessian(geometry, hessianHartreePerBohr2, hessianOptions).Modes, reactionBonds, scan);
}

/// <summary>
/// Settings of the saddle-point check.
/// </summary>
/// <param name="SignificantImaginaryCm1">
/// An imaginary mode with |ν̃| at or above this is significant; below it, soft. Default 100 cm⁻¹. The rule that small
/// imaginary modes (a methyl-like rotor, loose convergence) are reported and may be accepted after inspection, while a
/// saddle point needs exactly one significant one, is common practice, no source.
/// </param>
/// <param name="LeadingComponentCount">How many of the mode's largest components count as leading.</param>
/// <param name="LeadingMinimumRelativeShare">
/// A leading component must also carry at least this fraction of the largest component's share. Relative, not absolute,
/// because shares are normalised over every internal coordinate: in a large molecule the many small bends dilute every share,
/// but not the ratio to the largest. Default 0.25: common practice, no source.
/// </param>
/// <param name="ScanStepTolerance">The saddle geometry's scanned coordinate may lie this many typical scan steps from the scan maximum.</param>
/// <param name="ModeCharacter">Settings for describing modes.</param>
public sealed record SaddleCheckOptions(
    double SignificantImaginaryCm1 = 100.0,
    int LeadingComponentCount = 3,
    double LeadingMinimumRelativeShare = 0.25,
    double ScanStepTolerance = 1.0,
    ModeCharacterOptions? ModeCharacter = null)
{
    public static SaddleCheckOptions Default { get; } = new();
}

/// <summary>An imaginary mode with what it does (class <see cref="ModeClass.Unknown"/> when the mode came without displacements).</summary>
public sealed record SoftMode(NormalMode Mode, ModeCharacterResult Character);

/// <summary>The saddle geometry's scanned coordinate against the scan's maximum.</summary>
/// <param name="SaddleCoordinate">The scanned coordinate measured on the saddle geometry (Å or degrees).</param>
/// <param name="ScanMaximumCoordinate">The interpolated coordinate of the scan's highest maximum.</param>
/// <param name="TypicalStep">The scan's median step.</param>
/// <param name="DistanceInSteps">|difference| / typical step.</param>
/// <param name="Unit">"Å" or "°".</param>
public sealed record ScanComparison(double SaddleCoordinate, double ScanMaximumCoordinate, double TypicalStep, double DistanceInSteps, string Unit);

/// <summary>The verdict of the saddle-point check with its reasons and evidence.</summary>
/// <param name="Verdict">Passed, Needs attention or Failed.</param>
/// <param name="Reasons">Every reason, failures first; each has a stable code and a sentence.</param>
/// <param name="SignificantMode">The one significant imaginary mode, when there is exactly one.</param>
/// <param name="SignificantCharacter">Its character, when there is exactly one.</param>
/// <param name="SignificantModes">All significant imaginary modes with their character.</param>
/// <param name="SoftModes">Imaginary modes below the threshold with their character.</param>
/// <param name="Scan">The scan comparison, when a scan with a maximum and a known coordinate was given.</param>
public sealed record SaddleCheckResult(
    Verdict Verdict,
    IReadOnlyList<CheckReason> Reasons,
    NormalMode? SignificantMode,
    ModeCharacterResult? SignificantCharacter,
    IReadOnlyList<SoftMode> SignificantModes,
    IReadOnlyList<SoftMode> SoftModes,
    ScanComparison? Scan)
{
    /// <summary>"Verdict: Needs attention" followed by one "- [code] message" line per reason.</summary>
    public string Report() => CheckReport.Format(Verdict, Reasons);
}

/// <summary>Plain-text rendering of a verdict and its reasons (for the command line and logs).</summary>
public static class CheckReport
{
    public static string Format(Verdict verdict, IEnumerable<CheckReason> reasons) =>
        $"Verdict: {VerdictText.Of(verdict)}" + string.Concat(reasons.Select(r => $"{Environment.NewLine}  - [{r.Code}] {r.Message}"));
}

/// <summary>
/// The saddle-point frequency check. Failed: no imaginary mode; no significant one; two or more significant ones; or the
/// significant mode does not move any declared reaction bond among its leading components. Needs attention: soft imaginary
/// modes (each named with its character); no reaction bond declared; the saddle geometry's scanned coordinate more than
/// <see cref="SaddleCheckOptions.ScanStepTolerance"/> typical steps from the scan maximum. Passed otherwise.
/// Thresholds are in <see cref="SaddleCheckOptions"/>; the soft-mode rule is common practice, no source.
/// </summary>
public static class SaddleCheck
{
    public static SaddleCheckResult Run(SaddleCheckInput input, SaddleCheckOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(input);
        ArgumentNullException.ThrowIfNull(input.Geometry);
        ArgumentNullException.ThrowIfNull(input.Modes);
        var o = options ?? SaddleCheckOptions.Default;
        if (!(o.SignificantImaginaryCm1 > 0)) throw new ArgumentException("The significance threshold must be positive.", nameof(options));
        var mol = input.Geometry;
        var bonds = input.ReactionBonds ?? [];
        var reasons = new List<CheckReason>();
        var thr = o.SignificantImaginaryCm1;

        var imaginary = input.Modes.Where(m => m.IsImaginary).OrderBy(m => m.FrequencyCm1).ToList();
        ModeCharacterResult Describe(NormalMode m) =>
            m.DisplacementCartesian.IsDefaultOrEmpty ? ModeCharacter.Unknown(m) : ModeCharacter.Describe(mol, m, bonds, o.ModeCharacter);
        var significant = imaginary.Where(m => Math.Abs(m.FrequencyCm1) >= thr).Select(m => new SoftMode(m, Describe(m))).ToList();
        var soft = imaginary.Where(m => Math.Abs(m.FrequencyCm1) < thr).Select(m => new SoftMode(m, Describe(m))).ToList();
        if (imaginary.Any(m => m.DisplacementCartesian.IsDefaultOrEmpty))
            reasons.Add(new(SaddleCheckCodes.ModeCharacterUnknown, CheckSeverity.Attention,
                "Only wavenumbers were given, without the modes' displacements, so what the imaginary modes move cannot be checked. " +
                "Provide the normal modes or the Hessian."));

        if (imaginary.Count == 0)
        {
            reasons.Add(new(SaddleCheckCodes.NoImaginaryMode, CheckSeverity.Failure,
                "There is no imaginary frequency, so this structure is a minimum (or a flat region), not a saddle point; its energy is not a barrier. " +
                "Search for the saddle point again, for example from the highest point of a relaxed scan."));
        }
        else if (significant.Count == 0)
        {
            reasons.Add(new(SaddleCheckCodes.NoSignificantImaginaryMode, CheckSeverity.Failure,
                $"The only imaginary frequencies are small ({string.Join(", ", soft.Select(s => Wave(s.Mode)))}, all below the {Num(thr)}i cm⁻¹ threshold): " +
                "no mode carries a reaction. This is most likely a minimum with loose convergence, not a saddle point."));
        }
        else if (significant.Count > 1)
        {
            reasons.Add(new(SaddleCheckCodes.SeveralSignificantImaginaryModes, CheckSeverity.Failure,
                $"There are {significant.Count} significant imaginary frequencies ({string.Join("; ", significant.Select(s => $"{Wave(s.Mode)}: {Summary(s)}"))}). " +
                "A saddle point for one reaction step has exactly one; follow the unwanted mode down and optimise again."));
        }

        ModeCharacterResult? character = null;
        if (significant.Count == 1)
        {
            character = significant[0].Character;
            reasons.Add(new(SaddleCheckCodes.ReactionMode, CheckSeverity.Info,
                $"One significant imaginary frequency, {Wave(significant[0].Mode)}: {Summary(significant[0])}."));
            if (bonds.Count == 0)
            {
                reasons.Add(new(SaddleCheckCodes.NoReactionBondDeclared, CheckSeverity.Attention,
                    "No reaction bond is declared, so nobody has checked that the imaginary mode is the intended reaction. " +
                    "Declare the atom pairs that form or break (e.g. C3–C11) on the reaction."));
            }
            else if (character.Class != ModeClass.Unknown)
            {
                var top = character.Components.IsEmpty ? 0 : character.Components[0].Share;
                var leading = character.Leading(o.LeadingComponentCount).Where(c => c.Share >= o.LeadingMinimumRelativeShare * top).ToList();
                if (!leading.Any(c => c.IsReactionBond))
                {
                    var declared = string.Join(", ", bonds.Select(b => new Bond(b.A, b.B).Label(mol)));
                    reasons.Add(new(SaddleCheckCodes.ModeMissesReactionBond, CheckSeverity.Failure,
                        $"The imaginary mode {Wave(significant[0].Mode)} mainly moves {string.Join(", ", leading.Select(c => c.Label))}; " +
                        $"none of the declared forming/breaking bonds ({declared}) is among its leading motions. This saddle point belongs to a different " +
                        "motion than the reaction, or the forming/breaking bonds are declared wrongly." + DistanceSentence(character)));
                }
            }
        }

        foreach (var s in soft.Where(_ => significant.Count > 0))
        {
            reasons.Add(new(SaddleCheckCodes.SoftImaginaryMode, CheckSeverity.Attention,
                $"A small imaginary frequency, {Wave(s.Mode)} (below the {Num(thr)}i cm⁻¹ threshold): {Summary(s)}. " +
                (s.Character is { RotorLike: true }
                    ? "A terminal group turning like this is common and often acceptable after inspection; a tighter optimisation or a finer integration grid usually removes it."
                    : s.Character is { Class: ModeClass.NumericalNoise }
                        ? "This looks like numerical noise from loose convergence; tighten the optimisation and recompute the frequencies."
                        : "Inspect it: it may be loose convergence, or a second reaction path; displacing along it and reoptimising tells which.")));
        }

        ScanComparison? comparison = null;
        if (input.Scan is { } scan)
        {
            if (scan.Coordinate is null)
            {
                reasons.Add(new(SaddleCheckCodes.ScanCoordinateUnknown, CheckSeverity.Attention,
                    "A scan was given without its coordinate's atoms, so the saddle geometry cannot be placed on it."));
            }
            else if (scan.HighestMaximum is null)
            {
                reasons.Add(new(SaddleCheckCodes.ScanWithoutMaximum, CheckSeverity.Attention,
                    "The relaxed scan has no maximum inside its range, so it does not confirm where the saddle point lies."));
            }
            else
            {
                var c = scan.Coordinate;
                if (c.Atoms.Any(a => a < 0 || a >= mol.AtomCount))
                    throw new ArgumentException($"The scan coordinate names atoms beyond the saddle geometry's {mol.AtomCount} atoms.", nameof(input));
                var q = new InternalCoordinate(c.Kind switch
                {
                    ScanCoordinateKind.Distance => InternalKind.Stretch,
                    ScanCoordinateKind.Angle => InternalKind.Bend,
                    _ => InternalKind.Torsion,
                }, [.. c.Atoms]);
                var value = q.ValueAt(mol.PositionsAngstrom);
                var diff = value - scan.HighestMaximum.Coordinate;
                if (c.Kind == ScanCoordinateKind.Dihedral) diff = InternalCoordinates.WrapDegrees(diff);
                var steps = Math.Abs(diff) / scan.TypicalStep;
                comparison = new ScanComparison(value, scan.HighestMaximum.Coordinate, scan.TypicalStep, steps, c.Unit);
                var where = $"the saddle geometry has {Num(value, "0.000")} {c.Unit}, the scan maximum lies at {Num(scan.HighestMaximum.Coordinate, "0.000")} {c.Unit} " +
                            $"({Num(steps, "0.0")} scan steps of {Num(scan.TypicalStep, "0.000")} {c.Unit} away)";
                reasons.Add(steps > o.ScanStepTolerance
                    ? new(SaddleCheckCodes.FarFromScanMaximum, CheckSeverity.Attention,
                        $"Along the scanned coordinate {where}. The optimised saddle point may belong to a different path than the scan; compare the two geometries.")
                    : new(SaddleCheckCodes.NearScanMaximum, CheckSeverity.Info, $"Along the scanned coordinate {where}, as expected."));
            }
        }

        var ordered = reasons.OrderByDescending(r => r.Severity).ToList();
        return new SaddleCheckResult(CheckReason.VerdictOf(ordered), ordered,
            significant.Count == 1 ? significant[0].Mode : null, character, significant, soft, comparison);
    }

    private static string Summary(SoftMode s) => s.Character.Summary;

    /// <summary>" The distances that change most are …" naming the leading pairs (long contacts included), or "".</summary>
    private static string DistanceSentence(ModeCharacterResult character)
    {
        var leading = DistanceChanges.Leading(character.DistanceChanges).ToList();
        return leading.Count == 0 ? "" : $" The interatomic distances that change most along it: {string.Join("; ", leading.Select(c => c.Describe()))}.";
    }

    private static string Wave(NormalMode m) =>
        m.IsImaginary ? $"{Num(Math.Abs(m.FrequencyCm1))}i cm⁻¹" : $"{Num(m.FrequencyCm1)} cm⁻¹";

    private static string Num(double x, string format = "0") => x.ToString(format, CultureInfo.InvariantCulture);
}
