using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Tests.Units;

public class EnergyTests
{
    // CODATA 2018 energy-conversion relationships (NIST SP 961, 2019):
    // hartree–electron volt 27.211386245988 eV; hartree–inverse metre 2.1947463136320e7 m⁻¹;
    // hartree–joule × N_A gives 2625.4996394799 kJ/mol and, with the thermochemical calorie (4.184 J),
    // 627.5094740631 kcal/mol. Relative tolerance 1e-9.
    [Theory]
    [InlineData(EnergyUnit.KcalPerMol, 627.5094740631)]
    [InlineData(EnergyUnit.KJPerMol, 2625.4996394799)]
    [InlineData(EnergyUnit.ElectronVolt, 27.211386245988)]
    [InlineData(EnergyUnit.Wavenumber, 219474.63136320)]
    public void OneHartree_MatchesCodata2018(EnergyUnit unit, double expected) =>
        Close.Relative(expected, Energy.FromHartree(1.0).In(unit), 1e-9, $"1 Eh in {unit}", "CODATA 2018, NIST SP 961");
}
