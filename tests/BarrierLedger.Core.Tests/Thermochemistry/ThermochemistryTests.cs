using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Tests.ReferenceData;
using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Core.Units;
using Thermo = BarrierLedger.Core.Thermochemistry.IdealGasThermo;

namespace BarrierLedger.Core.Tests.Thermochemistry;

public class ThermochemistryTests
{
    private static readonly ThermoOptions OneBar = new(StandardState: StandardState.Gas1Bar);

    // Sackur–Tetrode for argon at 298.15 K and 1 bar against NIST-JANAF S° = 154.845 J/(mol K).
    [Fact]
    public void Argon_SackurTetrode_MatchesJanaf()
    {
        var r = Thermo.Compute(TestMolecules.Ar, [], OneBar);
        Assert.Equal(MolecularShape.Atom, r.Shape);
        Close.Absolute(NistJanaf.ArgonEntropy, r.EntropyJoulePerMoleKelvin, NistJanaf.ArgonEntropyTolerance, "S°(Ar, 298.15 K, 1 bar)", NistJanaf.Source);
        Close.Absolute(NistJanaf.ArgonEnthalpyIncrement, (r.EnthalpyCorrection - r.ZeroPointEnergy).KJPerMol, NistJanaf.EnthalpyIncrementTolerance,
            "H(298.15) − H(0) of Ar", NistJanaf.SourceFromMemory);
        Assert.Equal(0.0, r.Rotational.EntropyJoulePerMoleKelvin);
    }

    // RRHO from experimental geometries and fundamentals (Spectroscopy.cs, from memory) against NIST-JANAF S°(298.15 K, 1 bar);
    // the remaining difference (< 0.5 J/(mol K)) is anharmonicity and rotation–vibration coupling.
    [Fact]
    public void Nitrogen_RigidRotorHarmonicOscillator_MatchesJanaf()
    {
        var r = Thermo.Compute(TestMolecules.N2, [Spectroscopy.N2FundamentalCm1], OneBar with { SymmetryNumber = 2 });
        Assert.Equal(MolecularShape.Linear, r.Shape);
        Close.Absolute(NistJanaf.NitrogenEntropy, r.EntropyJoulePerMoleKelvin, NistJanaf.PolyatomicEntropyTolerance, "S°(N2)", NistJanaf.Source);
        Close.Absolute(NistJanaf.NitrogenEnthalpyIncrement, (r.EnthalpyCorrection - r.ZeroPointEnergy).KJPerMol, NistJanaf.EnthalpyIncrementTolerance,
            "H(298.15) − H(0) of N2", NistJanaf.SourceFromMemory);
    }

    [Fact]
    public void Water_RigidRotorHarmonicOscillator_MatchesJanaf()
    {
        var r = Thermo.Compute(TestMolecules.H2O, Spectroscopy.H2OFundamentalsCm1, OneBar with { SymmetryNumber = 2 });
        Assert.Equal(MolecularShape.NonLinear, r.Shape);
        Close.Absolute(NistJanaf.WaterEntropy, r.EntropyJoulePerMoleKelvin, NistJanaf.PolyatomicEntropyTolerance, "S°(H2O)", NistJanaf.Source);
        Close.Absolute(NistJanaf.WaterEnthalpyIncrement, (r.EnthalpyCorrection - r.ZeroPointEnergy).KJPerMol, NistJanaf.EnthalpyIncrementTolerance,
            "H(298.15) − H(0) of H2O", NistJanaf.SourceFromMemory);
        Assert.Empty(r.Notes);
    }

    [Fact]
    public void CarbonDioxide_RigidRotorHarmonicOscillator_MatchesJanaf()
    {
        var r = Thermo.Compute(TestMolecules.CO2, Spectroscopy.CO2FundamentalsCm1, OneBar with { SymmetryNumber = 2 });
        Assert.Equal(MolecularShape.Linear, r.Shape);
        Close.Absolute(NistJanaf.CarbonDioxideEntropy, r.EntropyJoulePerMoleKelvin, NistJanaf.PolyatomicEntropyTolerance, "S°(CO2)", NistJanaf.Source);
        Close.Absolute(NistJanaf.CarbonDioxideEnthalpyIncrement, (r.EnthalpyCorrection - r.ZeroPointEnergy).KJPerMol, NistJanaf.EnthalpyIncrementTolerance,
            "H(298.15) − H(0) of CO2", NistJanaf.SourceFromMemory);
    }

    // Zero-point energy of water from its fundamentals: ½ Σ ν̃ = ½ (3657 + 1595 + 3756) = 4504 cm⁻¹ = 53.88 kJ/mol (CODATA 2018 cm⁻¹ → kJ/mol).
    [Fact]
    public void ZeroPointEnergy_IsHalfTheSumOfWavenumbers()
    {
        var r = Thermo.Compute(TestMolecules.H2O, Spectroscopy.H2OFundamentalsCm1, ThermoOptions.Default with { SymmetryNumber = 2 });
        Close.Relative(4504.0, r.ZeroPointEnergy.Wavenumber, 1e-12, "ZPE of H2O in cm⁻¹", "½ Σ ν̃");
        Close.Relative(53.880, r.ZeroPointEnergy.KJPerMol, 1e-4, "ZPE of H2O in kJ/mol", "4504 cm⁻¹ × 0.01196266 kJ/mol per cm⁻¹ (CODATA 2018)");
        Close.Relative(r.EnthalpyCorrection.Hartree - r.TemperatureTimesEntropy.Hartree, r.GibbsCorrection.Hartree, 1e-12, "G = H − TS", "definition");
    }

    // Widely used in the trade: moving from 1 atm gas to 1 mol/L solution at 298.15 K costs RT ln(24.46) = 1.89 kcal/mol.
    [Fact]
    public void StandardStateCorrection_AtmToMolar_Is189KcalPerMol()
    {
        var dg = Thermo.StandardStateCorrection(298.15, StandardState.Gas1Atm, StandardState.Solution1Molar);
        Close.Absolute(1.89, dg.KcalPerMol, 0.005, "ΔG(1 atm → 1 M) at 298.15 K", "RT ln(24.46), value widely used in the trade");
        var ratio = Thermo.ReferencePressurePascal(298.15, StandardState.Solution1Molar) / PhysicalConstants.StandardAtmospherePascal;
        Close.Absolute(24.46, ratio, 0.01, "RT(1 mol/L)/1 atm at 298.15 K", "ideal-gas law, value widely used in the trade");
        Close.Absolute(0, (dg + Thermo.StandardStateCorrection(298.15, StandardState.Solution1Molar, StandardState.Gas1Atm)).Hartree, 1e-15,
            "round trip of the standard-state correction", "ΔG(a→b) = −ΔG(b→a)");
    }

    [Fact]
    public void SolutionStandardState_ShiftsGibbsByExactlyTheCorrection_AndOnlyEntropyChanges()
    {
        var gas = Thermo.Compute(TestMolecules.H2O, Spectroscopy.H2OFundamentalsCm1, ThermoOptions.Default with { SymmetryNumber = 2 });
        var sol = Thermo.Compute(TestMolecules.H2O, Spectroscopy.H2OFundamentalsCm1,
            ThermoOptions.Default with { SymmetryNumber = 2, StandardState = StandardState.Solution1Molar });
        var expected = Thermo.StandardStateCorrection(298.15, StandardState.Gas1Atm, StandardState.Solution1Molar);
        Close.Absolute(expected.Hartree, (sol.GibbsCorrection - gas.GibbsCorrection).Hartree, 1e-14, "G(1 M) − G(1 atm)", "RT ln(p ratio)");
        Assert.Equal(gas.EnthalpyCorrection, sol.EnthalpyCorrection);

        var neat = Thermo.Compute(TestMolecules.H2O, Spectroscopy.H2OFundamentalsCm1,
            ThermoOptions.Default with { SymmetryNumber = 2, StandardState = StandardState.Solution1Molar, ConcentrationMolPerL = 55.34 });
        Close.Absolute(PhysicalConstants.GasConstantJoulePerMoleKelvin * 298.15 * Math.Log(55.34) / 1000,
            (neat.GibbsCorrection - sol.GibbsCorrection).KJPerMol, 1e-9, "G(55.34 M) − G(1 M)", "RT ln(c ratio)");
    }

    [Fact]
    public void ImaginaryModes_AreExcludedAndListed_WithANote()
    {
        var withTs = Thermo.Compute(TestMolecules.H2O, [-1200.0, 1595, 3657], ThermoOptions.Default);
        var without = Thermo.Compute(TestMolecules.H2O, [1595, 3657], ThermoOptions.Default);
        Assert.Equal([-1200.0], withTs.ExcludedImaginaryFrequenciesCm1.ToArray());
        Assert.Equal(without.GibbsCorrection, withTs.GibbsCorrection);
        Assert.Contains(withTs.Notes, n => n.Contains("1200.0i"));
    }

    [Fact]
    public void SymmetryNumber_LowersEntropyByRLnSigma()
    {
        var one = Thermo.Compute(TestMolecules.H2O, Spectroscopy.H2OFundamentalsCm1, ThermoOptions.Default);
        var two = Thermo.Compute(TestMolecules.H2O, Spectroscopy.H2OFundamentalsCm1, ThermoOptions.Default with { SymmetryNumber = 2 });
        Close.Absolute(PhysicalConstants.GasConstantJoulePerMoleKelvin * Math.Log(2), one.EntropyJoulePerMoleKelvin - two.EntropyJoulePerMoleKelvin,
            1e-10, "S(σ=1) − S(σ=2)", "R ln σ, McQuarrie ch. 8");
    }

    [Fact]
    public void Multiplicity_AddsRLnOfIt()
    {
        var singlet = Thermo.Compute(TestMolecules.N2, [Spectroscopy.N2FundamentalCm1], ThermoOptions.Default);
        var triplet = Thermo.Compute(TestMolecules.N2 with { Multiplicity = 3 }, [Spectroscopy.N2FundamentalCm1], ThermoOptions.Default);
        Close.Absolute(PhysicalConstants.GasConstantJoulePerMoleKelvin * Math.Log(3), triplet.Electronic.EntropyJoulePerMoleKelvin,
            1e-12, "electronic entropy of a triplet", "R ln(2S+1)");
        Close.Absolute(singlet.EntropyJoulePerMoleKelvin + triplet.Electronic.EntropyJoulePerMoleKelvin, triplet.EntropyJoulePerMoleKelvin, 1e-10,
            "total entropy of the triplet", "additivity");
    }

    [Fact]
    public void QuasiRrho_ChangesOnlyLowModes()
    {
        var high = Spectroscopy.H2OFundamentalsCm1;
        var rrho = Thermo.Compute(TestMolecules.H2O, high, ThermoOptions.Default);
        var q = Thermo.Compute(TestMolecules.H2O, high, ThermoOptions.Default with { Treatment = ThermoTreatment.QuasiRrhoEntropyAndEnthalpy });
        // Lowest mode 1595 cm⁻¹: w = 1 − 1.5e-5, and S_HO − S_R is a few J/(mol K) at most, so the totals agree to 1e-3.
        Close.Absolute(rrho.EntropyJoulePerMoleKelvin, q.EntropyJoulePerMoleKelvin, 1e-3, "S with only high modes", "Grimme 2012: w → 1 above ω₀");

        double[] soft = [15.0, 1595, 3657];
        var rrhoSoft = Thermo.Compute(TestMolecules.H2O, soft, ThermoOptions.Default);
        var qSoft = Thermo.Compute(TestMolecules.H2O, soft, ThermoOptions.Default with { Treatment = ThermoTreatment.QuasiRrhoEntropy });
        Assert.True(qSoft.EntropyJoulePerMoleKelvin < rrhoSoft.EntropyJoulePerMoleKelvin, "a 15 cm⁻¹ mode has less entropy as a free rotor than as an oscillator");
        Assert.Equal(rrhoSoft.EnthalpyCorrection, qSoft.EnthalpyCorrection);
        Assert.Contains(rrhoSoft.Notes, n => n.Contains("below 100 cm⁻¹"));
    }

    [Fact]
    public void BadOptions_AreRejectedNamingTheProblem()
    {
        Assert.Throws<ArgumentException>(() => Thermo.Compute(TestMolecules.H2O, [1595], ThermoOptions.Default with { TemperatureKelvin = 0 }));
        Assert.Throws<ArgumentException>(() => Thermo.Compute(TestMolecules.H2O, [1595], ThermoOptions.Default with { SymmetryNumber = 0 }));
        var ex = Assert.Throws<ArgumentException>(() => Thermo.Compute(TestMolecules.H2O, [1595],
            ThermoOptions.Default with { StandardState = StandardState.Gas1Bar, PressurePascal = 2e5 }));
        Assert.Contains("fixes its own pressure", ex.Message);
        Assert.Throws<ArgumentException>(() => Thermo.Compute(TestMolecules.H2O, [1595], ThermoOptions.Default with { ConcentrationMolPerL = 2 }));
        Assert.Throws<ArgumentException>(() => Thermo.Compute(TestMolecules.H2O, [double.NaN], ThermoOptions.Default));
    }
}
