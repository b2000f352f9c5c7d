using BarrierLedger.Core.Scans;
using BarrierLedger.Core.Units;
using Plotly.Blazor;
using Plotly.Blazor.LayoutLib;
using Plotly.Blazor.Traces;
using Plotly.Blazor.Traces.ScatterLib;

namespace BarrierLedger.Web.Components.Shared.Charts;

/// <summary>
/// Plotly traces for a relaxed scan: the points (open markers where not converged), the interpolating spline,
/// the maxima and the flagged points, with energies relative to the first converged point.
/// </summary>
public static class ScanTraces
{
    public static IList<ITrace> Build(ScanProfile profile, EnergyUnit unit)
    {
        var reference = profile.Points.FirstOrDefault(p => p.Converged)?.EnergyHartree ?? profile.Points.FirstOrDefault()?.EnergyHartree ?? 0;
        double Rel(double hartree) => Energy.FromHartree(hartree - reference).In(unit);
        var symbol = Energy.Symbol(unit);
        var traces = new List<ITrace>();

        if (profile.Samples.Length > 0)
            traces.Add(new Scatter
            {
                Name = $"spline ({profile.Interpolation})", Mode = ModeFlag.Lines,
                X = profile.Samples.Select(s => (object)s.Coordinate).ToList(),
                Y = profile.Samples.Select(s => (object)Rel(s.Energy.Hartree)).ToList(),
                Line = new Line { Color = "#1d3b53", Width = 2 }, HoverInfo = HoverInfoFlag.Skip,
            });

        var converged = profile.Points.Select((p, i) => (p, i)).Where(t => t.p.Converged).ToList();
        traces.Add(new Scatter
        {
            Name = "points", Mode = ModeFlag.Markers,
            X = converged.Select(t => (object)t.p.Coordinate).ToList(),
            Y = converged.Select(t => (object)Rel(t.p.EnergyHartree)).ToList(),
            HoverTextArray = converged.Select(t => $"point {t.i + 1}: {t.p.Coordinate:F3} {profile.Unit}, {Rel(t.p.EnergyHartree):F2} {symbol}").ToList(),
            HoverInfo = HoverInfoFlag.Text,
            Marker = new Marker { Color = "#1d3b53", Size = 7 },
        });

        var open = profile.Points.Select((p, i) => (p, i)).Where(t => !t.p.Converged).ToList();
        if (open.Count > 0)
            traces.Add(new Scatter
            {
                Name = "not converged (left out of the spline)", Mode = ModeFlag.Markers,
                X = open.Select(t => (object)t.p.Coordinate).ToList(),
                Y = open.Select(t => (object)Rel(t.p.EnergyHartree)).ToList(),
                HoverTextArray = open.Select(t => $"point {t.i + 1} did not converge").ToList(),
                HoverInfo = HoverInfoFlag.Text,
                Marker = new Marker { Color = "#ffffff", Size = 9, Symbol = Plotly.Blazor.Traces.ScatterLib.MarkerLib.SymbolEnum.CircleOpen, Line = new Plotly.Blazor.Traces.ScatterLib.MarkerLib.Line { Color = "#9b1c1c", Width = 2 } },
            });

        var flagged = profile.Flags.Where(f => f.Code is ScanFlagCodes.Jump or ScanFlagCodes.IrregularStep or ScanFlagCodes.BondChange
                                               && f.PointIndex >= 0 && f.PointIndex < profile.Points.Length).ToList();
        if (flagged.Count > 0)
            traces.Add(new Scatter
            {
                Name = "flagged", Mode = ModeFlag.Markers,
                X = flagged.Select(f => (object)profile.Points[f.PointIndex].Coordinate).ToList(),
                Y = flagged.Select(f => (object)Rel(profile.Points[f.PointIndex].EnergyHartree)).ToList(),
                HoverTextArray = flagged.Select(f => ChartText.Plain(f.Message)).ToList(),
                HoverInfo = HoverInfoFlag.Text,
                Marker = new Marker { Color = "#9b1c1c", Size = 13, Symbol = Plotly.Blazor.Traces.ScatterLib.MarkerLib.SymbolEnum.XThin, Line = new Plotly.Blazor.Traces.ScatterLib.MarkerLib.Line { Color = "#9b1c1c", Width = 2 } },
            });

        if (profile.Maxima.Length > 0)
            traces.Add(new Scatter
            {
                Name = "maxima", Mode = ModeFlag.Markers | ModeFlag.Text,
                X = profile.Maxima.Select(m => (object)m.Coordinate).ToList(),
                Y = profile.Maxima.Select(m => (object)Rel(m.Energy.Hartree)).ToList(),
                TextArray = profile.Maxima.Select(m => $"max {m.Coordinate:F3} {profile.Unit}").ToList(),
                TextPosition = TextPositionEnum.TopCenter,
                HoverInfo = HoverInfoFlag.Text,
                HoverTextArray = profile.Maxima.Select(m => $"maximum at {m.Coordinate:F3} {profile.Unit}: {Rel(m.Energy.Hartree):F2} {symbol}").ToList(),
                Marker = new Marker { Color = "#b5470b", Size = 12, Symbol = Plotly.Blazor.Traces.ScatterLib.MarkerLib.SymbolEnum.Diamond },
            });
        return traces;
    }

    public static Plotly.Blazor.Layout BuildLayout(ScanProfile profile, EnergyUnit unit, string title) => new()
    {
        Title = new Title { Text = ChartText.Plain(title) },
        Height = 340,
        Margin = new Margin { L = 64, R = 16, T = 48, B = 48 },
        XAxis = [new XAxis { Title = new Plotly.Blazor.LayoutLib.XAxisLib.Title { Text = $"scanned coordinate ({profile.Unit})" } }],
        YAxis = [new YAxis { Title = new Plotly.Blazor.LayoutLib.YAxisLib.Title { Text = $"ΔE ({Energy.Symbol(unit)}) vs first point" } }],
    };
}
