using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Vibrations;

namespace BarrierLedger.Core.Tests.Checks;

public class SaddleCheckFromHessianTests
{
    /// <summary>
    /// Linear symmetric A–B–A (here [Cl–H–Cl]⁻ along x) with the force field V = ½ k_S S² + ½ k_Q Q² + ½ k_b (δ_y² + δ_z²):
    /// r1 = x_B − x_A1, r2 = x_A2 − x_B; symmetric stretch S = (r1 + r2)/√2, antisymmetric stretch Q = (r1 − r2)/√2;
    /// linear bends δ_y = (y_A1 − y_B)/r + (y_A2 − y_B)/r (and δ_z alike), which vanish for translations and rotations.
    /// Cartesian Hessian H = Σ k_q b_q b_qᵀ. With k_S &gt; 0 and k_Q &lt; 0 the surface is a first-order saddle.
    /// Eigenvalues (Wilson, Decius and Cross, Molecular Vibrations, 1955, linear XY2: G_QQ = Σ b_Q²/m = 1/m_A + 2/m_B):
    /// λ_Q = k_Q (1/m_A + 2/m_B) &lt; 0, λ_S = k_S / m_A; ν̃ = sign(λ) √|λ| × 5140.487 cm⁻¹ per √(E_h/(a₀² amu)) (CODATA 2018).
    /// </summary>
    internal static double[] ClHClHessian(double kS, double kQ, double kBend)
    {
        var m = TestSystems.ClHCl();
        var r = TestSystems.ClHAngstrom;
        var s2 = Math.Sqrt(2);
        return TestSystems.ForceFieldHessian(m,
        [
            (kS, p => ((p[1].X - p[0].X) + (p[2].X - p[1].X)) / s2, false),
            (kQ, p => ((p[1].X - p[0].X) - (p[2].X - p[1].X)) / s2, false),
            (kBend, p => (p[0].Y - p[1].Y) / r + (p[2].Y - p[1].Y) / r, true),
            (kBend, p => (p[0].Z - p[1].Z) / r + (p[2].Z - p[1].Z) / r, true),
        ]);
    }

    [Fact]
    public void LinearABA_NegativeAntisymmetricForceConstant_OneImaginaryModeThatMakesOneBondAndBreaksTheOther()
    {
        const double kS = 0.10, kQ = -0.05, kB = 0.05;
        var m = TestSystems.ClHCl();
        var input = SaddleCheckInput.FromHessian(m, ClHClHessian(kS, kQ, kB), [(0, 1), (1, 2)]);
        var result = SaddleCheck.Run(input);

        var mA = Elements.Get("Cl").MostAbundantIsotopeMassDa;
        var mB = Elements.H.MostAbundantIsotopeMassDa;
        var expected = -Math.Sqrt(-kQ * (1 / mA + 2 / mB)) * 5140.487;
        var imaginary = Assert.Single(input.Modes, x => x.IsImaginary);
        Close.Relative(expected, imaginary.FrequencyCm1, 1e-5, "antisymmetric-stretch wavenumber", "Wilson–Decius–Cross XY2 G matrix, derived in the comment");
        Close.Relative(Math.Sqrt(kS / mA) * 5140.487, input.Modes.Single(x => x.FrequencyCm1 > 0 && Math.Abs(x.DisplacementCartesian[1].X) < 1e-6 && x.DisplacementCartesian[0].Y == 0 && Math.Abs(x.DisplacementCartesian[0].X) > 0.1).FrequencyCm1,
            1e-5, "symmetric-stretch wavenumber", "λ_S = k_S/m_A, derived in the comment");

        Assert.True(result.Verdict == Verdict.Passed, result.Report());
        var c = result.SignificantCharacter!;
        Assert.Equal(ModeClass.Stretch, c.Class);
        Assert.Equal(new[] { "stretch Cl1–H2", "stretch H2–Cl3" }, c.Components.Take(2).Select(x => x.Label).Order());
        Assert.NotEqual(Math.Sign(c.Components[0].ChangePerUnitDisplacement), Math.Sign(c.Components[1].ChangePerUnitDisplacement));
        Assert.Contains("one bond breaks while the other forms", c.Summary);
    }

    /// <summary>
    /// The invented hydrogen transfer (<see cref="TestSystems.HydrogenTransfer"/>) with a valence force field: every bond
    /// 0.30 hartree/bohr² (≈ 4.7 mdyn/Å), every angle 0.10 hartree/rad², the three X–C2–H8–Cl9 dihedrals 0.01; the transfer
    /// as Q = (r(C2–H8) − r(H8–Cl9))/√2 with k = −0.05 and its partner S with +0.30 (in place of the two bond terms); and a
    /// soft methyl torsion: the mean of the nine H–C1–C2–X dihedrals with k = −0.001 hartree/rad² (a slightly wrong rotamer,
    /// a soft imaginary mode of some tens of cm⁻¹).
    /// </summary>
    [Fact]
    public void SoftTorsionComponent_NeedsAttentionWithRotorLikeSoftMode_NotFailed()
    {
        var m = TestSystems.HydrogenTransfer();
        var input = SaddleCheckInput.FromHessian(m, HydrogenTransferHessian(-0.001), [(1, 7), (7, 8)]);
        var result = SaddleCheck.Run(input);

        Assert.Equal(2, input.Modes.Count(x => x.IsImaginary));
        Assert.True(result.Verdict == Verdict.NeedsAttention, result.Report());
        var soft = Assert.Single(result.SoftModes);
        Assert.InRange(soft.Mode.FrequencyCm1, -100, -10);
        Assert.Equal(ModeClass.Torsion, soft.Character.Class);
        Assert.True(soft.Character.RotorLike);
        Assert.Contains(result.Reasons, r => r.Code == SaddleCheckCodes.SoftImaginaryMode && r.Message.Contains("about C1–C2"));
        Assert.Contains(result.SignificantCharacter!.Leading(3), x => x.IsReactionBond);
    }

    [Fact]
    public void StiffWrongTorsion_TwoSignificantImaginaryModes_Fails()
    {
        // The same system with the methyl-torsion constant thirty times larger (−0.03 hartree/rad²): the rotor becomes a
        // second significant imaginary mode (a rotamer that is a saddle point of its own), which is a failure.
        var m = TestSystems.HydrogenTransfer();
        var result = SaddleCheck.Run(SaddleCheckInput.FromHessian(m, HydrogenTransferHessian(-0.03), [(1, 7), (7, 8)]));
        Assert.True(result.Verdict == Verdict.Failed, result.Report());
        Assert.Equal(SaddleCheckCodes.SeveralSignificantImaginaryModes, result.Reasons[0].Code);
        Assert.Contains(result.SignificantModes, s => s.Character is { Class: ModeClass.Torsion, RotorLike: true });
    }

    /// <summary>The force-field Hessian of the hydrogen transfer described above, with the methyl-torsion constant as given (hartree/rad²).</summary>
    internal static double[] HydrogenTransferHessian(double methylTorsion)
    {
        var m = TestSystems.HydrogenTransfer();
        var g = new Connectivity(m.AtomCount, Connectivity.Of(m).Bonds.Append(new Bond(1, 7)));
        var terms = new List<(double, Func<Vec3[], double>, bool)>();
        foreach (var b in g.Bonds.Where(b => b != new Bond(1, 7) && b != new Bond(7, 8)))
            terms.Add((0.30, TestSystems.Distance(b.A, b.B), false));
        var s2 = Math.Sqrt(2);
        terms.Add((-0.05, p => ((p[1] - p[7]).Length - (p[7] - p[8]).Length) / s2, false));
        terms.Add((0.30, p => ((p[1] - p[7]).Length + (p[7] - p[8]).Length) / s2, false));
        foreach (var a in InternalCoordinates.Angles(g))
            terms.Add((0.10, TestSystems.AngleRad(a.Atoms[0], a.Atoms[1], a.Atoms[2]), true));
        var dihedrals = InternalCoordinates.ProperDihedrals(m, g);
        foreach (var d in dihedrals.Where(d => d.Atoms[1] == 1 && d.Atoms[2] == 7))
            terms.Add((0.01, TestSystems.DihedralRad(d.Atoms[0], d.Atoms[1], d.Atoms[2], d.Atoms[3]), true));
        var methyl = dihedrals.Where(d => d.Atoms[1] == 0 && d.Atoms[2] == 1).ToList();
        // Each dihedral is measured from its value at the saddle geometry, wrapped, so the mean does not jump at ±180°.
        var p0 = m.PositionsAngstrom.ToArray();
        double Twist(Vec3[] p) => methyl.Average(d => InternalCoordinates.WrapDegrees(d.ValueAt(p) - d.ValueAt(p0))) * Math.PI / 180;
        terms.Add((methylTorsion, Twist, true));

        return TestSystems.ForceFieldHessian(m, terms);
    }
}
