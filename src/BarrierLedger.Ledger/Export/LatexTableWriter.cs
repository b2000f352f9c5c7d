using System.Globalization;
using System.Text;

namespace BarrierLedger.Ledger.Export;

/// <summary>
/// Writes a barrier table as a LaTeX document that compiles on its own (pdflatex; packages booktabs, geometry, inputenc,
/// fontenc, all in Debian's texlive-latex-base/-recommended). The <c>table</c> environment between the two marker comments
/// is what goes into a manuscript. Rules are booktabs (\toprule, \midrule, \bottomrule); numeric columns are right-aligned
/// with fixed decimals, so the decimal points line up; negatives use a math minus; ‡ is <c>$^{\ddagger}$</c>.
/// </summary>
public static class LatexTableWriter
{
    public const string BeginMarker = "% --- BarrierLedger table: begin ---";
    public const string EndMarker = "% --- BarrierLedger table: end ---";

    public static string Write(BarrierTable table)
    {
        ArgumentNullException.ThrowIfNull(table);
        var sb = new StringBuilder();
        sb.Append("\\documentclass[10pt]{article}\n");
        sb.Append("\\usepackage[T1]{fontenc}\n\\usepackage[utf8]{inputenc}\n\\usepackage{booktabs}\n");
        sb.Append("\\usepackage[a4paper,landscape,margin=15mm]{geometry}\n");
        sb.Append("\\begin{document}\n");
        sb.Append(BeginMarker).Append('\n');
        sb.Append("% Needs \\usepackage{booktabs}.\n");
        sb.Append("\\begin{table}[htbp]\n\\centering\n");
        sb.Append("\\caption{").Append(Escape(table.Title)).Append(". ")
          .Append(string.Join(" ", table.ModelLines.Select(l => Escape(l.TrimEnd('.')) + "."))).Append("}\n");
        sb.Append("\\label{tab:barriers}\n\\small\n");
        var spec = string.Concat(table.Headers.Select(h => h.Numeric ? "r" : "l")) + "l";
        sb.Append("\\begin{tabular}{").Append(spec).Append("}\n\\toprule\n");
        sb.Append(string.Join(" & ", table.Headers.Select(h => h.Latex).Append(BarrierTable.NoteHeader))).Append(" \\\\\n\\midrule\n");
        foreach (var row in table.Rows)
        {
            var marks = row.Marks.Count == 0 ? "" : $"\\textsuperscript{{{string.Join(",", row.Marks)}}}";
            sb.Append(string.Join(" & ", row.Cells.Select(Format).Append(marks))).Append(" \\\\\n");
        }
        sb.Append("\\bottomrule\n\\end{tabular}\n");
        sb.Append("\\par\\smallskip\n\\begin{minipage}{0.95\\linewidth}\\footnotesize\n");
        foreach (var f in table.Footnotes) sb.Append("\\textsuperscript{").Append(f.Mark).Append("}~").Append(Escape(f.Text)).Append("\\par\n");
        sb.Append("\\textit{").Append(Escape(table.Caution)).Append("}\n");
        sb.Append("\\end{minipage}\n\\end{table}\n");
        sb.Append(EndMarker).Append('\n');
        sb.Append("\\end{document}\n");
        return sb.ToString();
    }

    internal static string Format(TableCell c) => c.Bounds is not null ? c.Join(Format) : c.Kind switch
    {
        CellKind.Fixed => c.Number < 0 ? "$-$" + c.Plain[1..] : c.Plain,
        CellKind.Scientific => $"${c.Mantissa.ToString("0." + new string('0', c.Decimals), CultureInfo.InvariantCulture)} \\times 10^{{{c.Exponent.ToString(CultureInfo.InvariantCulture)}}}$",
        CellKind.Imaginary => c.Plain + "$i$",
        CellKind.Empty => "--",
        _ => Escape(c.Text),
    };

    /// <summary>
    /// Escapes LaTeX specials and writes the symbols the trade uses in math mode (Δ, ‡, −, ×, ½, ⁻¹, ν̃, →, Greek letters),
    /// so pdflatex needs no Unicode declarations. Other non-ASCII letters pass through (utf8 inputenc covers Latin ones).
    /// </summary>
    public static string Escape(string s)
    {
        var sb = new StringBuilder(s.Length + 16);
        for (var i = 0; i < s.Length; i++)
        {
            var ch = s[i];
            var next = i + 1 < s.Length ? s[i + 1] : '\0';
            switch (ch)
            {
                case '\\': sb.Append("\\textbackslash{}"); break;
                case '&' or '%' or '$' or '#' or '_' or '{' or '}': sb.Append('\\').Append(ch); break;
                case '~': sb.Append("\\textasciitilde{}"); break;
                case '^': sb.Append("\\textasciicircum{}"); break;
                case '<': sb.Append("\\textless{}"); break;
                case '>': sb.Append("\\textgreater{}"); break;
                case '\u2021': M(sb, "^{\\ddagger}"); break;
                case '\u2212': M(sb, "-"); break;
                case '\u00d7': M(sb, "\\times"); break;
                case '\u00bd': M(sb, "_{1/2}"); break;
                case '\u2192': M(sb, "\\rightarrow"); break;
                case '\u21cc' or '\u21c4': M(sb, "\\rightleftharpoons"); break;
                case '\u00b0': M(sb, "^{\\circ}"); break;
                case '\u00b1': M(sb, "\\pm"); break;
                case '\u2013': sb.Append("--"); break;
                case '\u2014': sb.Append("---"); break;
                case '\u2018' or '\u2019': sb.Append('\''); break;
                case '\u201c': sb.Append("``"); break;
                case '\u201d': sb.Append("''"); break;
                case '\u2248': M(sb, "\\approx"); break;
                case '\u00c5': sb.Append("\\AA{}"); break;
                case '\u207b' when next == '\u00b9': M(sb, "^{-1}"); i++; break;
                case '\u00b9': M(sb, "^{1}"); break;
                case '\u00b2': M(sb, "^{2}"); break;
                case '\u00b3': M(sb, "^{3}"); break;
                case '\u03bd' when next == '\u0303': M(sb, "\\tilde{\\nu}"); i++; break;
                case '\u0394': M(sb, "\\Delta"); break;
                case '\u03b1': M(sb, "\\alpha"); break;
                case '\u03b2': M(sb, "\\beta"); break;
                case '\u03b3': M(sb, "\\gamma"); break;
                case '\u03ba': M(sb, "\\kappa"); break;
                case '\u03bd': M(sb, "\\nu"); break;
                case '\u03c0': M(sb, "\\pi"); break;
                case '\u03c3': M(sb, "\\sigma"); break;
                case '\u03c9': M(sb, "\\omega"); break;
                case '\u2080' or '\u2081' or '\u2082' or '\u2083' or '\u2084' or '\u2085' or '\u2086' or '\u2087' or '\u2088' or '\u2089':
                    M(sb, "_{" + (char)('0' + ch - '\u2080') + "}"); break;
                case '\n' or '\r': sb.Append(' '); break;
                default:
                    // Anything pdflatex's utf8 input cannot typeset without a declaration is written as its code point.
                    if (ch < 0x80 || (ch >= 0xc0 && ch <= 0x17f)) sb.Append(ch);
                    else sb.Append("\\texttt{U+").Append(((int)ch).ToString("X4", CultureInfo.InvariantCulture)).Append('}');
                    break;
            }
        }
        return sb.ToString();
    }

    /// <summary>Appends inline math, joining it to math that ends right before (so "Δ‡" becomes one <c>$\Delta^{\ddagger}$</c>).</summary>
    private static void M(StringBuilder sb, string math)
    {
        if (sb.Length >= 2 && sb[^1] == '$' && sb[^2] != '\\') sb.Length--;
        else sb.Append('$');
        sb.Append(math).Append('$');
    }
}
