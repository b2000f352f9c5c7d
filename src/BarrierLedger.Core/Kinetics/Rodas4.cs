using MathNet.Numerics.Providers.LinearAlgebra;

namespace BarrierLedger.Core.Kinetics;

/// <summary>
/// An initial-value problem y′ = f(t, y) for <see cref="Rodas4"/>: the right-hand side, its Jacobian ∂f/∂y and, for a
/// non-autonomous system, ∂f/∂t.
/// </summary>
public interface IStiffSystem
{
    /// <summary>Number of unknowns n.</summary>
    int Dimension { get; }

    /// <summary>Writes f(t, y) into <paramref name="dydt"/> (length n).</summary>
    void Derivative(double t, ReadOnlySpan<double> y, Span<double> dydt);

    /// <summary>Writes ∂f/∂y at (t, y) into <paramref name="jacobian"/>, column-major (element (i, j) at i + j·n), overwriting it.</summary>
    void Jacobian(double t, ReadOnlySpan<double> y, double[] jacobian);

    /// <summary>Writes ∂f/∂t into <paramref name="dfdt"/> and returns true, or returns false when f does not depend on t explicitly.</summary>
    bool TimeDerivative(double t, ReadOnlySpan<double> y, Span<double> dfdt);
}

/// <summary>
/// A system whose Jacobian keeps one sparsity pattern: <see cref="Rodas4"/> then factors (1/(hγ) I − J) by sparse elimination
/// in the pattern's precomputed order (<see cref="SparsePattern"/>), and by dense LU with partial pivoting only when that
/// elimination fails its pivot test.
/// </summary>
public interface ISparseStiffSystem : IStiffSystem
{
    /// <summary>The entries of ∂f/∂y that can be nonzero, with their elimination order (computed once per system shape).</summary>
    SparsePattern JacobianPattern { get; }

    /// <summary>Writes ∂f/∂y at (t, y) for the entries of <see cref="JacobianPattern"/>, in the order of its <see cref="SparsePattern.Entries"/>.</summary>
    void JacobianValues(double t, ReadOnlySpan<double> y, Span<double> values);
}

/// <summary>
/// Error control of <see cref="Rodas4"/>. A step is accepted when the root-mean-square of eᵢ / (atol + rtol · max(|yᵢ|, |ŷᵢ|))
/// is at most 1 (Hairer and Wanner II, §IV.8).
/// </summary>
/// <param name="RelativeTolerance">rtol, e.g. 1e-6.</param>
/// <param name="AbsoluteTolerance">atol in the units of y (mol/L for concentrations).</param>
/// <param name="InitialStep">First step size; null to choose it (Hairer, Nørsett and Wanner I, §II.4).</param>
/// <param name="MaxStep">Largest step; null for no limit.</param>
/// <param name="MaxSteps">Largest number of attempted steps before giving up.</param>
/// <param name="NonNegative">
/// The solution cannot be negative (concentrations): a component that comes out below zero counts as an error of at least its
/// size, so a step that drives a concentration negative beyond the absolute tolerance is rejected and retried shorter
/// (the error-estimate part of L. F. Shampine, S. Thompson, J. A. Kierzenka and G. D. Byrne, Appl. Math. Comput. 170 (2005) 556,
/// "Non-negative solutions of ODEs", from memory). Without it, a bimolecular step between two spuriously negative
/// concentrations can feed itself and blow up.
/// </param>
public sealed record StiffOptions(
    double RelativeTolerance = 1e-6, double AbsoluteTolerance = 1e-12, double? InitialStep = null, double? MaxStep = null, int MaxSteps = 200_000,
    bool NonNegative = false)
{
    /// <summary>Throws <see cref="ArgumentException"/> for tolerances that are not positive and finite.</summary>
    public void Validate()
    {
        if (!(RelativeTolerance > 0) || !double.IsFinite(RelativeTolerance) || RelativeTolerance >= 1)
            throw new ArgumentException($"Relative tolerance must be in (0, 1), got {RelativeTolerance}.", nameof(RelativeTolerance));
        if (!(AbsoluteTolerance > 0) || !double.IsFinite(AbsoluteTolerance))
            throw new ArgumentException($"Absolute tolerance must be positive and finite, got {AbsoluteTolerance}.", nameof(AbsoluteTolerance));
        if (InitialStep is { } h0 && (!(h0 > 0) || !double.IsFinite(h0)))
            throw new ArgumentException($"Initial step must be positive and finite, got {h0}.", nameof(InitialStep));
        if (MaxStep is { } hm && (!(hm > 0) || !double.IsFinite(hm)))
            throw new ArgumentException($"Largest step must be positive and finite, got {hm}.", nameof(MaxStep));
        if (MaxSteps < 1) throw new ArgumentException($"Step limit must be at least 1, got {MaxSteps}.", nameof(MaxSteps));
    }
}

/// <summary>
/// Work done by an integration: accepted and rejected steps, f and Jacobian evaluations, LU decompositions, and how many of those
/// were dense with partial pivoting because the sparse elimination of an <see cref="ISparseStiffSystem"/> failed its pivot test
/// (every decomposition is dense for a system without a pattern).
/// </summary>
public sealed record StiffStatistics(int AcceptedSteps, int RejectedSteps, int FunctionEvaluations, int JacobianEvaluations, int Decompositions, int DenseDecompositions = 0);

/// <summary>How an integration ended: reached the end, or stopped at <see cref="TimeReached"/> for <see cref="FailureReason"/>.</summary>
public sealed record StiffOutcome(bool Completed, double TimeReached, string? FailureReason, StiffStatistics Statistics);

/// <summary>Called after every accepted step with the step's start and end.</summary>
public delegate void AcceptedStepHandler(double tStart, double[] yStart, double tEnd, double[] yEnd);

/// <summary>
/// The stiffly accurate, L-stable Rosenbrock method RODAS of order 4 with an embedded method of order 3, in the transformed form
/// that needs one LU decomposition of (1/(hγ) I − J) per step and no Jacobian–vector products (E. Hairer and G. Wanner,
/// Solving Ordinary Differential Equations II, 2nd ed., Springer 1996, §IV.7: the method's coefficients are those of their code
/// RODAS, and satisfy the order conditions of their Table IV.7.1 to rounding, which the tests check):
/// (1/(hγ) I − J) uᵢ = f(t + αᵢh, y + Σⱼ aᵢⱼuⱼ) + Σⱼ (cᵢⱼ/h) uⱼ + h dᵢ ∂f/∂t, i = 1…6; y₁ = y + Σⱼ a₅ⱼuⱼ + u₅ + u₆ and the error
/// estimate is u₆ (the embedded solution is y₁ − u₆). Step sizes follow h_new = h · min(6, max(0.2, 0.9 · err^{−1/4})) with
/// Gustafsson's predictive controller after accepted steps (K. Gustafsson, ACM Trans. Math. Softw. 17 (1991) 533, as in RODAS).
/// f, ∂f/∂y and ∂f/∂t are evaluated once per point (t, y): a rejected step, or a shorter trial step from the same point, re-uses
/// them and only factors the matrix again for the new h (the method needs the exact Jacobian at the step's start, not a new one
/// per attempt). For an <see cref="ISparseStiffSystem"/> the matrix is factored by <see cref="SparsePattern"/>'s sparse
/// elimination; otherwise, and whenever that elimination fails its pivot test, by MathNet's dense LU with partial pivoting.
/// </summary>
public sealed class Rodas4
{
    // Coefficients of RODAS (Hairer & Wanner II, §IV.7), transformed form.
    private const double Gamma = 0.25;
    private const double C2 = 0.386, C3 = 0.21, C4 = 0.63;
    private const double D1 = 0.25, D2 = -0.1043, D3 = 0.1035, D4 = -0.3620000000000023e-01;
    private const double A21 = 1.544;
    private const double A31 = 0.9466785280815826, A32 = 0.2557011698983284;
    private const double A41 = 3.314825187068521, A42 = 2.896124015972201, A43 = 0.9986419139977817;
    private const double A51 = 1.221224509226641, A52 = 6.019134481288629, A53 = 12.53708332932087, A54 = -0.6878860361058950;
    private const double Cc21 = -5.6688;
    private const double Cc31 = -2.430093356833875, Cc32 = -0.2063599157091915;
    private const double Cc41 = -0.1073529058151375, Cc42 = -9.594562251023355, Cc43 = -20.47028614809616;
    private const double Cc51 = 7.496443313967647, Cc52 = -10.24680431464352, Cc53 = -33.99990352819905, Cc54 = 11.70890893206160;
    private const double Cc61 = 8.083246795921522, Cc62 = -7.981132988064893, Cc63 = -31.52159432874371, Cc64 = 16.31930543123136, Cc65 = -6.058818238834054;

    /// <summary>
    /// The transformed coefficients as arrays (a, c strictly lower triangular 6×6, γ, stage times αᵢ, time coefficients dᵢ and the
    /// weights m of y₁ = y + Σ mⱼuⱼ and m̂ of the embedded solution), for the tests that check the order conditions.
    /// </summary>
    internal static (double[,] A, double[,] C, double Gamma, double[] Alpha, double[] D, double[] M, double[] MEmbedded) Tableau()
    {
        var a = new double[6, 6];
        var c = new double[6, 6];
        a[1, 0] = A21;
        a[2, 0] = A31; a[2, 1] = A32;
        a[3, 0] = A41; a[3, 1] = A42; a[3, 2] = A43;
        a[4, 0] = A51; a[4, 1] = A52; a[4, 2] = A53; a[4, 3] = A54;
        a[5, 0] = A51; a[5, 1] = A52; a[5, 2] = A53; a[5, 3] = A54; a[5, 4] = 1.0;
        c[1, 0] = Cc21;
        c[2, 0] = Cc31; c[2, 1] = Cc32;
        c[3, 0] = Cc41; c[3, 1] = Cc42; c[3, 2] = Cc43;
        c[4, 0] = Cc51; c[4, 1] = Cc52; c[4, 2] = Cc53; c[4, 3] = Cc54;
        c[5, 0] = Cc61; c[5, 1] = Cc62; c[5, 2] = Cc63; c[5, 3] = Cc64; c[5, 4] = Cc65;
        return (a, c, Gamma, [0, C2, C3, C4, 1, 1], [D1, D2, D3, D4, 0, 0], [A51, A52, A53, A54, 1, 1], [A51, A52, A53, A54, 1, 0]);
    }

    /// <summary>Order of the method (the embedded one is 3).</summary>
    public const int Order = 4;

    private readonly IStiffSystem _system;
    private readonly StiffOptions _options;
    private readonly int _n;
    private readonly double[] _f0, _ft, _f, _yStage, _k1, _k2, _k3, _k4, _k5, _k6;
    private double[]? _jacobian, _matrix;
    private int[]? _pivots;
    private readonly ISparseStiffSystem? _sparseSystem;
    private readonly SparseLU? _sparse;
    private readonly double[] _jacobianValues = [];
    private bool _useSparse;
    private readonly ILinearAlgebraProvider _provider = LinearAlgebraControl.Provider;
    private int _accepted, _rejected, _evaluations, _jacobians, _decompositions, _denseDecompositions;
    // The point (t, y) whose f, ∂f/∂y and ∂f/∂t are held in _f0, the Jacobian and _ft.
    private readonly double[] _pointY;
    private double _pointT = double.NaN;
    private bool _pointNonAutonomous;

    public Rodas4(IStiffSystem system, StiffOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(system);
        _system = system;
        _options = options ?? new StiffOptions();
        _options.Validate();
        _n = system.Dimension;
        if (_n < 1) throw new ArgumentException($"The system must have at least one unknown, got {_n}.", nameof(system));
        if (system is ISparseStiffSystem sparse)
        {
            if (sparse.JacobianPattern.Dimension != _n)
                throw new ArgumentException($"The Jacobian pattern is {sparse.JacobianPattern.Dimension}×{sparse.JacobianPattern.Dimension} for a system of {_n}.", nameof(system));
            _sparseSystem = sparse;
            _sparse = new SparseLU(sparse.JacobianPattern);
            _jacobianValues = new double[sparse.JacobianPattern.Entries.Count];
        }
        _pointY = new double[_n];
        _f0 = new double[_n]; _ft = new double[_n]; _f = new double[_n]; _yStage = new double[_n];
        _k1 = new double[_n]; _k2 = new double[_n]; _k3 = new double[_n]; _k4 = new double[_n]; _k5 = new double[_n]; _k6 = new double[_n];
    }

    /// <summary>Work done so far by this integrator.</summary>
    public StiffStatistics Statistics => new(_accepted, _rejected, _evaluations, _jacobians, _decompositions, _denseDecompositions);

    /// <summary>
    /// One step of size <paramref name="h"/> from (t, y) into <paramref name="yNew"/>, with the scaled error norm of the step.
    /// Returns false (error = +∞) when the step produced a value that is not finite.
    /// </summary>
    public bool TryStep(double t, ReadOnlySpan<double> y, double h, Span<double> yNew, out double errorNorm)
    {
        var n = _n;
        var nonAutonomous = EvaluateAt(t, y);
        Decompose(1.0 / (h * Gamma));

        // Stage 1
        for (var i = 0; i < n; i++) _k1[i] = _f0[i] + (nonAutonomous ? h * D1 * _ft[i] : 0.0);
        Solve(_k1);
        // Stage 2
        for (var i = 0; i < n; i++) _yStage[i] = y[i] + A21 * _k1[i];
        Evaluate(t + C2 * h);
        var hc21 = Cc21 / h;
        for (var i = 0; i < n; i++) _k2[i] = _f[i] + hc21 * _k1[i] + (nonAutonomous ? h * D2 * _ft[i] : 0.0);
        Solve(_k2);
        // Stage 3
        for (var i = 0; i < n; i++) _yStage[i] = y[i] + A31 * _k1[i] + A32 * _k2[i];
        Evaluate(t + C3 * h);
        double hc31 = Cc31 / h, hc32 = Cc32 / h;
        for (var i = 0; i < n; i++) _k3[i] = _f[i] + hc31 * _k1[i] + hc32 * _k2[i] + (nonAutonomous ? h * D3 * _ft[i] : 0.0);
        Solve(_k3);
        // Stage 4
        for (var i = 0; i < n; i++) _yStage[i] = y[i] + A41 * _k1[i] + A42 * _k2[i] + A43 * _k3[i];
        Evaluate(t + C4 * h);
        double hc41 = Cc41 / h, hc42 = Cc42 / h, hc43 = Cc43 / h;
        for (var i = 0; i < n; i++) _k4[i] = _f[i] + hc41 * _k1[i] + hc42 * _k2[i] + hc43 * _k3[i] + (nonAutonomous ? h * D4 * _ft[i] : 0.0);
        Solve(_k4);
        // Stage 5 (at t + h)
        for (var i = 0; i < n; i++) _yStage[i] = y[i] + A51 * _k1[i] + A52 * _k2[i] + A53 * _k3[i] + A54 * _k4[i];
        Evaluate(t + h);
        double hc51 = Cc51 / h, hc52 = Cc52 / h, hc53 = Cc53 / h, hc54 = Cc54 / h;
        for (var i = 0; i < n; i++) _k5[i] = _f[i] + hc51 * _k1[i] + hc52 * _k2[i] + hc53 * _k3[i] + hc54 * _k4[i];
        Solve(_k5);
        // Stage 6: the embedded solution, then the last correction
        for (var i = 0; i < n; i++) _yStage[i] += _k5[i];
        Evaluate(t + h);
        double hc61 = Cc61 / h, hc62 = Cc62 / h, hc63 = Cc63 / h, hc64 = Cc64 / h, hc65 = Cc65 / h;
        for (var i = 0; i < n; i++) _k6[i] = _f[i] + hc61 * _k1[i] + hc62 * _k2[i] + hc63 * _k3[i] + hc64 * _k4[i] + hc65 * _k5[i];
        Solve(_k6);

        var atol = _options.AbsoluteTolerance;
        var rtol = _options.RelativeTolerance;
        var nonNegative = _options.NonNegative;
        var sum = 0.0;
        for (var i = 0; i < n; i++)
        {
            var value = _yStage[i] + _k6[i];
            yNew[i] = value;
            var scale = atol + rtol * Math.Max(Math.Abs(y[i]), Math.Abs(value));
            var e = (nonNegative && value < 0 ? Math.Max(Math.Abs(_k6[i]), -value) : _k6[i]) / scale;
            sum += e * e;
        }
        errorNorm = Math.Sqrt(sum / n);
        if (!double.IsFinite(errorNorm))
        {
            errorNorm = double.PositiveInfinity;
            return false;
        }
        return true;
    }

    /// <summary>
    /// Integrates from (t0, y0) to <paramref name="tEnd"/>, landing exactly on every time in <paramref name="stops"/> (report times,
    /// points where the temperature program changes slope), and calls <paramref name="onAccepted"/> after each accepted step.
    /// Stops early, with the reason, when the step limit is reached, the step size underflows or <paramref name="cancel"/> fires.
    /// </summary>
    public StiffOutcome Integrate(
        double t0, ReadOnlySpan<double> y0, double tEnd, IReadOnlyList<double>? stops = null, AcceptedStepHandler? onAccepted = null,
        CancellationToken cancel = default)
    {
        if (y0.Length != _n) throw new ArgumentException($"Initial values have {y0.Length} entries for a system of {_n}.", nameof(y0));
        if (!double.IsFinite(t0) || !double.IsFinite(tEnd) || !(tEnd > t0))
            throw new ArgumentException($"The end time must be finite and after the start, got {t0} to {tEnd}.", nameof(tEnd));
        for (var i = 0; i < _n; i++)
            if (!double.IsFinite(y0[i])) throw new ArgumentException($"Initial value {i + 1} is not finite.", nameof(y0));

        var marks = (stops ?? []).Where(s => s > t0 && s < tEnd).Append(tEnd).Distinct().Order().ToArray();
        var next = 0;
        var y = y0.ToArray();
        var yNew = new double[_n];
        var t = t0;
        var hMax = _options.MaxStep ?? (tEnd - t0);
        var h = Math.Min(_options.InitialStep ?? StartingStep(t0, y), hMax);
        var first = true;
        var rejectedLast = false;
        double hAccepted = 0, errorAccepted = 0;
        var attempts = 0;

        while (true)
        {
            if (cancel.IsCancellationRequested) return Outcome(false, t, "cancelled");
            if (++attempts > _options.MaxSteps)
                return Outcome(false, t, $"more than {_options.MaxSteps} steps were needed; the network may be too stiff for these tolerances, or the time span too long");
            var target = marks[next];
            var proposed = h;
            var landing = false;
            if (t + 1.01 * h >= target) { h = target - t; landing = true; }
            if (h <= Math.Max(1e-300, 1e-14 * Math.Abs(t)))
                return Outcome(false, t, $"the step size fell to {h:G3} s at t = {t:G6} s");

            var ok = TryStep(t, y, h, yNew, out var err);
            if (!ok)
            {
                _rejected++;
                h *= 0.25;
                rejectedLast = true;
                first = false;
                continue;
            }
            var fac = Math.Max(1.0 / 6.0, Math.Min(5.0, Math.Pow(err, 0.25) / 0.9));
            var hNew = h / fac;
            if (err <= 1.0)
            {
                _accepted++;
                if (!first)
                {
                    var gus = hAccepted / h * Math.Pow(err * err / errorAccepted, 0.25) / 0.9;
                    gus = Math.Max(1.0 / 6.0, Math.Min(5.0, gus));
                    fac = Math.Max(fac, gus);
                    hNew = h / fac;
                }
                hAccepted = h;
                errorAccepted = Math.Max(1e-2, err);
                var tStart = t;
                t = landing ? target : t + h;
                onAccepted?.Invoke(tStart, y, t, yNew);
                (y, yNew) = (yNew, y);
                if (landing)
                {
                    next++;
                    if (next == marks.Length) return Outcome(true, t, null);
                    // A landing step was shortened to hit the mark; carry on with what the controller wanted before.
                    hNew = Math.Max(hNew, proposed);
                }
                if (rejectedLast) hNew = Math.Min(hNew, h);
                h = Math.Min(hNew, hMax);
                rejectedLast = false;
                first = false;
            }
            else
            {
                _rejected++;
                h = first ? h * 0.1 : hNew;
                rejectedLast = true;
            }
        }
    }

    private StiffOutcome Outcome(bool completed, double t, string? reason) => new(completed, t, reason, Statistics);

    private void Evaluate(double t)
    {
        _system.Derivative(t, _yStage, _f);
        _evaluations++;
    }

    private void Solve(double[] rhs)
    {
        if (_useSparse) _sparse!.Solve(rhs);
        else _provider.LUSolveFactored(1, _matrix!, _n, _pivots!, rhs);
    }

    // f, ∂f/∂y and ∂f/∂t at (t, y), unless they are held for that very point already. Returns whether ∂f/∂t is nonzero.
    private bool EvaluateAt(double t, ReadOnlySpan<double> y)
    {
        if (t == _pointT && y.SequenceEqual(_pointY)) return _pointNonAutonomous;
        _system.Derivative(t, y, _f0);
        _evaluations++;
        if (_sparseSystem is not null) _sparseSystem.JacobianValues(t, y, _jacobianValues);
        else _system.Jacobian(t, y, _jacobian ??= new double[_n * _n]);
        _jacobians++;
        _pointNonAutonomous = _system.TimeDerivative(t, y, _ft);
        y.CopyTo(_pointY);
        _pointT = t;
        return _pointNonAutonomous;
    }

    // Factors (fac·I − J): sparse when the system has a pattern and the elimination passes its pivot test, else dense with partial pivoting.
    private void Decompose(double fac)
    {
        var n = _n;
        _decompositions++;
        _useSparse = _sparse is not null && _sparse.FactorShiftedNegative(fac, _jacobianValues);
        if (_useSparse) return;
        _denseDecompositions++;
        _matrix ??= new double[n * n];
        _pivots ??= new int[n];
        if (_sparseSystem is not null)
        {
            Array.Clear(_matrix);
            var entries = _sparseSystem.JacobianPattern.Entries;
            for (var e = 0; e < entries.Count; e++) _matrix[entries[e].Row + entries[e].Column * n] -= _jacobianValues[e];
        }
        else
        {
            var jacobian = _jacobian!;
            for (var i = 0; i < _matrix.Length; i++) _matrix[i] = -jacobian[i];
        }
        for (var i = 0; i < n; i++) _matrix[i + i * n] += fac;
        _provider.LUFactor(_matrix, n, _pivots);
    }

    // Starting step of Hairer, Nørsett and Wanner, Solving ODEs I, §II.4, for a method of order 4.
    private double StartingStep(double t0, double[] y0)
    {
        var scale = new double[_n];
        for (var i = 0; i < _n; i++) scale[i] = _options.AbsoluteTolerance + _options.RelativeTolerance * Math.Abs(y0[i]);
        var f0 = new double[_n];
        _system.Derivative(t0, y0, f0);
        _evaluations++;
        var d0 = Norm(y0, scale);
        var d1 = Norm(f0, scale);
        var h0 = d0 < 1e-5 || d1 < 1e-5 ? 1e-6 : 0.01 * d0 / d1;
        var y1 = new double[_n];
        for (var i = 0; i < _n; i++) y1[i] = y0[i] + h0 * f0[i];
        var f1 = new double[_n];
        _system.Derivative(t0 + h0, y1, f1);
        _evaluations++;
        for (var i = 0; i < _n; i++) f1[i] -= f0[i];
        var d2 = Norm(f1, scale) / h0;
        var h1 = Math.Max(d1, d2) <= 1e-15 ? Math.Max(1e-6, h0 * 1e-3) : Math.Pow(0.01 / Math.Max(d1, d2), 1.0 / (Order + 1));
        var h = Math.Min(100 * h0, h1);
        return double.IsFinite(h) && h > 0 ? h : 1e-6;
    }

    private static double Norm(double[] v, double[] scale)
    {
        var s = 0.0;
        for (var i = 0; i < v.Length; i++) { var x = v[i] / scale[i]; s += x * x; }
        return Math.Sqrt(s / v.Length);
    }
}
