using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Tests.ReferenceData;
using BarrierLedger.Core.Tests.Support;

namespace BarrierLedger.Core.Tests.Chemistry;

public class ElementsTests
{
    [Fact]
    public void Table_CoversHydrogenToRadon_WithConsistentNumbering()
    {
        Assert.Equal(86, Elements.All.Count);
        for (var z = 1; z <= 86; z++)
        {
            var e = Elements.Get(z);
            Assert.Equal(z, e.AtomicNumber);
            Assert.Same(e, Elements.Get(e.Symbol));
            Assert.True(e.StandardAtomicWeight > 0 && e.MostAbundantIsotopeMassDa > 0 && e.CovalentRadiusAngstrom > 0, e.Symbol);
            // An isotope mass lies within 0.5 Da of its mass number (binding energy per nucleon), and the mass number is
            // within a few units of the atomic weight: guards against shifted rows. Common practice, no source.
            Assert.InRange(e.MostAbundantIsotopeMassDa - e.StandardAtomicWeight, -4.1, 4.1);
        }
        Assert.Equal("Rn", Elements.Get(86).Symbol);
    }

    [Fact]
    public void IsotopeMassesAndCovalentRadii_AgreeWithIndependentTable()
    {
        foreach (var r in ElementReference.MostAbundantIsotopes)
        {
            var e = Elements.Get(r.Z);
            Assert.Equal(r.Symbol, e.Symbol);
            Close.Absolute(r.IsotopeMassDa, e.MostAbundantIsotopeMassDa, ElementReference.IsotopeMassToleranceDa,
                $"mass of {r.MassNumber}{r.Symbol}", ElementReference.Source);
            Close.Absolute(r.CovalentRadiusAngstrom, e.CovalentRadiusAngstrom, ElementReference.CovalentRadiusToleranceAngstrom,
                $"covalent radius of {r.Symbol}", ElementReference.Source);
        }
    }

    [Fact]
    public void StandardAtomicWeights_MatchIupacConventionalValues()
    {
        foreach (var (symbol, weight) in ElementReference.StandardAtomicWeights)
            Close.Absolute(weight, Elements.Get(symbol).StandardAtomicWeight, 1e-12, $"standard atomic weight of {symbol}", "IUPAC/CIAAW conventional weights, from memory");
    }

    [Theory]
    [InlineData("cl", "Cl")]
    [InlineData(" FE ", "Fe")]
    [InlineData("h", "H")]
    public void Get_IsCaseInsensitive_AndReturnsCanonicalSymbol(string input, string canonical) =>
        Assert.Equal(canonical, Elements.Get(input).Symbol);

    [Theory]
    [InlineData("Xx")]
    [InlineData("")]
    [InlineData("Fr")]
    public void Get_UnknownSymbol_ThrowsNamingIt(string symbol)
    {
        var ex = Assert.Throws<ArgumentException>(() => Elements.Get(symbol));
        Assert.Contains($"'{symbol}'", ex.Message);
    }

    [Fact]
    public void Get_AtomicNumberOutsideTable_Throws()
    {
        Assert.Throws<ArgumentException>(() => Elements.Get(0));
        Assert.Throws<ArgumentException>(() => Elements.Get(87));
    }
}
