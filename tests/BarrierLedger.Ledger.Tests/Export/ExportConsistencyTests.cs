using System.Globalization;
using System.Text;
using System.Text.RegularExpressions;
using BarrierLedger.Ledger.Export;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Support;
using CsvHelper;

namespace BarrierLedger.Ledger.Tests.Export;

/// <summary>
/// Issue 16, item 5: every ΔG‡, ΔG_r and k printed in each table format and every label of the energy diagrams equals the
/// stored derivation that the reaction page shows and the API returns (<see cref="ReactionQueryService.GetReactionAsync"/>),
/// at the format's rounding, for every reaction of the demo study.
/// </summary>
public sealed partial class ExportConsistencyTests
{
    // CODATA 2018: 1 Eh = 4.3597447222071e-18 J × N_A 6.02214076e23 / (4184 J/kcal) = 627.5094740631 kcal/mol.
    private const double KcalPerHartree = 627.5094740631;

    /// <summary>The table's rounding (TableOptions.Default: kcal/mol, 1 decimal, half away from zero; k three significant digits).</summary>
    private static string Kcal(double? hartree) => hartree is { } h
        ? (Math.Round(h * KcalPerHartree, 1, MidpointRounding.AwayFromZero) is var v && v == 0 ? 0 : v).ToString("F1", CultureInfo.InvariantCulture) : "";

    private static string Sci(double? x) => x is { } v && v > 0 ? v.ToString("0.00E+00", CultureInfo.InvariantCulture) : "";

    /// <summary>Per table row in order (reactions by label, steps in pathway order): ΔG‡, ΔG_r, k as the API's reaction detail gives them.</summary>
    private static async Task<List<(string Reaction, string G, string Gr, string K)>> ExpectedAsync(TempLedger ledger, int studyId)
    {
        var detail = new ReactionQueryService(ledger.Factory);
        var rows = new List<(string, string, string, string)>();
        foreach (var r in (await new ExportQueryService(ledger.Factory).ListStudiesAsync()).Single(s => s.Id == studyId).Reactions)
        {
            var d = (await detail.GetReactionAsync(r.Id))!;
            if (d.Steps.Count == 0) rows.Add((d.Label, "", "", ""));
            foreach (var s in d.Steps) rows.Add((d.Label, Kcal(s.BarrierGHartree), Kcal(s.ReactionGHartree), Sci(s.RateConstant)));
        }
        return rows;
    }

    // Each format's cells back to the plain form: "−"/"$-$" to "-", "1.23×10⁻⁴" / "$1.23 \times 10^{-4}$" to "1.23E-04", dashes to "".
    private static string PlainNumber(string cell)
    {
        var c = cell.Trim().Replace("$-$", "-").Replace('\u2212', '-');
        if (c is "–" or "—" or "--" or "---") return "";
        var m = SciPattern().Match(c);
        if (!m.Success) return c;
        var exponent = int.Parse(m.Groups[2].Value.Replace('\u2212', '-').Select(ch => "⁰¹²³⁴⁵⁶⁷⁸⁹".IndexOf(ch) is var i and >= 0 ? (char)('0' + i) : ch == '⁻' ? '-' : ch).ToArray(),
            CultureInfo.InvariantCulture);
        return double.Parse($"{m.Groups[1].Value}E{exponent}", CultureInfo.InvariantCulture).ToString("0.00E+00", CultureInfo.InvariantCulture);
    }

    [GeneratedRegex(@"^\$?([0-9.]+)\s*(?:×10|\\times 10\^\{)([⁻⁰¹²³⁴⁵⁶⁷⁸⁹\-0-9]+)\}?\$?$")]
    private static partial Regex SciPattern();

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task DemoStudy_EveryTableFormatAndDiagramLabel_PrintsTheStoredDerivation(StoreProvider store)
    {
        var (ledger, studyId) = await DemoLedger.CreateAsync(store);
        await using var _ = ledger;
        var expected = await ExpectedAsync(ledger, studyId);
        Assert.True(expected.Count(e => e.G.Length > 0) >= 6, "the demo must give barriers to compare");
        var service = new ExportService(new ExportQueryService(ledger.Factory));
        var table = BarrierTable.Build(await new ExportQueryService(ledger.Factory).GetTableSourceAsync(studyId), TableOptions.Default);
        int Col(ExportColumn c) => table.Headers.ToList().FindIndex(h => h.Column == c && !h.Plain.Contains("interval"));
        var (g, gr, k) = (Col(ExportColumn.BarrierGibbs), Col(ExportColumn.ReactionGibbs), Col(ExportColumn.RateConstant));

        var parsed = new Dictionary<string, List<string[]>>();
        // CSV, read with CsvHelper.
        var csv = Encoding.UTF8.GetString((await service.TableAsync(studyId, null, TableFormat.Csv, TableOptions.Default)).Content);
        using (var reader = CsvReader.FromText(csv, new CsvReaderOptions { CommentPrefix = CsvTableWriter.CommentPrefix }))
        {
            var rows = new List<string[]>();
            while (reader.Read()) rows.Add([.. Enumerable.Range(0, table.Headers.Count).Select(reader.GetString)]);
            parsed["csv"] = rows;
        }
        // XLSX, read with the OpenXML SDK: numeric cells hold the printed (rounded) value.
        var ws = XlsxSheet.Read((await service.TableAsync(studyId, null, TableFormat.Xlsx, TableOptions.Default)).Content, XlsxTableWriter.SheetName);
        var header = Enumerable.Range(1, 100).First(row => ws[row, 1]?.Text == table.Headers[0].Plain);
        parsed["xlsx"] = [.. Enumerable.Range(0, table.Rows.Count).Select(r => Enumerable.Range(0, table.Headers.Count).Select(c =>
            ws[header + 1 + r, c + 1] is { } cell ? cell.Number is { } n ? (c == k ? n.ToString("0.00E+00", CultureInfo.InvariantCulture) : n.ToString("F1", CultureInfo.InvariantCulture)) : cell.Text : "").ToArray())];
        // Markdown: the table's body lines.
        var md = Encoding.UTF8.GetString((await service.TableAsync(studyId, null, TableFormat.Markdown, TableOptions.Default)).Content);
        parsed["markdown"] = [.. md.Split('\n').Where(l => l.StartsWith("| ", StringComparison.Ordinal)).Skip(1)
            .Select(l => l.Trim().Trim('|').Split(" | ").Select(x => x.Trim()).ToArray())];
        // LaTeX: the rows between \midrule and \bottomrule.
        var tex = Encoding.UTF8.GetString((await service.TableAsync(studyId, null, TableFormat.Latex, TableOptions.Default)).Content).Split('\n');
        var (from, to) = (Array.FindIndex(tex, l => l.StartsWith(@"\midrule", StringComparison.Ordinal)), Array.FindIndex(tex, l => l.StartsWith(@"\bottomrule", StringComparison.Ordinal)));
        parsed["latex"] = [.. tex[(from + 1)..to].Where(l => l.Contains(" & ")).Select(l => l.TrimEnd().TrimEnd('\\').Split(" & "))];

        foreach (var (format, rows) in parsed)
        {
            Assert.True(expected.Count == rows.Count, $"{format}: {rows.Count} rows for {expected.Count} steps");
            for (var i = 0; i < rows.Count; i++)
            {
                var e = expected[i];
                var got = (rows[i][0], PlainNumber(rows[i][g]), PlainNumber(rows[i][gr]), PlainNumber(rows[i][k]));
                Assert.True((e.Reaction, e.G, e.Gr, e.K) == got, $"{format} row {i + 1}: expected {e}, printed {got}");
            }
        }

        // Energy diagrams (SVG, as the Export screen, the API and 'barrierledger export diagram' write them): each state's label is
        // its stored ΔG relative to the first state, the same numbers the reaction page draws.
        var detail = new ReactionQueryService(ledger.Factory);
        var drawn = 0;
        foreach (var r in (await new ExportQueryService(ledger.Factory).ListStudiesAsync()).Single(s => s.Id == studyId).Reactions)
        {
            var d = (await detail.GetReactionAsync(r.Id))!;
            if (d.StateEnergies.Any(s => s.DeltaGHartree is null)) continue;
            var (svg, _) = await service.DiagramAsync(r.Id, "ΔG", Core.Units.EnergyUnit.KcalPerMol, 1);
            var labels = SvgText().Matches(Encoding.UTF8.GetString(svg.Content)).Select(m => m.Groups[1].Value.Replace('\u2212', '-')).ToList();
            var baseline = d.StateEnergies.OrderBy(s => s.Position).First().DeltaGHartree!.Value;
            foreach (var s in d.StateEnergies)
                Assert.True(labels.Contains(Kcal(s.DeltaGHartree!.Value - baseline)), $"{d.Label} diagram: no label {Kcal(s.DeltaGHartree!.Value - baseline)} for {s.Label}");
            drawn++;
        }
        Assert.True(drawn >= 6, $"only {drawn} diagrams drawn");
    }

    [GeneratedRegex("<text[^>]*>([^<]*)</text>")]
    private static partial Regex SvgText();
}
