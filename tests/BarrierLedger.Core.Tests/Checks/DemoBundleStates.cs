using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Core.Tests.Formats;
using BarrierLedger.Core.Vibrations;

namespace BarrierLedger.Core.Tests.Checks;

/// <summary>The committed demo folder (seed-data/) read through the bundle reader, with each saddle point's neighbouring states as structures.</summary>
internal static class DemoBundleStates
{
    private static readonly Lazy<Bundle> s_bundle = new(() =>
    {
        var folder = RepoFiles.Path("seed-data");
        using var manifest = File.OpenRead(Path.Combine(folder, "bundle.json"));
        var result = BundleReader.Read(manifest, "bundle.json", openFile: p => File.OpenRead(Path.Combine(folder, p)));
        Assert.True(result.Succeeded, string.Join("\n", result.Issues));
        return result.Value!;
    });

    public static Bundle Bundle => s_bundle.Value;

    /// <summary>Every saddle-point state: reaction, state label, the saddle calculation, and the neighbouring minima without spectators.</summary>
    public static IEnumerable<(string Reaction, string State, BundleCalculation Saddle, StateStructure Before, StateStructure After)> Saddles()
    {
        foreach (var r in Bundle.Reactions)
            for (var i = 1; i < r.States.Length - 1; i++)
            {
                var s = r.States[i];
                if (s.Kind != StateKind.SaddlePoint) continue;
                var calc = Bundle.Calculations.Single(c => c.Label == s.Calculation);
                var spectators = s.Terms.Where(t => t.Species != calc.Species).ToList();
                yield return (r.Label, s.Label, calc, Structure(r.States[i - 1], spectators), Structure(r.States[i + 1], spectators));
            }
    }

    /// <summary>A minimum state's species with their optimised geometries, spectators taken out.</summary>
    public static StateStructure Structure(BundleState state, IReadOnlyList<BundleTerm> spectators)
    {
        var terms = state.Terms.ToDictionary(t => t.Species, t => t.Coefficient);
        foreach (var sp in spectators)
        {
            Assert.True(terms.TryGetValue(sp.Species, out var n) && n >= sp.Coefficient, $"spectator {sp.Species} missing from {state.Label}");
            terms[sp.Species] = n - sp.Coefficient;
        }
        return new StateStructure(state.Label, [.. terms.Where(t => t.Value > 0).Select(t => new StateSpecies(t.Key, GeometryOf(t.Key), t.Value))]);
    }

    public static Core.Geometry.Molecule GeometryOf(string species) =>
        Bundle.Calculations.First(c => c.Species == species && c.Kind != CalculationKind.SinglePoint && c.Geometry is not null).Geometry!;

    /// <summary>The saddle calculation's significant imaginary mode (from its Hessian).</summary>
    public static NormalMode ImaginaryMode(BundleCalculation saddle) =>
        FrequencyAnalysis.FromHessian(saddle.Geometry!, [.. saddle.HessianHartreePerBohr2]).Modes.OrderBy(m => m.FrequencyCm1).First();
}
