using BarrierLedger.Core.Diagrams;
using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Tests.Diagrams;

public class EnergyDiagramTests
{
    private static readonly DiagramState[] s_pathway =
    [
        new("A + B", Energy.Zero, false),
        new("TS1", Energy.FromKcalPerMol(24.64), true),
        new("INT1", Energy.FromKcalPerMol(-5.25), false),
        new("TS2", Energy.FromKcalPerMol(12.0), true),
        new("P", Energy.FromKcalPerMol(-18.04), false),
    ];

    [Fact]
    public void Layout_PutsEachStateInItsSlot_AndJoinsNeighbours()
    {
        var layout = EnergyDiagram.Layout(s_pathway, "ΔG", EnergyUnit.KcalPerMol);

        Assert.Equal(5, layout.Levels.Count);
        Assert.Equal(4, layout.Connectors.Count);
        for (var i = 0; i < 5; i++)
        {
            Assert.Equal(i, layout.Levels[i].XCentre, 12);
            Assert.Equal(0.6, layout.Levels[i].X1 - layout.Levels[i].X0, 12);
        }
        // Each connector runs from the right end of a level to the left end of the next, at their heights.
        for (var i = 0; i < 4; i++)
        {
            Assert.Equal(layout.Levels[i].X1, layout.Connectors[i].X0);
            Assert.Equal(layout.Levels[i].Y, layout.Connectors[i].Y0);
            Assert.Equal(layout.Levels[i + 1].X0, layout.Connectors[i].X1);
            Assert.Equal(layout.Levels[i + 1].Y, layout.Connectors[i].Y1);
        }
        Assert.Equal("ΔG (kcal/mol)", layout.YAxisTitle);
        Assert.True(layout.Levels[1].IsSaddle && !layout.Levels[2].IsSaddle);
    }

    [Fact]
    public void Layout_ConvertsUnits_WithCodataFactor()
    {
        // 24.64 kcal/mol × 4.184 kJ/kcal = 103.09376 kJ/mol (thermochemical calorie, exact by definition).
        var layout = EnergyDiagram.Layout(s_pathway, "ΔG", EnergyUnit.KJPerMol);
        Close.Absolute(103.09376, layout.Levels[1].Y, 1e-9, "TS1 in kJ/mol", "1 cal = 4.184 J (thermochemical calorie)");
        Assert.Equal("103.1", layout.Levels[1].ValueText);
    }

    [Theory]
    [InlineData(-5.25, 1, "\u22125.3")] // half away from zero, as tables round
    [InlineData(-0.04, 1, "0.0")]       // never "−0.0"
    [InlineData(24.64, 1, "24.6")]
    [InlineData(12.0, 2, "12.00")]
    public void FormatValue_UsesTrueMinusAndFixedDecimals(double value, int decimals, string expected) =>
        Assert.Equal(expected, EnergyDiagram.FormatValue(value, decimals));

    [Fact]
    public void Layout_PadsTheRange_SoLabelsFit()
    {
        var layout = EnergyDiagram.Layout(s_pathway, "ΔG", EnergyUnit.KcalPerMol);
        var span = 24.64 + 18.04;
        Close.Absolute(-18.04 - 0.12 * span, layout.YMin, 1e-9, "lower bound", "12 % padding (design choice)");
        Close.Absolute(24.64 + 0.12 * span, layout.YMax, 1e-9, "upper bound", "12 % padding (design choice)");
    }

    [Fact]
    public void Layout_RefusesEmptyOrNonFiniteInput()
    {
        Assert.Throws<ArgumentException>(() => EnergyDiagram.Layout([], "ΔG", EnergyUnit.KcalPerMol));
        Assert.Throws<ArgumentException>(() => EnergyDiagram.Layout([new DiagramState("X", new Energy(double.NaN), false)], "ΔG", EnergyUnit.KcalPerMol));
    }
}
