using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Tests.ReferenceData;
using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Units;
using BarrierLedger.Core.Vibrations;

namespace BarrierLedger.Core.Tests.Vibrations;

public class FrequencyAnalysisTests
{
    // Handbook harmonic wavenumber of H³⁵Cl, ω_e ≈ 2991 cm⁻¹, from k = 516.3 N/m (Huber & Herzberg 1979, from memory).
    // The Hessian is built in an arbitrary orientation away from the origin and goes through the full pipeline.
    [Theory]
    [InlineData(EigenSolverChoice.Auto)]
    [InlineData(EigenSolverChoice.Managed)]
    public void HCl_FromForceConstant_GivesHandbookWavenumber_AndRemovesFiveModes(EigenSolverChoice solver)
    {
        var m = TestMolecules.HCl;
        var h = SpringHessians.Build(m, [(0, 1, Spectroscopy.HClForceConstantNewtonPerMetre)]);
        var a = FrequencyAnalysis.FromHessian(m, h, new HessianOptions(Solver: solver));

        Assert.Equal(MolecularShape.Linear, a.Shape);
        Assert.Equal(5, a.RemovedModeCount);
        var mode = Assert.Single(a.Modes);
        Close.Absolute(Spectroscopy.HClHarmonicWavenumberCm1, mode.FrequencyCm1, Spectroscopy.HClWavenumberToleranceCm1,
            "ω_e of H35Cl", Spectroscopy.HuberHerzberg);
        // Reduced mass and force constant refer to the unit Cartesian displacement x̂ = (m_Cl, −m_H)/√(m_H² + m_Cl²) along the bond
        // (μ = 1/Σ q²/m, the usual output convention): the bond stretches by M/√(m_H² + m_Cl²) per unit x̂, so
        // k_x = k·M²/(m_H² + m_Cl²) and μ_x = μ_AB·M²/(m_H² + m_Cl²), with μ_AB = m_H m_Cl / M the two-body reduced mass.
        var mh = m.Elements[0].MostAbundantIsotopeMassDa;
        var mcl = m.Elements[1].MostAbundantIsotopeMassDa;
        var stretchFactor = (mh + mcl) * (mh + mcl) / (mh * mh + mcl * mcl);
        Close.Relative(mh * mcl / (mh + mcl) * stretchFactor, mode.ReducedMassDalton, 1e-9, "reduced mass of HCl", "two-body reduced mass, projected on x̂");
        Close.Relative(516.3 * stretchFactor, mode.ForceConstantNewtonPerMetre, 1e-9, "force constant of HCl", "input 516.3 N/m, projected on x̂");
        // The displacement is along the bond, unit length over all components.
        var norm = Math.Sqrt(mode.DisplacementCartesian.Sum(v => v.LengthSquared));
        Close.Absolute(1.0, norm, 1e-12, "displacement norm", "normalisation convention of NormalMode");
        var bond = (m.PositionsAngstrom[1] - m.PositionsAngstrom[0]).Normalized();
        Close.Absolute(1.0, Math.Abs(mode.DisplacementCartesian[0].Normalized().Dot(bond)), 1e-9, "H displacement direction", "stretch is along the bond");
    }

    // Linear XY₂ with only bond-stretch constants k (no bending): ω₁² = k/m_Y, ω₃² = k (1/m_Y + 2/m_X), bends at zero
    // (Herzberg, Molecular Spectra and Molecular Structure II, 1945, valence force field of linear XY₂).
    [Fact]
    public void LinearTriatomic_WithStretchSprings_MatchesValenceForceFieldFormulas()
    {
        var m = TestMolecules.CO2;
        const double k = 1600.0; // N/m
        var h = SpringHessians.Build(m, [(0, 1, k), (1, 2, k)]);
        var a = FrequencyAnalysis.FromHessian(m, h);
        Assert.Equal(5, a.RemovedModeCount);
        Assert.Equal(4, a.Modes.Length);
        var mO = m.Elements[0].MostAbundantIsotopeMassDa * PhysicalConstants.AtomicMassConstantKilogram;
        var mC = m.Elements[1].MostAbundantIsotopeMassDa * PhysicalConstants.AtomicMassConstantKilogram;
        var toCm1 = 1.0 / (2 * Math.PI * PhysicalConstants.SpeedOfLightMetrePerSecond * 100);
        var nu1 = Math.Sqrt(k / mO) * toCm1;
        var nu3 = Math.Sqrt(k * (1 / mO + 2 / mC)) * toCm1;
        Close.Absolute(0, a.Modes[0].FrequencyCm1, 1e-3, "bend 1 without a bending constant", "Herzberg II, linear XY2");
        Close.Absolute(0, a.Modes[1].FrequencyCm1, 1e-3, "bend 2 without a bending constant", "Herzberg II, linear XY2");
        Close.Relative(nu1, a.Modes[2].FrequencyCm1, 1e-9, "symmetric stretch", "Herzberg II, linear XY2");
        Close.Relative(nu3, a.Modes[3].FrequencyCm1, 1e-9, "antisymmetric stretch", "Herzberg II, linear XY2");
    }

    [Fact]
    public void Atom_HasNoVibrations_AndThreeRemovedModes()
    {
        var a = FrequencyAnalysis.FromHessian(TestMolecules.Ar, new double[9]);
        Assert.Equal(MolecularShape.Atom, a.Shape);
        Assert.Equal(3, a.RemovedModeCount);
        Assert.Empty(a.Modes);
    }

    // Property: a translation/rotation-invariant Hessian rebuilt from its 3N − 6 modes equals the input.
    [Theory]
    [InlineData(4, 1)]
    [InlineData(7, 2)]
    [InlineData(12, 3)]
    public void HessianRebuiltFromModes_EqualsInput(int atoms, int stream)
    {
        var (m, h) = SpringHessians.RandomCluster(atoms, stream);
        var a = FrequencyAnalysis.FromHessian(m, h);
        Assert.Equal(6, a.RemovedModeCount);
        Assert.Equal(3 * atoms - 6, a.Modes.Length);
        var rebuilt = FrequencyAnalysis.ToCartesianHessian(a);
        var scale = h.Max(Math.Abs);
        for (var i = 0; i < h.Length; i++)
            Close.Absolute(h[i], rebuilt[i], 1e-10 * scale, $"rebuilt Hessian element {i}", "property: H = M½ Q Λ Qᵀ M½");
        Assert.True(a.Modes.Zip(a.Modes.Skip(1)).All(p => p.First.FrequencyCm1 <= p.Second.FrequencyCm1), "modes ascending");
    }

    // Projection: adding curvature along rigid-body motions (a uniform translation and a rotation) must not change the vibrations.
    [Fact]
    public void RigidBodyContamination_IsProjectedOut()
    {
        var (m, h) = SpringHessians.RandomCluster(6, 4);
        var clean = FrequencyAnalysis.FromHessian(m, h);
        var n = h.Length is var len ? (int)Math.Sqrt(len) : 0;
        var masses = Inertia.MassesAmu(m);
        var com = Inertia.CentreOfMass(m);
        // Mass-weighted translation along x and rotation about z, taken back to Cartesian (× √m): t_i = m_a e_x, r_i = m_a (e_z × r_a).
        var t = new double[n];
        var r = new double[n];
        for (var atom = 0; atom < m.AtomCount; atom++)
        {
            t[3 * atom] = masses[atom];
            var rel = m.PositionsAngstrom[atom] - com;
            r[3 * atom] = -rel.Y * masses[atom];
            r[3 * atom + 1] = rel.X * masses[atom];
        }
        var dirty = (double[])h.Clone();
        for (var i = 0; i < n; i++)
            for (var j = 0; j < n; j++)
                dirty[i * n + j] += 1e-3 * t[i] * t[j] + 2e-3 * r[i] * r[j] + 5e-4 * (t[i] * r[j] + r[i] * t[j]);
        var projected = FrequencyAnalysis.FromHessian(m, dirty);
        for (var k = 0; k < clean.Modes.Length; k++)
            Close.Absolute(clean.Modes[k].FrequencyCm1, projected.Modes[k].FrequencyCm1, 1e-6,
                $"mode {k + 1} with rigid-body contamination", "projection P = 1 − DᵀD (Miller, Handy & Adams 1980)");
    }

    // Independent library check: OpenBLAS LAPACK dsyevd against MathNet's managed Evd on the same Hessian.
    [SkippableFact]
    public void NativeAndManagedSolvers_Agree()
    {
        Skip.IfNot(SymmetricEigensolver.NativeAvailable, "libopenblas.so.0 not loadable on this machine");
        var (m, h) = SpringHessians.RandomCluster(15, 5);
        var native = FrequencyAnalysis.FromHessian(m, h, new HessianOptions(Solver: EigenSolverChoice.Native));
        var managed = FrequencyAnalysis.FromHessian(m, h, new HessianOptions(Solver: EigenSolverChoice.Managed));
        Assert.Equal(SymmetricEigensolver.NativeName, native.EigenSolver);
        Assert.Equal(SymmetricEigensolver.ManagedName, managed.EigenSolver);
        for (var k = 0; k < native.Modes.Length; k++)
        {
            Close.Absolute(managed.Modes[k].FrequencyCm1, native.Modes[k].FrequencyCm1, 1e-6, $"mode {k + 1}", "MathNet managed Evd");
            Close.Relative(managed.Modes[k].ReducedMassDalton, native.Modes[k].ReducedMassDalton, 1e-6, $"reduced mass {k + 1}", "MathNet managed Evd");
        }
    }

    [Fact]
    public void NegativeCurvature_GivesOneImaginaryModeFirst_WithNegativeForceConstant()
    {
        // A bent H₃ triangle with springs on its three sides, one of them negative: the three side lengths are complete internal
        // coordinates, so by Sylvester's law of inertia the Hessian has exactly one negative eigenvalue (a model saddle point).
        var m = TestMolecules.Build(("H", -0.8, 0.3, 0), ("H", 0, 0, 0), ("H", 0.8, 0.3, 0));
        var h = SpringHessians.Build(m, [(0, 1, 300.0), (1, 2, 300.0), (0, 2, -400.0)]);
        var a = FrequencyAnalysis.FromHessian(m, h);
        var imaginary = Assert.Single(a.ImaginaryModes);
        Assert.Same(a.Modes[0], imaginary);
        Assert.True(imaginary.ForceConstantNewtonPerMetre < 0);
        Assert.DoesNotContain(a.RealFrequenciesCm1, v => v < 0);
    }

    [Fact]
    public void WrongSize_IsRejectedWithTheExpectedDimensions()
    {
        var ex = Assert.Throws<HessianException>(() => FrequencyAnalysis.FromHessian(TestMolecules.H2O, new double[36]));
        Assert.Equal(HessianProblem.SizeMismatch, ex.Problem);
        Assert.Contains("9×9 = 81", ex.Message);
        Assert.Contains("6×6", ex.Message);
    }

    [Fact]
    public void NonFiniteElement_IsRejectedWithRowColumnAndAtom()
    {
        var h = SpringHessians.Build(TestMolecules.H2O, [(0, 1, 800), (0, 2, 800)]);
        h[4 * 9 + 7] = double.NaN;
        var ex = Assert.Throws<HessianException>(() => FrequencyAnalysis.FromHessian(TestMolecules.H2O, h));
        Assert.Equal(HessianProblem.NonFinite, ex.Problem);
        Assert.Contains("row 5, column 8", ex.Message);
        Assert.Contains("H2 y", ex.Message);
        Assert.Contains("H3 y", ex.Message);
    }

    [Fact]
    public void Asymmetry_BeyondTolerance_IsRejected_ButSmallAsymmetryIsSymmetrised()
    {
        var m = TestMolecules.H2O;
        var h = SpringHessians.Build(m, [(0, 1, 800), (0, 2, 800), (1, 2, 50)]);
        var reference = FrequencyAnalysis.FromHessian(m, h);

        var bad = (double[])h.Clone();
        bad[0 * 9 + 5] += 0.05;
        var ex = Assert.Throws<HessianException>(() => FrequencyAnalysis.FromHessian(m, bad));
        Assert.Equal(HessianProblem.Asymmetric, ex.Problem);
        Assert.Contains("H[1,6]", ex.Message);
        Assert.False(FrequencyAnalysis.TryFromHessian(m, bad, out _, out var error));
        Assert.Contains("not symmetric", error);

        var slightly = (double[])h.Clone();
        slightly[0 * 9 + 5] += 2e-6;
        slightly[5 * 9 + 0] -= 2e-6;
        Assert.True(FrequencyAnalysis.TryFromHessian(m, slightly, out var ok, out _));
        for (var k = 0; k < 3; k++)
            Close.Absolute(reference.Modes[k].FrequencyCm1, ok.Modes[k].FrequencyCm1, 1e-9,
                "wavenumber after symmetrising an antisymmetric perturbation", "(H + Hᵀ)/2 removes it exactly");
    }

    [Fact]
    public void FromFrequencies_SortsAndDropsRigidBodyModesOnlyForAFullSet()
    {
        var m = TestMolecules.H2O;
        var a = FrequencyAnalysis.FromFrequencies(m, [3756, 1595, 3657]);
        Assert.Equal([1595, 3657, 3756], a.FrequenciesCm1.ToArray());
        Assert.Equal(0, a.RemovedModeCount);
        Assert.Equal(FrequencyAnalysis.GivenFrequenciesSolver, a.EigenSolver);

        var full = FrequencyAnalysis.FromFrequencies(m, [0.1, -0.3, 3756, 0.2, 1595, 0.0, 3657, -0.05, 0.4]);
        Assert.Equal(6, full.RemovedModeCount);
        Assert.Equal([1595, 3657, 3756], full.FrequenciesCm1.ToArray());

        var ex = Assert.Throws<ArgumentException>(() => FrequencyAnalysis.FromFrequencies(m, [1, 2, 3, 4]));
        Assert.Contains("at most 3N − 6 = 3", ex.Message);
    }

    [Fact]
    public void FromModes_RejectsDisplacementsOfTheWrongLength()
    {
        var mode = new NormalMode(1000, [new Vec3(1, 0, 0)]);
        var ex = Assert.Throws<ArgumentException>(() => FrequencyAnalysis.FromModes(TestMolecules.H2O, [mode]));
        Assert.Contains("1 displacement vectors for 3 atoms", ex.Message);
    }

    [Fact]
    public void EigenvalueToWavenumberFactor_MatchesCodata()
    {
        // √(E_h/(a₀² m_u))/(2πc) with CODATA 2018: 5140.48714 cm⁻¹ (computed independently from the NIST SP 961 values).
        Close.Relative(5140.48714, FrequencyAnalysis.WavenumberPerSqrtAtomicEigenvalue, 1e-8,
            "cm⁻¹ per √(Eh/(bohr² amu))", "CODATA 2018, NIST SP 961");
    }
}
