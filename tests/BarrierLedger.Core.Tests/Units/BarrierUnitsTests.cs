using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Tests.Units;

public class BarrierUnitsTests
{
    [Theory]
    [InlineData(null, EnergyUnit.KcalPerMol)]
    [InlineData("", EnergyUnit.KcalPerMol)]
    [InlineData("kcal/mol", EnergyUnit.KcalPerMol)]
    [InlineData("KcalPerMol", EnergyUnit.KcalPerMol)]
    [InlineData("kJ/mol", EnergyUnit.KJPerMol)]
    [InlineData("kjpermol", EnergyUnit.KJPerMol)]
    [InlineData("eV", EnergyUnit.ElectronVolt)]
    [InlineData("ElectronVolt", EnergyUnit.ElectronVolt)]
    [InlineData("hartree", EnergyUnit.Hartree)]
    [InlineData(" Eh ", EnergyUnit.Hartree)]
    public void TryParse_SymbolOrName_GivesTheUnit(string? text, EnergyUnit expected)
    {
        Assert.True(BarrierUnits.TryParse(text, out var unit, out var problem), problem);
        Assert.Equal(expected, unit);
        Assert.Equal("", problem);
    }

    [Theory]
    [InlineData("cm-1")]
    [InlineData("Wavenumber")]
    [InlineData("cm⁻¹")]
    public void TryParse_Wavenumber_IsRefusedAsNotABarrierUnit(string text)
    {
        Assert.False(BarrierUnits.TryParse(text, out _, out var problem));
        Assert.Equal($"'{text}' is a wavenumber, which is not a unit for barriers or reaction energies; expected kcal/mol, kJ/mol, eV or hartree.", problem);
    }

    [Theory]
    [InlineData("furlongs")]
    [InlineData("4")] // an enum's number is not a unit
    [InlineData("Hartree,KcalPerMol")] // nor a list of names
    public void TryParse_NotAUnit_NamesTheText(string text)
    {
        Assert.False(BarrierUnits.TryParse(text, out _, out var problem));
        Assert.Equal($"'{text}' is not an energy unit; expected kcal/mol, kJ/mol, eV or hartree.", problem);
    }

    [Fact]
    public void All_IsEveryEnergyUnitButTheWavenumber() =>
        Assert.Equal(Enum.GetValues<EnergyUnit>().Where(u => u != EnergyUnit.Wavenumber).Order(), BarrierUnits.All.Order());
}
