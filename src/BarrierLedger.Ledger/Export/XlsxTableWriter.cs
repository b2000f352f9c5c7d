using SpreadCheetah;
using SpreadCheetah.Styling;
using SpreadCheetah.Worksheets;

namespace BarrierLedger.Ledger.Export;

/// <summary>
/// Writes a barrier table as an XLSX workbook: one sheet "Barriers" with the title, the model lines, the table (numbers as
/// numeric cells holding exactly the printed, rounded values, with a matching number format), the footnotes and the caution.
/// Written forward-only with SpreadCheetah (a streaming writer: rows go out as they are made, no workbook is held in memory),
/// so column widths are measured from the text before the first row is written.
/// </summary>
public static class XlsxTableWriter
{
    public const string SheetName = "Barriers";

    /// <summary>1-based row of the header record: title, model lines, one blank row, then the header.</summary>
    public static int HeaderRow(BarrierTable table) => 1 + table.ModelLines.Count + 2;

    public static async Task WriteAsync(BarrierTable table, Stream destination, CancellationToken ct = default)
    {
        ArgumentNullException.ThrowIfNull(table);
        ArgumentNullException.ThrowIfNull(destination);
        var columns = table.Headers.Count + 1;
        var options = new WorksheetOptions();
        var widths = Widths(table, columns);
        for (var c = 0; c < columns; c++) options.Column(c + 1).Width = Math.Clamp(widths[c] + 2, 6, 60);

        await using var book = await Spreadsheet.CreateNewAsync(destination, cancellationToken: ct).ConfigureAwait(false);
        await book.StartWorksheetAsync(table.SheetName, options, ct).ConfigureAwait(false);
        var bold = book.AddStyle(new Style { Font = { Bold = true } });
        var italic = book.AddStyle(new Style { Font = { Italic = true } });
        var header = book.AddStyle(new Style
        {
            Font = { Bold = true },
            Border = { Top = { BorderStyle = BorderStyle.Medium }, Bottom = { BorderStyle = BorderStyle.Thin } },
        });
        var formats = new Dictionary<string, StyleId>(StringComparer.Ordinal);
        StyleId Format(string format, bool lastRow)
        {
            var key = format + (lastRow ? "|last" : "");
            if (!formats.TryGetValue(key, out var id))
            {
                var style = new Style { Format = NumberFormat.Custom(format) };
                if (lastRow) style.Border.Bottom.BorderStyle = BorderStyle.Medium;
                formats[key] = id = book.AddStyle(style);
            }
            return id;
        }
        var lastRowText = book.AddStyle(new Style { Border = { Bottom = { BorderStyle = BorderStyle.Medium } } });

        await book.AddRowAsync([new Cell(table.Title, bold)], ct).ConfigureAwait(false);
        foreach (var line in table.ModelLines) await book.AddRowAsync([new Cell(line)], ct).ConfigureAwait(false);
        await book.AddRowAsync(Array.Empty<Cell>(), ct).ConfigureAwait(false);
        await book.AddRowAsync([.. table.Headers.Select(h => new Cell(h.Plain, header)), new Cell(BarrierTable.NoteHeader, header)], ct).ConfigureAwait(false);

        for (var r = 0; r < table.Rows.Count; r++)
        {
            var row = table.Rows[r];
            var last = r == table.Rows.Count - 1;
            var cells = new Cell[columns];
            for (var c = 0; c < row.Cells.Count; c++)
            {
                var v = row.Cells[c];
                cells[c] = v.Kind switch
                {
                    CellKind.Fixed => new Cell(v.Number!.Value, Format(v.Decimals == 0 ? "0" : "0." + new string('0', v.Decimals), last)),
                    CellKind.Scientific => new Cell(v.Number!.Value, Format(v.ScientificFormat, last)),
                    CellKind.Imaginary => new Cell(v.Number!.Value, Format("0\"i\"", last)),
                    // An empty cell stays empty (no value), with the rule under the last row.
                    CellKind.Empty => last ? new Cell((string?)null, lastRowText) : new Cell((string?)null),
                    // Text is written as text: "1e5" or "=…" in a label stays a label, never a number or a formula.
                    _ => last ? new Cell(v.Text, lastRowText) : new Cell(v.Text),
                };
            }
            var marks = string.Join(" ", row.Marks);
            cells[columns - 1] = last ? new Cell(marks, lastRowText) : new Cell(marks);
            await book.AddRowAsync(cells, ct).ConfigureAwait(false);
        }

        await book.AddRowAsync(Array.Empty<Cell>(), ct).ConfigureAwait(false);
        foreach (var f in table.Footnotes) await book.AddRowAsync([new Cell($"[{f.Mark}] {f.Text}")], ct).ConfigureAwait(false);
        await book.AddRowAsync(Array.Empty<Cell>(), ct).ConfigureAwait(false);
        await book.AddRowAsync([new Cell(table.Caution, italic)], ct).ConfigureAwait(false);
        await book.FinishAsync(ct).ConfigureAwait(false);
    }

    public static byte[] ToBytes(BarrierTable table)
    {
        using var ms = new MemoryStream();
        // Writing to memory completes without waiting on I/O; no synchronisation context is captured (ConfigureAwait(false) throughout).
        Task.Run(() => WriteAsync(table, ms)).GetAwaiter().GetResult();
        return ms.ToArray();
    }

    /// <summary>Column widths in characters from the header, the printed values and the marks (no auto-fit: widths are set up front).</summary>
    private static double[] Widths(BarrierTable table, int columns)
    {
        var widths = new double[columns];
        for (var c = 0; c < table.Headers.Count; c++) widths[c] = table.Headers[c].Plain.Length;
        widths[columns - 1] = BarrierTable.NoteHeader.Length;
        foreach (var row in table.Rows)
        {
            for (var c = 0; c < row.Cells.Count; c++)
            {
                var v = row.Cells[c];
                var chars = v.Kind switch
                {
                    CellKind.Fixed => v.Plain.Length + 1,
                    CellKind.Scientific => v.Decimals + 8,
                    CellKind.Imaginary => v.Plain.Length + 2,
                    CellKind.Empty => 0,
                    _ => v.Text.Length,
                };
                widths[c] = Math.Max(widths[c], chars);
            }
            widths[columns - 1] = Math.Max(widths[columns - 1], string.Join(" ", row.Marks).Length);
        }
        return widths;
    }
}
