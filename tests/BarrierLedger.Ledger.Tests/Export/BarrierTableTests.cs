using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Export;

namespace BarrierLedger.Ledger.Tests.Export;

public class BarrierTableTests
{
    [Fact]
    public void Build_RoundsOnlyAtOutput_InTheChosenUnit()
    {
        var t = ExportExamples.Table();
        var g = t.Headers.ToList().FindIndex(h => h.Column == ExportColumn.BarrierGibbs);
        // 0.039200 Eh × 627.509474 kcal/mol per Eh (CODATA 2018) = 24.5984 → 24.6 at one decimal.
        Assert.Equal(Math.Round(0.039200 * ExportExamples.KcalPerHartreeCodata2018, 1), t.Rows[0].Cells[g].Number);
        Assert.Equal("24.6", t.Rows[0].Cells[g].Plain);

        var kj = BarrierTable.Build(ExportExamples.Source, new TableOptions([ExportColumn.BarrierGibbs], EnergyUnit.KJPerMol, 2));
        // 0.039200 Eh × 2625.499639 kJ/mol per Eh (CODATA 2018) = 102.9196 → 102.92.
        Assert.Equal("102.92", kj.Rows[0].Cells[0].Plain);
        Assert.Equal("ΔG‡ (kJ/mol)", kj.Headers[0].Plain);
    }

    [Fact]
    public void Build_WritesNoNegativeZero()
    {
        var t = ExportExamples.Table();
        var r = t.Headers.ToList().FindIndex(h => h.Column == ExportColumn.ReactionGibbs);
        // −0.000040 Eh = −0.0251 kcal/mol, which rounds to zero: printed "0.0", not "-0.0".
        Assert.Equal("0.0", t.Rows[1].Cells[r].Plain);
    }

    [Fact]
    public void Build_MarksUnverifiedAndInconsistentRows_WithReasons()
    {
        var t = ExportExamples.Table();
        Assert.Empty(t.Rows[0].Marks);
        Assert.Equal(["a"], t.Rows[1].Marks);
        Assert.Equal(["b"], t.Rows[2].Marks);
        Assert.Contains("TS2: saddle point not verified by a reviewer (awaiting review); automatic check: Needs attention (a second imaginary mode", t.Footnotes[0].Text);
        Assert.Contains("breaks a consistency rule: energies come from two levels of theory", t.Footnotes[1].Text);
        Assert.Equal(ExportCaution.Text, t.Caution);
        Assert.Contains(t.ModelLines, l => l.Contains("wB97X-D/def2-TZVP (SMD, water)//B3LYP-D3/def2-SVP"));
        Assert.Contains(t.ModelLines, l => l.Contains("298.15 K") && l.Contains("1 mol/L"));
        Assert.Contains(t.ModelLines, l => l.Contains("low-mode entropy interpolated") && l.Contains("Grimme"));
        Assert.Contains(t.ModelLines, l => l.Contains("kcal/mol"));
    }

    [Fact]
    public void Build_WritesRateConstantsWithThreeSignificantDigits()
    {
        var t = ExportExamples.Table(new TableOptions([ExportColumn.RateConstant, ExportColumn.HalfLife]));
        Assert.Equal("1.23E-05", t.Rows[0].Cells[0].Plain);
        Assert.Equal("2.50E+03", t.Rows[1].Cells[0].Plain);
        // Each of k and t½ is followed by its interval column, so t½ is the third cell.
        Assert.Equal(["k (s⁻¹)", "k 95 % interval", "t½ (s)", "t½ 95 % interval (s)"], t.Headers.Select(h => h.Plain));
        // t½ = ln 2 / k = 0.693147 / 1.234e-5 s = 5.617e4 s.
        Assert.Equal("5.62E+04", t.Rows[0].Cells[2].Plain);
    }

    // A rate never leaves without its interval: with no uncertainty set the interval cell says so, and with σ = 2 kcal/mol the
    // 95 % bounds are k e^{∓zσ/RT}: z = 1.959964 (standard normal quantile, NIST/SEMATECH e-Handbook §1.3.6.7.1), RT = 0.592485
    // kcal/mol at 298.15 K (CODATA 2018 R), zσ/RT = 6.61608, e^{6.61608} = 747.011 (independent computation with Python's
    // statistics.NormalDist and math.exp): 1.234e-5 s⁻¹ gives 1.652e-8 to 9.218e-3 s⁻¹; t½ = 5.617e4 s gives 75.19 s to 4.196e7 s.
    [Fact]
    public void Build_FollowsEveryRateWithItsIntervalOrSaysNoneIsSet()
    {
        var none = ExportExamples.Table(new TableOptions([ExportColumn.RateConstant, ExportColumn.HalfLife]));
        Assert.Equal("no uncertainty set", none.Rows[0].Cells[1].Plain);
        Assert.Equal("no uncertainty set", none.Rows[0].Cells[3].Plain);
        Assert.Contains(none.ModelLines, l => l.Contains("Rate intervals") && l.Contains("no uncertainty set"));

        var sigma = ExportExamples.Source with { Model = ExportExamples.Source.Model with { Uncertainty = new BarrierLedger.Ledger.Kinetics.EnergyUncertainty(2.0, []) } };
        var t = BarrierTable.Build(sigma, new TableOptions([ExportColumn.RateConstant, ExportColumn.HalfLife]));
        Assert.Equal("1.65E-08 to 9.22E-03", t.Rows[0].Cells[1].Plain);
        Assert.Equal("7.52E+01 to 4.20E+07", t.Rows[0].Cells[3].Plain);
        // Each writer prints the bounds in its own notation for numbers over many decades.
        Assert.Contains("1.65×10⁻⁸ to 9.22×10⁻³", MarkdownTableWriter.Write(t));
        Assert.Contains("$1.65 \\times 10^{-8}$ to $9.22 \\times 10^{-3}$", LatexTableWriter.Write(t));
        Assert.Contains(t.ModelLines, l => l.Contains("σ = 2.0 kcal/mol per barrier") && l.Contains("common practice, no source"));
        // A column set without k or t½ gains no interval column.
        Assert.Single(BarrierTable.Build(sigma, new TableOptions([ExportColumn.BarrierGibbs])).Headers);
    }

    [Fact]
    public void Build_RejectsNoColumnsAndBadDecimals()
    {
        Assert.Throws<ArgumentException>(() => BarrierTable.Build(ExportExamples.Source, new TableOptions([])));
        Assert.Throws<ArgumentException>(() => BarrierTable.Build(ExportExamples.Source, new TableOptions([ExportColumn.Step], Decimals: 9)));
        Assert.Throws<ArgumentException>(() => BarrierTable.Build(ExportExamples.Source, new TableOptions([ExportColumn.Step, ExportColumn.Step])));
    }

    [Theory]
    [InlineData(0, "a")]
    [InlineData(25, "z")]
    [InlineData(26, "aa")]
    [InlineData(27, "ab")]
    public void MarkName_CountsInLetters(int index, string expected) => Assert.Equal(expected, BarrierTable.MarkName(index));
}
