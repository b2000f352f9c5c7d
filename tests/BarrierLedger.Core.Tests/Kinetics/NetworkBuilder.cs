using BarrierLedger.Core.Kinetics;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Tests.Kinetics;

/// <summary>Short ways to write test networks: "A + 2 B" sides, levels in kcal/mol.</summary>
internal static class NetworkBuilder
{
    public const double Room = 298.15;

    public static IReadOnlyList<StepTerm> Side(string text) =>
        [.. text.Split('+', StringSplitOptions.TrimEntries | StringSplitOptions.RemoveEmptyEntries).Select(part =>
        {
            var bits = part.Split(' ', 2, StringSplitOptions.TrimEntries);
            return bits.Length == 2 && int.TryParse(bits[0], out var n) ? new StepTerm(bits[1], n) : new StepTerm(part);
        })];

    public static ElementaryStep Fixed(string label, string reactants, string products, double kf, double kr = 0) =>
        new(label, Side(reactants), Side(products), new FixedRates(kf, kr));

    public static ElementaryStep Eyring(string label, string reactants, string products, string from, string ts, string to, TunnellingModel? tunnelling = null) =>
        new(label, Side(reactants), Side(products), new EyringRates(from, ts, to, tunnelling));

    public static EnergyLevel Level(string key, double gibbsKcal, double? enthalpyKcal = null, double sigma = 0) =>
        new(key, Energy.FromKcalPerMol(gibbsKcal), enthalpyKcal is { } h ? Energy.FromKcalPerMol(h) : null, sigma);

    public static SimulationConditions At(double kelvin, double endSeconds, IReadOnlyList<double>? reports, params (string Species, double MolPerL)[] initial) =>
        new(initial.ToDictionary(x => x.Species, x => x.MolPerL), TemperatureProgram.Isothermal(kelvin), endSeconds, reports);

    /// <summary>Tight tolerances for the textbook checks (relative error ≤ 1e-6 asked).</summary>
    public static SimulationOptions Tight { get; } = new(RelativeTolerance: 1e-10, AbsoluteToleranceFraction: 1e-16);

    /// <summary>RT in kcal/mol.</summary>
    public static double RtKcal(double kelvin) => PhysicalConstants.GasConstantJoulePerMoleKelvin * kelvin / 4184.0;
}
