using System.Globalization;
using System.Text;

namespace BarrierLedger.Ledger.Export;

/// <summary>
/// Writes a barrier table as GitHub-flavoured Markdown: a heading, the model as a list, a pipe table (numbers right-aligned,
/// "−" for negatives, imaginary frequencies as "512i", k as "1.23×10⁴"), the footnotes and the caution as a quote.
/// </summary>
public static class MarkdownTableWriter
{
    public static string Write(BarrierTable table)
    {
        ArgumentNullException.ThrowIfNull(table);
        var sb = new StringBuilder();
        sb.Append("## ").Append(Escape(table.Title)).Append("\n\n");
        foreach (var line in table.ModelLines) sb.Append("- ").Append(Escape(line)).Append('\n');
        sb.Append('\n');
        sb.Append("| ").Append(string.Join(" | ", table.Headers.Select(h => h.Markdown).Append(BarrierTable.NoteHeader))).Append(" |\n");
        sb.Append('|').Append(string.Join("|", table.Headers.Select(h => h.Numeric ? "---:" : "---").Append("---"))).Append("|\n");
        foreach (var row in table.Rows)
        {
            sb.Append("| ").Append(string.Join(" | ", row.Cells.Select(Format).Append(string.Join(", ", row.Marks)))).Append(" |\n");
        }
        sb.Append('\n');
        foreach (var f in table.Footnotes) sb.Append("- **[").Append(f.Mark).Append("]** ").Append(Escape(f.Text)).Append('\n');
        if (table.Footnotes.Count > 0) sb.Append('\n');
        sb.Append("> ").Append(Escape(table.Caution)).Append('\n');
        return sb.ToString();
    }

    internal static string Format(TableCell c) => c.Bounds is not null ? c.Join(Format) : c.Kind switch
    {
        CellKind.Fixed => c.Plain.Replace('-', '\u2212'),
        CellKind.Scientific => $"{c.Mantissa.ToString("0." + new string('0', c.Decimals), CultureInfo.InvariantCulture)}×10{Superscript(c.Exponent)}",
        CellKind.Imaginary => c.Plain + "i",
        CellKind.Empty => "–",
        _ => Escape(c.Text),
    };

    private static string Superscript(int n)
    {
        const string digits = "⁰¹²³⁴⁵⁶⁷⁸⁹";
        var s = n.ToString(CultureInfo.InvariantCulture);
        return string.Concat(s.Select(ch => ch == '-' ? '⁻' : digits[ch - '0']));
    }

    /// <summary>Escapes the characters that would break a table cell or start markup.</summary>
    internal static string Escape(string s)
    {
        var sb = new StringBuilder(s.Length);
        foreach (var ch in s)
        {
            if (ch is '|' or '\\' or '*' or '_' or '`' or '[' or ']' or '<' or '>') sb.Append('\\');
            sb.Append(ch is '\n' or '\r' ? ' ' : ch);
        }
        return sb.ToString();
    }
}
