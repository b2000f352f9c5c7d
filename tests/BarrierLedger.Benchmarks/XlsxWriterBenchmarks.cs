using System.Globalization;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Export;
using BenchmarkDotNet.Attributes;
using DocumentFormat.OpenXml;
using DocumentFormat.OpenXml.Packaging;
using X = DocumentFormat.OpenXml.Spreadsheet;

namespace BarrierLedger.Benchmarks;

/// <summary>
/// The two maintained XLSX writers served here, side by side on a 10,000-row barrier table (13 columns: text, fixed-point
/// energies, scientific rate constants, imaginary wavenumbers): SpreadCheetah, which the product uses
/// (<see cref="XlsxTableWriter"/>), and the Open XML SDK's forward-only <see cref="OpenXmlWriter"/> writing the same cells,
/// number formats, bold header and column widths. Run: <c>dotnet run -c Release --project tests/BarrierLedger.Benchmarks -- --filter '*Xlsx*'</c>.
/// </summary>
[MemoryDiagnoser]
public class XlsxWriterBenchmarks
{
    private BarrierTable _table = null!;

    [Params(10_000)]
    public int Rows { get; set; }

    [GlobalSetup]
    public void Setup() => _table = MakeTable(Rows);

    [Benchmark(Baseline = true)]
    public int SpreadCheetah() => XlsxTableWriter.ToBytes(_table).Length;

    [Benchmark]
    public int OpenXmlSdk()
    {
        using var ms = new MemoryStream();
        OpenXmlSdkWriter.Write(_table, ms);
        return (int)ms.Length;
    }

    /// <summary>An invented table of the shape the ledger exports (values are arbitrary; only the shape matters here).</summary>
    public static BarrierTable MakeTable(int rows)
    {
        var columns = Enum.GetValues<ExportColumn>();
        var headers = columns.Select(c => new TableHeader(c, c.ToString(), c.ToString(), c.ToString(), c is not (ExportColumn.Reaction or ExportColumn.Step
            or ExportColumn.Verdict or ExportColumn.ReviewStatus or ExportColumn.LevelOfTheory))).ToList();
        var random = new Random(17);
        var list = new List<TableRow>(rows);
        for (var i = 0; i < rows; i++)
        {
            var cells = columns.Select(c => c switch
            {
                ExportColumn.Reaction => new TableCell(CellKind.Text, "reaction " + i.ToString(CultureInfo.InvariantCulture)),
                ExportColumn.Step => new TableCell(CellKind.Text, "A + B → INT1"),
                ExportColumn.RateConstant or ExportColumn.HalfLife => new TableCell(CellKind.Scientific, "", Math.Round(random.NextDouble() * 9 + 1, 2) * Math.Pow(10, random.Next(-12, 12)), 2),
                ExportColumn.ImaginaryFrequency => new TableCell(CellKind.Imaginary, "", random.Next(100, 2000)),
                ExportColumn.Verdict => new TableCell(CellKind.Text, "passed"),
                ExportColumn.ReviewStatus => new TableCell(CellKind.Text, "awaiting review"),
                ExportColumn.LevelOfTheory => new TableCell(CellKind.Text, "wB97X-D/def2-TZVP//B3LYP-D3/def2-SVP"),
                _ => new TableCell(CellKind.Fixed, "", Math.Round(random.NextDouble() * 60 - 20, 1), 1),
            }).ToList();
            list.Add(new TableRow(cells, i % 7 == 0 ? ["a"] : []));
        }
        return new BarrierTable("Barriers and reaction energies: scale", ["Energies: wB97X-D/def2-TZVP; 298.15 K; 1 mol/L"], headers, list,
            [new TableFootnote("a", "saddle point not verified by a reviewer")], "Caution: model estimates.", EnergyUnit.KcalPerMol, 1);
    }

    /// <summary>The same sheet through the Open XML SDK's streaming writer (styles part built once, rows written forward).</summary>
    private static class OpenXmlSdkWriter
    {
        public static void Write(BarrierTable table, Stream destination)
        {
            using var doc = SpreadsheetDocument.Create(destination, SpreadsheetDocumentType.Workbook);
            var book = doc.AddWorkbookPart();
            book.Workbook = new X.Workbook(new X.Sheets(new X.Sheet { Name = XlsxTableWriter.SheetName, SheetId = 1, Id = "rId1" }));
            var styles = book.AddNewPart<WorkbookStylesPart>();
            styles.Stylesheet = new X.Stylesheet(
                new X.NumberingFormats(new X.NumberingFormat { NumberFormatId = 164, FormatCode = "0.0" },
                    new X.NumberingFormat { NumberFormatId = 165, FormatCode = "0.00E+00" }, new X.NumberingFormat { NumberFormatId = 166, FormatCode = "0\"i\"" }),
                new X.Fonts(new X.Font(), new X.Font(new X.Bold())),
                new X.Fills(new X.Fill(new X.PatternFill { PatternType = X.PatternValues.None }), new X.Fill(new X.PatternFill { PatternType = X.PatternValues.Gray125 })),
                new X.Borders(new X.Border()),
                new X.CellFormats(new X.CellFormat(), new X.CellFormat { FontId = 1, ApplyFont = true },
                    new X.CellFormat { NumberFormatId = 164, ApplyNumberFormat = true }, new X.CellFormat { NumberFormatId = 165, ApplyNumberFormat = true },
                    new X.CellFormat { NumberFormatId = 166, ApplyNumberFormat = true }));
            var sheet = book.AddNewPart<WorksheetPart>("rId1");
            using var w = OpenXmlWriter.Create(sheet);
            w.WriteStartElement(new X.Worksheet());
            w.WriteStartElement(new X.Columns());
            for (uint c = 1; c <= table.Headers.Count + 1; c++) w.WriteElement(new X.Column { Min = c, Max = c, Width = 16, CustomWidth = true });
            w.WriteEndElement();
            w.WriteStartElement(new X.SheetData());
            Row(w, [Text(table.Title, 1)]);
            foreach (var line in table.ModelLines) Row(w, [Text(line, 0)]);
            Row(w, []);
            Row(w, [.. table.Headers.Select(h => Text(h.Plain, 1)), Text(BarrierTable.NoteHeader, 1)]);
            foreach (var row in table.Rows)
            {
                var cells = row.Cells.Select(v => v.Kind switch
                {
                    CellKind.Fixed => Number(v.Number!.Value, 2),
                    CellKind.Scientific => Number(v.Number!.Value, 3),
                    CellKind.Imaginary => Number(v.Number!.Value, 4),
                    CellKind.Empty => new X.Cell(),
                    _ => Text(v.Text, 0),
                }).Append(Text(string.Join(" ", row.Marks), 0)).ToArray();
                Row(w, cells);
            }
            foreach (var f in table.Footnotes) Row(w, [Text($"[{f.Mark}] {f.Text}", 0)]);
            Row(w, [Text(table.Caution, 0)]);
            w.WriteEndElement();
            w.WriteEndElement();
        }

        private static void Row(OpenXmlWriter w, X.Cell[] cells)
        {
            w.WriteStartElement(new X.Row());
            foreach (var c in cells) w.WriteElement(c);
            w.WriteEndElement();
        }

        private static X.Cell Text(string text, uint style) =>
            new(new X.InlineString(new X.Text(text))) { DataType = X.CellValues.InlineString, StyleIndex = style };

        private static X.Cell Number(double value, uint style) =>
            new(new X.CellValue(value.ToString("R", CultureInfo.InvariantCulture))) { StyleIndex = style };
    }
}
