using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Vibrations;

namespace BarrierLedger.Cli;

/// <summary>
/// One calculation taken from any readable input: its geometry and whatever vibrational data it carries
/// (a Hessian, normal modes or bare frequencies), plus energy and level of theory when known.
/// </summary>
/// <param name="ReactionBonds">0-based atom pairs declared as the reaction coordinate (bundle saddle states); empty otherwise.</param>
public sealed record CalculationData(
    string Source,
    string Label,
    Molecule Molecule,
    CalculationKind? Kind,
    double? EnergyHartree,
    LevelOfTheory? LevelOfTheory,
    double[]? HessianHartreePerBohr2,
    IReadOnlyList<NormalMode>? Modes,
    IReadOnlyList<double>? FrequenciesCm1,
    IReadOnlyList<(int A, int B)> ReactionBonds)
{
    public bool HasVibrations => HessianHartreePerBohr2 is not null || Modes is { Count: > 0 } || FrequenciesCm1 is { Count: > 0 };

    /// <summary>The vibrational analysis: from the Hessian when there is one, else from modes, else from frequencies. Null when none.</summary>
    public VibrationalAnalysis? Analyse() =>
        HessianHartreePerBohr2 is { } h ? FrequencyAnalysis.FromHessian(Molecule, h)
        : Modes is { Count: > 0 } m ? FrequencyAnalysis.FromModes(Molecule, m)
        : FrequenciesCm1 is { Count: > 0 } f ? FrequencyAnalysis.FromFrequencies(Molecule, f)
        : null;
}

/// <summary>Picks the calculation a command works on from a loaded file.</summary>
public static class CalculationSource
{
    /// <summary>
    /// XYZ: the last frame. QCSchema: the result. Bundle: the calculation named by <paramref name="label"/>, or the only
    /// one with vibrational data. Returns null with a sentence saying what is missing.
    /// </summary>
    public static CalculationData? Pick(LoadedInput input, string? label, out string error)
    {
        error = "";
        var name = Path.GetFileName(input.Path);
        switch (input.Value)
        {
            case XyzDocument x:
                var f = x.Last;
                return new CalculationData(name, $"frame {x.Frames.Length}", f.Molecule, null, f.EnergyHartree, null, null, null, null, []);
            case QcSchemaResult q:
                return new CalculationData(name, q.Driver.ToString().ToLowerInvariant() + " result", q.Molecule, null, q.EnergyHartree, q.LevelOfTheory,
                    q.HessianHartreePerBohr2.IsDefaultOrEmpty ? null : [.. q.HessianHartreePerBohr2], null, null, []);
            case Bundle b:
                BundleCalculation? c;
                if (label is not null)
                {
                    c = b.Calculations.FirstOrDefault(k => k.Label == label);
                    if (c is null) { error = $"{name} has no calculation '{label}'; it has: {string.Join(", ", b.Calculations.Select(k => k.Label))}"; return null; }
                }
                else
                {
                    var withVib = b.Calculations.Where(k => k.Geometry is not null && (!k.HessianHartreePerBohr2.IsDefaultOrEmpty || !k.Modes.IsDefaultOrEmpty || !k.FrequenciesCm1.IsDefaultOrEmpty)).ToList();
                    if (withVib.Count != 1)
                    {
                        error = $"{name} has {withVib.Count} calculations with frequencies or a Hessian; name one with --calculation ({string.Join(", ", withVib.Select(k => k.Label))})";
                        return null;
                    }
                    c = withVib[0];
                }
                if (c.Geometry is null) { error = $"calculation '{c.Label}' in {name} has no geometry"; return null; }
                var bonds = b.Reactions.SelectMany(r => r.States).Where(s => s.Calculation == c.Label)
                    .SelectMany(s => s.ReactionCoordinate).Select(p => (p.First - 1, p.Second - 1)).Distinct().ToList();
                return new CalculationData(name, c.Label, c.Geometry, c.Kind, c.EnergyHartree, c.LevelOfTheory,
                    c.HessianHartreePerBohr2.IsDefaultOrEmpty ? null : [.. c.HessianHartreePerBohr2],
                    c.Modes.IsDefaultOrEmpty ? null : c.Modes, c.FrequenciesCm1.IsDefaultOrEmpty ? null : c.FrequenciesCm1, bonds);
            default:
                error = $"{name} holds no calculation (a {input.Format} file); expected XYZ, QCSchema or a bundle";
                return null;
        }
    }
}
