using BarrierLedger.Core.Kinetics;
using BarrierLedger.Core.Tests.ReferenceData;
using BarrierLedger.Core.Tests.Support;
using MathNet.Numerics.LinearAlgebra;

namespace BarrierLedger.Core.Tests.Kinetics;

public class Rodas4Tests
{
    // Order conditions of a Rosenbrock method with γᵢᵢ = γ (E. Hairer and G. Wanner, Solving ODEs II, 2nd ed. 1996, Table IV.7.1;
    // the conditions as recalled, from memory — the convergence test below checks the order independently). The transformed
    // coefficients are turned back into the standard form: Γ⁻¹ = I/γ − C, α = AΓ, b = mΓ, β = α + Γ − γI.
    [Fact]
    public void Tableau_SatisfiesTheOrderConditionsToRounding()
    {
        var (a, c, gamma, alphaSum, d, m, mHat) = Rodas4.Tableau();
        var A = Matrix<double>.Build.DenseOfArray(a);
        var C = Matrix<double>.Build.DenseOfArray(c);
        var I = Matrix<double>.Build.DenseIdentity(6);
        var G = (I / gamma - C).Inverse();
        var alpha = A * G;
        var beta = alpha + G - gamma * I;
        var b = Vector<double>.Build.DenseOfArray(m) * G;
        var bHat = Vector<double>.Build.DenseOfArray(mHat) * G;
        var al = alpha.RowSums();
        var bp = beta.RowSums();
        for (var i = 0; i < 6; i++)
        {
            Close.Absolute(alphaSum[i], al[i], 1e-13, $"αᵢ = Σⱼ αᵢⱼ (stage {i + 1})", "consistency of the stage times");
            Close.Absolute(d[i], G.Row(i).Sum(), 1e-13, $"dᵢ = Σⱼ γᵢⱼ (stage {i + 1})", "consistency of the time coefficients");
        }
        double[] Conditions(Vector<double> w) =>
        [
            w.Sum() - 1,
            w * bp - (0.5 - gamma),
            w * al.PointwisePower(2) - 1.0 / 3,
            w * (beta * bp) - (1.0 / 6 - gamma + gamma * gamma),
            w * al.PointwisePower(3) - 0.25,
            w * al.PointwiseMultiply(alpha * bp) - (1.0 / 8 - gamma / 3),
            w * (beta * al.PointwisePower(2)) - (1.0 / 12 - gamma / 3),
            w * (beta * (beta * bp)) - (1.0 / 24 - gamma / 2 + 1.5 * gamma * gamma - gamma * gamma * gamma),
        ];
        var main = Conditions(b);
        for (var k = 0; k < main.Length; k++) Close.Absolute(0, main[k], 1e-12, $"order condition {k + 1} (order 4 method)", "Hairer & Wanner II, Table IV.7.1");
        var embedded = Conditions(bHat);
        for (var k = 0; k < 4; k++) Close.Absolute(0, embedded[k], 1e-12, $"order condition {k + 1} (embedded order 3)", "Hairer & Wanner II, Table IV.7.1");
        Assert.True(embedded.Skip(4).Any(x => Math.Abs(x) > 1e-3), "the embedded method must not be of order 4, or its error estimate is void");
    }

    // y′ = −2 t y², y(0) = 1 has y = 1/(1 + t²): non-autonomous and nonlinear, so the ∂f/∂t terms count. Halving a fixed step must
    // cut the error at t = 2 by 2⁴ for a method of order 4 (definition of the order of a one-step method, Hairer, Nørsett and Wanner I, §II.3).
    [Fact]
    public void FixedSteps_ConvergeWithOrderFour()
    {
        var system = new Scalar((t, y) => -2 * t * y * y, (t, y) => -4 * t * y, (t, y) => -2 * y * y);
        double Error(int steps)
        {
            var integrator = new Rodas4(system);
            var y = new[] { 1.0 };
            var next = new double[1];
            var h = 2.0 / steps;
            for (var i = 0; i < steps; i++) { integrator.TryStep(i * h, y, h, next, out _); y[0] = next[0]; }
            return Math.Abs(y[0] - 1.0 / 5.0);
        }
        var e1 = Error(40);
        var e2 = Error(80);
        var e3 = Error(160);
        Close.Absolute(4.0, Math.Log2(e1 / e2), 0.3, "observed order (h → h/2)", "RODAS is of order 4 (Hairer & Wanner II, §IV.7)");
        Close.Absolute(4.0, Math.Log2(e2 / e3), 0.3, "observed order (h/2 → h/4)", "RODAS is of order 4 (Hairer & Wanner II, §IV.7)");
    }

    // Prothero–Robinson test y′ = λ (y − cos t) − sin t, y(0) = 1, exact y = cos t (A. Prothero and A. Robinson, Math. Comp. 28
    // (1974) 145). With λ = −10⁸ an explicit method needs steps below 10⁻⁸; a stiffly accurate, L-stable method follows the smooth
    // solution with steps set by accuracy alone.
    [Fact]
    public void ProtheroRobinson_VeryStiff_FollowsTheSmoothSolutionWithFewSteps()
    {
        const double lambda = -1e8;
        var system = new Scalar((t, y) => lambda * (y - Math.Cos(t)) - Math.Sin(t), (t, y) => lambda, (t, y) => lambda * Math.Sin(t) - Math.Cos(t));
        var integrator = new Rodas4(system, new StiffOptions(1e-8, 1e-10));
        double last = double.NaN;
        var outcome = integrator.Integrate(0, [1.0], 10.0, onAccepted: (_, _, _, y) => last = y[0]);
        Assert.True(outcome.Completed, outcome.FailureReason);
        Close.Absolute(Math.Cos(10.0), last, 1e-7, "y(10)", "exact solution cos t (Prothero & Robinson 1974)");
        Assert.InRange(outcome.Statistics.AcceptedSteps, 1, 500);
    }

    // Robertson's chemical kinetics problem (H. H. Robertson 1966; Hairer & Wanner II, §IV.1): A → B (0.04), 2B → B + C (3×10⁷),
    // B + C → A + C (10⁴), from (1, 0, 0) to t = 10¹¹, rate constants eleven decades apart. Reference values: the Test Set for IVP
    // Solvers (F. Mazzia and C. Magherini, University of Bari, release 2.4, 2008), problem ROBER at t = 10¹¹, and the value at
    // t = 40 as usually tabulated — both from memory, and both agreed to 1e-9 relative by an independent computation with SciPy 1.10
    // (Radau, BDF and LSODA at rtol 1e-12).
    [Fact]
    public void Robertson_MatchesPublishedReferenceValues()
    {
        var network = new ReactionNetwork(["A", "B", "C"],
        [
            new ElementaryStep("r1", [new("A")], [new("B")], new FixedRates(0.04)),
            new ElementaryStep("r2", [new("B", 2)], [new("B"), new("C")], new FixedRates(3e7)),
            new ElementaryStep("r3", [new("B"), new("C")], [new("A"), new("C")], new FixedRates(1e4)),
        ]);
        var conditions = new SimulationConditions(new Dictionary<string, double> { ["A"] = 1.0 }, TemperatureProgram.Isothermal(298.15), 1e11, [40.0, 1e11]);
        var result = Microkinetics.Simulate(network, conditions, options: new SimulationOptions(1e-10, 1e-22));
        Assert.True(result.Outcome.Completed, result.Outcome.FailureReason);
        var at40 = result.Reports[0].MolPerL;
        var atEnd = result.Reports[1].MolPerL;
        foreach (var (i, expected) in KineticsReference.RobertsonAt40.Select((v, i) => (i, v)))
            Close.Relative(expected, at40[i], 1e-6, $"Robertson y{i + 1}(40)", "commonly tabulated (from memory), SciPy Radau/BDF/LSODA");
        foreach (var (i, expected) in KineticsReference.RobertsonAt1e11.Select((v, i) => (i, v)))
            Close.Relative(expected, atEnd[i], 1e-6, $"Robertson y{i + 1}(1e11)", "IVP Test Set, ROBER (from memory), SciPy Radau/BDF/LSODA");
        Close.Relative(1.0, atEnd.Sum(), 1e-12, "y1 + y2 + y3 (mass balance)", "conservation of the network");
    }

    // y′ = −1 from y = 10⁻³ over h = 1: every consistent method is exact for a linear solution, so the embedded error estimate is
    // zero and the step to y = −0.999 would be accepted. With NonNegative the negative component counts as an error of its size
    // (L. F. Shampine, S. Thompson, J. A. Kierzenka and G. D. Byrne, Appl. Math. Comput. 170 (2005) 556, from memory) and the
    // step is refused; a step that stays above zero is unaffected.
    [Fact]
    public void NonNegative_StepBelowZero_CountsAsError()
    {
        var system = new Scalar((t, y) => -1.0, (t, y) => 0.0, (t, y) => 0.0);
        double[] y = [1e-3];
        var yNew = new double[1];
        new Rodas4(system, new StiffOptions(1e-6, 1e-12)).TryStep(0, y, 1.0, yNew, out var plain);
        Close.Absolute(-0.999, yNew[0], 1e-15, "y(1)", "exact solution y = 10⁻³ − t");
        Assert.True(plain < 1e-6, $"error estimate {plain}");
        var guarded = new Rodas4(system, new StiffOptions(1e-6, 1e-12, NonNegative: true));
        guarded.TryStep(0, y, 1.0, yNew, out var refused);
        Assert.True(refused > 1.0, $"error estimate {refused}");
        guarded.TryStep(0, y, 5e-4, yNew, out var accepted);
        Close.Absolute(5e-4, yNew[0], 1e-15, "y(5e-4)", "exact solution y = 10⁻³ − t");
        Assert.True(accepted < 1e-6, $"error estimate {accepted}");
    }

    private sealed class Scalar(Func<double, double, double> f, Func<double, double, double> dfdy, Func<double, double, double> dfdt) : IStiffSystem
    {
        public int Dimension => 1;
        public void Derivative(double t, ReadOnlySpan<double> y, Span<double> dydt) => dydt[0] = f(t, y[0]);
        public void Jacobian(double t, ReadOnlySpan<double> y, double[] jacobian) => jacobian[0] = dfdy(t, y[0]);
        public bool TimeDerivative(double t, ReadOnlySpan<double> y, Span<double> d) { d[0] = dfdt(t, y[0]); return true; }
    }
}
