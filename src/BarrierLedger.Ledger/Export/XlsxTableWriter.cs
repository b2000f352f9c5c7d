using ClosedXML.Excel;

namespace BarrierLedger.Ledger.Export;

/// <summary>
/// Writes a barrier table as an XLSX workbook (ClosedXML): one sheet "Barriers" with the title, the model lines, the table
/// (numbers as numeric cells holding exactly the printed, rounded values, with a matching number format), the footnotes
/// and the caution. Column widths are set from the text lengths (no auto-fit: that needs libgdiplus).
/// </summary>
public static class XlsxTableWriter
{
    public const string SheetName = "Barriers";

    /// <summary>1-based row of the header record: title, model lines, one blank row, then the header.</summary>
    public static int HeaderRow(BarrierTable table) => 1 + table.ModelLines.Count + 2;

    public static void Write(BarrierTable table, Stream destination)
    {
        ArgumentNullException.ThrowIfNull(table);
        ArgumentNullException.ThrowIfNull(destination);
        using var wb = new XLWorkbook();
        var ws = wb.Worksheets.Add(SheetName);
        ws.Cell(1, 1).Value = table.Title;
        ws.Cell(1, 1).Style.Font.Bold = true;
        for (var i = 0; i < table.ModelLines.Count; i++) ws.Cell(2 + i, 1).Value = table.ModelLines[i];

        var header = HeaderRow(table);
        var columns = table.Headers.Count + 1;
        var widths = new double[columns];
        for (var c = 0; c < table.Headers.Count; c++) SetText(ws.Cell(header, c + 1), table.Headers[c].Plain, widths, c);
        SetText(ws.Cell(header, columns), BarrierTable.NoteHeader, widths, columns - 1);
        var headerRange = ws.Range(header, 1, header, columns);
        headerRange.Style.Font.Bold = true;
        headerRange.Style.Border.TopBorder = XLBorderStyleValues.Medium;
        headerRange.Style.Border.BottomBorder = XLBorderStyleValues.Thin;

        var r = header + 1;
        foreach (var row in table.Rows)
        {
            for (var c = 0; c < row.Cells.Count; c++)
            {
                var cell = ws.Cell(r, c + 1);
                var v = row.Cells[c];
                switch (v.Kind)
                {
                    case CellKind.Fixed:
                        cell.Value = v.Number!.Value;
                        cell.Style.NumberFormat.Format = v.Decimals == 0 ? "0" : "0." + new string('0', v.Decimals);
                        Widen(widths, c, v.Plain.Length + 1);
                        break;
                    case CellKind.Scientific:
                        cell.Value = v.Number!.Value;
                        cell.Style.NumberFormat.Format = "0.00E+00";
                        Widen(widths, c, 10);
                        break;
                    case CellKind.Imaginary:
                        cell.Value = v.Number!.Value;
                        cell.Style.NumberFormat.Format = "0\"i\"";
                        Widen(widths, c, v.Plain.Length + 2);
                        break;
                    case CellKind.Empty:
                        break;
                    default:
                        SetText(cell, v.Text, widths, c);
                        break;
                }
            }
            SetText(ws.Cell(r, columns), string.Join(" ", row.Marks), widths, columns - 1);
            r++;
        }
        ws.Range(r - 1, 1, r - 1, columns).Style.Border.BottomBorder = XLBorderStyleValues.Medium;

        r++;
        foreach (var f in table.Footnotes) ws.Cell(r++, 1).Value = $"[{f.Mark}] {f.Text}";
        r++;
        ws.Cell(r, 1).Value = table.Caution;
        ws.Cell(r, 1).Style.Font.Italic = true;

        for (var c = 0; c < columns; c++) ws.Column(c + 1).Width = Math.Clamp(widths[c] + 2, 6, 60);
        wb.SaveAs(destination);
    }

    public static byte[] ToBytes(BarrierTable table)
    {
        using var ms = new MemoryStream();
        Write(table, ms);
        return ms.ToArray();
    }

    private static void SetText(IXLCell cell, string text, double[] widths, int column)
    {
        // Set as text explicitly, so "1e5" or "=…" in a label stays a label.
        cell.SetValue(text);
        cell.DataType = XLDataType.Text;
        Widen(widths, column, text.Length);
    }

    private static void Widen(double[] widths, int column, double chars) => widths[column] = Math.Max(widths[column], chars);
}
