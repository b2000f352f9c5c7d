using System.CommandLine;
using System.Globalization;
using BarrierLedger.Core.Kinetics;
using BarrierLedger.Ledger.Export;
using BarrierLedger.Ledger.Kinetics;
using BarrierLedger.Ledger.Queries;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.Cli.Commands;

/// <summary>
/// <c>barrierledger kinetics --reaction R</c>: the microkinetic simulation of a stored reaction (from a ledger, <c>--data-dir</c>, or a
/// bundle, <c>--bundle</c>), the same run as the reaction page's kinetics section (<see cref="KineticsRun"/>): the answer sentence,
/// the conversion times with their intervals, yields and product ratio, the rate constants, every caution; the curves and the
/// answers as CSV or XLSX through the export writers.
/// </summary>
internal static class KineticsCommand
{
    public static Command Create(CliContext ctx)
    {
        var src = new SourceOptions();
        var study = new Option<string?>("--study") { Description = "Study name or id (default: the only study)" };
        var reaction = new Option<string>("--reaction") { Description = "Reaction label or id", Required = true };
        var c0 = new Option<string[]>("--c0")
        {
            Description = "Starting concentration SPECIES=MOL_PER_L (repeat, or separate by commas); species not named keep the proposed amounts (0.1 mol/L, catalysts 5 mol%)",
            AllowMultipleArgumentsPerToken = true,
        };
        var temperature = new Option<double?>("--temperature") { Description = "Temperature in K (default: the reaction's proposed one, else the energy model's)" };
        var hours = new Option<double?>("--hours") { Description = "Time span in h (default: the reaction's proposed one, else 24)" };
        var ramp = new Option<double?>("--ramp") { Description = "Linear temperature ramp in K/min (default: none)" };
        var rampEnd = new Option<double?>("--ramp-end") { Description = "Temperature in K at which the ramp stops and holds" };
        var substrate = new Option<string?>("--substrate") { Description = "Limiting reactant whose conversion is reported (default: the proposed one)" };
        var at = new Option<string?>("--at") { Description = "Comma-separated times in h at which conversion is reported (default: the end)" };
        var samples = new Option<int>("--samples") { Description = "Monte Carlo samples over the energy uncertainty for intervals of times, yields and ratio (0: none; 1000 or more for a stated interval)", DefaultValueFactory = _ => 0 };
        var key = new Option<int>("--random-key") { Description = "Key of the Monte Carlo's random streams: the same key gives the same intervals", DefaultValueFactory = _ => 2026 };
        var csv = new Option<bool>("--csv") { Description = "Print the concentration–time curves as CSV instead of the answers" };
        var output = new Option<string?>("--out") { Description = "Write the concentration–time curves to this file (.csv or .xlsx)" };
        var answers = new Option<string?>("--answers") { Description = "Write the answers table to this file (.csv or .xlsx)" };
        var json = CommonOptions.Json();
        var cmd = new Command("kinetics", "Microkinetic simulation of a stored reaction: conversion times, yields, product ratio and their intervals, curves as CSV/XLSX.")
        {
            study, reaction, c0, temperature, hours, ramp, rampEnd, substrate, at, samples, key, csv, output, answers, json,
        };
        src.AddTo(cmd);
        cmd.SetAction(pr => src.Run(ctx, pr, async (services, ct) =>
        {
            if (pr.GetValue(csv) && pr.GetValue(json)) throw new UsageException("give either --csv or --json, not both");
            var studyId = await ExportCommand.ResolveStudyAsync(services, pr.GetValue(study), ct);
            var id = (await ExportCommand.ResolveReactionsAsync(services, studyId, pr.GetValue(reaction), ct))!.Single();
            var detail = await services.GetRequiredService<ReactionQueryService>().GetReactionAsync(id, ct)
                ?? throw new InvalidOperationException($"reaction {id} disappeared while reading");
            var request = new KineticsRequest(
                ParseConcentrations(pr.GetValue(c0)), pr.GetValue(temperature), pr.GetValue(hours), pr.GetValue(ramp), pr.GetValue(rampEnd), pr.GetValue(substrate),
                ParseHours(pr.GetValue(at)), pr.GetValue(samples), pr.GetValue(key));
            if (request.Samples < 0) throw new UsageException($"--samples must be 0 or more, got {request.Samples}");
            var outPath = pr.GetValue(output);
            var answersPath = pr.GetValue(answers);
            var outFormat = outPath is null ? TableFormat.Csv : FormatOf("--out", outPath);
            var answersFormat = answersPath is null ? TableFormat.Csv : FormatOf("--answers", answersPath);

            var report = KineticsRun.Run(detail, request, cancel: ct);
            if (pr.GetValue(json)) ctx.WriteJson(KineticsSummary.Of(report, withCurve: true));
            else if (pr.GetValue(csv)) ctx.Out.Write(System.Text.Encoding.UTF8.GetString(KineticsTables.File(report, KineticsTable.Curves, TableFormat.Csv).Content));
            else Print(ctx.Out, report);
            // Files are reported on stderr when stdout carries a document, so the document stays parseable.
            var log = pr.GetValue(json) || pr.GetValue(csv) ? ctx.Err : ctx.Out;
            if (outPath is not null) ExportCommand.Write(log, outPath, KineticsTables.File(report, KineticsTable.Curves, outFormat).Content);
            if (answersPath is not null) ExportCommand.Write(log, answersPath, KineticsTables.File(report, KineticsTable.Answers, answersFormat).Content);
            return ExitCodes.Ok;
        }));
        return cmd;
    }

    /// <summary>The answers as text: the header lines, the sentence, the answers table's rows, the cautions.</summary>
    private static void Print(TextWriter o, KineticsReport report)
    {
        o.WriteLine(report.Title);
        foreach (var line in report.HeaderLines) o.WriteLine("  " + line);
        o.WriteLine();
        if (report.Result.Answers is { } a) o.WriteLine(a.Sentence);
        if (report.MonteCarlo is { UncertaintySet: true } mc) o.WriteLine("With intervals: " + mc.Sentence);
        o.WriteLine();
        var table = KineticsTables.Answers(report);
        var cells = table.Rows.Select(r => r.Cells.Select(c => c.Plain).ToArray()).ToList();
        var headers = table.Headers.Select(h => h.Plain).ToArray();
        var widths = headers.Select((h, i) => Math.Max(h.Length, cells.Select(r => r[i].Length).DefaultIfEmpty(0).Max())).ToArray();
        o.WriteLine(string.Join("  ", headers.Select((h, i) => h.PadRight(widths[i]))).TrimEnd());
        foreach (var r in cells) o.WriteLine(string.Join("  ", r.Select((c, i) => c.PadRight(widths[i]))).TrimEnd());
        if (report.Cautions.Count > 0)
        {
            o.WriteLine();
            o.WriteLine("Notes:");
            foreach (var c in report.Cautions) o.WriteLine("  - " + c);
        }
        o.WriteLine();
        o.WriteLine(ExportCaution.Text);
    }

    internal static Dictionary<string, double>? ParseConcentrations(string[]? given)
    {
        if (given is null || given.Length == 0) return null;
        var result = new Dictionary<string, double>(StringComparer.Ordinal);
        foreach (var item in given.SelectMany(g => g.Split(',', StringSplitOptions.TrimEntries | StringSplitOptions.RemoveEmptyEntries)))
        {
            var eq = item.LastIndexOf('=');
            if (eq <= 0 || !double.TryParse(item[(eq + 1)..], NumberStyles.Float, CultureInfo.InvariantCulture, out var c))
                throw new UsageException($"--c0 '{item}': expected SPECIES=MOL_PER_L, e.g. chloromethane=0.1");
            if (!(c >= 0) || !double.IsFinite(c)) throw new UsageException($"--c0 '{item}': a concentration is zero or positive, in mol/L");
            if (!result.TryAdd(item[..eq].Trim(), c)) throw new UsageException($"--c0: '{item[..eq].Trim()}' is given twice");
        }
        return result;
    }

    private static List<double>? ParseHours(string? text)
    {
        if (string.IsNullOrWhiteSpace(text)) return null;
        var list = new List<double>();
        foreach (var t in text.Split(',', StringSplitOptions.TrimEntries | StringSplitOptions.RemoveEmptyEntries))
        {
            if (!double.TryParse(t, NumberStyles.Float, CultureInfo.InvariantCulture, out var h) || !(h > 0) || !double.IsFinite(h))
                throw new UsageException($"--at '{t}': a report time is a number of hours above 0");
            list.Add(h);
        }
        return list;
    }

    private static TableFormat FormatOf(string option, string path) => Path.GetExtension(path).ToLowerInvariant() switch
    {
        ".csv" => TableFormat.Csv,
        ".xlsx" => TableFormat.Xlsx,
        _ => throw new UsageException($"{option} {path}: the file must end in .csv or .xlsx"),
    };
}
