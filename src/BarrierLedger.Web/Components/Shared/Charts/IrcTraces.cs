using System.Globalization;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Queries;
using Plotly.Blazor;
using Plotly.Blazor.LayoutLib;
using Plotly.Blazor.Traces;
using Plotly.Blazor.Traces.ScatterLib;

namespace BarrierLedger.Web.Components.Shared.Charts;

/// <summary>
/// The IRC profile: energy against the signed path length from the saddle point (Å, mass-unweighted, as stored), in kcal/mol
/// relative to the saddle-point frame, with the saddle frame and the two ends marked and each end labelled with the state it
/// reached in the connection check.
/// </summary>
public static class IrcTraces
{
    /// <summary>The frame the energies are relative to: the saddle frame when it has an energy, else the highest frame.</summary>
    public static int ReferenceFrame(IrcView irc)
    {
        if (irc.SaddleFrame is { } s && s >= 0 && s < irc.Frames.Count && irc.Frames[s].EnergyHartree is not null) return s;
        var withEnergy = irc.Frames.Select((f, i) => (f, i)).Where(x => x.f.EnergyHartree is not null).ToList();
        return withEnergy.Count == 0 ? 0 : withEnergy.MaxBy(x => x.f.EnergyHartree!.Value).i;
    }

    /// <summary>ΔE of every frame in kcal/mol relative to <see cref="ReferenceFrame"/> (null where a frame has no energy).</summary>
    public static double?[] RelativeKcal(IrcView irc)
    {
        var reference = irc.Frames[ReferenceFrame(irc)].EnergyHartree;
        return [.. irc.Frames.Select(f => f.EnergyHartree is { } e && reference is { } r ? Energy.FromHartree(e - r).KcalPerMol : (double?)null)];
    }

    /// <summary>What an end reached, from the stored connection evidence ("first frame" / "last frame").</summary>
    public static string EndLabel(string endName, ConnectionEvidence? evidence)
    {
        var end = evidence?.Ends.FirstOrDefault(e => e.Name == endName);
        return end is null ? endName : end.Reached is { } r ? $"{endName}: {r}" : $"{endName}: no state of the study";
    }

    public static IList<ITrace> Build(IrcView irc, ConnectionEvidence? evidence)
    {
        var x = irc.Frames.Select(f => f.PathLengthAngstrom ?? 0).ToArray();
        var y = RelativeKcal(irc);
        var shown = Enumerable.Range(0, irc.Frames.Count).Where(i => y[i] is not null).ToList();
        string At(int i) => string.Create(CultureInfo.InvariantCulture, $"frame {i + 1}: s = {x[i]:F2} Å, ΔE = {Core.Diagrams.EnergyDiagram.FormatValue(y[i]!.Value, 2)} kcal/mol");
        var traces = new List<ITrace>
        {
            new Scatter
            {
                Name = "IRC", Mode = ModeFlag.Lines | ModeFlag.Markers,
                X = shown.Select(i => (object)x[i]).ToList(), Y = shown.Select(i => (object)y[i]!.Value).ToList(),
                HoverTextArray = shown.Select(At).ToList(), HoverInfo = HoverInfoFlag.Text,
                Line = new Line { Color = "#1d3b53", Width = 2 }, Marker = new Marker { Color = "#1d3b53", Size = 4 },
            },
        };
        var ends = new[] { (Index: 0, Name: "first frame"), (Index: irc.Frames.Count - 1, Name: "last frame") }.Where(e => y[e.Index] is not null).ToList();
        if (ends.Count > 0)
            traces.Add(new Scatter
            {
                Name = "ends", Mode = ModeFlag.Markers | ModeFlag.Text,
                X = ends.Select(e => (object)x[e.Index]).ToList(), Y = ends.Select(e => (object)y[e.Index]!.Value).ToList(),
                TextArray = ends.Select(e => ChartText.Plain(EndLabel(e.Name, evidence))).ToList(), TextPosition = TextPositionEnum.TopCenter,
                HoverTextArray = ends.Select(e => At(e.Index)).ToList(), HoverInfo = HoverInfoFlag.Text,
                Marker = new Marker { Color = "#1d3b53", Size = 10, Symbol = Plotly.Blazor.Traces.ScatterLib.MarkerLib.SymbolEnum.Square },
            });
        var r = ReferenceFrame(irc);
        if (y[r] is not null)
            traces.Add(new Scatter
            {
                Name = "saddle point", Mode = ModeFlag.Markers | ModeFlag.Text,
                X = [x[r]], Y = [y[r]!.Value], TextArray = ["saddle point"], TextPosition = TextPositionEnum.TopCenter,
                HoverTextArray = [At(r)], HoverInfo = HoverInfoFlag.Text,
                Marker = new Marker { Color = "#b5470b", Size = 12, Symbol = Plotly.Blazor.Traces.ScatterLib.MarkerLib.SymbolEnum.Diamond },
            });
        return traces;
    }

    public static Plotly.Blazor.Layout BuildLayout(IrcView irc) => new()
    {
        Title = new Title { Text = ChartText.Plain($"IRC {irc.Label} ({irc.LevelOfTheory})") },
        Height = 340,
        ShowLegend = false,
        Margin = new Margin { L = 64, R = 24, T = 48, B = 48 },
        XAxis = [new XAxis { Title = new Plotly.Blazor.LayoutLib.XAxisLib.Title { Text = "path length from the saddle point (Å)" }, ZeroLine = true }],
        YAxis = [new YAxis { Title = new Plotly.Blazor.LayoutLib.YAxisLib.Title { Text = "ΔE (kcal/mol) vs the saddle-point frame" } }],
    };
}
