using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Units;
using BarrierLedger.Core.Vibrations;

namespace BarrierLedger.Demo.Tests;

public class ValenceForceFieldTests
{
    private const string GfSource =
        "Wilson, Decius and Cross, Molecular Vibrations (1955): G-matrix elements of a bent symmetric XY2 molecule, " +
        "simple valence force field without interaction constants (from memory)";

    private static Molecule BentXy2(double r, double angleDegrees)
    {
        var half = angleDegrees / 2 * Math.PI / 180;
        return new Molecule(
            [Elements.O, Elements.H, Elements.H],
            [Vec3.Zero, new Vec3(r * Math.Sin(half), 0, r * Math.Cos(half)), new Vec3(-r * Math.Sin(half), 0, r * Math.Cos(half))]);
    }

    [Fact]
    public void Bent_XY2_frequencies_match_the_GF_matrix_solution()
    {
        const double r = 0.9572, phi = 104.52, kr = 8.45, kphi = 0.76; // aJ/Å², aJ/rad² (water-like magnitudes)
        var m = BentXy2(r, phi);
        ForceFieldTerm T(InternalCoordinate q, double k) => new([new WeightedCoordinate(q, 1.0)], k, "");
        var terms = new[] { T(InternalCoordinate.Stretch(0, 1), kr), T(InternalCoordinate.Stretch(0, 2), kr), T(InternalCoordinate.Bend(1, 0, 2), kphi) };
        var modes = FrequencyAnalysis.FromHessian(m, ValenceForceField.CartesianHessian(m, terms)).Modes.Select(x => x.FrequencyCm1).Order().ToArray();

        // GF method in SI: F in N/m (1 aJ/Å² = 100 N/m) and J/rad² (1 aJ = 1e-18 J); G from inverse masses (1/kg) and r (m).
        var amu = PhysicalConstants.AtomicMassConstantKilogram;
        var muX = 1 / (Elements.O.MostAbundantIsotopeMassDa * amu);
        var muY = 1 / (Elements.H.MostAbundantIsotopeMassDa * amu);
        var rm = r * 1e-10;
        var f = phi * Math.PI / 180;
        var f11 = kr * 100;
        var f22 = kphi * 1e-18;
        var g11 = muY + muX * (1 + Math.Cos(f));
        var g22 = 2 / (rm * rm) * (muY + muX * (1 - Math.Cos(f)));
        var g12 = -Math.Sqrt(2) * muX * Math.Sin(f) / rm;
        var g33 = muY + muX * (1 - Math.Cos(f));
        var sum = f11 * g11 + f22 * g22;
        var product = f11 * f22 * (g11 * g22 - g12 * g12);
        var disc = Math.Sqrt(sum * sum - 4 * product);
        double Wave(double lambda) => Math.Sqrt(lambda) / (2 * Math.PI * PhysicalConstants.SpeedOfLightMetrePerSecond * 100);
        var expected = new[] { Wave((sum - disc) / 2), Wave((sum + disc) / 2), Wave(f11 * g33) }.Order().ToArray();

        Assert.Equal(3, modes.Length);
        for (var i = 0; i < 3; i++)
            Close.Relative(expected[i], modes[i], 1e-6, $"XY2 mode {i + 1} (cm⁻¹)", GfSource);
    }

    [Fact]
    public void Negative_curvature_along_a_bond_gives_one_imaginary_mode_with_the_GF_value()
    {
        // Antisymmetric stretch of the bent XY2 with k_r < 0: λ3 = k_r G33 < 0, the only negative eigenvalue when the
        // symmetric block stays positive (k_r enters it too, so the bend and a positive symmetric term keep it so).
        const double r = 0.9572, phi = 104.52, kphi = 0.76;
        var m = BentXy2(r, phi);
        ForceFieldTerm T(InternalCoordinate q, double k) => new([new WeightedCoordinate(q, 1.0)], k, "");
        var s = 1 / Math.Sqrt(2);
        var antisym = new ForceFieldTerm([new(InternalCoordinate.Stretch(0, 1), s), new(InternalCoordinate.Stretch(0, 2), -s)], -2.0, "");
        var sym = new ForceFieldTerm([new(InternalCoordinate.Stretch(0, 1), s), new(InternalCoordinate.Stretch(0, 2), s)], 8.45, "");
        var analysis = FrequencyAnalysis.FromHessian(m, ValenceForceField.CartesianHessian(m, [antisym, sym, T(InternalCoordinate.Bend(1, 0, 2), kphi)]));
        var imaginary = analysis.Modes.Where(x => x.IsImaginary).ToArray();
        Assert.Single(imaginary);

        var amu = PhysicalConstants.AtomicMassConstantKilogram;
        var g33 = 1 / (Elements.H.MostAbundantIsotopeMassDa * amu) + 1 / (Elements.O.MostAbundantIsotopeMassDa * amu) * (1 - Math.Cos(phi * Math.PI / 180));
        var expected = -Math.Sqrt(2.0 * 100 * g33) / (2 * Math.PI * PhysicalConstants.SpeedOfLightMetrePerSecond * 100);
        Close.Relative(expected, imaginary[0].FrequencyCm1, 1e-6, "imaginary antisymmetric stretch (cm⁻¹)", GfSource);
    }

    [Fact]
    public void Hessian_is_symmetric_and_blind_to_overall_translation_and_rotation()
    {
        // Property check: E depends on internal coordinates only, so H·t = 0 for a rigid translation t and H·ω = 0 for an
        // infinitesimal rotation ω × r at the reference geometry (Wilson, Decius and Cross 1955, ch. 2).
        var m = DemoStructures.DielsAlderSaddle;
        var h = ValenceForceField.CartesianHessian(m, new ForceFieldSpec(Reaction: [new ReactionCurvature([(0, 5, 1.0), (3, 4, 1.0)], -1.5)]));
        var n3 = 3 * m.AtomCount;
        var scale = h.Max(Math.Abs);
        for (var i = 0; i < n3; i++)
            for (var j = 0; j < n3; j++)
                Assert.Equal(h[i * n3 + j], h[j * n3 + i]);
        var centre = m.PositionsAngstrom.Aggregate(Vec3.Zero, (a, b) => a + b) / m.AtomCount;
        var axes = new[] { new Vec3(1, 0, 0), new Vec3(0, 1, 0), new Vec3(0, 0, 1) };
        var rigid = axes.Select(t => m.PositionsAngstrom.Select(_ => t).ToArray())
            .Concat(axes.Select(ax => m.PositionsAngstrom.Select(p => ax.Cross(p - centre)).ToArray()));
        foreach (var v in rigid)
        {
            var x = v.SelectMany(p => new[] { p.X, p.Y, p.Z }).ToArray();
            var worst = Enumerable.Range(0, n3).Max(i => Math.Abs(Enumerable.Range(0, n3).Sum(j => h[i * n3 + j] * x[j])));
            Close.Absolute(0, worst / scale, 1e-6, "|H·rigid motion| / max|H|", "invariance of an internal-coordinate energy (Wilson, Decius and Cross 1955)");
        }
    }

    [Fact]
    public void Unit_factor_is_attojoule_per_square_angstrom_in_hartree_per_square_bohr()
    {
        // 1 aJ/Å² = 1e-18 J / E_h × (a0/Å)²; with CODATA 2018 E_h = 4.3597447222071e-18 J and a0 = 0.529177210903 Å this is 0.0642304.
        Close.Relative(0.0642304, ValenceForceField.HartreePerBohr2PerAttojoulePerAngstrom2, 1e-5, "aJ/Å² in Eh/bohr²", "CODATA 2018 (E_h, a0)");
    }

    [Fact]
    public void Bad_requests_are_refused_with_the_reason()
    {
        var m = BentXy2(0.96, 104.5);
        var ex = Assert.Throws<ArgumentException>(() => ValenceForceField.Terms(m, new ForceFieldSpec(Torsions: [new TorsionCurvature(1, 2, -0.1)])));
        Assert.Contains("not bonded", ex.Message);
        ex = Assert.Throws<ArgumentException>(() => ValenceForceField.Terms(m, new ForceFieldSpec(Reaction: [new ReactionCurvature([(0, 5, 1.0)], -1)])));
        Assert.Contains("Atom 6 does not exist", ex.Message);
        ex = Assert.Throws<ArgumentException>(() => ValenceForceField.Terms(m, new ForceFieldSpec(Reaction: [new ReactionCurvature([(0, 1, 1.0)], 0.5)])));
        Assert.Contains("must be negative", ex.Message);
    }
}
