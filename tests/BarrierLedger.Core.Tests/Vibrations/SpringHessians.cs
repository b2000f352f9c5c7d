using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Tests.Vibrations;

/// <summary>
/// Cartesian Hessians of harmonic pair springs V = Σ ½ k_ab (r_ab − r⁰_ab)² at r = r⁰: H = Σ k_ab (u uᵀ) in the (a,a), (b,b) blocks and
/// −k_ab (u uᵀ) in (a,b), (b,a), u the unit bond vector. Such a Hessian is exactly invariant to translations and rotations
/// (Wilson, Decius & Cross, Molecular Vibrations, ch. 2), so it is a clean input for projection and rebuild checks.
/// </summary>
public static class SpringHessians
{
    /// <summary>Hartree/bohr² per N/m: 1 / (E_h / a₀²), CODATA 2018.</summary>
    public static readonly double HartreePerBohr2PerNewtonPerMetre =
        PhysicalConstants.BohrMetre * PhysicalConstants.BohrMetre / PhysicalConstants.HartreeJoule;

    public static double[] Build(Molecule m, IEnumerable<(int A, int B, double KNewtonPerMetre)> springs)
    {
        var n = 3 * m.AtomCount;
        var h = new double[n * n];
        foreach (var (a, b, kSi) in springs)
        {
            var k = kSi * HartreePerBohr2PerNewtonPerMetre;
            var u = (m.PositionsAngstrom[b] - m.PositionsAngstrom[a]).Normalized();
            for (var x = 0; x < 3; x++)
                for (var y = 0; y < 3; y++)
                {
                    var v = k * u[x] * u[y];
                    h[(3 * a + x) * n + 3 * a + y] += v;
                    h[(3 * b + x) * n + 3 * b + y] += v;
                    h[(3 * a + x) * n + 3 * b + y] -= v;
                    h[(3 * b + x) * n + 3 * a + y] -= v;
                }
        }
        return h;
    }

    /// <summary>A random non-planar cluster of <paramref name="atoms"/> atoms (C, H, N, O, Cl cycled), ~1.5 Å apart, all pairs sprung.</summary>
    public static (Molecule Molecule, double[] Hessian) RandomCluster(int atoms, int randomStream)
    {
        var rng = new Random(randomStream);
        var symbols = new[] { "C", "H", "N", "O", "Cl" };
        var side = Math.Cbrt(atoms) * 1.5;
        var positions = new Vec3[atoms];
        for (var i = 0; i < atoms; i++)
            positions[i] = new Vec3(rng.NextDouble() * side, rng.NextDouble() * side, rng.NextDouble() * side);
        var m = new Molecule(Enumerable.Range(0, atoms).Select(i => BarrierLedger.Core.Chemistry.Elements.Get(symbols[i % symbols.Length])), positions);
        var springs = new List<(int, int, double)>();
        for (var a = 0; a < atoms; a++)
            for (var b = a + 1; b < atoms; b++)
            {
                var r = (positions[a] - positions[b]).Length;
                // Stiff near neighbours, soft far pairs, like a real force field.
                springs.Add((a, b, 500.0 * Math.Exp(-(r - 1.0)) * (0.5 + rng.NextDouble())));
            }
        return (m, Build(m, springs));
    }
}
