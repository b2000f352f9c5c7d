using System.Globalization;
using System.Xml.Linq;
using BarrierLedger.Core.Diagrams;
using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Tests.Diagrams;

public class SvgEnergyDiagramTests
{
    private static readonly XNamespace s_svg = "http://www.w3.org/2000/svg";

    private static readonly DiagramState[] s_pathway =
    [
        new("A + B", Energy.Zero, false),
        new("TS1", Energy.FromKcalPerMol(24.64), true),
        new("INT1", Energy.FromKcalPerMol(-5.25), false),
        new("TS2", Energy.FromKcalPerMol(12.0), true),
        new("P & Q <x>", Energy.FromKcalPerMol(-18.04), false),
    ];

    private static DiagramText Text(IReadOnlyDictionary<int, string>? marks = null, IReadOnlyList<string>? notes = null) => new(
        "R1: ring closure",
        ["Level of theory: B/x//C/y", "T = 298.15 K; standard state 1 mol/L; quasi-RRHO; ΔG in kcal/mol"],
        marks ?? new Dictionary<int, string>(),
        notes ?? [],
        "Caution sentence for the test.");

    private static XDocument Svg(IReadOnlyDictionary<int, string>? marks = null, IReadOnlyList<string>? notes = null) =>
        XDocument.Parse(SvgEnergyDiagram.ToSvg(EnergyDiagram.Layout(s_pathway, "ΔG", EnergyUnit.KcalPerMol), Text(marks, notes)));

    private static double Attr(XElement e, string name) => double.Parse(e.Attribute(name)!.Value, CultureInfo.InvariantCulture);

    [Fact]
    public void ToSvg_IsWellFormedXml_WithEscapedLabels()
    {
        var doc = Svg();
        Assert.Equal(s_svg + "svg", doc.Root!.Name);
        var texts = doc.Descendants(s_svg + "text").Select(t => t.Value).ToList();
        Assert.Contains("P & Q <x>", texts);
    }

    [Fact]
    public void ToSvg_DrawsOneLevelPerState_InTheScreenColours()
    {
        var levels = Svg().Descendants(s_svg + "line").Where(l => (string?)l.Attribute("class") == "level").ToList();
        Assert.Equal(5, levels.Count);
        Assert.Equal(
            [DiagramStyle.MinimumColour, DiagramStyle.SaddleColour, DiagramStyle.MinimumColour, DiagramStyle.SaddleColour, DiagramStyle.MinimumColour],
            levels.Select(l => (string)l.Attribute("stroke")!));
        Assert.All(levels, l => Assert.Equal(4, Attr(l, "stroke-width")));
        var connectors = Svg().Descendants(s_svg + "line").Where(l => (string?)l.Attribute("class") == "connector").ToList();
        Assert.Equal(4, connectors.Count);
        Assert.All(connectors, c => Assert.NotNull(c.Attribute("stroke-dasharray")));
    }

    [Fact]
    public void ToSvg_LevelHeights_AreLinearInEnergy()
    {
        var ys = Svg().Descendants(s_svg + "line").Where(l => (string?)l.Attribute("class") == "level").Select(l => Attr(l, "y1")).ToList();
        // Pixel gaps must be proportional to energy gaps (independent arithmetic on the input values; SVG numbers have 2 decimals).
        var perKcal = (ys[0] - ys[1]) / 24.64;
        Assert.True(perKcal > 0, "higher energy is drawn higher (smaller y)");
        Close.Absolute(ys[0] + 5.25 * perKcal, ys[2], 0.02, "INT1 level y", "linear map of the input energies, common practice, no source");
        Close.Absolute(ys[0] + 18.04 * perKcal, ys[4], 0.02, "P level y", "linear map of the input energies, common practice, no source");
    }

    [Fact]
    public void ToSvg_PutsLabelAboveValue_AndStatesModelAndCaution()
    {
        var doc = Svg(new Dictionary<int, string> { [1] = "a" }, ["[a] TS1 is not verified: awaiting review."]);
        var texts = doc.Descendants(s_svg + "text").ToList();
        var label = texts.Single(t => t.Value == "TS1 [a]");
        var value = texts.Single(t => t.Value == "24.6");
        Assert.True(Attr(label, "y") < Attr(value, "y"), "label above its value");
        Assert.Equal(Attr(label, "x"), Attr(value, "x"));
        var all = string.Join("\n", texts.Select(t => t.Value));
        Assert.Contains("Level of theory: B/x//C/y", all);
        Assert.Contains("[a] TS1 is not verified: awaiting review.", all);
        Assert.Contains("Caution sentence for the test.", all);
        Assert.Contains("ΔG (kcal/mol)", all);
        Assert.Contains("\u22125.3", all); // −5.25 rounds away from zero, true minus
    }

    [Theory]
    [InlineData(0.7, 1.0)]
    [InlineData(1.0, 1.0)]
    [InlineData(1.3, 2.0)]
    [InlineData(3.1, 5.0)]
    [InlineData(6.0, 10.0)]
    [InlineData(0.013, 0.02)]
    public void NiceStep_RoundsUpTo1_2_5(double rough, double expected) =>
        Close.Relative(expected, SvgEnergyDiagram.NiceStep(rough), 1e-12, $"tick step for {rough}", "1-2-5 tick series, common practice, no source");

    [Fact]
    public void Wrap_KeepsEveryWord_AndRespectsTheWidth()
    {
        var text = string.Join(' ', Enumerable.Range(0, 60).Select(i => $"word{i}"));
        var lines = SvgEnergyDiagram.Wrap(text, 11, 300).ToList();
        Assert.True(lines.Count > 1);
        Assert.Equal(text, string.Join(' ', lines));
        Assert.All(lines, l => Assert.True(l.Length <= (int)(300 / (0.56 * 11))));
    }
}

public class SvgLabelSplitTests
{
    [Fact]
    public void SplitLabel_BreaksLongSumsAfterPlusSigns_AndKeepsShortLabels()
    {
        Assert.Equal(["TS1"], SvgEnergyDiagram.SplitLabel("TS1", 10));
        Assert.Equal(["iodomethane +", "chloride +", "fluoride"], SvgEnergyDiagram.SplitLabel("iodomethane + chloride + fluoride", 14));
        Assert.Equal(["averyveryverylonglabel"], SvgEnergyDiagram.SplitLabel("averyveryverylonglabel", 5));
    }
}
