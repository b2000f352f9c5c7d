using System.Globalization;
using DocumentFormat.OpenXml.Packaging;
using DocumentFormat.OpenXml.Spreadsheet;

namespace BarrierLedger.Ledger.Tests.Support;

/// <summary>
/// One worksheet of an XLSX file read back with the Open XML SDK (an independent reader, not the library that wrote it):
/// every cell's text or number with its number format, whether it is bold or italic, and the column widths.
/// </summary>
public sealed class XlsxSheet
{
    public sealed record SheetCell(string Text, double? Number, string NumberFormat, bool Bold, bool Italic, string TopBorder, string BottomBorder);

    private readonly Dictionary<(int Row, int Column), SheetCell> _cells = [];
    private readonly Dictionary<int, double> _widths = [];

    public static XlsxSheet Read(byte[] bytes, string sheetName)
    {
        using var doc = SpreadsheetDocument.Open(new MemoryStream(bytes), false);
        var book = doc.WorkbookPart ?? throw new InvalidDataException("no workbook part");
        var sheet = book.Workbook.Sheets!.Elements<Sheet>().Single(s => s.Name == sheetName);
        var part = (WorksheetPart)book.GetPartById(sheet.Id!);
        var styles = book.WorkbookStylesPart?.Stylesheet;
        var shared = book.SharedStringTablePart?.SharedStringTable.Elements<SharedStringItem>().Select(i => i.InnerText).ToList() ?? [];
        var result = new XlsxSheet();
        foreach (var col in part.Worksheet.Descendants<Column>())
            for (var c = col.Min!.Value; c <= col.Max!.Value; c++) result._widths[(int)c] = col.Width?.Value ?? 0;
        // Row and cell references are optional in the format: without one, a row or cell follows the one before it.
        var row = 0;
        foreach (var rowElement in part.Worksheet.Descendants<Row>())
        {
            row = rowElement.RowIndex is { } ri ? (int)ri.Value : row + 1;
            var column = 0;
            foreach (var cell in rowElement.Elements<Cell>())
            {
                column = cell.CellReference?.Value is { } reference ? Address(reference).Column : column + 1;
                var type = cell.DataType?.Value;
                string text;
                double? number = null;
                if (type == CellValues.InlineString) text = cell.InlineString?.InnerText ?? "";
                else if (type == CellValues.SharedString) text = shared[int.Parse(cell.CellValue!.Text, CultureInfo.InvariantCulture)];
                else if (type == CellValues.String) text = cell.CellValue?.Text ?? "";
                else if (cell.CellValue is null) text = "";
                else
                {
                    number = double.Parse(cell.CellValue.Text, CultureInfo.InvariantCulture);
                    text = cell.CellValue.Text;
                }
                var (format, bold, italic, top, bottom) = Style(styles, cell.StyleIndex?.Value ?? 0);
                result._cells[(row, column)] = new SheetCell(text, number, format, bold, italic, top, bottom);
            }
        }
        return result;
    }

    public SheetCell? this[int row, int column] => _cells.GetValueOrDefault((row, column));

    public IEnumerable<SheetCell> Cells => _cells.OrderBy(c => c.Key.Row).ThenBy(c => c.Key.Column).Select(c => c.Value);

    public double Width(int column) => _widths.GetValueOrDefault(column);

    private static (int Row, int Column) Address(string reference)
    {
        var letters = new string([.. reference.TakeWhile(char.IsLetter)]);
        var column = letters.Aggregate(0, (acc, ch) => acc * 26 + (ch - 'A' + 1));
        return (int.Parse(reference[letters.Length..], CultureInfo.InvariantCulture), column);
    }

    private static (string Format, bool Bold, bool Italic, string Top, string Bottom) Style(Stylesheet? styles, uint index)
    {
        if (styles?.CellFormats is null) return ("General", false, false, "none", "none");
        var xf = styles.CellFormats.Elements<CellFormat>().ElementAt((int)index);
        var id = xf.NumberFormatId?.Value ?? 0;
        var format = styles.NumberingFormats?.Elements<NumberingFormat>().FirstOrDefault(n => n.NumberFormatId?.Value == id)?.FormatCode?.Value
            ?? (id == 0 ? "General" : "builtin:" + id.ToString(CultureInfo.InvariantCulture));
        var font = styles.Fonts!.Elements<Font>().ElementAt((int)(xf.FontId?.Value ?? 0));
        var border = styles.Borders!.Elements<Border>().ElementAt((int)(xf.BorderId?.Value ?? 0));
        return (format, font.Bold is not null && (font.Bold.Val?.Value ?? true), font.Italic is not null && (font.Italic.Val?.Value ?? true),
            border.TopBorder?.Style?.InnerText ?? "none", border.BottomBorder?.Style?.InnerText ?? "none");
    }
}
