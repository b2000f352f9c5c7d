using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Units;
using static BarrierLedger.Core.Tests.Formats.FormatTestHelpers;

namespace BarrierLedger.Core.Tests.Formats;

public class ScanTableReaderTests
{
    private static ReadResult<ScanTable> Read(string text, EnergyUnit? unit = null) => ScanTableReader.Read(Utf8(text), "scan.csv", unit);

    [Theory]
    [InlineData("r,energy\n1.0,-1.0\n1.1,-1.1\n")]
    [InlineData("r;energy\n1.0;-1.0\n1.1;-1.1\n")]
    [InlineData("r\tenergy\n1.0\t-1.0\n1.1\t-1.1\n")]
    [InlineData("# comment\n1.0,-1.0\n\n1.1,-1.1\n")]
    [InlineData("\"r, Å\",\"energy\"\r\n1.0,-1.0\r\n1.1,-1.1\r\n")]
    public void Delimiters_headers_comments_and_quotes(string text)
    {
        var t = Read(text).GetValueOrThrow();
        Assert.Equal([1.0, 1.1], t.Points.Select(p => p.Coordinate));
        Assert.Equal([-1.0, -1.1], t.Points.Select(p => p.EnergyHartree));
        Assert.Equal(EnergyUnit.Hartree, t.SourceUnit);
    }

    [Fact]
    public void Unit_in_header_converts_to_hartree_and_converged_column_is_read()
    {
        var t = Read("converged;d(C1-C4);energy [kJ/mol]\nyes;2.2;0.0\nno;2.1;10.5\n").GetValueOrThrow();
        Assert.Equal(EnergyUnit.KJPerMol, t.SourceUnit);
        Assert.Equal("d(C1-C4)", t.CoordinateHeader);
        Assert.True(t.HasConvergedColumn);
        Assert.False(t.Points[1].Converged);
        // 10.5 kJ/mol / 2625.4996394799 kJ/mol per hartree (CODATA 2018).
        Close.Absolute(10.5 / 2625.4996394799, t.Points[1].EnergyHartree, 1e-12, "kJ/mol to hartree", "CODATA 2018");
    }

    [Fact]
    public void Unit_option_applies_without_header()
    {
        var t = Read("1.0,0.0\n1.1,1.0\n", EnergyUnit.KcalPerMol).GetValueOrThrow();
        Close.Absolute(1.0 / 627.5094740631, t.Points[1].EnergyHartree, 1e-12, "kcal/mol to hartree", "CODATA 2018");
    }

    [Fact]
    public void Third_column_without_header_is_the_converged_flag()
    {
        var t = Read("1.0,-1.0,1\n1.1,-1.1,0\n1.2,-1.2,\n").GetValueOrThrow();
        Assert.Equal([true, false, true], t.Points.Select(p => p.Converged));
    }

    public static TheoryData<string, int?, string[]> Errors => new()
    {
        { "", 1, ["no rows found"] },
        { "1.0 -1.0\n1.1 -1.1\n", 1, ["no comma, semicolon or tab", "'1.0 -1.0'"] },
        { "r,energy\n1.0,-1.0\n1.1\n", 3, ["expected at least 2 comma-separated columns, found 1"] },
        { "r,energy\n1.0,-1.0\nx,-1.1\n", 3, ["coordinate 'x' is not a number"] },
        { "r;energy\n1,0;-1,0\n1,1;-1,1\n", 2, ["'1,0'", "decimal comma", "decimal point"] },
        { "r,energy\n1.0,NaN\n1.1,-1.1\n", 2, ["energy is NaN, expected a finite number"] },
        { "r,energy (furlongs)\n1.0,-1.0\n1.1,-1.1\n", 1, ["unit 'furlongs'", "not known"] },
        { "r,energy,converged\n1.0,-1.0,maybe\n1.1,-1.1,yes\n", 2, ["converged flag 'maybe'"] },
        { "r,energy\n1.0,-1.0\n", 1, ["1 data row(s)", "at least 2"] },
    };

    [Theory]
    [MemberData(nameof(Errors))]
    public void Error_messages_name_the_line_and_what_was_expected(string input, int? line, string[] fragments) =>
        SingleError(Read(input), line, null, fragments);

    [Fact]
    public void Header_unit_contradicting_the_option_is_an_error()
    {
        SingleError(Read("r,energy (kcal/mol)\n1,0\n2,1\n", EnergyUnit.KJPerMol), 1, null, "kcal/mol", "option says kJ/mol");
    }

    [Fact]
    public void Extra_columns_and_repeated_coordinates_are_warnings()
    {
        var r = Read("r,energy,converged,comment\n1.0,-1.0,yes,a\n1.0,-1.1,yes,b\n");
        Assert.True(r.Succeeded);
        Assert.Contains(r.Warnings, w => w.Line == 1 && w.Message.Contains("'comment' is ignored"));
        Assert.Contains(r.Warnings, w => w.Message.Contains("appears 2 times"));
    }
}
