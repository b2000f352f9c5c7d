using System.Globalization;
using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Reviews;

namespace BarrierLedger.Ledger.Export;

/// <summary>How a cell's value is written.</summary>
public enum CellKind
{
    Text,
    /// <summary>An energy in the table unit, rounded to the table's decimals.</summary>
    Fixed,
    /// <summary>A positive quantity over many decades (k, t½): three significant digits, mantissa × 10^exponent.</summary>
    Scientific,
    /// <summary>An imaginary wavenumber: its magnitude, whole cm⁻¹, written with "i".</summary>
    Imaginary,
    Empty,
}

/// <summary>
/// One formatted cell. <see cref="Number"/> is the value as printed (already rounded); writers format it for their
/// medium (ASCII minus in CSV, "−" in Markdown, "$-$" in LaTeX, a numeric cell in XLSX).
/// </summary>
public sealed record TableCell(CellKind Kind, string Text, double? Number = null, int Decimals = 0, double Mantissa = 0, int Exponent = 0)
{
    /// <summary>For an interval cell: its lower and upper bound (each a <see cref="CellKind.Scientific"/> cell); <see cref="Text"/> is their plain form.</summary>
    public IReadOnlyList<TableCell>? Bounds { get; init; }

    /// <summary>The bounds of an interval joined by " to " in a writer's notation.</summary>
    public string Join(Func<TableCell, string> format) => string.Join(" to ", Bounds!.Select(format));

    public static TableCell Empty { get; } = new(CellKind.Empty, "");

    /// <summary>The number format of a <see cref="CellKind.Scientific"/> cell: <see cref="Decimals"/> mantissa decimals ("0.00E+00" for three significant digits).</summary>
    public string ScientificFormat => "0." + new string('0', Decimals) + "E+00";

    /// <summary>Plain text with an ASCII minus (what CSV carries and what parses back).</summary>
    public string Plain => Kind switch
    {
        CellKind.Fixed => Number!.Value.ToString("F" + Decimals.ToString(CultureInfo.InvariantCulture), CultureInfo.InvariantCulture),
        CellKind.Scientific => Number!.Value.ToString(ScientificFormat, CultureInfo.InvariantCulture),
        CellKind.Imaginary => Number!.Value.ToString("F0", CultureInfo.InvariantCulture),
        _ => Text,
    };
}

/// <summary>A column header in the three notations the writers need; <see cref="Column"/> is null for a table that is not a barrier table (kinetics).</summary>
public sealed record TableHeader(ExportColumn? Column, string Plain, string Latex, string Markdown, bool Numeric);

/// <summary>A formatted row: its cells (one per chosen column) and the marks of its footnotes.</summary>
public sealed record TableRow(IReadOnlyList<TableCell> Cells, IReadOnlyList<string> Marks);

/// <summary>A footnote: its mark ("a") and why the marked rows may mislead.</summary>
public sealed record TableFootnote(string Mark, string Text);

/// <summary>
/// A barrier table ready to write in any format: title, model lines, headers, rows (values rounded once, here), marks with
/// their footnotes, and the caution. Every writer prints all of it.
/// </summary>
public sealed record BarrierTable(
    string Title,
    IReadOnlyList<string> ModelLines,
    IReadOnlyList<TableHeader> Headers,
    IReadOnlyList<TableRow> Rows,
    IReadOnlyList<TableFootnote> Footnotes,
    string Caution,
    EnergyUnit Unit,
    int Decimals)
{
    /// <summary>Header of the marks column that every format appends.</summary>
    public const string NoteHeader = "Note";

    /// <summary>Name of the XLSX sheet (the kinetics tables name theirs).</summary>
    public string SheetName { get; init; } = XlsxTableWriter.SheetName;

    /// <summary>
    /// Builds the table. Energies are converted from hartree and rounded half away from zero to <see cref="TableOptions.Decimals"/>
    /// only here. A row is marked when its saddle point is not verified by a reviewer, and when its barrier breaks a
    /// consistency rule; each distinct reason gets one footnote.
    /// </summary>
    public static BarrierTable Build(BarrierTableSource source, TableOptions options)
    {
        ArgumentNullException.ThrowIfNull(source);
        ArgumentNullException.ThrowIfNull(options);
        if (options.Columns is null || options.Columns.Count == 0) throw new ArgumentException("Choose at least one column.", nameof(options));
        if (options.Columns.Distinct().Count() != options.Columns.Count) throw new ArgumentException("A column is chosen twice.", nameof(options));
        if (options.Decimals is < 0 or > 6) throw new ArgumentException($"Decimals must be 0 to 6, not {options.Decimals}.", nameof(options));

        var unit = Energy.Symbol(options.Unit);
        // k and t½ are each followed by their 95 % interval (or "no uncertainty set"): a rate is never exported as if exact.
        var layout = options.Columns.SelectMany(c => c is ExportColumn.RateConstant or ExportColumn.HalfLife
            ? new[] { (Column: c, Interval: false), (Column: c, Interval: true) } : [(Column: c, Interval: false)]).ToList();
        var headers = layout.Select(x => x.Interval ? IntervalHeader(x.Column) : Header(x.Column, unit)).ToList();
        var uncertainty = source.Model.Uncertainty ?? Kinetics.EnergyUncertainty.None;
        var footnotes = new List<TableFootnote>();
        var rows = new List<TableRow>();
        foreach (var r in source.Rows)
        {
            var marks = new List<string>();
            if (r.HasSaddle && !r.IsVerified) marks.Add(MarkFor(footnotes, UnverifiedText(r)));
            if (!r.IsConsistent) marks.Add(MarkFor(footnotes, $"{r.Reaction}: the barrier breaks a consistency rule: {string.Join("; ", r.ConsistencyProblems.Select(p => p.TrimEnd('.')))}."));
            foreach (var caution in r.Cautions) marks.Add(MarkFor(footnotes, $"{r.Reaction}: {caution}"));
            if (r.RateConstantUnit != "s⁻¹" && r.RateConstant is not null && options.Columns.Contains(ExportColumn.RateConstant))
                marks.Add(MarkFor(footnotes, $"k of a step with more than one molecule is in {r.RateConstantUnit} (standard state {source.Model.StandardStateText})."));
            rows.Add(new TableRow([.. layout.Select(x => x.Interval ? IntervalCell(r, x.Column, uncertainty, source.Model.TemperatureKelvin) : Cell(r, x.Column, options))], marks));
        }
        var model = source.Model.Lines(options.Unit).ToList();
        model.Add($"Energies rounded to {options.Decimals} decimal{(options.Decimals == 1 ? "" : "s")} for this table only; stored values are unrounded.");
        return new BarrierTable($"Barriers and reaction energies: {source.StudyName}", model, headers, rows, footnotes, ExportCaution.Text, options.Unit, options.Decimals);
    }

    /// <summary>Why an unverified row is marked, in words.</summary>
    public static string UnverifiedText(BarrierRow r)
    {
        var status = r.Review switch
        {
            ReviewState.AwaitingReview => "awaiting review",
            ReviewState.Returned => "returned by the reviewer",
            ReviewState.Reopened => "reopened after a new upload",
            _ => "not verified",
        };
        var check = r.Check is { } v ? $"automatic check: {VerdictText.Of(v)}" : "no automatic check";
        var reasons = r.Check is Verdict.NeedsAttention or Verdict.Failed && r.CheckReasons.Count > 0 ? $" ({string.Join("; ", r.CheckReasons.Select(x => x.TrimEnd('.')))})" : "";
        return $"{r.Reaction}, {r.SaddleLabel}: saddle point not verified by a reviewer ({status}); {check}{reasons}.";
    }

    private static string MarkFor(List<TableFootnote> footnotes, string text)
    {
        var existing = footnotes.FirstOrDefault(f => f.Text == text);
        if (existing is not null) return existing.Mark;
        var mark = MarkName(footnotes.Count);
        footnotes.Add(new TableFootnote(mark, text));
        return mark;
    }

    /// <summary>a, b, …, z, aa, ab, …</summary>
    internal static string MarkName(int index) => index < 26 ? ((char)('a' + index)).ToString() : MarkName(index / 26 - 1) + (char)('a' + index % 26);

    private static TableHeader Header(ExportColumn c, string unit)
    {
        var latexUnit = unit switch { "cm⁻¹" => "cm$^{-1}$", "kcal/mol" => "kcal\\,mol$^{-1}$", "kJ/mol" => "kJ\\,mol$^{-1}$", "Eh" => "$E_\\mathrm{h}$", _ => unit };
        return c switch
        {
            ExportColumn.Reaction => new(c, "Reaction", "Reaction", "Reaction", false),
            ExportColumn.Step => new(c, "Step", "Step", "Step", false),
            ExportColumn.BarrierElectronic => new(c, $"ΔE‡ ({unit})", $"$\\Delta E^{{\\ddagger}}$ ({latexUnit})", $"ΔE‡ ({unit})", true),
            ExportColumn.BarrierEnthalpy => new(c, $"ΔH‡ ({unit})", $"$\\Delta H^{{\\ddagger}}$ ({latexUnit})", $"ΔH‡ ({unit})", true),
            ExportColumn.BarrierGibbs => new(c, $"ΔG‡ ({unit})", $"$\\Delta G^{{\\ddagger}}$ ({latexUnit})", $"ΔG‡ ({unit})", true),
            ExportColumn.ReactionGibbs => new(c, $"ΔG_r ({unit})", $"$\\Delta G_\\mathrm{{r}}$ ({latexUnit})", $"ΔG<sub>r</sub> ({unit})", true),
            ExportColumn.RateConstant => new(c, "k (s⁻¹)", "$k$ (s$^{-1}$)", "k (s⁻¹)", true),
            ExportColumn.HalfLife => new(c, "t½ (s)", "$t_{1/2}$ (s)", "t½ (s)", true),
            ExportColumn.ImaginaryFrequency => new(c, "Imaginary frequency (i cm⁻¹)", "$\\tilde{\\nu}_\\mathrm{imag}$ (cm$^{-1}$)", "Imaginary frequency (cm⁻¹)", true),
            ExportColumn.Verdict => new(c, "Check", "Check", "Check", false),
            ExportColumn.ReviewStatus => new(c, "Review", "Review", "Review", false),
            ExportColumn.LevelOfTheory => new(c, "Level of theory", "Level of theory", "Level of theory", false),
            _ => throw new ArgumentOutOfRangeException(nameof(c), c, "Unknown column."),
        };
    }

    private static TableHeader IntervalHeader(ExportColumn c) => c == ExportColumn.RateConstant
        ? new(c, "k 95 % interval", "$k$ 95\\,\\% interval", "k 95 % interval", false)
        : new(c, "t½ 95 % interval (s)", "$t_{1/2}$ 95\\,\\% interval (s)", "t½ 95 % interval (s)", false);

    // "lower to upper" in the k or t½ column's notation, or "no uncertainty set"; empty where the value is.
    private static TableCell IntervalCell(BarrierRow r, ExportColumn c, Kinetics.EnergyUncertainty uncertainty, double temperatureKelvin)
    {
        var value = c == ExportColumn.RateConstant ? r.RateConstant : r.HalfLifeSeconds;
        if (value is not { } v || !double.IsFinite(v) || v <= 0) return TableCell.Empty;
        var interval = c == ExportColumn.RateConstant
            ? uncertainty.RateConstant(v, r.LevelOfTheory, temperatureKelvin)
            : uncertainty.Time(v, r.LevelOfTheory, temperatureKelvin);
        if (!interval.IsSet) return new TableCell(CellKind.Text, Core.Kinetics.UncertainValue.NotSet);
        var (lower, upper) = (ScientificCell(interval.Lower), ScientificCell(interval.Upper));
        return new TableCell(CellKind.Text, $"{lower.Plain} to {upper.Plain}") { Bounds = [lower, upper] };
    }

    private static TableCell Cell(BarrierRow r, ExportColumn c, TableOptions o) => c switch
    {
        ExportColumn.Reaction => new(CellKind.Text, r.Reaction),
        ExportColumn.Step => new(CellKind.Text, r.Step),
        ExportColumn.BarrierElectronic => EnergyCell(r.BarrierElectronic, o),
        ExportColumn.BarrierEnthalpy => EnergyCell(r.BarrierEnthalpy, o),
        ExportColumn.BarrierGibbs => EnergyCell(r.BarrierGibbs, o),
        ExportColumn.ReactionGibbs => EnergyCell(r.ReactionGibbs, o),
        ExportColumn.RateConstant => ScientificCell(r.RateConstant),
        ExportColumn.HalfLife => ScientificCell(r.HalfLifeSeconds),
        ExportColumn.ImaginaryFrequency => r.ImaginaryFrequencyCm1 is { } f && double.IsFinite(f)
            ? new(CellKind.Imaginary, "", Math.Round(Math.Abs(f), 0, MidpointRounding.AwayFromZero)) : TableCell.Empty,
        ExportColumn.Verdict => new(CellKind.Text, r.Check is { } v ? VerdictText.Of(v) : "not checked"),
        ExportColumn.ReviewStatus => new(CellKind.Text, ReviewStates.Text(r.Review)),
        ExportColumn.LevelOfTheory => new(CellKind.Text, r.LevelOfTheory),
        _ => throw new ArgumentOutOfRangeException(nameof(c), c, "Unknown column."),
    };

    /// <summary>A number rounded to <paramref name="decimals"/> places (half away from zero), e.g. a percentage.</summary>
    internal static TableCell FixedCell(double x, int decimals) =>
        new(CellKind.Fixed, "", Math.Round(x, decimals, MidpointRounding.AwayFromZero), decimals);

    private static TableCell EnergyCell(Energy? e, TableOptions o)
    {
        if (e is not { } v || !double.IsFinite(v.Hartree)) return TableCell.Empty;
        var rounded = Math.Round(v.In(o.Unit), o.Decimals, MidpointRounding.AwayFromZero);
        if (rounded == 0) rounded = 0; // no "-0.0"
        return new TableCell(CellKind.Fixed, "", rounded, o.Decimals);
    }

    /// <summary>A positive quantity to 1 + <paramref name="decimals"/> significant digits (three unless asked; empty when there is none, it is not finite or not positive).</summary>
    internal static TableCell ScientificCell(double? x, int decimals = 2)
    {
        if (x is not { } v || !double.IsFinite(v) || v <= 0) return TableCell.Empty;
        var exponent = (int)Math.Floor(Math.Log10(v));
        var mantissa = Math.Round(v / Math.Pow(10, exponent), decimals, MidpointRounding.AwayFromZero);
        if (mantissa >= 10) { mantissa /= 10; exponent++; }
        var digits = "0." + new string('0', decimals);
        var number = double.Parse($"{mantissa.ToString(digits, CultureInfo.InvariantCulture)}E{exponent.ToString(CultureInfo.InvariantCulture)}", CultureInfo.InvariantCulture);
        return new TableCell(CellKind.Scientific, "", number, decimals, mantissa, exponent);
    }
}
