using BarrierLedger.Core.Kinetics;
using Plotly.Blazor;
using Plotly.Blazor.LayoutLib;
using Plotly.Blazor.Traces;
using Plotly.Blazor.Traces.ScatterLib;

namespace BarrierLedger.Web.Components.Shared.Charts;

/// <summary>Plotly traces for a simulation: one line per species against time (t &gt; 0, for a logarithmic time axis).</summary>
public static class ConcentrationTraces
{
    private static readonly string[] Palette = ["#1d3b53", "#b5470b", "#2f7d4a", "#7a3e9d", "#9b1c1c", "#4a6fa5", "#8a6d1f", "#3d7f82"];

    public static IList<ITrace> Build(SimulationResult result)
    {
        var points = result.Curve.Where(p => p.TimeSeconds > 0).ToList();
        var traces = new List<ITrace>();
        for (var i = 0; i < result.Species.Length; i++)
        {
            var index = i;
            traces.Add(new Scatter
            {
                Name = ChartText.Plain(result.Species[i]),
                Mode = ModeFlag.Lines,
                X = points.Select(p => (object)p.TimeSeconds).ToList(),
                Y = points.Select(p => (object)Math.Max(0.0, p.MolPerL[index])).ToList(),
                Line = new Line { Color = Palette[i % Palette.Length], Width = 2 },
            });
        }
        return traces;
    }

    public static Plotly.Blazor.Layout BuildLayout(string title, bool logTime) => new()
    {
        Title = new Title { Text = ChartText.Plain(title) },
        Height = 380,
        Margin = new Margin { L = 72, R = 16, T = 48, B = 56 },
        XAxis = [new XAxis
        {
            Title = new Plotly.Blazor.LayoutLib.XAxisLib.Title { Text = "time (s)" },
            Type = logTime ? Plotly.Blazor.LayoutLib.XAxisLib.TypeEnum.Log : Plotly.Blazor.LayoutLib.XAxisLib.TypeEnum.Linear,
            ExponentFormat = Plotly.Blazor.LayoutLib.XAxisLib.ExponentFormatEnum.Power,
        }],
        YAxis = [new YAxis { Title = new Plotly.Blazor.LayoutLib.YAxisLib.Title { Text = "concentration (mol/L)" } }],
    };
}
