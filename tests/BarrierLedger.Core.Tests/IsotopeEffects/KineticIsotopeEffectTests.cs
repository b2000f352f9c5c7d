using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.IsotopeEffects;
using BarrierLedger.Core.Kinetics;
using BarrierLedger.Core.Tests.ReferenceData;
using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Tests.Vibrations;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Core.Units;
using BarrierLedger.Core.Vibrations;
using MathNet.Numerics.LinearAlgebra;

namespace BarrierLedger.Core.Tests.IsotopeEffects;

public class KineticIsotopeEffectTests
{
    // Redlich–Teller product rule (O. Redlich, Z. Phys. Chem. B 28, 371 (1935); Wilson, Decius & Cross, Molecular Vibrations, 1955,
    // §8-4): Π(ν_s/ν_p) over all 3N − 6 modes = Π_atoms (m_p/m_s)^{3/2} (M_s/M_p)^{3/2} (I_A I_B I_C)_s^{1/2}/(I_A I_B I_C)_p^{1/2},
    // exact for harmonic frequencies of a Hessian invariant to rigid-body motion; here for the reactant and the saddle point (whose
    // imaginary frequency enters by its magnitude) of every isotope pair. The right side is computed in the test with its own inertia
    // tensor and MathNet's eigensolver.
    [Theory]
    [InlineData("H", "2H")]
    [InlineData("H", "3H")]
    [InlineData("C", "13C")]
    [InlineData("N", "15N")]
    [InlineData("O", "18O")]
    [InlineData("Cl", "37Cl")]
    public void ProductRule_HoldsForEveryIsotopePair_OnReactantAndSaddlePoint(string element, string isotope)
    {
        var (m, reactant, saddle) = KieSystems.Cluster(10, 7);
        var atom = KieSystems.FirstAtom(m, element);
        var r = KineticIsotopeEffect.Compute(
            KieSystems.Structure("TS", m, saddle, (atom, isotope)), [KieSystems.Structure("R", m, reactant, (atom, isotope))]);
        foreach (var s in r.Structures)
        {
            var lhs = s.Parent.Modes.Zip(s.Substituted.Modes).Sum(p => Math.Log(Math.Abs(p.Second.FrequencyCm1) / Math.Abs(p.First.FrequencyCm1)));
            var mp = s.Parent.MassesAmu.ToArray();
            var ms = s.Substituted.MassesAmu.ToArray();
            var rhs = mp.Zip(ms).Sum(p => 1.5 * Math.Log(p.First / p.Second)) + 1.5 * Math.Log(ms.Sum() / mp.Sum())
                      + 0.5 * Math.Log(MomentProduct(m, ms) / MomentProduct(m, mp));
            Close.Relative(1.0, Math.Exp(lhs - rhs), IsotopeReference.ProductRuleTolerance, $"product rule, {s.Label}, {element}→{isotope}",
                "Redlich 1935; Wilson, Decius & Cross §8-4");
            Assert.InRange(s.ProductRuleDeviation, 0, IsotopeReference.ProductRuleTolerance);
        }
        // And the factorisation built on it: MMI = (ν‡_p/ν‡_s) · VP.
        Close.Relative(r.MassMomentFactor, r.ImaginaryFrequencyRatio * r.VibrationalProductFactor, IsotopeReference.ProductRuleTolerance,
            "MMI against ν‡ ratio × VP", "Bigeleisen & Mayer 1947 with the Redlich–Teller rule");
    }

    // The textbook maximum primary H/D isotope effect: a C–H stretch of ~2900 cm⁻¹ is lost at the saddle point, and the zero-point
    // difference of that stretch alone, exp[h c (ν_H − ν_D) / 2 k_B T] with ν_D from the same Hessian with a deuterium mass, is the
    // classical maximum of about 6.5–7 at 298 K. The model saddle point keeps the geometry and every other spring (so MMI = 1); its
    // full KIE stays below that maximum because the remaining modes around the lost bond shift with the masses as well.
    [Fact]
    public void PrimaryHD_WhenAStretchNear2900IsLost_GivesTheClassicalMaximumNear7()
    {
        var (m, reactant, saddle) = KieSystems.HydrogenLoss();
        var r = KineticIsotopeEffect.Compute(KieSystems.Structure("TS", m, saddle, (2, "D")), [KieSystems.Structure("R", m, reactant, (2, "D"))],
            new KieOptions(298.15));
        var stretchH = r.Structures[1].Parent.FrequenciesCm1.Max();
        var stretchD = r.Structures[1].Substituted.FrequenciesCm1.Max();
        Assert.InRange(stretchH, 2850, 2950);
        var classicalMaximum = Math.Exp(HarmonicOscillator.SecondRadiationConstantCmKelvin * (stretchH - stretchD) / (2 * 298.15));
        Assert.InRange(classicalMaximum, IsotopeReference.ClassicalMaximumLow, IsotopeReference.ClassicalMaximumHigh);
        Assert.InRange(r.Kie, 1.0, classicalMaximum);
        Close.Relative(1.0, r.MassMomentFactor, 1e-12, "MMI with the same geometry on both sides", "definition of MMI");
        // Model property (no source): the other modes couple weakly to the stretch, so the ZPE factor stays within 5 % of the maximum.
        Close.Relative(classicalMaximum, r.ZeroPointFactor, 0.05, "ZPE factor against the lost stretch alone", IsotopeReference.ClassicalMaximumSource);
        Close.Relative(r.Kie, r.SymmetryFactor * r.MassMomentFactor * r.ZeroPointFactor * r.ExcitationFactor * r.LowModeFactor * r.TunnellingFactor,
            1e-12, "KIE as the product of its factors", "Bigeleisen–Mayer factorisation");
    }

    // H₂/D₂ and H³⁵Cl/D³⁵Cl: the Hessian of the light molecule (force constant from its tabulated ω_e) re-analysed with the heavy
    // masses gives ω_H/ω_D = √(μ_D/μ_H) exactly (harmonic, Born–Oppenheimer) and the tabulated ω_e of the heavy molecule within the
    // mass-dependent corrections the harmonic rule leaves out.
    [Theory]
    [InlineData("H", "H", IsotopeReference.H2OmegaE, IsotopeReference.D2OmegaE, 0.7414, IsotopeReference.H2D2RelativeTolerance)]
    [InlineData("H", "Cl", IsotopeReference.H35ClOmegaE, IsotopeReference.D35ClOmegaE, 1.27455, IsotopeReference.HClDClRelativeTolerance)]
    public void Diatomics_WithHeavyMasses_FollowTheReducedMassRule_AndTheHandbook(string a, string b, double omegaLight, double omegaHeavy, double r, double tolerance)
    {
        var m = TestMolecules.Diatomic(a, b, r, new Vec3(1, -2, 2), new Vec3(0.4, 0.1, -0.3));
        var light = Inertia.MassesAmu(m);
        var heavy = IsotopeSubstitution.Masses(m, b == "H" ? KieSystems.Subs((1, "D"), (2, "D")) : KieSystems.Subs((1, "D")));
        static double Mu(IReadOnlyList<double> x) => x[0] * x[1] / (x[0] + x[1]);
        // k = μ (2π c ω)², in N/m.
        var omega = 2 * Math.PI * PhysicalConstants.SpeedOfLightMetrePerSecond * 100 * omegaLight;
        var k = Mu(light) * PhysicalConstants.AtomicMassConstantKilogram * omega * omega;
        var h = SpringHessians.Build(m, [(0, 1, k)]);
        var nuLight = Assert.Single(FrequencyAnalysis.FromHessian(m, h, new HessianOptions(MassesAmu: light)).Modes).FrequencyCm1;
        var nuHeavy = Assert.Single(FrequencyAnalysis.FromHessian(m, h, new HessianOptions(MassesAmu: heavy)).Modes).FrequencyCm1;
        Close.Relative(omegaLight, nuLight, 1e-9, $"ω_e of the light {a}{b}", "force constant built from it");
        Close.Relative(Math.Sqrt(Mu(heavy) / Mu(light)), nuLight / nuHeavy, 1e-10, "ω_light/ω_heavy", "√(reduced-mass) rule, Herzberg I");
        Close.Relative(omegaHeavy, nuHeavy, tolerance, "ω_e of the deuterated molecule", IsotopeReference.HuberHerzberg);
        Close.Relative(omegaLight / omegaHeavy, nuLight / nuHeavy, tolerance, "tabulated ω ratio", IsotopeReference.HuberHerzberg);
    }

    // An independent computation of one KIE by hand-written statistical mechanics: mass-weighting, MathNet's eigensolver on the
    // unprojected matrix (an invariant Hessian has six exact zero eigenvalues), wavenumbers from the CODATA 2018 constants typed in
    // ReferenceData, the inertia tensor diagonalised by MathNet, and the textbook partition functions (McQuarrie, Statistical Mechanics,
    // 1976, ch. 5–8): q_tr ∝ M^{3/2}, q_rot ∝ (I_A I_B I_C)^{1/2}, q_vib = Π e^{−u/2}/(1 − e^{−u}).
    [Theory]
    [InlineData("H", "2H", KieTunnelling.None)]
    [InlineData("C", "13C", KieTunnelling.Wigner)]
    [InlineData("Cl", "37Cl", KieTunnelling.None)]
    public void Kie_AgreesWithAnIndependentPartitionFunctionComputation(string element, string isotope, KieTunnelling tunnelling)
    {
        const double t = 310.0;
        var (m, reactant, saddle) = KieSystems.Cluster(9, 3);
        var atom = KieSystems.FirstAtom(m, element);
        var result = KineticIsotopeEffect.Compute(KieSystems.Structure("TS", m, saddle, (atom, isotope)),
            [KieSystems.Structure("R", m, reactant, (atom, isotope))], new KieOptions(t, Tunnelling: tunnelling));

        var light = Inertia.MassesAmu(m);
        var heavy = (double[])light.Clone();
        heavy[atom - 1] = Isotopes.Parse(isotope).MassDa;
        double LnQ(double[] h, double[] masses, out double imaginary)
        {
            var nus = IndependentWavenumbers(h, masses);
            imaginary = nus.Where(v => v < 0).DefaultIfEmpty(0).Single();
            var c2 = Codata2018.Planck * Codata2018.SpeedOfLight * 100 / (Codata2018.Boltzmann * t);
            var lnVib = nus.Where(v => v > 0).Sum(v => -0.5 * c2 * v - Math.Log(1 - Math.Exp(-c2 * v)));
            return 1.5 * Math.Log(masses.Sum()) + 0.5 * Math.Log(MomentProduct(m, masses)) + lnVib;
        }
        var lnKie = LnQ(saddle, light, out var nuL) - LnQ(saddle, heavy, out var nuH) - LnQ(reactant, light, out _) + LnQ(reactant, heavy, out _);
        var kie = Math.Exp(lnKie);
        if (tunnelling == KieTunnelling.Wigner)
        {
            double Wigner(double nu) { var u = Codata2018.Planck * Codata2018.SpeedOfLight * 100 * nu / (Codata2018.Boltzmann * t); return 1 + u * u / 24; }
            kie *= Wigner(nuL) / Wigner(nuH);
        }
        Close.Relative(kie, result.Kie, IsotopeReference.IndependentKieTolerance, $"KIE {element}→{isotope}, {tunnelling}",
            "independent partition functions (McQuarrie 1976) and MathNet eigenvalues");
        Close.Relative(kie, result.SemiclassicalKie * result.TunnellingFactor, IsotopeReference.IndependentKieTolerance,
            "SYM·MMI·ZPE·EXC·TUN", "independent partition functions");
    }

    // Under RRHO the model's Gibbs energies and the partition-function factors are the same statistical mechanics: LOW = 1. Under
    // quasi-RRHO the low modes of each isotopologue are damped by their own wavenumbers, and LOW carries the whole difference.
    [Fact]
    public void LowModeFactor_IsOneUnderRrho_AndCarriesTheQuasiRrhoDifference()
    {
        var (m, reactant, saddle) = KieSystems.Cluster(8, 11);
        var ts = KieSystems.Structure("TS", m, saddle, (2, "D"));
        var rs = new[] { KieSystems.Structure("R", m, reactant, (2, "D")) };
        var rrho = KineticIsotopeEffect.Compute(ts, rs, new KieOptions(298.15));
        Close.Relative(1.0, rrho.LowModeFactor, 1e-10, "LOW under RRHO", "G = −RT ln q for the ideal gas (McQuarrie ch. 5)");
        var quasi = KineticIsotopeEffect.Compute(ts, rs, new KieOptions(298.15, ThermoTreatment.QuasiRrhoEntropy, 400.0));
        Close.Relative(rrho.SemiclassicalKie, quasi.SemiclassicalKie, 1e-12, "SYM·MMI·ZPE·EXC do not depend on the treatment", "definition");
        Close.Relative(quasi.KieWithoutTunnelling, quasi.SemiclassicalKie * quasi.LowModeFactor, 1e-12, "KIE = factors × LOW", "definition");
        Assert.Contains(quasi.Notes, n => n.Contains("quasi-RRHO"));
    }

    // Bell's truncated parabola needs each isotopologue's own zero-point-corrected barrier; the heavier one's is higher by its
    // zero-point change, which the result uses: recomputed here from the reported zero-point energies.
    [Fact]
    public void TunnellingFactors_UseEachIsotopologuesOwnFrequencyAndBarrier()
    {
        var (m, reactant, saddle) = KieSystems.HydrogenLoss();
        var v0 = Energy.FromKcalPerMol(12.0);
        const double t = 350.0; // above the crossover temperature of this saddle point (~309 K), where Bell's model applies
        var r = KineticIsotopeEffect.Compute(KieSystems.Structure("TS", m, saddle, (2, "D")), [KieSystems.Structure("R", m, reactant, (2, "D"))],
            new KieOptions(t, Tunnelling: KieTunnelling.Bell, ZeroPointBarrier: v0));
        var ts = r.Structures[0];
        var re = r.Structures[1];
        var shift = ts.ThermoSubstituted.ZeroPointEnergy - ts.ThermoParent.ZeroPointEnergy - (re.ThermoSubstituted.ZeroPointEnergy - re.ThermoParent.ZeroPointEnergy);
        Assert.True(shift.Hartree > 0, "the deuterated saddle point lies higher above its reactant");
        var expected = Tunnelling.Bell(r.ImaginaryParentCm1, t, v0, 1) / Tunnelling.Bell(r.ImaginarySubstitutedCm1, t, v0 + shift, 1);
        Close.Relative(expected, r.TunnellingFactor, 1e-12, "Bell κ_H/κ_D", "Bell 1980 with each isotopologue's barrier");
        var wigner = r.TunnellingFactors.Single(f => f.Correction == KieTunnelling.Wigner);
        Close.Relative(Tunnelling.Wigner(r.ImaginaryParentCm1, t) / Tunnelling.Wigner(r.ImaginarySubstitutedCm1, t), wigner.Ratio!.Value, 1e-12,
            "Wigner κ_H/κ_D", "Wigner 1932");
        Assert.True(r.ImaginaryFrequencyRatio > 1.3, "the H/D imaginary frequency ratio of a hydrogen-transfer mode is well above 1");
        // Below the crossover temperature Bell's model is not offered, and says why.
        var cold = KineticIsotopeEffect.Compute(KieSystems.Structure("TS", m, saddle, (2, "D")), [KieSystems.Structure("R", m, reactant, (2, "D"))],
            new KieOptions(250.0, ZeroPointBarrier: v0));
        var bell = cold.TunnellingFactors.Single(f => f.Correction == KieTunnelling.Bell);
        Assert.Null(bell.Ratio);
        Assert.Contains("crossover", bell.Note);
    }

    [Fact]
    public void Compute_WhenTheTwoSidesSubstituteDifferentIsotopes_RefusesWithBoth()
    {
        var (m, reactant, saddle) = KieSystems.HydrogenLoss();
        var ex = Assert.Throws<ArgumentException>(() => KineticIsotopeEffect.Compute(
            KieSystems.Structure("TS", m, saddle, (2, "D")), [KieSystems.Structure("R", m, reactant, (1, "13C"))]));
        Assert.Contains("1×2H", ex.Message);
        Assert.Contains("1×13C", ex.Message);
    }

    [Fact]
    public void Compute_WithAMinimumAsSaddlePoint_RefusesBecauseThereIsNoImaginaryMode()
    {
        var (m, reactant, _) = KieSystems.HydrogenLoss();
        var ex = Assert.Throws<ArgumentException>(() => KineticIsotopeEffect.Compute(
            KieSystems.Structure("TS", m, reactant, (2, "D")), [KieSystems.Structure("R", m, reactant, (2, "D"))]));
        Assert.Contains("no imaginary mode", ex.Message);
    }

    [Theory]
    [InlineData("2=D, 1=13C", 2)]
    [InlineData("H2=D;C1=13C", 2)]
    [InlineData("2=T", 1)]
    public void ParseList_ReadsAtomsAndIsotopes(string text, int count) =>
        Assert.Equal(count, IsotopeSubstitution.ParseList(text).Length);

    [Theory]
    [InlineData("C2=D", "cannot become 2H")]
    [InlineData("x=D", "not an atom number")]
    [InlineData("2", "expected atom=isotope")]
    public void ParseList_WithBadText_SaysWhichItemAndWhy(string text, string expected)
    {
        Assert.False(IsotopeSubstitution.TryParseList(text, out _, out var error));
        Assert.Contains(expected, error);
    }

    [Fact]
    public void Masses_WithAnAtomOfAnotherElement_NamesTheAtom()
    {
        var (m, _, _) = KieSystems.HydrogenLoss();
        var ex = Assert.Throws<ArgumentException>(() => IsotopeSubstitution.Masses(m, KieSystems.Subs((3, "D"))));
        Assert.Contains("Cl3", ex.Message);
        Assert.Throws<ArgumentException>(() => IsotopeSubstitution.Masses(m, KieSystems.Subs((6, "D"))));
    }

    /// <summary>Product of the principal moments (amu³ Å⁶) from the inertia tensor diagonalised by MathNet.</summary>
    private static double MomentProduct(Molecule m, IReadOnlyList<double> masses)
    {
        var total = masses.Sum();
        var com = new double[3];
        for (var a = 0; a < m.AtomCount; a++)
            for (var x = 0; x < 3; x++) com[x] += masses[a] * m.PositionsAngstrom[a][x] / total;
        var t = Matrix<double>.Build.Dense(3, 3);
        for (var a = 0; a < m.AtomCount; a++)
        {
            var r = new[] { m.PositionsAngstrom[a].X - com[0], m.PositionsAngstrom[a].Y - com[1], m.PositionsAngstrom[a].Z - com[2] };
            var r2 = r[0] * r[0] + r[1] * r[1] + r[2] * r[2];
            for (var i = 0; i < 3; i++)
                for (var j = 0; j < 3; j++) t[i, j] += masses[a] * ((i == j ? r2 : 0) - r[i] * r[j]);
        }
        return t.Evd(Symmetricity.Symmetric).EigenValues.Aggregate(1.0, (p, v) => p * v.Real);
    }

    /// <summary>Wavenumbers (cm⁻¹, imaginary negative) of the unprojected mass-weighted Hessian, its six rigid-body zeros dropped.</summary>
    private static double[] IndependentWavenumbers(double[] h, double[] masses)
    {
        var n = 3 * masses.Length;
        var f = Matrix<double>.Build.Dense(n, n, (i, j) => h[i * n + j] / Math.Sqrt(masses[i / 3] * masses[j / 3]));
        var toCm1 = Math.Sqrt(Codata2018.HartreeJoule / (Codata2018.BohrMetre * Codata2018.BohrMetre * Codata2018.AtomicMassConstantKilogram))
                    / (2 * Math.PI * Codata2018.SpeedOfLight * 100);
        return [.. f.Evd(Symmetricity.Symmetric).EigenValues.Select(l => l.Real).OrderBy(Math.Abs).Skip(6)
            .Select(l => Math.Sign(l) * Math.Sqrt(Math.Abs(l)) * toCm1)];
    }
}
