namespace BarrierLedger.Core.Tests.Scans;

/// <summary>
/// The Müller–Brown model surface (K. Müller, L. D. Brown, Theor. Chim. Acta 1979, 53, 75), in its own energy units:
/// V(x, y) = Σₖ Aₖ exp[aₖ (x − x⁰ₖ)² + bₖ (x − x⁰ₖ)(y − y⁰ₖ) + cₖ (y − y⁰ₖ)²].
/// Parameters and stationary points as widely reproduced from that paper; values from memory, three decimals.
/// </summary>
public static class MullerBrown
{
    // From memory (Müller & Brown 1979, Table/eq. for the model surface).
    private static readonly double[] A = [-200, -100, -170, 15];
    private static readonly double[] Ka = [-1, -1, -6.5, 0.7];
    private static readonly double[] Kb = [0, 0, 11, 0.6];
    private static readonly double[] Kc = [-10, -10, -6.5, 0.7];
    private static readonly double[] X0 = [1, 0, -0.5, -1];
    private static readonly double[] Y0 = [0, 0.5, 1.5, 1];

    /// <summary>Published saddle points (x, y, V), from memory.</summary>
    public static readonly (double X, double Y, double V)[] SaddlePoints = [(-0.822, 0.624, -40.66), (0.212, 0.293, -72.25)];

    /// <summary>Published minima (x, y, V), from memory.</summary>
    public static readonly (double X, double Y, double V)[] Minima = [(-0.558, 1.442, -146.70), (0.623, 0.028, -108.17), (-0.050, 0.467, -80.77)];

    /// <summary>Tolerance on the published coordinates (they are given to three decimals).</summary>
    public const double CoordinateTolerance = 2e-3;

    /// <summary>Value, gradient and Hessian, all analytic.</summary>
    public static (double V, double Gx, double Gy, double Hxx, double Hxy, double Hyy) Evaluate(double x, double y)
    {
        double v = 0, gx = 0, gy = 0, hxx = 0, hxy = 0, hyy = 0;
        for (var k = 0; k < 4; k++)
        {
            var dx = x - X0[k];
            var dy = y - Y0[k];
            var e = A[k] * Math.Exp(Ka[k] * dx * dx + Kb[k] * dx * dy + Kc[k] * dy * dy);
            var px = 2 * Ka[k] * dx + Kb[k] * dy;
            var py = Kb[k] * dx + 2 * Kc[k] * dy;
            v += e;
            gx += e * px;
            gy += e * py;
            hxx += e * (px * px + 2 * Ka[k]);
            hxy += e * (px * py + Kb[k]);
            hyy += e * (py * py + 2 * Kc[k]);
        }
        return (v, gx, gy, hxx, hxy, hyy);
    }

    /// <summary>Eigenvalues of the symmetric 2×2 Hessian, ascending (closed form).</summary>
    public static (double Low, double High) HessianEigenvalues(double x, double y)
    {
        var (_, _, _, hxx, hxy, hyy) = Evaluate(x, y);
        var mean = 0.5 * (hxx + hyy);
        var r = Math.Sqrt(0.25 * (hxx - hyy) * (hxx - hyy) + hxy * hxy);
        return (mean - r, mean + r);
    }

    /// <summary>Newton's method on the gradient from a starting point (finds the nearby stationary point).</summary>
    public static (double X, double Y) Stationary(double x, double y)
    {
        for (var it = 0; it < 50; it++)
        {
            var (_, gx, gy, hxx, hxy, hyy) = Evaluate(x, y);
            var det = hxx * hyy - hxy * hxy;
            var sx = (hyy * gx - hxy * gy) / det;
            var sy = (hxx * gy - hxy * gx) / det;
            x -= sx;
            y -= sy;
            if (Math.Abs(sx) + Math.Abs(sy) < 1e-14) break;
        }
        return (x, y);
    }

    /// <summary>The y that minimises V at fixed x, by Newton on ∂V/∂y from <paramref name="yStart"/> (what a relaxed scan does).</summary>
    public static double RelaxY(double x, double yStart)
    {
        var y = yStart;
        for (var it = 0; it < 100; it++)
        {
            var (_, _, gy, _, _, hyy) = Evaluate(x, y);
            var step = hyy > 0 ? -gy / hyy : -Math.Sign(gy) * 0.01;
            step = Math.Clamp(step, -0.05, 0.05);
            y += step;
            if (Math.Abs(step) < 1e-13) break;
        }
        return y;
    }
}
