using System.Diagnostics;
using System.Text;
using CsvHelper;
using BarrierLedger.Ledger.Export;
using BarrierLedger.Ledger.Tests.Support;

namespace BarrierLedger.Ledger.Tests.Export;

public class TableWriterTests
{
    private static readonly BarrierTable s_table = ExportExamples.Table();

    public static TheoryData<string> Formats => ["csv", "xlsx", "latex", "markdown"];

    /// <summary>All text a reader of the exported file sees, whatever the format.</summary>
    private static string VisibleText(string format) => format switch
    {
        "csv" => Encoding.UTF8.GetString(CsvTableWriter.ToBytes(s_table)),
        "xlsx" => XlsxText(XlsxTableWriter.ToBytes(s_table)),
        "latex" => LatexTableWriter.Write(s_table),
        "markdown" => MarkdownTableWriter.Write(s_table),
        _ => throw new ArgumentException(format),
    };

    private static string XlsxText(byte[] bytes) =>
        string.Join("\n", XlsxSheet.Read(bytes, XlsxTableWriter.SheetName).Cells.Select(c => c.Text));

    [Theory]
    [MemberData(nameof(Formats))]
    public void EveryFormat_StatesModel_Caution_AndBothFootnotes(string format)
    {
        var text = VisibleText(format);
        Assert.Contains("wB97X-D/def2-TZVP", text);
        Assert.Contains("298.15", text);
        Assert.Contains("1 mol/L", text);
        Assert.Contains("low-mode entropy interpolated", text);
        Assert.Contains("kcal", text);
        Assert.Contains("process-safety or scale-up decisions", text);
        Assert.Contains("experimental thermal-hazard testing", text);
        Assert.Contains("saddle point not verified by a reviewer (awaiting review)", text);
        Assert.Contains("breaks a consistency rule", text);
    }

    [Fact]
    public void Csv_ParsesWithCsvHelper_ToTheSameCellsAndMarks()
    {
        var text = Encoding.UTF8.GetString(CsvTableWriter.ToBytes(s_table));
        using var reader = CsvReader.FromText(text, new CsvReaderOptions { CommentPrefix = CsvTableWriter.CommentPrefix });
        var headers = reader.Headers.ToList();
        Assert.Equal([.. s_table.Headers.Select(h => h.Plain), BarrierTable.NoteHeader, CsvTableWriter.NoteTextHeader], headers);
        var i = 0;
        while (reader.Read())
        {
            var row = s_table.Rows[i];
            for (var c = 0; c < row.Cells.Count; c++) Assert.Equal(row.Cells[c].Plain, reader.GetString(c));
            Assert.Equal(string.Join(" ", row.Marks), reader.GetString(BarrierTable.NoteHeader));
            foreach (var m in row.Marks) Assert.Contains(s_table.Footnotes.Single(f => f.Mark == m).Text, reader.GetString(CsvTableWriter.NoteTextHeader));
            i++;
        }
        Assert.Equal(3, i);
        // Label with '&' and a comma-free name come through unchanged; numbers parse back as numbers.
        Assert.Contains("R2 hydrolysis & co", text);
    }

    [Fact]
    public void Xlsx_ReadsBackWithOpenXmlSdk_ToTheSameValuesFormatsAndRules()
    {
        var ws = XlsxSheet.Read(XlsxTableWriter.ToBytes(s_table), XlsxTableWriter.SheetName);
        Assert.Equal(s_table.Title, ws[1, 1]!.Text);
        Assert.True(ws[1, 1]!.Bold);
        for (var i = 0; i < s_table.ModelLines.Count; i++) Assert.Equal(s_table.ModelLines[i], ws[2 + i, 1]!.Text);
        var header = XlsxTableWriter.HeaderRow(s_table);
        for (var c = 0; c < s_table.Headers.Count; c++)
        {
            var cell = ws[header, c + 1]!;
            Assert.Equal(s_table.Headers[c].Plain, cell.Text);
            Assert.True(cell.Bold);
            Assert.Equal("medium", cell.TopBorder);
            Assert.Equal("thin", cell.BottomBorder);
        }
        Assert.Equal(BarrierTable.NoteHeader, ws[header, s_table.Headers.Count + 1]!.Text);
        for (var r = 0; r < s_table.Rows.Count; r++)
        {
            var row = s_table.Rows[r];
            for (var c = 0; c < row.Cells.Count; c++)
            {
                var cell = ws[header + 1 + r, c + 1];
                var expected = row.Cells[c];
                switch (expected.Kind)
                {
                    case CellKind.Fixed or CellKind.Scientific or CellKind.Imaginary:
                        Assert.Equal(expected.Number!.Value, cell!.Number);
                        Assert.Equal(expected.Kind switch
                        {
                            CellKind.Fixed => expected.Decimals == 0 ? "0" : "0." + new string('0', expected.Decimals),
                            CellKind.Scientific => "0.00E+00",
                            _ => "0\"i\"",
                        }, cell.NumberFormat);
                        break;
                    case CellKind.Empty:
                        Assert.True(cell is null || (cell.Text.Length == 0 && cell.Number is null));
                        break;
                    default:
                        // Text stays text, never parsed into a number.
                        Assert.Null(cell!.Number);
                        Assert.Equal(expected.Text, cell.Text);
                        break;
                }
            }
            Assert.Equal(string.Join(" ", row.Marks), ws[header + 1 + r, row.Cells.Count + 1]!.Text);
        }
        // The rule under the table: the last row's cells carry a medium bottom border.
        Assert.Equal("medium", ws[header + s_table.Rows.Count, 1]!.BottomBorder);
        var footRow = header + s_table.Rows.Count + 2;
        foreach (var f in s_table.Footnotes) Assert.Equal($"[{f.Mark}] {f.Text}", ws[footRow++, 1]!.Text);
        var caution = ws[footRow + 1, 1]!;
        Assert.Equal(s_table.Caution, caution.Text);
        Assert.True(caution.Italic);
        // Widths were set up front (no auto-fit), wide enough for the longest label.
        Assert.True(ws.Width(1) >= "R2 hydrolysis & co".Length);
    }

    [Fact]
    public void Xlsx_LabelThatLooksLikeAFormula_StaysText()
    {
        var row = s_table.Rows[0];
        var cells = row.Cells.ToList();
        cells[0] = new TableCell(CellKind.Text, "=HYPERLINK(\"http://example.invalid\")");
        var table = s_table with { Rows = [row with { Cells = cells }] };
        var ws = XlsxSheet.Read(XlsxTableWriter.ToBytes(table), XlsxTableWriter.SheetName);
        var cell = ws[XlsxTableWriter.HeaderRow(table) + 1, 1]!;
        Assert.Equal("=HYPERLINK(\"http://example.invalid\")", cell.Text);
        Assert.Null(cell.Number);
    }

    [Fact]
    public void Latex_UsesBooktabs_DaggerInMath_AndEscapes()
    {
        var tex = LatexTableWriter.Write(s_table);
        Assert.Contains("\\usepackage{booktabs}", tex);
        Assert.Contains("\\toprule", tex);
        Assert.Contains("\\midrule", tex);
        Assert.Contains("\\bottomrule", tex);
        Assert.Contains("$\\Delta G^{\\ddagger}$", tex);
        Assert.DoesNotContain("‡", tex);
        Assert.Contains("R2 hydrolysis \\& co", tex);
        Assert.Contains("Ring closures\\_50\\%", tex);
        Assert.Contains("\\textsuperscript{a}", tex);
        Assert.Contains("\\textsuperscript{b}", tex);
        Assert.Contains("512$i$", tex);
        Assert.Contains("$1.23 \\times 10^{-5}$", tex);
        // k and t½ are each followed by their (text) interval column.
        Assert.Contains("{llrrrrrlrlrllll}", tex);
        Assert.Contains("no uncertainty set", tex);
        // Every non-ASCII character left is a Latin letter that utf8 inputenc typesets.
        Assert.All(tex.Where(ch => ch > 127), ch => Assert.InRange(ch, '\u00c0', '\u017f'));
    }

    [Theory]
    [InlineData("ΔG‡ (kcal/mol)", "$\\Delta$G$^{\\ddagger}$ (kcal/mol)")]
    [InlineData("k (s⁻¹)", "k (s$^{-1}$)")]
    [InlineData("5$ & 10%", "5\\$ \\& 10\\%")]
    [InlineData("\\$−", "\\textbackslash{}\\$$-$")]
    [InlineData("a_b {c} ~^", "a\\_b \\{c\\} \\textasciitilde{}\\textasciicircum{}")]
    public void LatexEscape_WritesSymbolsInMath(string input, string expected)
    {
        Assert.Equal(expected, LatexTableWriter.Escape(input));
    }

    [SkippableFact]
    public void Latex_CompilesWithPdflatex()
    {
        var pdflatex = new[] { "/usr/bin/pdflatex", "/usr/local/bin/pdflatex" }.FirstOrDefault(File.Exists);
        Skip.If(pdflatex is null, "pdflatex is not installed (apt-get install texlive-latex-base texlive-latex-recommended)");
        var dir = Directory.CreateTempSubdirectory("bl-tex-").FullName;
        try
        {
            File.WriteAllText(Path.Combine(dir, "table.tex"), LatexTableWriter.Write(s_table), new UTF8Encoding(false));
            var psi = new ProcessStartInfo(pdflatex!, "-interaction=nonstopmode -halt-on-error table.tex")
            {
                WorkingDirectory = dir, RedirectStandardOutput = true, RedirectStandardError = true,
            };
            using var p = Process.Start(psi)!;
            var log = p.StandardOutput.ReadToEnd();
            p.WaitForExit(120_000);
            Assert.True(p.ExitCode == 0, $"pdflatex failed:\n{log[^Math.Min(log.Length, 3000)..]}");
            Assert.True(new FileInfo(Path.Combine(dir, "table.pdf")).Length > 1000);
            Assert.DoesNotContain("Undefined control sequence", log);
        }
        finally
        {
            Directory.Delete(dir, true);
        }
    }

    [Fact]
    public void Markdown_IsAPipeTable_WithAlignedNumbersAndTrueMinus()
    {
        var md = MarkdownTableWriter.Write(s_table);
        var lines = md.Split('\n');
        var header = Array.FindIndex(lines, l => l.StartsWith("| Reaction"));
        Assert.True(header > 0);
        var columns = s_table.Headers.Count + 1;
        Assert.Equal(columns + 1, lines[header].Count(c => c == '|'));
        Assert.Equal("|---|---|---:|---:|---:|---:|---:|---|---:|---|---:|---|---|---|---|", lines[header + 1]);
        // ΔG_r of the first row: −0.012345 Eh × 627.509474 kcal/mol per Eh (CODATA 2018) = −7.7466 → "−7.7" with a true minus.
        Assert.Contains("| \u22127.7 |", md);
        Assert.Contains("1.23×10⁻⁵", md);
        Assert.Contains("512i", md);
        Assert.Contains("- **[a]**", md);
        Assert.Contains("> Caution:", md);
    }
}
