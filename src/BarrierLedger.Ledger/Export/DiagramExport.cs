using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Diagrams;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Reviews;

namespace BarrierLedger.Ledger.Export;

/// <summary>One state of a reaction's diagram with what a reader must know about it.</summary>
/// <param name="Label">"A + B", "TS1".</param>
/// <param name="Relative">Energy relative to the first state (full precision).</param>
/// <param name="IsSaddle">Saddle point or minimum.</param>
/// <param name="Review">Review status of a saddle point (ignored for minima).</param>
/// <param name="Check">Automatic check of a saddle point.</param>
/// <param name="CheckReasons">Its reasons.</param>
public sealed record DiagramStateInfo(string Label, Energy Relative, bool IsSaddle, ReviewState Review = ReviewState.AwaitingReview,
    Verdict? Check = null, IReadOnlyList<string>? CheckReasons = null);

/// <summary>A reaction's energy profile to export.</summary>
/// <param name="Reaction">Reaction label (the figure title).</param>
/// <param name="Model">The energy model.</param>
/// <param name="Quantity">"ΔG", "ΔH" or "ΔE".</param>
/// <param name="States">States in pathway order.</param>
/// <param name="ConsistencyProblems">Consistency rules the reaction's energies break; empty when consistent.</param>
public sealed record DiagramSource(string Reaction, ExportModel Model, string Quantity, IReadOnlyList<DiagramStateInfo> States,
    IReadOnlyList<string> ConsistencyProblems)
{
    /// <summary>Reasons that do not break consistency but can mislead (the conformer checks), each footnoted and marked on every saddle point.</summary>
    public IReadOnlyList<string> Cautions { get; init; } = [];
}

/// <summary>The exported figure in both formats, drawn from one scene.</summary>
public sealed record DiagramFiles(string Svg, byte[] Png, DiagramScene Scene);

/// <summary>
/// Builds the exported energy diagram: the screen's layout (<see cref="EnergyDiagram.Layout"/>), marks on saddle points that
/// are not verified and on every saddle point when the reaction breaks a consistency rule, footnotes saying why, the model
/// and the caution; written as SVG and PNG from the same scene.
/// </summary>
public static class DiagramExport
{
    public static DiagramFiles Build(DiagramSource source, EnergyUnit unit = EnergyUnit.KcalPerMol, int decimals = 1, float pngScale = 2f)
    {
        ArgumentNullException.ThrowIfNull(source);
        var layout = EnergyDiagram.Layout([.. source.States.Select(s => new DiagramState(s.Label, s.Relative, s.IsSaddle))], source.Quantity, unit, decimals);
        var text = Text(source, unit);
        var scene = SvgEnergyDiagram.Scene(layout, text);
        return new DiagramFiles(SvgEnergyDiagram.ToSvg(scene, text.Title), PngEnergyDiagram.Render(scene, pngScale), scene);
    }

    /// <summary>Title, model lines, marks, footnotes and caution of a diagram.</summary>
    public static DiagramText Text(DiagramSource source, EnergyUnit unit)
    {
        var footnotes = new List<string>();
        var marks = new Dictionary<int, string>();
        string? inconsistentMark = null;
        if (source.ConsistencyProblems.Count > 0)
        {
            inconsistentMark = BarrierTable.MarkName(footnotes.Count);
            footnotes.Add($"[{inconsistentMark}] {source.Reaction}: the energies break a consistency rule: {string.Join("; ", source.ConsistencyProblems.Select(p => p.TrimEnd('.')))}.");
        }
        var cautionMarks = new List<string>();
        foreach (var caution in source.Cautions)
        {
            cautionMarks.Add(BarrierTable.MarkName(footnotes.Count));
            footnotes.Add($"[{cautionMarks[^1]}] {source.Reaction}: {caution}");
        }
        for (var i = 0; i < source.States.Count; i++)
        {
            var s = source.States[i];
            if (!s.IsSaddle) continue;
            var m = new List<string>();
            if (s.Review != ReviewState.Verified)
            {
                var row = new BarrierRow(source.Reaction, s.Label, s.Label, null, null, null, null, null, null, null, s.Check, s.CheckReasons ?? [], s.Review, "", []);
                var mark = BarrierTable.MarkName(footnotes.Count);
                footnotes.Add($"[{mark}] {BarrierTable.UnverifiedText(row)}");
                m.Add(mark);
            }
            if (inconsistentMark is not null) m.Add(inconsistentMark);
            m.AddRange(cautionMarks);
            if (m.Count > 0) marks[i] = string.Join(",", m);
        }
        var lines = source.Model.Lines(unit).Take(4).Append($"{source.Quantity} relative to {source.States[0].Label}, in {Energy.Symbol(unit)}").ToList();
        return new DiagramText(source.Reaction, lines, marks, footnotes, ExportCaution.Text);
    }
}
