using BarrierLedger.Core.Kinetics;
using BarrierLedger.Core.Tests.ReferenceData;
using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Tests.Kinetics;

public class EyringTests
{
    [Fact]
    public void FrequencyFactor_At298_MatchesConstants() =>
        Close.Relative(KineticsReference.FrequencyFactor298, Eyring.FrequencyFactorPerSecond(298.15), KineticsReference.FrequencyFactorRelativeTolerance,
            "k_B T/h at 298.15 K", "CODATA 2018 exact k_B and h");

    [Fact]
    public void TwentyKcalBarrier_At298_GivesRateAndHalfLife()
    {
        var k = Eyring.RateConstant(Energy.FromKcalPerMol(20.0), 298.15);
        Close.Absolute(KineticsReference.Eyring20KcalRateConstant, k, KineticsReference.Eyring20KcalRateTolerance, "k(20 kcal/mol, 298.15 K)", "Eyring with CODATA 2018");
        Close.Absolute(KineticsReference.Eyring20KcalHalfLifeSeconds, Eyring.HalfLifeSeconds(k), KineticsReference.Eyring20KcalHalfLifeTolerance,
            "t½(20 kcal/mol, 298.15 K)", "ln 2 / k");
    }

    [Fact]
    public void TemperatureForHalfLife_InvertsTheRateConstant()
    {
        var barrier = Energy.FromKcalPerMol(20.0);
        var halfLife = Eyring.HalfLifeSeconds(Eyring.RateConstant(barrier, 298.15));
        Close.Absolute(298.15, Eyring.TemperatureForHalfLife(barrier, halfLife), 1e-8, "T for the 298.15 K half-life", "round trip through Eyring");
        // One hour for a 25 kcal/mol barrier: solve, then check the half-life at that temperature independently.
        var t = Eyring.TemperatureForHalfLife(Energy.FromKcalPerMol(25.0), 3600.0);
        Close.Relative(3600.0, Eyring.HalfLifeSeconds(Eyring.RateConstant(Energy.FromKcalPerMol(25.0), t)), 1e-9, "t½ at the solved T", "Eyring");
        Assert.InRange(t, 298.15, 400.0);
    }

    [Fact]
    public void TemperatureForHalfLife_RejectsANonPositiveBarrier()
    {
        var ex = Assert.Throws<ArgumentException>(() => Eyring.TemperatureForHalfLife(Energy.FromKcalPerMol(-1.0), 60.0));
        Assert.Equal("gibbsBarrier", ex.ParamName);
    }

    // Bimolecular: k = (k_B T/h)(c°)^{−1} e^{−ΔG‡/RT}; with c° = 1 M the number is the same, the unit M⁻¹ s⁻¹; for a 1 bar gas
    // standard state (c° = p°/RT = 0.04034 mol/L at 298.15 K) the constant is 1/0.04034 larger.
    [Fact]
    public void Bimolecular_ScalesWithTheStandardConcentration()
    {
        var g = Energy.FromKcalPerMol(15.0);
        var uni = Eyring.RateConstant(g, 298.15);
        Close.Relative(uni, Eyring.RateConstant(g, 298.15, molecularity: 2), 1e-15, "k₂ with c° = 1 M", "(c°)^{1−m} = 1");
        var cGas = PhysicalConstants.BarPascal / (PhysicalConstants.GasConstantJoulePerMoleKelvin * 298.15) / 1000.0;
        Close.Relative(0.04034, cGas, 1e-3, "1 bar ideal gas concentration at 298.15 K", "ideal-gas law");
        Close.Relative(uni / cGas, Eyring.RateConstant(g, 298.15, molecularity: 2, standardConcentrationMolPerL: cGas), 1e-12,
            "k₂ for a 1 bar standard state", "(c°)^{1−m}");
        Close.Relative(2.5 * uni, Eyring.RateConstant(g, 298.15, transmissionCoefficient: 2.5), 1e-15, "κ scales k", "Eyring");
    }

    [Fact]
    public void BarrierForRateConstant_InvertsRateConstant()
    {
        var g = Energy.FromKcalPerMol(17.3);
        Close.Absolute(17.3, Eyring.BarrierForRateConstant(Eyring.RateConstant(g, 310.0), 310.0).KcalPerMol, 1e-10, "barrier round trip", "Eyring");
    }

    [Fact]
    public void BadInput_IsRejected()
    {
        Assert.Throws<ArgumentException>(() => Eyring.RateConstant(Energy.FromKcalPerMol(20), 0));
        Assert.Throws<ArgumentException>(() => Eyring.RateConstant(Energy.FromKcalPerMol(20), 298.15, molecularity: 4));
        Assert.Throws<ArgumentException>(() => Eyring.RateConstant(Energy.FromKcalPerMol(20), 298.15, transmissionCoefficient: 0));
        Assert.Throws<ArgumentException>(() => Eyring.HalfLifeSeconds(0));
    }
}
