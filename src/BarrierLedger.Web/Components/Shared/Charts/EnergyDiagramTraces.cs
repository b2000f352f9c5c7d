using BarrierLedger.Core.Diagrams;
using Plotly.Blazor;
using Plotly.Blazor.LayoutLib;
using Plotly.Blazor.Traces;
using Plotly.Blazor.Traces.ScatterLib;

namespace BarrierLedger.Web.Components.Shared.Charts;

/// <summary>Turns an <see cref="EnergyDiagramLayout"/> into Plotly traces: thick levels, thin dashed connectors, labels with values.</summary>
public static class EnergyDiagramTraces
{
    public const string MinimumColour = "#1d3b53";
    public const string SaddleColour = "#b5470b";
    public const string ConnectorColour = "#7b8794";

    public static IList<ITrace> Build(EnergyDiagramLayout layout)
    {
        var traces = new List<ITrace>();
        // Connectors first so levels draw on top; one trace with gaps (null) between segments.
        var cx = new List<object?>();
        var cy = new List<object?>();
        foreach (var c in layout.Connectors)
        {
            cx.AddRange([c.X0, c.X1, null]);
            cy.AddRange([c.Y0, c.Y1, null]);
        }
        traces.Add(new Scatter
        {
            Name = "connectors", Mode = ModeFlag.Lines, X = cx!, Y = cy!, ShowLegend = false, HoverInfo = HoverInfoFlag.Skip,
            Line = new Line { Color = ConnectorColour, Width = 1, Dash = "dash" },
        });
        foreach (var saddle in new[] { false, true })
        {
            var x = new List<object?>();
            var y = new List<object?>();
            var hover = new List<string>();
            foreach (var l in layout.Levels.Where(l => l.IsSaddle == saddle))
            {
                x.AddRange([l.X0, l.X1, null]);
                y.AddRange([l.Y, l.Y, null]);
                var text = $"{ChartText.Plain(l.Label)}: {l.ValueText} {layout.YAxisTitle}";
                hover.AddRange([text, text, ""]);
            }
            if (x.Count == 0) continue;
            traces.Add(new Scatter
            {
                Name = saddle ? "saddle points" : "minima", Mode = ModeFlag.Lines, X = x!, Y = y!, ShowLegend = true,
                HoverTextArray = hover, HoverInfo = HoverInfoFlag.Text,
                Line = new Line { Color = saddle ? SaddleColour : MinimumColour, Width = 4 },
            });
        }
        traces.Add(new Scatter
        {
            Name = "labels", Mode = ModeFlag.Text, ShowLegend = false, HoverInfo = HoverInfoFlag.Skip,
            X = layout.Levels.Select(l => (object)l.XCentre).ToList(),
            Y = layout.Levels.Select(l => (object)l.Y).ToList(),
            TextArray = layout.Levels.Select(l => $"{ChartText.Plain(l.Label)}<br>{l.ValueText}").ToList(),
            TextPosition = TextPositionEnum.TopCenter,
        });
        return traces;
    }

    public static Plotly.Blazor.Layout BuildLayout(EnergyDiagramLayout layout, string title) => new()
    {
        Title = new Title { Text = ChartText.Plain(title) },
        ShowLegend = true,
        Height = 380,
        Margin = new Margin { L = 64, R = 16, T = 48, B = 32 },
        XAxis = [new XAxis { ShowTickLabels = false, ShowGrid = false, ZeroLine = false, Range = [-0.6, layout.Levels.Count - 0.4] }],
        YAxis = [new YAxis { Title = new Plotly.Blazor.LayoutLib.YAxisLib.Title { Text = layout.YAxisTitle }, ZeroLine = true, Range = [layout.YMin, layout.YMax + 0.08 * (layout.YMax - layout.YMin)] }],
    };
}
