using BarrierLedger.Core.Kinetics;
using BarrierLedger.Core.Tests.ReferenceData;
using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Core.Units;
using MathNet.Numerics;
using static BarrierLedger.Core.Tests.Kinetics.NetworkBuilder;

namespace BarrierLedger.Core.Tests.Kinetics;

// Textbook analytic solutions (relative error ≤ 1e-6 at the checked times, as issue 22 asks). Sources named at each test:
// P. Atkins and J. de Paula, Physical Chemistry (integrated rate laws; reactions approaching equilibrium; consecutive reactions,
// pre-equilibria and the steady-state approximation) and J. I. Steinfeld, J. S. Francisco and W. L. Hase, Chemical Kinetics and
// Dynamics, 2nd ed. 1999, ch. 2 (exact solutions of first-order schemes).
public class MicrokineticsTests
{
    private static readonly double[] Checked = [30.0, 100.0, 300.0];

    // A → B: [A] = [A]₀ e^{−kt}. k from the Eyring equation at ΔG‡ = 20 kcal/mol (1.36×10⁻² s⁻¹, checked in EyringTests).
    [Fact]
    public void FirstOrder_FollowsTheIntegratedRateLaw()
    {
        var network = new ReactionNetwork(["A", "B"], [Eyring("A→B", "A", "B", "A", "TS", "B")], [Level("A", 0), Level("TS", 20), Level("B", -15)]);
        var result = Microkinetics.Simulate(network, At(Room, 300, Checked, ("A", 0.2)), options: Tight);
        var k = global::BarrierLedger.Core.Kinetics.Eyring.RateConstant(Energy.FromKcalPerMol(20), Room);
        Close.Relative(k, result.RateConstantsAtStart[0].Forward, 1e-14, "k_f of the network", "Eyring equation");
        foreach (var p in result.Reports)
            Close.Relative(0.2 * Math.Exp(-k * p.TimeSeconds), p.MolPerL[0], 1e-6, $"[A]({p.TimeSeconds} s)", "first-order integrated rate law (Atkins & de Paula)");
    }

    // A ⇌ B with ΔG° = −1.0 kcal/mol: [A](t) = [A]₀ (k_r + k_f e^{−(k_f + k_r) t})/(k_f + k_r), and at equilibrium [B]/[A] = K = exp(−ΔG°/RT)
    // (Atkins & de Paula, reactions approaching equilibrium; K from ΔG°: IUPAC Green Book §2.11).
    [Fact]
    public void Reversible_ReachesTheEquilibriumConstantOfDeltaG()
    {
        var network = new ReactionNetwork(["A", "B"], [Eyring("A⇌B", "A", "B", "A", "TS", "B")], [Level("A", 0), Level("TS", 19), Level("B", -1.0)]);
        var result = Microkinetics.Simulate(network, At(Room, 5000, [10, 60, 5000], ("A", 1.0)), options: Tight);
        var kf = result.RateConstantsAtStart[0].Forward;
        var kr = result.RateConstantsAtStart[0].Reverse;
        var K = Math.Exp(1.0 / RtKcal(Room));
        Close.Relative(K, kf / kr, 1e-12, "k_f / k_r", "detailed balance, K = exp(−ΔG°/RT)");
        foreach (var p in result.Reports)
            Close.Relative((kr + kf * Math.Exp(-(kf + kr) * p.TimeSeconds)) / (kf + kr), p.MolPerL[0], 1e-6, $"[A]({p.TimeSeconds} s)",
                "A ⇌ B integrated rate law (Atkins & de Paula)");
        var end = result.Final.MolPerL;
        Close.Relative(K, end[1] / end[0], 1e-6, "[B]/[A] at equilibrium", "K = exp(−ΔG°/RT), IUPAC Green Book §2.11");
    }

    // A → B → C: [B] = [A]₀ k₁/(k₂ − k₁)(e^{−k₁t} − e^{−k₂t}) (H. Bateman, Proc. Cambridge Philos. Soc. 15 (1910) 423;
    // Atkins & de Paula, consecutive reactions), [C] = [A]₀ − [A] − [B].
    [Fact]
    public void Consecutive_FollowsBateman()
    {
        const double k1 = 2e-2, k2 = 5e-3;
        var network = new ReactionNetwork(["A", "B", "C"], [Fixed("1", "A", "B", k1), Fixed("2", "B", "C", k2)]);
        var result = Microkinetics.Simulate(network, At(Room, 2000, [10, 100, 500, 2000], ("A", 0.5)), options: Tight);
        foreach (var p in result.Reports)
        {
            var t = p.TimeSeconds;
            var a = 0.5 * Math.Exp(-k1 * t);
            var b = 0.5 * k1 / (k2 - k1) * (Math.Exp(-k1 * t) - Math.Exp(-k2 * t));
            Close.Relative(a, p.MolPerL[0], 1e-6, $"[A]({t} s)", "first-order law");
            Close.Relative(b, p.MolPerL[1], 1e-6, $"[B]({t} s)", "Bateman 1910");
            Close.Relative(0.5 - a - b, p.MolPerL[2], 1e-6, $"[C]({t} s)", "Bateman 1910, mass balance");
        }
    }

    // A + B → P, rate k[A][B], [A]₀ ≠ [B]₀: kt = ln([B][A]₀/([A][B]₀))/([B]₀ − [A]₀) (Atkins & de Paula, table of integrated rate
    // laws), i.e. [A](t) = [A]₀ Δ / ([B]₀ e^{Δkt} − [A]₀), Δ = [B]₀ − [A]₀. k is bimolecular Eyring at ΔG‡ = 15 kcal/mol, 1 mol/L.
    [Fact]
    public void SecondOrderUnequal_FollowsTheIntegratedRateLaw()
    {
        var network = new ReactionNetwork(["A", "B", "P"], [Eyring("A+B", "A + B", "P", "A+B", "TS", "P")], [Level("A+B", 0), Level("TS", 15), Level("P", -20)]);
        const double a0 = 0.05, b0 = 0.08;
        var result = Microkinetics.Simulate(network, At(Room, 10, [0.05, 0.2, 1, 3], ("A", a0), ("B", b0)), options: Tight);
        var k = global::BarrierLedger.Core.Kinetics.Eyring.RateConstant(Energy.FromKcalPerMol(15), Room, molecularity: 2);
        Close.Relative(k, result.RateConstantsAtStart[0].Forward, 1e-14, "k (M⁻¹ s⁻¹)", "Eyring, c° = 1 mol/L");
        Assert.Equal("M⁻¹ s⁻¹", result.RateConstantsAtStart[0].ForwardUnit);
        foreach (var p in result.Reports)
        {
            var d = b0 - a0;
            var a = a0 * d / (b0 * Math.Exp(d * k * p.TimeSeconds) - a0);
            Close.Relative(a, p.MolPerL[0], 1e-6, $"[A]({p.TimeSeconds} s)", "second-order law, unequal concentrations (Atkins & de Paula)");
            Close.Relative(b0 - (a0 - a), p.MolPerL[1], 1e-6, $"[B]({p.TimeSeconds} s)", "stoichiometry");
        }
    }

    // A ⇌ I → P, all first order: exact solution with λ₁,₂ = ½[(k₁ + k₋₁ + k₂) ∓ √((k₁ + k₋₁ + k₂)² − 4k₁k₂)],
    // [A] = [A]₀[(λ₂ − k₁)e^{−λ₁t} + (k₁ − λ₁)e^{−λ₂t}]/(λ₂ − λ₁), [I] = [A]₀ k₁ (e^{−λ₁t} − e^{−λ₂t})/(λ₂ − λ₁) (Steinfeld, Francisco & Hase,
    // ch. 2). With k₋₁ + k₂ ≫ k₁ the steady-state approximation gives d[P]/dt = k₁k₂/(k₋₁ + k₂)[A], and the pre-equilibrium one
    // K k₂ with K = k₁/k₋₁ when also k₋₁ ≫ k₂ (Atkins & de Paula, the steady-state approximation and pre-equilibria).
    [Fact]
    public void PreEquilibrium_MatchesTheExactSolutionAndTheSteadyStateRate()
    {
        const double k1 = 1e-3, km1 = 1e2, k2 = 1.0;
        var network = new ReactionNetwork(["A", "I", "P"], [Fixed("1", "A", "I", k1, km1), Fixed("2", "I", "P", k2)]);
        double[] times = [1e-3, 0.1, 1e4, 1e5, 2e5];
        var result = Microkinetics.Simulate(network, At(Room, 2e5, times, ("A", 1.0)), options: Tight);
        var s = k1 + km1 + k2;
        var root = Math.Sqrt(s * s - 4 * k1 * k2);
        var (l1, l2) = ((s - root) / 2, (s + root) / 2);
        foreach (var p in result.Reports)
        {
            var t = p.TimeSeconds;
            var a = ((l2 - k1) * Math.Exp(-l1 * t) + (k1 - l1) * Math.Exp(-l2 * t)) / (l2 - l1);
            var i = k1 * (Math.Exp(-l1 * t) - Math.Exp(-l2 * t)) / (l2 - l1);
            Close.Relative(a, p.MolPerL[0], 1e-6, $"[A]({t} s)", "exact solution of A ⇌ I → P (Steinfeld, Francisco & Hase ch. 2)");
            Close.Relative(i, p.MolPerL[1], 1e-6, $"[I]({t} s)", "exact solution of A ⇌ I → P (Steinfeld, Francisco & Hase ch. 2)");
        }
        // The simulated slow decay rate of A + I equals λ₁, which the steady-state rate constant approximates to O(k₁/(k₋₁ + k₂)).
        var late = result.Reports.Where(p => p.TimeSeconds >= 1e5).ToArray();
        var decay = -Math.Log((late[1].MolPerL[0] + late[1].MolPerL[1]) / (late[0].MolPerL[0] + late[0].MolPerL[1])) / (late[1].TimeSeconds - late[0].TimeSeconds);
        Close.Relative(l1, decay, 1e-6, "late decay rate of A + I", "slow eigenvalue λ₁");
        var steady = k1 * k2 / (km1 + k2);
        Close.Relative(steady, decay, 2 * k1 / (km1 + k2), "steady-state k_eff = k₁k₂/(k₋₁ + k₂)", "steady-state approximation (Atkins & de Paula)");
        Close.Relative(k1 / km1 * k2, decay, 2 * k2 / km1, "pre-equilibrium K k₂", "pre-equilibrium approximation (Atkins & de Paula)");
    }

    // A + B ⇌ C with a 1 atm gas standard state: K_c = K° (c°)^{Δn}, c° = p°/RT, so [C]/([A][B]) = exp(−ΔG°/RT)/c° at equilibrium
    // (IUPAC Green Book, 3rd ed. 2007, §2.11). The forward k is bimolecular Eyring with (c°)^{−1}.
    [Fact]
    public void GasStandardState_BimolecularEquilibriumUsesTheStandardConcentration()
    {
        var standard = new StandardConcentration(StandardState.Gas1Atm);
        var network = new ReactionNetwork(["A", "B", "C"], [Eyring("assoc", "A + B", "C", "A+B", "TS", "C")],
            [Level("A+B", 0), Level("TS", 12), Level("C", -3)], Room, standard);
        var result = Microkinetics.Simulate(network, At(Room, 1e6, null, ("A", 0.01), ("B", 0.02)), options: Tight);
        var c0 = 101325.0 / (PhysicalConstants.GasConstantJoulePerMoleKelvin * Room) / 1000.0;
        Close.Relative(0.040874, c0, 1e-4, "c° of an ideal gas at 1 atm, 298.15 K", "ideal-gas law, p/RT");
        Close.Relative(global::BarrierLedger.Core.Kinetics.Eyring.RateConstant(Energy.FromKcalPerMol(12), Room, molecularity: 2, standardConcentrationMolPerL: c0),
            result.RateConstantsAtStart[0].Forward, 1e-12, "k_f", "Eyring with (c°)^{1−m}");
        var y = result.Final.MolPerL;
        Close.Relative(Math.Exp(3 / RtKcal(Room)) / c0, y[2] / (y[0] * y[1]), 1e-6, "[C]/([A][B]) at equilibrium", "K_c = K°(c°)^{Δn}, IUPAC Green Book §2.11");
    }

    // A linear network obeying detailed balance, rate constants from 10⁻⁸ to 10¹² s⁻¹ (20.5 decades), against an independent exact
    // solution: the matrix exponential in 60-digit arithmetic (mpmath; values and set-up in KineticsReference).
    [Fact]
    public void LinearNetworkOverTwentyDecades_MatchesTheExactMatrixExponential()
    {
        var levels = new[]
        {
            Level("A", 0), Level("B", 2), Level("C", -1), Level("D", 4), Level("E", -3),
            Level("TAB", 3.0), Level("TBC", 10), Level("TCD", 28), Level("TDE", 20), Level("TAE", 15), Level("TBD", 6),
        };
        var network = new ReactionNetwork(["A", "B", "C", "D", "E"],
        [
            Eyring("AB", "A", "B", "A", "TAB", "B"), Eyring("BC", "B", "C", "B", "TBC", "C"), Eyring("CD", "C", "D", "C", "TCD", "D"),
            Eyring("DE", "D", "E", "D", "TDE", "E"), Eyring("AE", "A", "E", "A", "TAE", "E"), Eyring("BD", "B", "D", "B", "TBD", "D"),
        ], levels);
        var times = KineticsReference.LinearNetworkTimes;
        var result = Microkinetics.Simulate(network, At(Room, times[^1], times, ("A", 1.0)), options: Tight);
        var ks = result.RateConstantsAtStart.SelectMany(r => new[] { r.Forward, r.Reverse }).ToArray();
        Close.Absolute(20.524, Math.Log10(ks.Max() / ks.Min()), 1e-3, "decades spanned by the rate constants", "mpmath computation of the same constants");
        for (var k = 0; k < times.Length; k++)
        {
            var point = result.Reports[k];
            Assert.Equal(times[k], point.TimeSeconds);
            for (var i = 0; i < 5; i++)
            {
                var expected = KineticsReference.LinearNetworkConcentrations[k][i];
                if (expected > 1e-9)
                    Close.Relative(expected, point.MolPerL[i], 1e-6, $"[{network.Species[i]}]({times[k]:G3} s)", "60-digit matrix exponential (mpmath), KineticsReference");
            }
        }
    }

    // A → B on a ramp of 2 K/min from 298.15 K, held at 373.15 K, with ΔH‡ = 24 and ΔG‡(298.15 K) = 26 kcal/mol (B 40 kcal/mol lower, so the reverse step is negligible): ln([A]/[A]₀) = −∫k(T(t)) dt,
    // the integral computed independently by MathNet's adaptive Gauss–Kronrod quadrature.
    [Fact]
    public void TemperatureRamp_MatchesQuadratureOfTheRateConstant()
    {
        var network = new ReactionNetwork(["A", "B"], [Eyring("A→B", "A", "B", "A", "TS", "B")], [Level("A", 0, 0), Level("TS", 26, 24), Level("B", -40, -42)]);
        var program = new TemperatureProgram(298.15, 2.0 / 60.0, 373.15);
        double[] times = [600, 1800, 2250, 3000, 4000];
        var conditions = new SimulationConditions(new Dictionary<string, double> { ["A"] = 1.0 }, program, 4000, times);
        var result = Microkinetics.Simulate(network, conditions, options: Tight);
        double K(double t)
        {
            var temperature = program.At(t);
            var dg = 24 - temperature * (24 - 26) / Room;
            return global::BarrierLedger.Core.Kinetics.Eyring.RateConstant(Energy.FromKcalPerMol(dg), temperature);
        }
        var hold = program.HoldTimeSeconds!.Value;
        Close.Relative(2250, hold, 1e-12, "time the ramp reaches 373.15 K", "75 K at 2 K/min");
        foreach (var p in result.Reports)
        {
            var integral = p.TimeSeconds <= hold
                ? Integrate.GaussKronrod(K, 0, p.TimeSeconds, 1e-13, 20, 15)
                : Integrate.GaussKronrod(K, 0, hold, 1e-13, 20, 15) + K(hold) * (p.TimeSeconds - hold);
            Close.Relative(Math.Exp(-integral), p.MolPerL[0], 1e-6, $"[A]({p.TimeSeconds} s)", "exp(−∫k dt), Gauss–Kronrod quadrature (MathNet)");
        }
        Assert.Contains(result.Notes, n => n.Contains("heat capacities neglected"));
    }

    [Fact]
    public void Jacobian_EqualsFiniteDifferencesOfTheRates()
    {
        var network = new ReactionNetwork(["A", "B", "C", "D"],
        [
            Fixed("1", "2 A", "B", 3.0, 0.7), Fixed("2", "A + B + C", "D", 5.0, 0.2), Fixed("3", "D", "2 C", 0.9, 1.3), Fixed("4", "3 C", "A + D", 0.4, 0.1),
        ]);
        var system = new MassActionSystem(new CompiledNetwork(network), TemperatureProgram.Isothermal(Room));
        double[] y = [0.3, 0.7, 1.1, 0.4];
        var jac = new double[16];
        system.Jacobian(0, y, jac);
        var plus = new double[4];
        var minus = new double[4];
        for (var j = 0; j < 4; j++)
        {
            var h = 1e-6;
            var yp = (double[])y.Clone(); yp[j] += h;
            var ym = (double[])y.Clone(); ym[j] -= h;
            system.Derivative(0, yp, plus);
            system.Derivative(0, ym, minus);
            for (var i = 0; i < 4; i++)
                Close.Absolute((plus[i] - minus[i]) / (2 * h), jac[i + 4 * j], 1e-7, $"∂f{i}/∂y{j}", "central differences (independent computation)");
        }
    }

    // First order: t(X) = −ln(1 − X)/k, so t½ = ln 2/k and t(95 %) = ln 20/k (integrated first-order law).
    [Fact]
    public void Answers_ConversionTimesOfAFirstOrderStep()
    {
        var network = new ReactionNetwork(["S", "P"], [Eyring("S→P", "S", "P", "S", "TS", "P")], [Level("S", 0), Level("TS", 25), Level("P", -20)]);
        var conditions = At(353.15, 86400, [3600], ("S", 0.1));
        var result = Microkinetics.Simulate(network, conditions, new KineticsQuestion("S", ["P"]), Tight);
        var k = result.RateConstantsAtStart[0].Forward;
        var answers = result.Answers!;
        Close.Relative(Math.Log(2) / k, answers.ConversionTimes[0].TimeSeconds!.Value, 1e-6, "t(50 %)", "ln 2/k");
        Close.Relative(Math.Log(20) / k, answers.ConversionTimes[1].TimeSeconds!.Value, 1e-6, "t(95 %)", "ln 20/k");
        Close.Relative(1 - Math.Exp(-k * 3600), answers.AtReportTimes[0].Conversion, 1e-6, "conversion at 1 h", "1 − e^{−kt}");
        Close.Relative(1 - Math.Exp(-k * 3600), answers.AtReportTimes[0].Yields[0], 1e-6, "yield of P at 1 h", "stoichiometry");
        var t95 = Microkinetics.Format.Duration(Math.Log(20) / k);
        Assert.StartsWith($"95 % conversion of S after {t95} at 353 K", answers.Sentence);
    }

    [Fact]
    public void Answers_ConversionNotReached_IsSaidPlainly()
    {
        var network = new ReactionNetwork(["S", "P"], [Eyring("S→P", "S", "P", "S", "TS", "P")], [Level("S", 0), Level("TS", 30), Level("P", -20)]);
        var result = Microkinetics.Simulate(network, At(Room, 3600, null, ("S", 0.1)), new KineticsQuestion("S", ["P"]));
        Assert.All(result.Answers!.ConversionTimes, t => Assert.Null(t.TimeSeconds));
        Assert.StartsWith("Only ", result.Answers.Sentence);
        Assert.Contains("is not reached", result.Answers.Sentence);
    }

    [Theory]
    [InlineData(8.5e-4, "850 µs")]
    [InlineData(12.0, "12 s")]
    [InlineData(2460.0, "41 min")]
    [InlineData(11520.0, "3.2 h")]
    [InlineData(1036800.0, "12 d")]
    public void Duration_IsWrittenInTheUnitAChemistWouldUse(double seconds, string expected) =>
        Assert.Equal(expected, Microkinetics.Format.Duration(seconds));

    // A saddle point below its minimum is not a barrier: the step becomes barrierless (k = k_BT/h), never faster, and the note says so.
    [Fact]
    public void SaddleBelowItsMinimum_IsRaisedToBarrierlessAndNoted()
    {
        var network = new ReactionNetwork(["A", "B"], [Eyring("A→B", "A", "B", "A", "TS", "B")], [Level("A", 0), Level("TS", -0.5), Level("B", -5)]);
        var result = Microkinetics.Simulate(network, At(Room, 1, null, ("A", 1.0)));
        Close.Relative(global::BarrierLedger.Core.Kinetics.Eyring.FrequencyFactorPerSecond(Room), result.RateConstantsAtStart[0].Forward, 1e-12, "k_f", "k_BT/h");
        Assert.True(result.RateConstantsAtStart[0].BarrierRaised);
        Assert.Contains(result.Notes, n => n.Contains("barrierless"));
    }

    [Fact]
    public void BadInput_IsRejectedWithWhatAndWhere()
    {
        var network = new ReactionNetwork(["A", "B"], [Fixed("1", "A", "B", 1.0)]);
        Assert.Contains("'X'", Assert.Throws<ArgumentException>(() => Microkinetics.Simulate(network, At(Room, 1, null, ("X", 1.0)))).Message);
        Assert.Contains("'A'", Assert.Throws<ArgumentException>(() => Microkinetics.Simulate(network, At(Room, 1, null, ("A", -1.0)))).Message);
        Assert.Contains("outside the run", Assert.Throws<ArgumentException>(() => Microkinetics.Simulate(network, At(Room, 1, [2.0], ("A", 1.0)))).Message);
        var unknown = new ReactionNetwork(["A"], [Fixed("1", "A", "Z", 1.0)]);
        Assert.Contains("'Z'", Assert.Throws<ArgumentException>(() => Microkinetics.Simulate(unknown, At(Room, 1, null, ("A", 1.0)))).Message);
        var noLevel = new ReactionNetwork(["A", "B"], [Eyring("s", "A", "B", "A", "TS", "B")]);
        Assert.Contains("energy level 'A'", Assert.Throws<ArgumentException>(() => Microkinetics.Simulate(noLevel, At(Room, 1, null, ("A", 1.0)))).Message);
        var four = new ReactionNetwork(["A", "B"], [Fixed("1", "4 A", "B", 1.0)]);
        Assert.Contains("molecularity 4", Assert.Throws<ArgumentException>(() => Microkinetics.Simulate(four, At(Room, 1, null, ("A", 1.0)))).Message);
    }
}
