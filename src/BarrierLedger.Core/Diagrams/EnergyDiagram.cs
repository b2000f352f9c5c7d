using System.Globalization;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Diagrams;

/// <summary>One state of a pathway as drawn: its label, its energy relative to the reference state, and whether it is a saddle point.</summary>
/// <param name="Label">As the group writes it ("A + B", "TS1", "INT1").</param>
/// <param name="Relative">Energy relative to the first state (or another reference).</param>
/// <param name="IsSaddle">Saddle points are drawn as levels too, and marked as such.</param>
public sealed record DiagramState(string Label, Energy Relative, bool IsSaddle);

/// <summary>A horizontal level of the diagram, in diagram coordinates (x: state slots, y: the chosen unit).</summary>
public sealed record DiagramLevel(int Index, string Label, double X0, double X1, double Y, bool IsSaddle, string ValueText)
{
    public double XCentre => (X0 + X1) / 2;
}

/// <summary>A thin dashed line joining the right end of one level to the left end of the next.</summary>
public sealed record DiagramConnector(double X0, double Y0, double X1, double Y1);

/// <summary>
/// Everything needed to draw an energy diagram, shared by the dashboard (Plotly) and the exported SVG/PNG,
/// so the screen and the manuscript figure look the same.
/// </summary>
public sealed record EnergyDiagramLayout(
    IReadOnlyList<DiagramLevel> Levels,
    IReadOnlyList<DiagramConnector> Connectors,
    double YMin,
    double YMax,
    string YAxisTitle,
    EnergyUnit Unit);

/// <summary>Lays out a reaction-energy diagram: state i occupies slot i; a level spans <c>levelWidth</c> of its slot.</summary>
public static class EnergyDiagram
{
    /// <summary>
    /// Builds the layout. <paramref name="quantity"/> names what is plotted ("ΔG", "ΔH", "ΔE"); the axis title becomes
    /// e.g. "ΔG (kcal/mol)". Values are formatted with <paramref name="decimals"/> decimals and a true minus sign.
    /// The y range is padded by 12 % of the span (at least 1 unit) so labels above and below levels fit.
    /// </summary>
    public static EnergyDiagramLayout Layout(
        IReadOnlyList<DiagramState> states, string quantity, EnergyUnit unit, int decimals = 1, double levelWidth = 0.6)
    {
        ArgumentNullException.ThrowIfNull(states);
        if (states.Count == 0) throw new ArgumentException("A diagram needs at least one state.", nameof(states));
        if (levelWidth is <= 0 or > 1) throw new ArgumentException("The level width is a fraction of a slot, in (0, 1].", nameof(levelWidth));
        if (decimals is < 0 or > 6) throw new ArgumentException("Between 0 and 6 decimals.", nameof(decimals));

        var levels = new List<DiagramLevel>(states.Count);
        for (var i = 0; i < states.Count; i++)
        {
            var y = states[i].Relative.In(unit);
            if (!double.IsFinite(y)) throw new ArgumentException($"State '{states[i].Label}' has no finite energy.", nameof(states));
            levels.Add(new DiagramLevel(i, states[i].Label, i - levelWidth / 2, i + levelWidth / 2, y, states[i].IsSaddle, FormatValue(y, decimals)));
        }
        var connectors = new List<DiagramConnector>(Math.Max(0, states.Count - 1));
        for (var i = 0; i + 1 < levels.Count; i++)
            connectors.Add(new DiagramConnector(levels[i].X1, levels[i].Y, levels[i + 1].X0, levels[i + 1].Y));

        var min = levels.Min(l => l.Y);
        var max = levels.Max(l => l.Y);
        var pad = Math.Max(0.12 * (max - min), 1.0 / Energy.FactorFromHartree(EnergyUnit.KcalPerMol) * Energy.FactorFromHartree(unit));
        return new EnergyDiagramLayout(levels, connectors, min - pad, max + pad, $"{quantity} ({Energy.Symbol(unit)})", unit);
    }

    /// <summary>Formats a value as printed in a figure: fixed decimals, "−" (U+2212) for negatives, no "−0.0".</summary>
    public static string FormatValue(double value, int decimals)
    {
        var rounded = Math.Round(value, decimals, MidpointRounding.AwayFromZero);
        if (rounded == 0) rounded = 0; // drops the sign of −0
        var text = Math.Abs(rounded).ToString("F" + decimals.ToString(CultureInfo.InvariantCulture), CultureInfo.InvariantCulture);
        return rounded < 0 ? "\u2212" + text : text;
    }
}
