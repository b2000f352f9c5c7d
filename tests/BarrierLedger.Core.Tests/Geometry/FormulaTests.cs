using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Tests.Geometry;

public class FormulaTests
{
    // Hill order (Hill, J. Am. Chem. Soc. 1900, 22, 478; the convention of the CAS index):
    // ethanol C2H6O, chloromethane CH3Cl, hydrogen chloride ClH, water H2O, dinitrogen tetroxide N2O4.
    [Theory]
    [InlineData("OCCHHHHHH", "C2H6O")]
    [InlineData("ClHHHC", "CH3Cl")]
    [InlineData("HCl", "ClH")]
    [InlineData("OHH", "H2O")]
    [InlineData("NNOOOO", "N2O4")]
    public void HillOrder_MatchesTheConvention(string atoms, string expected)
    {
        var symbols = System.Text.RegularExpressions.Regex.Matches(atoms, "[A-Z][a-z]?").Select(m => m.Value);
        var mol = new Molecule(symbols.Select(Elements.Get), symbols.Select(_ => Vec3.Zero));
        Assert.Equal(expected, Formula.Of(mol).ToString());
        Assert.Equal(Formula.Of(mol), Formula.Parse(expected));
    }

    [Fact]
    public void SumOfSpeciesWithCoefficients_AddsElementCounts()
    {
        // CH4 + 2 O2 = CO2 + 2 H2O: both sides are CH4O4 (combustion of methane, balanced by hand).
        var left = Formula.Sum([(Formula.Parse("CH4"), 1), (Formula.Parse("O2"), 2)]);
        var right = Formula.Sum([(Formula.Parse("CO2"), 1), (Formula.Parse("H2O"), 2)]);
        Assert.Equal("CH4O4", left.ToString());
        Assert.Equal(left, right);
        Assert.Equal(42, left.NuclearCharge); // 6 + 4 × 1 + 4 × 8
        Assert.Equal("+H2", Formula.Parse("CH6").DifferenceFrom(Formula.Parse("CH4")));
    }

    [Fact]
    public void BadFormulaText_SaysWhere()
    {
        var e = Assert.Throws<FormatException>(() => Formula.Parse("C2Xq4"));
        Assert.Contains("unknown element 'Xq' at position 3", e.Message);
    }
}
