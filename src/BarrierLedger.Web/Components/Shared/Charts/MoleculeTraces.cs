using BarrierLedger.Core.Geometry;
using Plotly.Blazor;
using Plotly.Blazor.Traces;
using Plotly.Blazor.Traces.Scatter3DLib;

namespace BarrierLedger.Web.Components.Shared.Charts;

/// <summary>A ball-and-stick picture of a molecule as two Plotly 3D traces (atoms, then bonds), plus the data the animation needs.</summary>
public static class MoleculeTraces
{
    private static readonly Dictionary<string, string> s_colours = new(StringComparer.Ordinal)
    {
        ["H"] = "#d9dde1", ["C"] = "#3b4650", ["N"] = "#3a62c4", ["O"] = "#cc3a2f", ["F"] = "#5fb84a", ["Cl"] = "#3f9a3a",
        ["S"] = "#d4b21f", ["P"] = "#e0832b", ["Br"] = "#8c3a1a", ["I"] = "#6b2a8f", ["B"] = "#e3a58a", ["Si"] = "#b3a27a",
    };

    public static string Colour(string symbol) => s_colours.GetValueOrDefault(symbol, "#9c6fb5");

    /// <summary>Bonds from covalent radii, as 0-based pairs.</summary>
    public static IReadOnlyList<(int A, int B)> Bonds(Molecule m) =>
        Connectivity.Of(m).Bonds.Select(b => (b.A, b.B)).ToList();

    public static IList<ITrace> Build(Molecule m, IReadOnlyList<(int A, int B)> bonds, IReadOnlyCollection<int>? selected = null)
    {
        selected ??= [];
        var p = m.PositionsAngstrom;
        var atoms = new Scatter3D
        {
            Name = "atoms", Mode = ModeFlag.Markers, ShowLegend = false,
            X = p.Select(v => (object)v.X).ToList(), Y = p.Select(v => (object)v.Y).ToList(), Z = p.Select(v => (object)v.Z).ToList(),
            HoverTextArray = Enumerable.Range(0, m.AtomCount).Select(m.AtomLabel).ToList(),
            HoverInfo = Plotly.Blazor.Traces.Scatter3DLib.HoverInfoFlag.Text,
            Marker = new Marker
            {
                ColorArray = m.Elements.Select(e => (object)Colour(e.Symbol)).ToList(),
                SizeArray = m.Elements.Select(e => (decimal?)(e.AtomicNumber == 1 ? 7 : 11)).ToList(),
                Line = new Plotly.Blazor.Traces.Scatter3DLib.MarkerLib.Line { Color = "#1b2430", Width = 1 },
            },
        };
        var bx = new List<object?>(); var by = new List<object?>(); var bz = new List<object?>();
        foreach (var (a, b) in bonds)
        {
            bx.AddRange([p[a].X, p[b].X, null]); by.AddRange([p[a].Y, p[b].Y, null]); bz.AddRange([p[a].Z, p[b].Z, null]);
        }
        var sticks = new Scatter3D
        {
            Name = "bonds", Mode = ModeFlag.Lines, ShowLegend = false, HoverInfo = Plotly.Blazor.Traces.Scatter3DLib.HoverInfoFlag.Skip,
            X = bx!, Y = by!, Z = bz!, Line = new Line { Color = "#7b8794", Width = 6 },
        };
        if (selected.Count == 0) return [atoms, sticks];
        // Picked atoms: a ring (an open marker) around each, labelled, so the choice is seen without relying on colour.
        var ring = new Scatter3D
        {
            Name = "selected", Mode = ModeFlag.Markers | ModeFlag.Text, ShowLegend = false, HoverInfo = Plotly.Blazor.Traces.Scatter3DLib.HoverInfoFlag.Skip,
            X = selected.Select(i => (object)p[i].X).ToList(), Y = selected.Select(i => (object)p[i].Y).ToList(), Z = selected.Select(i => (object)p[i].Z).ToList(),
            TextArray = selected.Select(i => m.AtomLabel(i)).ToList(), TextPosition = Plotly.Blazor.Traces.Scatter3DLib.TextPositionEnum.TopCenter,
            Marker = new Marker { Size = 18, Symbol = Plotly.Blazor.Traces.Scatter3DLib.MarkerLib.SymbolEnum.CircleOpen, Color = "#c2410c" },
        };
        return [atoms, sticks, ring];
    }

    /// <summary>Colour of a second structure drawn over the first (a conformer overlay).</summary>
    public const string OverlayColour = "#d97706";

    /// <summary>
    /// A second structure drawn over the first, all in one colour and half transparent so the first shows through: its atoms
    /// (hover: "second: C4") and its bonds. Appended after the first structure's traces, so trace 0 stays the clickable atoms.
    /// </summary>
    public static IList<ITrace> Overlay(Molecule m, IReadOnlyList<(int A, int B)> bonds, string name)
    {
        var p = m.PositionsAngstrom;
        var atoms = new Scatter3D
        {
            Name = name, Mode = ModeFlag.Markers, ShowLegend = false, Opacity = 0.55m,
            X = p.Select(v => (object)v.X).ToList(), Y = p.Select(v => (object)v.Y).ToList(), Z = p.Select(v => (object)v.Z).ToList(),
            HoverTextArray = Enumerable.Range(0, m.AtomCount).Select(i => $"{name}: {m.AtomLabel(i)}").ToList(),
            HoverInfo = Plotly.Blazor.Traces.Scatter3DLib.HoverInfoFlag.Text,
            Marker = new Marker { Color = OverlayColour, SizeArray = m.Elements.Select(e => (decimal?)(e.AtomicNumber == 1 ? 6 : 10)).ToList() },
        };
        var bx = new List<object?>(); var by = new List<object?>(); var bz = new List<object?>();
        foreach (var (a, b) in bonds)
        {
            bx.AddRange([p[a].X, p[b].X, null]); by.AddRange([p[a].Y, p[b].Y, null]); bz.AddRange([p[a].Z, p[b].Z, null]);
        }
        var sticks = new Scatter3D
        {
            Name = name + " bonds", Mode = ModeFlag.Lines, ShowLegend = false, Opacity = 0.55m, HoverInfo = Plotly.Blazor.Traces.Scatter3DLib.HoverInfoFlag.Skip,
            X = bx!, Y = by!, Z = bz!, Line = new Line { Color = OverlayColour, Width = 4 },
        };
        return [atoms, sticks];
    }

    /// <summary>
    /// A 3D scene that holds the whole molecule in every orientation: one cube centred on the molecule's bounding box, its side the
    /// box's longest edge plus <paramref name="padAngstrom"/> on each side (for the atom markers and, when animated, the largest
    /// displacement), with equal scales on the three axes. Left to Plotly's autorange the box follows the data of each frame and
    /// long bonds or displaced atoms can leave the frame.
    /// </summary>
    public static Plotly.Blazor.LayoutLib.Scene Scene(Molecule m, double padAngstrom) => Scene(m.PositionsAngstrom, padAngstrom);

    /// <summary>The same cube around any set of points (e.g. every frame of a path, so that no frame leaves the picture).</summary>
    public static Plotly.Blazor.LayoutLib.Scene Scene(IReadOnlyList<Vec3> p, double padAngstrom)
    {
        double Mid(Func<Vec3, double> f) => (p.Max(f) + p.Min(f)) / 2;
        var half = Math.Max(new[] { p.Max(v => v.X) - p.Min(v => v.X), p.Max(v => v.Y) - p.Min(v => v.Y), p.Max(v => v.Z) - p.Min(v => v.Z) }.Max() / 2, 0.5) + padAngstrom;
        List<object> Range(double c) => [c - half, c + half];
        return new Plotly.Blazor.LayoutLib.Scene
        {
            AspectMode = Plotly.Blazor.LayoutLib.SceneLib.AspectModeEnum.Cube,
            XAxis = new Plotly.Blazor.LayoutLib.SceneLib.XAxis { Visible = false, Range = Range(Mid(v => v.X)) },
            YAxis = new Plotly.Blazor.LayoutLib.SceneLib.YAxis { Visible = false, Range = Range(Mid(v => v.Y)) },
            ZAxis = new Plotly.Blazor.LayoutLib.SceneLib.ZAxis { Visible = false, Range = Range(Mid(v => v.Z)) },
        };
    }
}
