using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Scans;

namespace BarrierLedger.Demo;

/// <summary>One generated file: its path relative to the output folder ('/' separators) and its text (UTF-8, '\n' line ends).</summary>
public sealed record DemoFile(string RelativePath, string Content);

/// <summary>
/// A species of a demo study with its one structure calculation (optimisation plus Hessian at the geometry level) and,
/// optionally, a single point at another level. Several entries with the same <see cref="Label"/> and each its own
/// <see cref="Conformer"/> are the conformers of one species, in the order listed; a saddle-point state names the first.
/// </summary>
/// <param name="Label">Unique label in the study.</param>
/// <param name="Slug">File-name stem (lower case, no spaces).</param>
/// <param name="Geometry">Structure in Å with charge and multiplicity.</param>
/// <param name="Kind">Minimum or saddle point (a lone atom is a minimum without a Hessian).</param>
/// <param name="ForceField">What the force field should produce; null for a lone atom.</param>
/// <param name="OptEnergyHartree">Electronic energy at the geometry level.</param>
/// <param name="SinglePointEnergyHartree">Electronic energy of the single point, or null for none.</param>
/// <param name="SinglePointLevel">Level of the single point.</param>
/// <param name="Note">Free text kept with the calculations.</param>
/// <param name="GeometryLevel">Level of the optimisation and Hessian when it is not the study's.</param>
/// <param name="Conformer">Conformer label when the species has several conformers, else null.</param>
/// <param name="Frequencies">False: the optimisation has no Hessian yet (written as extended XYZ with its energy).</param>
public sealed record DemoSpecies(
    string Label,
    string Slug,
    Molecule Geometry,
    CalculationKind Kind,
    ForceFieldSpec? ForceField,
    double OptEnergyHartree,
    double? SinglePointEnergyHartree,
    string SinglePointLevel,
    string Note = "",
    string? GeometryLevel = null,
    string? Conformer = null,
    bool Frequencies = true);

/// <summary>One state of a demo pathway: a sum of species; saddle-point states name their species and reaction bonds (1-based).</summary>
public sealed record DemoState(string Label, bool IsSaddlePoint, IReadOnlyList<(string Species, int Coefficient)> Terms, IReadOnlyList<(int First, int Second)> ReactionCoordinate)
{
    public static DemoState Minimum(string label, params string[] species) =>
        new(label, false, [.. species.GroupBy(s => s).Select(g => (g.Key, g.Count()))], []);

    public static DemoState Saddle(string label, string species, string[] spectators, params (int, int)[] reactionCoordinate) =>
        new(label, true, [(species, 1), .. spectators.Select(s => (s, 1))], reactionCoordinate);
}

/// <summary>A reaction: ordered states.</summary>
/// <summary>A demo reaction; <paramref name="RunKelvin"/> and <paramref name="RunHours"/> are the conditions its definition proposes for a kinetics run.</summary>
public sealed record DemoReaction(string Label, string Description, IReadOnlyList<DemoState> States, double? RunKelvin = null, double? RunHours = null);

/// <summary>A relaxed scan of one species, with a geometry per point (written as multi-frame extended XYZ).</summary>
public sealed record DemoScan(string Label, string Slug, string Species, string Level, ScanCoordinateKind Kind, IReadOnlyList<int> Atoms1Based, IReadOnlyList<ScanPoint> Points);

/// <summary>An IRC path of one saddle-point species: frames in path order, each with its energy (written as multi-frame extended XYZ).</summary>
public sealed record DemoIrc(string Label, string Slug, string Saddle, string Level, IReadOnlyList<(Molecule Geometry, double EnergyHartree)> Frames);

/// <summary>A whole demo study, ready to be written as a bundle.</summary>
public sealed record DemoStudy(
    string Name,
    string Description,
    string GeometryLevel,
    IReadOnlyList<DemoSpecies> Species,
    IReadOnlyList<DemoReaction> Reactions,
    IReadOnlyList<DemoScan> Scans,
    IReadOnlyList<DemoIrc>? Ircs = null);
