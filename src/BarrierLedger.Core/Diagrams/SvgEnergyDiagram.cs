using System.Globalization;
using System.Text;

namespace BarrierLedger.Core.Diagrams;

/// <summary>The colours and strokes of an energy diagram, shared by the dashboard chart and the exported figure.</summary>
public static class DiagramStyle
{
    public const string MinimumColour = "#1d3b53";
    public const string SaddleColour = "#b5470b";
    public const string ConnectorColour = "#7b8794";
    public const string AxisColour = "#444444";
    public const string TextColour = "#222222";
    public const string NoteColour = "#444444";
    public const string Background = "#ffffff";
    /// <summary>Levels are 4 px thick, connectors 1 px dashed (as on the Reaction screen).</summary>
    public const double LevelWidthPx = 4;
    public const double ConnectorWidthPx = 1;
    public const string FontFamily = "DejaVu Sans";
}

/// <summary>Where text is anchored horizontally.</summary>
public enum TextAnchor
{
    Start,
    Middle,
    End,
}

/// <summary>A straight line in pixels (y grows downwards); <see cref="Role"/> is "level", "connector", "axis" or "legend".</summary>
public sealed record SceneLine(double X0, double Y0, double X1, double Y1, string Colour, double Width, bool Dashed, string Role = "axis");

/// <summary>A line of text in pixels; <see cref="Y"/> is the baseline; <see cref="RotationDegrees"/> turns it about (X, Y).</summary>
public sealed record SceneText(double X, double Y, string Text, double Size, TextAnchor Anchor, string Colour,
    bool Bold = false, bool Italic = false, double RotationDegrees = 0);

/// <summary>
/// A diagram as lines and texts in pixels: what both the SVG writer and a raster renderer draw, so the two files show the
/// same figure.
/// </summary>
public sealed record DiagramScene(double Width, double Height, IReadOnlyList<SceneLine> Lines, IReadOnlyList<SceneText> Texts);

/// <summary>
/// The words around a diagram: title, the energy model (level of theory, temperature, standard state, treatment, unit),
/// marks on levels with their footnotes, and the caution sentence.
/// </summary>
/// <param name="Title">Figure title, e.g. the reaction name.</param>
/// <param name="ModelLines">One line each (level of theory; temperature and standard state; treatment and unit).</param>
/// <param name="LevelMarks">Marks per level index (e.g. 1 → "a"), shown as "TS1 [a]".</param>
/// <param name="Footnotes">Lines explaining the marks ("[a] TS1 is not verified: …").</param>
/// <param name="Caution">Shown at the foot of every exported figure.</param>
public sealed record DiagramText(
    string Title,
    IReadOnlyList<string> ModelLines,
    IReadOnlyDictionary<int, string> LevelMarks,
    IReadOnlyList<string> Footnotes,
    string Caution);

/// <summary>
/// Draws an <see cref="EnergyDiagramLayout"/> as a figure: the same levels, colours, dashed connectors and "label over
/// value" texts as the Reaction screen, plus a y axis, a legend and the model, footnotes and caution beneath.
/// <see cref="Scene"/> gives the pixel geometry, <c>ToSvg</c> writes it as SVG 1.1 text.
/// </summary>
public static class SvgEnergyDiagram
{
    private const double Width = 760;
    private const double PlotLeft = 84;
    private const double PlotRight = 736;
    private const double PlotTop = 64;
    private const double PlotBottom = 404;
    private const double FootSize = 11;
    private const double FootLine = 15;

    /// <summary>Lays the figure out in pixels. The y range matches the screen chart: [YMin, YMax + 8 % of the span].</summary>
    public static DiagramScene Scene(EnergyDiagramLayout layout, DiagramText text)
    {
        ArgumentNullException.ThrowIfNull(layout);
        ArgumentNullException.ThrowIfNull(text);
        var lines = new List<SceneLine>();
        var texts = new List<SceneText>();

        var xMin = -0.6;
        var xMax = layout.Levels.Count - 0.4;
        var yMin = layout.YMin;
        var yMax = layout.YMax + 0.08 * (layout.YMax - layout.YMin);
        double Px(double x) => PlotLeft + (x - xMin) / (xMax - xMin) * (PlotRight - PlotLeft);
        double Py(double y) => PlotBottom - (y - yMin) / (yMax - yMin) * (PlotBottom - PlotTop);

        texts.Add(new SceneText(Width / 2, 28, text.Title, 16, TextAnchor.Middle, DiagramStyle.TextColour, Bold: true));

        // Axis, ticks and the zero line.
        lines.Add(new SceneLine(PlotLeft, PlotTop, PlotLeft, PlotBottom, DiagramStyle.AxisColour, 1, false));
        var step = NiceStep((yMax - yMin) / 6);
        var decimals = Math.Max(0, (int)-Math.Floor(Math.Log10(step) + 1e-9));
        for (var t = Math.Ceiling(yMin / step) * step; t <= yMax + 1e-9 * step; t += step)
        {
            var py = Py(t);
            lines.Add(new SceneLine(PlotLeft - 5, py, PlotLeft, py, DiagramStyle.AxisColour, 1, false));
            texts.Add(new SceneText(PlotLeft - 8, py + 4, EnergyDiagram.FormatValue(t, decimals), 11, TextAnchor.End, DiagramStyle.TextColour));
        }
        if (yMin < 0 && yMax > 0)
            lines.Add(new SceneLine(PlotLeft, Py(0), PlotRight, Py(0), "#d0d4d9", 1, false));
        var mid = (PlotTop + PlotBottom) / 2;
        texts.Add(new SceneText(30, mid, layout.YAxisTitle, 13, TextAnchor.Middle, DiagramStyle.TextColour, RotationDegrees: -90));

        // Legend, top right, as on the screen.
        AddLegendEntry(lines, texts, PlotRight - 240, 48, DiagramStyle.MinimumColour, "minima");
        AddLegendEntry(lines, texts, PlotRight - 120, 48, DiagramStyle.SaddleColour, "saddle points");

        foreach (var c in layout.Connectors)
            lines.Add(new SceneLine(Px(c.X0), Py(c.Y0), Px(c.X1), Py(c.Y1), DiagramStyle.ConnectorColour, DiagramStyle.ConnectorWidthPx, true, "connector"));
        foreach (var l in layout.Levels)
        {
            var colour = l.IsSaddle ? DiagramStyle.SaddleColour : DiagramStyle.MinimumColour;
            var py = Py(l.Y);
            lines.Add(new SceneLine(Px(l.X0), py, Px(l.X1), py, colour, DiagramStyle.LevelWidthPx, false, "level"));
            var label = text.LevelMarks.TryGetValue(l.Index, out var mark) && mark.Length > 0 ? $"{l.Label} [{mark}]" : l.Label;
            var labelLines = SplitLabel(label, (Px(1) - Px(0)) / (0.62 * 12));
            for (var k = 0; k < labelLines.Count; k++)
                texts.Add(new SceneText(Px(l.XCentre), py - 22 - 14 * (labelLines.Count - 1 - k), labelLines[k], 12, TextAnchor.Middle, colour, Bold: true));
            texts.Add(new SceneText(Px(l.XCentre), py - 8, l.ValueText, 12, TextAnchor.Middle, DiagramStyle.TextColour));
        }

        var y = PlotBottom + 28;
        foreach (var line in text.ModelLines.SelectMany(m => Wrap(m, FootSize, Width - 48)))
        {
            texts.Add(new SceneText(24, y, line, FootSize, TextAnchor.Start, DiagramStyle.NoteColour));
            y += FootLine;
        }
        foreach (var line in text.Footnotes.SelectMany(m => Wrap(m, FootSize, Width - 48)))
        {
            texts.Add(new SceneText(24, y, line, FootSize, TextAnchor.Start, DiagramStyle.NoteColour));
            y += FootLine;
        }
        y += 4;
        foreach (var line in Wrap(text.Caution, FootSize, Width - 48))
        {
            texts.Add(new SceneText(24, y, line, FootSize, TextAnchor.Start, DiagramStyle.NoteColour, Italic: true));
            y += FootLine;
        }
        return new DiagramScene(Width, Math.Ceiling(y + 8), lines, texts);
    }

    /// <summary>The figure as a standalone SVG 1.1 document (UTF-8 text, no external references).</summary>
    public static string ToSvg(EnergyDiagramLayout layout, DiagramText text) => ToSvg(Scene(layout, text), text.Title);

    /// <summary>Writes a scene as SVG.</summary>
    public static string ToSvg(DiagramScene scene, string title)
    {
        ArgumentNullException.ThrowIfNull(scene);
        var sb = new StringBuilder();
        sb.Append("<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n");
        sb.Append($"<svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" width=\"{N(scene.Width)}\" height=\"{N(scene.Height)}\" viewBox=\"0 0 {N(scene.Width)} {N(scene.Height)}\" font-family=\"{DiagramStyle.FontFamily}, Arial, sans-serif\">\n");
        sb.Append($"<title>{Escape(title)}</title>\n");
        sb.Append($"<rect x=\"0\" y=\"0\" width=\"{N(scene.Width)}\" height=\"{N(scene.Height)}\" fill=\"{DiagramStyle.Background}\"/>\n");
        foreach (var l in scene.Lines)
        {
            var dash = l.Dashed ? " stroke-dasharray=\"6 4\"" : "";
            sb.Append($"<line class=\"{Escape(l.Role)}\" x1=\"{N(l.X0)}\" y1=\"{N(l.Y0)}\" x2=\"{N(l.X1)}\" y2=\"{N(l.Y1)}\" stroke=\"{l.Colour}\" stroke-width=\"{N(l.Width)}\"{dash}/>\n");
        }
        foreach (var t in scene.Texts)
        {
            var anchor = t.Anchor switch { TextAnchor.Middle => "middle", TextAnchor.End => "end", _ => "start" };
            var extra = (t.Bold ? " font-weight=\"bold\"" : "") + (t.Italic ? " font-style=\"italic\"" : "")
                + (t.RotationDegrees != 0 ? $" transform=\"rotate({N(t.RotationDegrees)} {N(t.X)} {N(t.Y)})\"" : "");
            sb.Append($"<text x=\"{N(t.X)}\" y=\"{N(t.Y)}\" font-size=\"{N(t.Size)}\" text-anchor=\"{anchor}\" fill=\"{t.Colour}\"{extra}>{Escape(t.Text)}</text>\n");
        }
        sb.Append("</svg>\n");
        return sb.ToString();
    }

    /// <summary>1, 2 or 5 × 10ⁿ, the smallest not below <paramref name="rough"/>.</summary>
    internal static double NiceStep(double rough)
    {
        if (!(rough > 0) || !double.IsFinite(rough)) return 1;
        var p = Math.Pow(10, Math.Floor(Math.Log10(rough)));
        foreach (var m in new[] { 1.0, 2.0, 5.0, 10.0 })
            if (m * p >= rough * (1 - 1e-12)) return m * p;
        return 10 * p;
    }

    /// <summary>Greedy word wrap with an average glyph width of 0.56 em (DejaVu Sans is a little wider than most sans faces).</summary>
    internal static IEnumerable<string> Wrap(string text, double size, double widthPx)
    {
        var max = Math.Max(10, (int)(widthPx / (0.56 * size)));
        var line = new StringBuilder();
        foreach (var word in text.Split(' ', StringSplitOptions.RemoveEmptyEntries))
        {
            if (line.Length > 0 && line.Length + 1 + word.Length > max)
            {
                yield return line.ToString();
                line.Clear();
            }
            if (line.Length > 0) line.Append(' ');
            line.Append(word);
        }
        if (line.Length > 0) yield return line.ToString();
    }

    /// <summary>Splits a long state label ("A + B + C") after its " + " signs so each line fits a slot; short labels stay whole.</summary>
    internal static IReadOnlyList<string> SplitLabel(string label, double maxChars)
    {
        if (label.Length <= maxChars || !label.Contains(" + ")) return [label];
        var parts = label.Split(" + ");
        var lines = new List<string>();
        var current = parts[0];
        foreach (var p in parts.Skip(1))
        {
            if (current.Length + 3 + p.Length <= maxChars) current += " + " + p;
            else { lines.Add(current + " +"); current = p; }
        }
        lines.Add(current);
        return lines;
    }

    private static void AddLegendEntry(List<SceneLine> lines, List<SceneText> texts, double x, double y, string colour, string label)
    {
        lines.Add(new SceneLine(x, y - 4, x + 24, y - 4, colour, DiagramStyle.LevelWidthPx, false, "legend"));
        texts.Add(new SceneText(x + 30, y, label, 11, TextAnchor.Start, DiagramStyle.TextColour));
    }

    private static string N(double v) => Math.Round(v, 2).ToString("0.##", CultureInfo.InvariantCulture);

    private static string Escape(string s)
    {
        var sb = new StringBuilder(s.Length);
        foreach (var c in s)
        {
            switch (c)
            {
                case '&': sb.Append("&amp;"); break;
                case '<': sb.Append("&lt;"); break;
                case '>': sb.Append("&gt;"); break;
                case '"': sb.Append("&quot;"); break;
                default:
                    // XML 1.0 forbids most control characters; a label never needs them.
                    if (c < 0x20 && c != '\t') sb.Append(' ');
                    else sb.Append(c);
                    break;
            }
        }
        return sb.ToString();
    }
}
