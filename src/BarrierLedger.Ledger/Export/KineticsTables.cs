using BarrierLedger.Core.Kinetics;
using BarrierLedger.Ledger.Kinetics;

namespace BarrierLedger.Ledger.Export;

/// <summary>Which table of a kinetics run.</summary>
public enum KineticsTable
{
    /// <summary>Conversion times, conversion and yields, product ratio, rate constants, each with its interval or why it has none.</summary>
    Answers,
    /// <summary>Concentration of every species against time (the plotted curve).</summary>
    Curves,
}

/// <summary>
/// A kinetics run (<see cref="KineticsReport"/>) as tables for the existing writers (<see cref="ExportService.Table"/>: CSV with
/// every cell neutralised against formula injection, XLSX with numeric cells). Each table's header states the run's energy model,
/// temperature, standard state, conditions, and the uncertainty behind the intervals or "no uncertainty set", the answer sentence
/// and every caution; nothing is computed here, only rounded for the file (three significant digits for answers and k, six for
/// the curves, two decimals for percentages).
/// </summary>
public static class KineticsTables
{
    public const string AnswersSheet = "Kinetics answers";
    public const string CurvesSheet = "Concentrations";
    public const string NoMonteCarlo = "no Monte Carlo run";

    /// <summary>Mantissa decimals of times and concentrations in the curves (six significant digits, so a curve can be re-plotted or fitted).</summary>
    public const int CurveDecimals = 5;

    /// <summary>The file of one table of the run, in CSV or XLSX.</summary>
    public static ExportFile File(KineticsReport report, KineticsTable table, TableFormat format)
    {
        ArgumentNullException.ThrowIfNull(report);
        if (format is not (TableFormat.Csv or TableFormat.Xlsx)) throw new ArgumentException($"Kinetics tables are written as CSV or XLSX, not {format}.", nameof(format));
        var built = table == KineticsTable.Answers ? Answers(report) : Curves(report);
        var name = SupportingInfoWriter.SafeFileName(report.Title.Replace("Kinetics of ", "", StringComparison.Ordinal));
        return ExportService.Table(built, format, $"kinetics-{name}-{(table == KineticsTable.Answers ? "answers" : "curves")}");
    }

    /// <summary>Header lines of both tables: the report's own lines, the answer sentence(s) and the cautions.</summary>
    public static IReadOnlyList<string> Lines(KineticsReport report)
    {
        ArgumentNullException.ThrowIfNull(report);
        var lines = new List<string>(report.HeaderLines);
        if (report.Result.Answers is { } a) lines.Add($"Answer: {a.Sentence}");
        if (report.MonteCarlo is { UncertaintySet: true } mc) lines.Add($"With intervals: {mc.Sentence}");
        lines.AddRange(report.Cautions.Select(c => $"Note: {c}"));
        return lines;
    }

    public static BarrierTable Answers(KineticsReport report)
    {
        ArgumentNullException.ThrowIfNull(report);
        var level = report.MonteCarlo is { } m ? Microkinetics.Format.Percent(m.ConfidenceLevel) : "95 %";
        var headers = new[]
        {
            Header("Quantity", false), Header("Value", true), Header("Unit", false), Header("Median", true),
            Header($"{level} lower", true), Header($"{level} upper", true),
        };
        var rows = new List<TableRow>();
        var a = report.Result.Answers;
        var mc = report.MonteCarlo;
        var noInterval = report.Model.SigmaKcalPerMol > 0 ? NoMonteCarlo : Core.Kinetics.UncertainValue.NotSet;
        TableCell[] Sampled(SampledInterval? s, Func<double, TableCell> cell) => s is null || mc is not { UncertaintySet: true }
            ? [Text(noInterval), TableCell.Empty, TableCell.Empty]
            : [cell(s.Median), cell(s.Lower), cell(s.Upper)];
        TableCell Time(double t) => double.IsPositiveInfinity(t) ? Text("not reached") : BarrierTable.ScientificCell(t);
        TableCell Percent(double f) => double.IsFinite(f) ? BarrierTable.FixedCell(f * 100, 2) : TableCell.Empty;

        if (a is not null)
        {
            for (var k = 0; k < a.ConversionTimes.Length; k++)
            {
                var t = a.ConversionTimes[k];
                rows.Add(Row([Text($"time to {Microkinetics.Format.Percent(t.Conversion)} conversion of {a.Question.Substrate}"),
                    t.TimeSeconds is { } s ? BarrierTable.ScientificCell(s) : Text($"not reached within {Microkinetics.Format.Duration(report.Conditions.EndTimeSeconds)}"),
                    Text("s"), .. Sampled(mc?.ConversionTimes.ElementAtOrDefault(k), Time)]));
            }
            for (var k = 0; k < a.AtReportTimes.Length; k++)
            {
                var p = a.AtReportTimes[k];
                rows.Add(Row([Text($"conversion of {a.Question.Substrate} after {Microkinetics.Format.Duration(p.TimeSeconds)}"), Percent(p.Conversion), Text("%"),
                    .. Sampled(mc?.ConversionAtReportTimes.ElementAtOrDefault(k), Percent)]));
            }
            for (var k = 0; k < a.Question.Products.Count; k++)
                rows.Add(Row([Text($"yield of {a.Question.Products[k]} after {Microkinetics.Format.Duration(a.AtEnd.TimeSeconds)}"), Percent(a.AtEnd.Yields[k]), Text("%"),
                    .. Sampled(mc?.FinalYields.ElementAtOrDefault(k), Percent)]));
            if (a.Question.Products.Count >= 2)
                rows.Add(Row([Text($"product ratio [{a.Question.Products[0]}]/[{a.Question.Products[1]}] after {Microkinetics.Format.Duration(a.AtEnd.TimeSeconds)}"),
                    report.ProductRatio is { } r ? BarrierTable.ScientificCell(r) : Text($"{a.Question.Products[1]} does not form"), Text(""),
                    .. Sampled(mc?.ProductRatio, x => BarrierTable.ScientificCell(x))]));
        }
        for (var i = 0; i < report.Result.RateConstantsAtStart.Count; i++)
        {
            var r = report.Result.RateConstantsAtStart[i];
            var interval = RateUncertainty.RateConstant(r.Forward, report.Model.SigmaKcalPerMol, r.TemperatureKelvin);
            rows.Add(Row([Text($"k forward of {r.Label} at {r.TemperatureKelvin:0.##} K"), BarrierTable.ScientificCell(r.Forward), Text(r.ForwardUnit),
                .. interval.IsSet ? new[] { TableCell.Empty, BarrierTable.ScientificCell(interval.Lower), BarrierTable.ScientificCell(interval.Upper) }
                    : [Text(Core.Kinetics.UncertainValue.NotSet), TableCell.Empty, TableCell.Empty]]));
            rows.Add(Row([Text($"k reverse of {r.Label} at {r.TemperatureKelvin:0.##} K"), r.Reverse > 0 ? BarrierTable.ScientificCell(r.Reverse) : BarrierTable.FixedCell(0, 0),
                Text(r.ReverseUnit), TableCell.Empty, TableCell.Empty, TableCell.Empty]));
        }
        return new BarrierTable($"{report.Title}: answers", Lines(report), headers, rows, [], ExportCaution.Text, Core.Units.EnergyUnit.KcalPerMol, 2)
        {
            SheetName = AnswersSheet,
        };
    }

    public static BarrierTable Curves(KineticsReport report)
    {
        ArgumentNullException.ThrowIfNull(report);
        var species = report.Result.Species;
        var headers = new List<TableHeader> { Header("time (s)", true), Header("T (K)", true) };
        headers.AddRange(species.Select(s => Header($"[{s}] (mol/L)", true)));
        var rows = report.Result.Curve.Select(p => Row([
            p.TimeSeconds > 0 ? BarrierTable.ScientificCell(p.TimeSeconds, CurveDecimals) : BarrierTable.FixedCell(0, 0),
            BarrierTable.FixedCell(p.TemperatureKelvin, 2),
            .. p.MolPerL.Select(c => c > 0 ? BarrierTable.ScientificCell(c, CurveDecimals) : BarrierTable.FixedCell(0, 0)),
        ])).ToList();
        var lines = Lines(report).ToList();
        lines.Add("Times are the integrator's accepted steps (thinned evenly in log t); concentrations to six significant digits; a value below 0 within the integrator's tolerance is written as 0.");
        return new BarrierTable($"{report.Title}: concentrations against time", lines, headers, rows, [], ExportCaution.Text, Core.Units.EnergyUnit.KcalPerMol, 2)
        {
            SheetName = CurvesSheet,
        };
    }

    private static TableHeader Header(string text, bool numeric) => new(null, text, text.Replace("%", "\\%", StringComparison.Ordinal), text, numeric);

    private static TableCell Text(string text) => new(CellKind.Text, text);

    private static TableRow Row(TableCell[] cells) => new(cells, []);
}
