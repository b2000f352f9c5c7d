using System.Text;
using CsvHelper;

namespace BarrierLedger.Ledger.Export;

/// <summary>
/// Writes a barrier table as CSV (RFC 4180, UTF-8, comma): comment lines starting with '#' carry the title, the energy
/// model, the footnotes and the caution; then one header record and one record per row, with a "Note" column holding the
/// marks and a "Note text" column repeating why, so a row keeps its warning when sorted or copied alone.
/// Read it back with <c>CommentPrefix = '#'</c>. Cells that a spreadsheet would run as formulas are neutralised (<see cref="CsvCells"/>).
/// </summary>
public static class CsvTableWriter
{
    public const char CommentPrefix = '#';
    public const string NoteTextHeader = "Note text";

    public static void Write(BarrierTable table, TextWriter writer)
    {
        ArgumentNullException.ThrowIfNull(table);
        ArgumentNullException.ThrowIfNull(writer);
        using var csv = CsvWriter.Create(writer, new CsvWriterOptions { CommentPrefix = CommentPrefix, NewLine = "\n" }, true);
        csv.WriteComment(" " + table.Title);
        foreach (var line in table.ModelLines) csv.WriteComment(" " + line);
        foreach (var f in table.Footnotes) csv.WriteComment($" [{f.Mark}] {f.Text}");
        csv.WriteComment(" " + table.Caution);
        csv.WriteHeader([.. table.Headers.Select(h => CsvCells.Neutralise(h.Plain)), BarrierTable.NoteHeader, NoteTextHeader]);
        var texts = table.Footnotes.ToDictionary(f => f.Mark, f => f.Text);
        foreach (var row in table.Rows)
        {
            string[] fields = [.. row.Cells.Select(c => c.Plain), string.Join(" ", row.Marks), string.Join(" | ", row.Marks.Select(m => $"[{m}] {texts[m]}"))];
            csv.WriteRecord([.. fields.Select(CsvCells.Neutralise)]);
        }
        csv.Flush();
    }

    public static byte[] ToBytes(BarrierTable table)
    {
        var sw = new StringWriter(System.Globalization.CultureInfo.InvariantCulture);
        Write(table, sw);
        return new UTF8Encoding(false).GetBytes(sw.ToString());
    }
}
