using System.Diagnostics;
using System.Text;
using ClosedXML.Excel;
using CsvHelper;
using BarrierLedger.Ledger.Export;

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

    private static string XlsxText(byte[] bytes)
    {
        using var wb = new XLWorkbook(new MemoryStream(bytes));
        return string.Join("\n", wb.Worksheet(XlsxTableWriter.SheetName).CellsUsed().Select(c => c.GetString()));
    }

    [Theory]
    [MemberData(nameof(Formats))]
    public void EveryFormat_StatesModel_Caution_AndBothFootnotes(string format)
    {
        var text = VisibleText(format);
        Assert.Contains("wB97X-D/def2-TZVP", text);
        Assert.Contains("298.15", text);
        Assert.Contains("1 mol/L", text);
        Assert.Contains("quasi-RRHO", text);
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
    public void Xlsx_ReadsBackWithClosedXml_ToTheSameValues()
    {
        using var wb = new XLWorkbook(new MemoryStream(XlsxTableWriter.ToBytes(s_table)));
        var ws = wb.Worksheet(XlsxTableWriter.SheetName);
        var header = XlsxTableWriter.HeaderRow(s_table);
        for (var c = 0; c < s_table.Headers.Count; c++) Assert.Equal(s_table.Headers[c].Plain, ws.Cell(header, c + 1).GetString());
        Assert.Equal(BarrierTable.NoteHeader, ws.Cell(header, s_table.Headers.Count + 1).GetString());
        for (var r = 0; r < s_table.Rows.Count; r++)
        {
            var row = s_table.Rows[r];
            for (var c = 0; c < row.Cells.Count; c++)
            {
                var cell = ws.Cell(header + 1 + r, c + 1);
                var expected = row.Cells[c];
                switch (expected.Kind)
                {
                    case CellKind.Fixed or CellKind.Scientific or CellKind.Imaginary:
                        Assert.Equal(XLDataType.Number, cell.DataType);
                        Assert.Equal(expected.Number!.Value, cell.GetDouble());
                        break;
                    case CellKind.Empty:
                        Assert.True(cell.IsEmpty());
                        break;
                    default:
                        Assert.Equal(expected.Text, cell.GetString());
                        break;
                }
            }
            Assert.Equal(string.Join(" ", row.Marks), ws.Cell(header + 1 + r, row.Cells.Count + 1).GetString());
        }
        // Widths were set (no auto-fit), wide enough for the longest header.
        Assert.True(ws.Column(1).Width >= "R2 hydrolysis & co".Length);
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
        Assert.Contains("{llrrrrrrrllll}", tex);
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
        Assert.Equal("|---|---|---:|---:|---:|---:|---:|---:|---:|---|---|---|---|", lines[header + 1]);
        // ΔG_r of the first row: −0.012345 Eh × 627.509474 kcal/mol per Eh (CODATA 2018) = −7.7466 → "−7.7" with a true minus.
        Assert.Contains("| \u22127.7 |", md);
        Assert.Contains("1.23×10⁻⁵", md);
        Assert.Contains("512i", md);
        Assert.Contains("- **[a]**", md);
        Assert.Contains("> Caution:", md);
    }
}
