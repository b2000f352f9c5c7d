using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Core.Units;
using static BarrierLedger.Core.Tests.Pathways.PathwayExamples;

namespace BarrierLedger.Core.Tests.Pathways;

public class PathwayEnergiesTests
{
    // CODATA 2018 (exact constants): k_B = 1.380649e-23 J/K, h = 6.62607015e-34 J s, N_A = 6.02214076e23 /mol;
    // 1 hartree = 627.5094740631 kcal/mol; thermochemical calorie 4.184 J.
    private const double KB = 1.380649e-23, H = 6.62607015e-34, R = 1.380649e-23 * 6.02214076e23, KcalPerHartree = 627.5094740631;

    private static ThermalCorrection T(double h, double g, StandardState state = StandardState.Gas1Atm) =>
        new(Energy.FromHartree(0.05), Energy.FromHartree(h), Energy.FromHartree(g), FreqLevel, 298.15, state);

    /// <summary>
    /// diene + ene → TS1 → INT → TS2 → adduct with invented energies (hartree):
    /// E: −155.90 − 78.55 = −234.45, −234.42, −234.47, −234.44, −234.52; Gibbs corrections 0.060 + 0.030, 0.100, 0.101, 0.099, 0.102.
    /// By hand: G relative = 0, +0.040, −0.009, +0.019, −0.058 hartree; ΔG‡(TS1) = 0.040, ΔG‡(TS2) = 0.028, ΔG_r = −0.058.
    /// Energetic span (Kozuch–Shaik): TS after I: 0.040 (TS1/R), 0.019 (TS2/R), 0.028 (TS2/INT); TS before I: 0.040 + 0.009 − 0.058;
    /// largest 0.040 hartree with TDTS = TS1, TDI = first state.
    /// </summary>
    private static Pathway TwoSteps(LevelOfTheory? tsLevel = null)
    {
        var diene = Species("diene", "C4H6", -155.90, thermal: T(0.090, 0.060));
        var ene = Species("ene", "C2H4", -78.55, thermal: T(0.055, 0.030));
        var ts1 = Species("TS1", "C6H10", -234.42, tsLevel, thermal: T(0.150, 0.100));
        var inter = Species("INT", "C6H10", -234.47, thermal: T(0.152, 0.101));
        var ts2 = Species("TS2", "C6H10", -234.44, thermal: T(0.149, 0.099));
        var adduct = Species("adduct", "C6H10", -234.52, thermal: T(0.153, 0.102));
        return new Pathway("two steps",
        [
            new("diene + ene", StateKind.Minimum, [new(diene), new(ene)]),
            new("TS1", StateKind.SaddlePoint, [new(ts1)]),
            new("INT", StateKind.Minimum, [new(inter)]),
            new("TS2", StateKind.SaddlePoint, [new(ts2)]),
            new("adduct", StateKind.Minimum, [new(adduct)]),
        ]);
    }

    [Fact]
    public void RelativeEnergiesBarriersAndSpan_MatchHandArithmetic()
    {
        var r = PathwayEnergies.Derive(TwoSteps());
        Assert.True(r.Verdict == Verdict.Passed, r.Report());
        double[] g = [0, 0.040, -0.009, 0.019, -0.058];
        for (var i = 0; i < g.Length; i++)
            Close.Absolute(g[i], r.States[i].RelativeGibbs!.Value.Hartree, 1e-12, $"ΔG of {r.States[i].Label}", "hand arithmetic in the comment");
        Close.Absolute(0.03 * KcalPerHartree, r.Steps[0].ElectronicBarrier.KcalPerMol, 1e-9, "ΔE‡(TS1)", "−234.42 − (−234.45) hartree, CODATA 2018 kcal/mol");
        Close.Absolute(0.028, r.Steps[1].GibbsBarrier!.Value.Hartree, 1e-12, "ΔG‡(TS2)", "hand arithmetic");
        Close.Absolute(-0.049, r.Steps[1].GibbsReactionEnergy!.Value.Hartree, 1e-12, "ΔG_r(INT → adduct)", "−0.058 − (−0.009)");
        Assert.Equal(2, r.Steps[0].Molecularity);
        Assert.Equal("M⁻¹ s⁻¹", r.Steps[0].RateConstantUnit);
        Assert.Null(r.Steps[0].HalfLifeSeconds);
        Assert.NotNull(r.OverallSpan);
        Assert.Equal(("TS1", "diene + ene"), (r.OverallSpan!.Tdts.Label, r.OverallSpan.Tdi.Label));
        Close.Absolute(0.040, r.OverallSpan.EnergeticSpanEnergy.Hartree, 1e-12, "energetic span", "Kozuch–Shaik rule by hand in the comment");
    }

    [Fact]
    public void UnimolecularStep_RateConstantAndHalfLife_FollowEyringFromCodataConstants()
    {
        // Eyring (J. Chem. Phys. 1935, 3, 107): k = (k_B T/h) exp(−ΔG‡/RT), t½ = ln 2 / k, computed here from the constants alone.
        var r = PathwayEnergies.Derive(TwoSteps());
        var step = r.Steps[1];
        var dgJPerMol = 0.028 * KcalPerHartree * 4184.0;
        var k = KB * 298.15 / H * Math.Exp(-dgJPerMol / (R * 298.15));
        Close.Relative(k, step.RateConstant!.Value, 1e-9, "k(INT → TS2)", "Eyring equation with CODATA 2018 constants");
        Close.Relative(Math.Log(2) / k, step.HalfLifeSeconds!.Value, 1e-9, "t½(INT → TS2)", "ln 2 / k");
        Assert.Equal("s⁻¹", step.RateConstantUnit);
    }

    [Fact]
    public void OneMolarStandardState_LowersTheBimolecularBarrierBy1_89()
    {
        // 1 atm → 1 mol/L adds RT ln(24.46) = +1.89 kcal/mol to each species' G at 298.15 K (textbook value, from memory);
        // TS1 has one species, "diene + ene" two, so ΔG‡(TS1) drops by 1.89 kcal/mol and the unimolecular ΔG‡(TS2) is unchanged.
        var gas = PathwayEnergies.Derive(TwoSteps());
        var sol = PathwayEnergies.Derive(TwoSteps(), new EnergyModel(Thermo: new ThermoOptions(StandardState: StandardState.Solution1Molar)));
        Close.Absolute(-1.89, sol.Steps[0].GibbsBarrier!.Value.KcalPerMol - gas.Steps[0].GibbsBarrier!.Value.KcalPerMol, 0.005,
            "standard-state shift of a bimolecular barrier", "RT ln 24.46 at 298.15 K, from memory");
        Close.Absolute(gas.Steps[1].GibbsBarrier!.Value.Hartree, sol.Steps[1].GibbsBarrier!.Value.Hartree, 1e-12, "unimolecular barrier", "unchanged by construction");
        Assert.Contains(sol.Reasons, x => x.Code == PathwayEnergyCodes.StandardStateConverted);
    }

    [Fact]
    public void SpeciesAtAnotherLevel_BarrierCarriesTheReason()
    {
        var r = PathwayEnergies.Derive(TwoSteps(LevelOfTheory.Parse("B3LYP/def2-SVP")));
        Assert.Equal(Verdict.Failed, r.Verdict);
        Assert.Contains(r.Reasons, x => x.Code == ConsistencyCodes.MixedElectronicLevels && x.Message.Contains("B3LYP/def2-SVP for TS1"));
        Assert.NotNull(r.Steps[0].GibbsBarrier); // still shown, with the reason beside it
    }

    [Fact]
    public void ReportedCorrectionsAtAnotherTemperature_Fail()
    {
        var r = PathwayEnergies.Derive(TwoSteps(), new EnergyModel(Thermo: new ThermoOptions(TemperatureKelvin: 350)));
        Assert.Equal(Verdict.Failed, r.Verdict);
        Assert.Contains(r.Reasons, x => x.Code == PathwayEnergyCodes.ThermalTemperatureNotModel && x.Message.Contains("298.15 K but the energy model is at 350 K"));
    }

    [Fact]
    public void ComputedThermochemistry_UsesCoreThermochemistry_AndNamesSpeciesWithoutFrequencies()
    {
        // Water: r(O–H) 0.9572 Å, ∠HOH 104.52°; fundamentals 3657, 1595, 3756 cm⁻¹ (gas-phase experimental values, from memory).
        const double r = 0.9572, half = 104.52 / 2 * Math.PI / 180;
        var geom = new Molecule([Elements.O, Elements.H, Elements.H],
            [Vec3.Zero, new Vec3(r * Math.Sin(half), 0, r * Math.Cos(half)), new Vec3(-r * Math.Sin(half), 0, r * Math.Cos(half))]);
        var water = Species("water", "H2O", -76.40) with { Geometry = geom, FrequenciesCm1 = [1595, 3657, 3756], FrequencyLevel = FreqLevel, SymmetryNumber = 2 };
        var bare = Species("water2", "H2O", -76.41);
        var path = new Pathway("w", [new("a", StateKind.Minimum, [new(water)]), new("b", StateKind.Minimum, [new(bare)])]);
        var res = PathwayEnergies.Derive(path, new EnergyModel(ThermalSource.Computed));
        var direct = BarrierLedger.Core.Thermochemistry.IdealGasThermo.Compute(geom, [1595, 3657, 3756], new ThermoOptions(SymmetryNumber: 2));
        Close.Absolute(-76.40 + direct.GibbsCorrection.Hartree, res.States[0].Gibbs!.Value.Hartree, 1e-12, "G of water", "IdealGasThermo.Compute");
        Assert.Null(res.States[1].Gibbs);
        Assert.Contains(res.Reasons, x => x.Code == PathwayEnergyCodes.MissingFrequencies && x.Message.StartsWith("water2"));
        Assert.Contains(res.Reasons, x => x.Code == ConsistencyCodes.MissingThermal && x.Severity == CheckSeverity.Failure);
    }

    [Fact]
    public void Derive_WignerTunnelling_KappaEntersTheStepAndTheHeadlineRate()
    {
        // TS1 with an imaginary mode of 1500i cm⁻¹; TS2 gives none, so its κ stays 1.
        var p = TwoSteps();
        var path = p with { States = [.. p.States.Select(s => s.Label == "TS1" ? s with { ImaginaryFrequencyCm1 = -1500 } : s)] };
        var r = PathwayEnergies.Derive(path, new EnergyModel(Tunnelling: StepTunnelling.Wigner));

        // Wigner, Z. Phys. Chem. B 19, 203 (1932): κ = 1 + (1/24)(h c ν̃ / k_B T)², CODATA 2018 exact h, c, k_B.
        const double c = 299792458.0, t = 298.15;
        var u = H * c * 1500 * 100 / (KB * t);
        var kappa = 1 + u * u / 24;
        Close.Relative(kappa, r.Steps[0].TransmissionCoefficient, 1e-12, "κ(TS1)", "Wigner 1932 by hand");
        Assert.Equal(1.0, r.Steps[1].TransmissionCoefficient);
        Assert.Equal(-1500, r.Steps[0].ImaginaryFrequencyCm1);

        // Headline: the energetic span 0.040 hartree with TDTS = TS1 (see TwoSteps), k_eff = κ (k_B T/h) exp(−ΔG‡/RT) (Eyring 1935).
        Assert.Equal("TS1", r.Overall.DeterminingSaddlePoint);
        Close.Absolute(0.040, r.Overall.GibbsBarrier!.Value.Hartree, 1e-12, "headline ΔG‡", "Kozuch–Shaik rule by hand");
        var k = kappa * KB * t / H * Math.Exp(-0.040 * KcalPerHartree * 4184 / (R * t));
        Close.Relative(k, r.Overall.RateConstantPerSecond!.Value, 1e-9, "k_eff", "Eyring with Wigner κ by hand, CODATA 2018");
        Close.Relative(Math.Log(2) / k, r.Overall.HalfLifeSeconds!.Value, 1e-9, "t½", "ln 2 / k");
        Close.Absolute(-0.058, r.Overall.ReactionGibbs!.Value.Hartree, 1e-12, "ΔG_r", "hand arithmetic in TwoSteps");
        // ΔE‡ is 0.030 hartree for both steps; ΔH‡(TS1) = (−234.42 + 0.150) − (−234.45 + 0.145) = 0.035 hartree (hand arithmetic).
        Close.Absolute(0.030, r.Overall.ElectronicBarrier!.Value.Hartree, 1e-12, "highest ΔE‡", "hand arithmetic in TwoSteps");
        Close.Absolute(0.035, r.Steps[0].EnthalpyBarrier!.Value.Hartree, 1e-12, "ΔH‡(TS1)", "hand arithmetic");
    }

    [Fact]
    public void Derive_ComputedModel_SpeciesWithOnlyReportedCorrections_UsesThemAndThermalCorrectionOfAgrees()
    {
        var r = PathwayEnergies.Derive(TwoSteps(), new EnergyModel(ThermalSource.Computed));
        // No geometry or frequencies anywhere in TwoSteps: the reported corrections give the same ΔG‡ as the reported model.
        Close.Absolute(0.040, r.Steps[0].GibbsBarrier!.Value.Hartree, 1e-12, "ΔG‡(TS1)", "hand arithmetic in TwoSteps");
        Assert.DoesNotContain(r.Reasons, x => x.Code == PathwayEnergyCodes.MissingFrequencies);
        var ts1 = r.States[1].Terms.Single().Species;
        var alone = PathwayEnergies.ThermalCorrectionOf(ts1 with { Thermal = T(0.150, 0.100) }, new EnergyModel(ThermalSource.Computed), out _);
        Assert.Equal(ts1.Thermal, alone);
        Assert.False(alone!.IsComputed);
    }

    /// <summary>A → TS → B, one molecule each, with Gibbs corrections 0.050 hartree everywhere; E(TS) − E(A) = <paramref name="barrierHartree"/>.</summary>
    private static Pathway OneStep(double barrierHartree, double? imaginaryCm1 = null) => new("one step",
    [
        new("A", StateKind.Minimum, [new(Species("A", "C2H4O", -153.00, thermal: T(0.060, 0.050)))]),
        new("TS", StateKind.SaddlePoint, [new(Species("TS", "C2H4O", -153.00 + barrierHartree, thermal: T(0.060, 0.050)))], imaginaryCm1),
        new("B", StateKind.Minimum, [new(Species("B", "C2H4O", -153.05, thermal: T(0.060, 0.050)))]),
    ]);

    [Fact]
    public void Derive_SaddlePointBelowTheMinimumBeforeIt_IsAConsistencyFailureAndGivesNoRate()
    {
        var r = PathwayEnergies.Derive(OneStep(-0.002));
        // ΔG‡ = −0.002 hartree = −1.255 kcal/mol (CODATA 2018: 627.5094740631 kcal/mol per hartree).
        Close.Absolute(-0.002, r.Steps[0].GibbsBarrier!.Value.Hartree, 1e-12, "ΔG‡", "hand arithmetic");
        Assert.Equal(Verdict.Failed, r.Verdict);
        Assert.Contains(r.Reasons, x => x.Code == PathwayEnergyCodes.NegativeBarrier && x.Severity == CheckSeverity.Failure && x.Message.Contains("1.3 kcal/mol below"));
        Assert.Null(r.Steps[0].RateConstant);
        Assert.Null(r.Steps[0].HalfLifeSeconds);
        Assert.Null(r.Overall.RateConstantPerSecond);
        Assert.Null(r.Overall.HalfLifeSeconds);
    }

    [Fact]
    public void Derive_RateAboveKbTOverH_IsNeverGivenAndSaysWhy()
    {
        // ΔG‡ = 0.0002 hartree (0.13 kcal/mol) with Wigner κ at 2000i cm⁻¹: κ = 1 + u²/24, u = h c ν̃ / k_B T ≈ 9.65, κ ≈ 4.9, so
        // κ exp(−ΔG‡/RT) ≈ 3.9 > 1 and Eyring would exceed k_B T/h = 6.21×10¹² s⁻¹ (CODATA 2018 exact k_B, h; Eyring 1935).
        const double c = 299792458.0, t = 298.15;
        var u = H * c * 2000 * 100 / (KB * t);
        var kappa = 1 + u * u / 24;
        Assert.True(kappa * Math.Exp(-0.0002 * KcalPerHartree * 4184 / (R * t)) > 1, "the example must lie above the limit");
        var r = PathwayEnergies.Derive(OneStep(0.0002, -2000), new EnergyModel(Tunnelling: StepTunnelling.Wigner));
        Assert.Null(r.Steps[0].RateConstant);
        Assert.Null(r.Overall.RateConstantPerSecond);
        Assert.Contains(r.Reasons, x => x.Code == PathwayEnergyCodes.RateAboveLimit && x.Severity == CheckSeverity.Failure && x.Message.Contains("6.21E+12 s⁻¹"));
        // Without tunnelling the same barrier stays below the limit: k = (k_B T/h) exp(−ΔG‡/RT), given.
        var plain = PathwayEnergies.Derive(OneStep(0.0002));
        Close.Relative(KB * t / H * Math.Exp(-0.0002 * KcalPerHartree * 4184 / (R * t)), plain.Steps[0].RateConstant!.Value, 1e-9, "k", "Eyring by hand");
        Assert.DoesNotContain(plain.Reasons, x => x.Code == PathwayEnergyCodes.RateAboveLimit);
    }

    [Fact]
    public void Equal_but_separately_built_species_records_are_resolved_alike()
    {
        // A spectator catalyst written as two separate but equal records (as a caller building states one by one does).
        // Its energy cancels: ΔG‡ is the plain TS1 − reactants difference, 0.040 hartree by hand (see TwoSteps).
        var cat = Species("cat", "CH4", -40.0, thermal: T(0.045, 0.020));
        var cat2 = cat with { };
        Assert.Equal(cat, cat2);
        Assert.False(ReferenceEquals(cat, cat2));
        var p = TwoSteps();
        var withCat = p with
        {
            States = [.. p.States.Select((s, i) => s with { Terms = [.. s.Terms, new(i % 2 == 0 ? cat : cat2)] })],
        };
        var r = PathwayEnergies.Derive(withCat);
        Close.Absolute(0.040, r.Steps[0].GibbsBarrier!.Value.Hartree, 1e-12, "ΔG‡(TS1) with a spectator", "hand arithmetic: the spectator cancels");
    }
}
