using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Tests.ReferenceData;
using BarrierLedger.Core.Tests.Support;

namespace BarrierLedger.Core.Tests.Chemistry;

public class IsotopesTests
{
    // Atomic mass of ¹H, ²H, ³H = nuclear mass + electron mass − binding energy (13.598 eV), from CODATA 2018 particle masses: an
    // evaluation independent of the Atomic Mass Evaluation the table cites.
    [Theory]
    [InlineData("1H", IsotopeReference.ProtonMassU)]
    [InlineData("D", IsotopeReference.DeuteronMassU)]
    [InlineData("T", IsotopeReference.TritonMassU)]
    public void HydrogenIsotopeMasses_MatchCodataNuclearMassesPlusElectron(string label, double nucleusU)
    {
        var expected = nucleusU + IsotopeReference.ElectronMassU - IsotopeReference.HydrogenBindingEV / IsotopeReference.AtomicMassUnitEV;
        Close.Absolute(expected, Isotopes.Parse(label).MassDa, IsotopeReference.AtomicMassToleranceU, $"atomic mass of {label}",
            IsotopeReference.Codata2018Particles);
    }

    // ¹²C is 12 Da exactly by the definition of the unified atomic mass unit (SI Brochure, 9th ed.); every mass lies within 0.1 Da of
    // its mass number (nuclear binding is below 9 MeV per nucleon, i.e. below 0.01 u per nucleon; common practice, no source).
    [Fact]
    public void Masses_AreNearTheirMassNumbers_AndCarbon12IsExactly12()
    {
        Assert.Equal(12.0, Isotopes.Parse("12C").MassDa);
        Assert.All(Isotopes.All, i => Assert.InRange(i.MassDa - i.MassNumber, -0.1, 0.1));
    }

    // The parent isotope of every element is the one the element table uses, so a parent isotopologue has exactly the masses of
    // every other frequency analysis; natural abundances of an element add up to 100 % (IUPAC, Rosman & Taylor 1998).
    [Fact]
    public void EveryElement_HasItsParent_WithTheElementTableMass_AndAbundancesSumTo100()
    {
        foreach (var element in Elements.All)
        {
            var parent = Isotopes.Parent(element);
            Assert.Equal(element.MostAbundantIsotopeMassDa, parent.MassDa);
            var natural = Isotopes.Of(element).Where(i => i.NaturalAbundancePercent > 0).ToArray();
            if (natural.Length > 0)
            {
                Close.Absolute(100.0, natural.Sum(i => i.NaturalAbundancePercent), 0.01, $"abundances of {element.Symbol}", "IUPAC isotopic compositions");
                Assert.Equal(parent, natural.MaxBy(i => i.NaturalAbundancePercent));
            }
        }
    }

    [Theory]
    [InlineData("D", 1, 2)]
    [InlineData("t", 1, 3)]
    [InlineData("13C", 6, 13)]
    [InlineData("C13", 6, 13)]
    [InlineData("c-13", 6, 13)]
    [InlineData("¹⁵N", 7, 15)]
    [InlineData("18O", 8, 18)]
    [InlineData("37cl", 17, 37)]
    public void Parse_ReadsTheUsualSpellings(string text, int z, int a)
    {
        var i = Isotopes.Parse(text);
        Assert.Equal((z, a), (i.AtomicNumber, i.MassNumber));
    }

    [Theory]
    [InlineData("13", "not an isotope label")]
    [InlineData("Xx13", "unknown element symbol")]
    [InlineData("19C", "no 19C")]
    [InlineData("1C3", "not an isotope label")]
    public void Parse_WithBadText_SaysWhy(string text, string expected)
    {
        Assert.False(Isotopes.TryParse(text, out _, out var error));
        Assert.Contains(expected, error);
    }
}
