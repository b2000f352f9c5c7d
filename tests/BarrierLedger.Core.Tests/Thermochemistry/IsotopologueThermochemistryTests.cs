using BarrierLedger.Core.IsotopeEffects;
using BarrierLedger.Core.Tests.ReferenceData;
using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Thermochemistry;
using ThermoCalc = BarrierLedger.Core.Thermochemistry.IdealGasThermo;

namespace BarrierLedger.Core.Tests.Thermochemistry;

public class IsotopologueThermochemistryTests
{
    // S°(D₂O, 298.15 K, 1 bar) = 198.34 J/(mol K) (NIST-JANAF Tables, 4th ed., from memory) from the H₂O structure with deuterium masses,
    // σ = 2 and the D₂O gas-phase fundamentals ν₁ 2671, ν₂ 1178, ν₃ 2788 cm⁻¹ (Herzberg II / CCCBDB, from memory): the isotopologue's
    // translation and rotation use its own masses. The same molecule with the parent masses gives H₂O's 188.83 instead.
    [Fact]
    public void Entropy_OfHeavyWater_UsesTheDeuteriumMasses_AndMatchesJanaf()
    {
        var m = TestMolecules.H2O;
        var masses = IsotopeSubstitution.Masses(m, IsotopeSubstitution.ParseList("2=D, 3=D"));
        var options = new ThermoOptions(298.15, StandardState: StandardState.Gas1Bar, SymmetryNumber: 2);
        var d2o = ThermoCalc.Compute(m, [2671.0, 1178.0, 2788.0], options, masses);
        Close.Absolute(198.34, d2o.EntropyJoulePerMoleKelvin, NistJanaf.PolyatomicEntropyTolerance, "S°(D2O)", NistJanaf.SourceFromMemory);
        var h2o = ThermoCalc.Compute(m, Spectroscopy.H2OFundamentalsCm1, options);
        Close.Absolute(NistJanaf.WaterEntropy, h2o.EntropyJoulePerMoleKelvin, NistJanaf.PolyatomicEntropyTolerance, "S°(H2O)", NistJanaf.Source);
    }

    [Fact]
    public void Compute_WithTheWrongNumberOfMasses_Refuses() =>
        Assert.Throws<ArgumentException>(() => ThermoCalc.Compute(TestMolecules.H2O, Spectroscopy.H2OFundamentalsCm1, ThermoOptions.Default, [1.0, 2.0]));
}
