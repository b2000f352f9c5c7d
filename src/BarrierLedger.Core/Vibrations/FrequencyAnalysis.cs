using System.Buffers;
using System.Collections.Immutable;
using System.Runtime.InteropServices;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Vibrations;

/// <summary>
/// Harmonic vibrational analysis from a Cartesian Hessian (Wilson, Decius and Cross, Molecular Vibrations, 1955, ch. 2;
/// the projection of rigid-body motions as in Miller, Handy and Adams, J. Chem. Phys. 72, 99 (1980)):
/// <list type="number">
/// <item>check size (3N)², finiteness and symmetry (|H_ij − H_ji| within tolerance), then symmetrise: H ← (H + Hᵀ)/2;</item>
/// <item>mass-weight: F_ij = H_ij / √(m_i m_j), hartree/(bohr²·amu);</item>
/// <item>build the orthonormal mass-weighted translations √m_a e_α and rotations √m_a (e_p × r_a) about the principal axes
/// through the centre of mass (two for a linear molecule): the k × 3N matrix D, k = 3, 5 or 6;</item>
/// <item>project with P = 1 − DᵀD as a rank-2k update, never as a dense product:
/// PFP + s DᵀD = F − Dᵀ Wᵀ − W D with G = F Dᵀ, M = D G + s·1, W = G − ½ Dᵀ M; the shift s = 2‖F‖∞ + 1 places the k rigid-body
/// eigenvalues above the whole vibrational spectrum, so they are identified exactly and removed;</item>
/// <item>diagonalise (LAPACK dsyevd through OpenBLAS, or MathNet managed Evd): F q = λ q;</item>
/// <item>wavenumber ν̃ = sign(λ) √(|λ| E_h / (a₀² m_u)) / (2π c), in cm⁻¹ (imaginary modes as negative numbers);</item>
/// <item>Cartesian displacement x_i = q_i/√m_i normalised to unit length; reduced mass μ = 1 / Σ_i q_i²/m_i (amu);
/// force constant k = (2π c ν̃)² μ, in mdyn/Å, negative for imaginary modes.</item>
/// </list>
/// Constants are CODATA 2018 (<see cref="PhysicalConstants"/>).
/// </summary>
public static class FrequencyAnalysis
{
    /// <summary>
    /// cm⁻¹ per √(hartree / (bohr² amu)): √(E_h / (a₀² m_u)) / (2π c · 100 cm/m) ≈ 5140.487 (CODATA 2018).
    /// </summary>
    public static readonly double WavenumberPerSqrtAtomicEigenvalue =
        Math.Sqrt(PhysicalConstants.HartreeJoule / (PhysicalConstants.BohrMetre * PhysicalConstants.BohrMetre * PhysicalConstants.AtomicMassConstantKilogram))
        / (2.0 * Math.PI * PhysicalConstants.SpeedOfLightMetrePerSecond * 100.0);

    /// <summary>Description used in <see cref="VibrationalAnalysis.EigenSolver"/> for modes given directly.</summary>
    public const string GivenModesSolver = "none (modes given)";

    /// <summary>Description used in <see cref="VibrationalAnalysis.EigenSolver"/> for wavenumbers given directly.</summary>
    public const string GivenFrequenciesSolver = "none (frequencies given)";

    /// <summary>
    /// Vibrational analysis of a row-major 3N×3N Cartesian Hessian in hartree/bohr² (atom-major: x₁ y₁ z₁ x₂ …).
    /// Throws <see cref="HessianException"/> naming the problem: wrong size, a non-finite element (with its row and column),
    /// or asymmetry beyond <see cref="HessianOptions.AsymmetryToleranceHartreePerBohr2"/> (with the worst pair).
    /// </summary>
    public static VibrationalAnalysis FromHessian(Molecule molecule, double[] hessianHartreePerBohr2, HessianOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(molecule);
        ArgumentNullException.ThrowIfNull(hessianHartreePerBohr2);
        options ??= HessianOptions.Default;
        var n = 3 * molecule.AtomCount;
        if (molecule.AtomCount == 0) throw new HessianException(HessianProblem.EmptyMolecule, "The molecule has no atoms.", nameof(molecule));
        var masses = HessianPreparation.ResolveMasses(molecule, options);
        HessianPreparation.CheckSize(molecule, hessianHartreePerBohr2);

        var shape = RigidBodyProjection.ShapeOf(molecule, masses, options.LinearToleranceAmuAngstrom2);
        var invSqrtMass = new double[n];
        for (var i = 0; i < n; i++) invSqrtMass[i] = 1.0 / Math.Sqrt(masses[i / 3]);

        // The working matrix comes from the shared pool: for large n a fresh 3N×3N array costs more in page faults and GC than the
        // projection itself. Every element is overwritten before use, and nothing refers to it after the modes are copied out.
        var f = ArrayPool<double>.Shared.Rent(n * n);
        try
        {
            var scan = HessianPreparation.SymmetriseAndMassWeight(hessianHartreePerBohr2, n, invSqrtMass, f);
            if (scan.NonFiniteIndex >= 0)
            {
                var i = scan.NonFiniteIndex;
                throw new HessianException(HessianProblem.NonFinite,
                    $"Hessian element at row {i / n + 1}, column {i % n + 1} ({HessianPreparation.Coordinate(molecule, i / n)}, {HessianPreparation.Coordinate(molecule, i % n)}) is {hessianHartreePerBohr2[i]}.");
            }
            if (scan.WorstAsymmetry > options.AsymmetryToleranceHartreePerBohr2)
            {
                var (h, wi, wj) = (hessianHartreePerBohr2, scan.WorstRow, scan.WorstColumn);
                throw new HessianException(HessianProblem.Asymmetric,
                    $"Hessian is not symmetric: H[{wi + 1},{wj + 1}] = {h[wi * n + wj]:G6} but H[{wj + 1},{wi + 1}] = {h[wj * n + wi]:G6} " +
                    $"({HessianPreparation.Coordinate(molecule, wi)} / {HessianPreparation.Coordinate(molecule, wj)}), difference {scan.WorstAsymmetry:G3} hartree/bohr² exceeds the tolerance " +
                    $"{options.AsymmetryToleranceHartreePerBohr2:G3}.");
            }
            // The ∞-norm bounds the spectrum; the shift must lie above it.
            var shift = 2.0 * scan.NormInf + 1.0;

            var d = RigidBodyProjection.RigidBodyBasis(molecule, masses, shape);
            var k = d.Length / n;
            RigidBodyProjection.ProjectAndShift(f, n, d, k, shift);

            var eigenvalues = new double[n];
            var solver = SymmetricEigensolver.SolveInPlace(f, n, eigenvalues, options.Solver);

            // The k rigid-body eigenvalues sit at the shift, above every vibrational one (‖PFP‖₂ ≤ ‖F‖∞ < shift/2).
            for (var r = n - k; r < n; r++)
                if (Math.Abs(eigenvalues[r] - shift) > 1e-8 * shift)
                    throw new InvalidOperationException(
                        $"Projection of translations and rotations failed: eigenvalue {eigenvalues[r]:G6} where {shift:G6} was expected.");

            var modes = ImmutableArray.CreateBuilder<NormalMode>(n - k);
            var scratch = new double[n];
            for (var r = 0; r < n - k; r++)
                modes.Add(ModeFromEigenpair(eigenvalues[r], f.AsSpan(r * n, n), invSqrtMass, masses, scratch));
            return new VibrationalAnalysis(molecule, shape, modes.MoveToImmutable(), k, solver) { MassesAmu = [.. masses] };
        }
        finally
        {
            ArrayPool<double>.Shared.Return(f);
        }
    }

    /// <summary>
    /// As <see cref="FromHessian"/>, but returns false with the reason in <paramref name="error"/> instead of throwing for bad input.
    /// </summary>
    public static bool TryFromHessian(
        Molecule molecule, double[] hessian, out VibrationalAnalysis result, out string error, HessianOptions? options = null)
    {
        try
        {
            result = FromHessian(molecule, hessian, options);
            error = "";
            return true;
        }
        catch (ArgumentException ex)
        {
            result = null!;
            error = ex is HessianException ? ex.Message.Split(" (Parameter")[0] : ex.Message;
            return false;
        }
        catch (InvalidOperationException ex)
        {
            result = null!;
            error = ex.Message;
            return false;
        }
    }

    /// <summary>
    /// Analysis from normal modes given directly (for example read from a file). Modes are sorted ascending. If 3N modes are given,
    /// the 3, 5 or 6 with the smallest |ν̃| are taken to be translations and rotations and removed; otherwise at most 3N − 3/5/6
    /// modes are accepted. Each displacement must be empty or have one vector per atom.
    /// </summary>
    public static VibrationalAnalysis FromModes(Molecule molecule, IReadOnlyList<NormalMode> modes)
    {
        ArgumentNullException.ThrowIfNull(molecule);
        ArgumentNullException.ThrowIfNull(modes);
        for (var i = 0; i < modes.Count; i++)
        {
            var mode = modes[i] ?? throw new ArgumentException($"Mode {i + 1} is null.", nameof(modes));
            if (!double.IsFinite(mode.FrequencyCm1))
                throw new ArgumentException($"Mode {i + 1} has a non-finite wavenumber ({mode.FrequencyCm1}).", nameof(modes));
            if (!mode.DisplacementCartesian.IsDefaultOrEmpty && mode.DisplacementCartesian.Length != molecule.AtomCount)
                throw new ArgumentException(
                    $"Mode {i + 1} ({mode.FrequencyCm1:F1} cm⁻¹) has {mode.DisplacementCartesian.Length} displacement vectors for {molecule.AtomCount} atoms.",
                    nameof(modes));
        }
        var (shape, kept, removed) = RigidBodyProjection.DropRigidBodyModes(molecule, modes, nameof(modes));
        return new VibrationalAnalysis(molecule, shape, [.. kept.OrderBy(m => m.FrequencyCm1)], removed, GivenModesSolver);
    }

    /// <summary>
    /// Analysis from wavenumbers (cm⁻¹, imaginary as negative) given directly; the modes have empty displacements and unknown
    /// reduced masses and force constants. The same count rule as <see cref="FromModes"/> applies.
    /// </summary>
    public static VibrationalAnalysis FromFrequencies(Molecule molecule, IReadOnlyList<double> frequenciesCm1)
    {
        ArgumentNullException.ThrowIfNull(frequenciesCm1);
        var modes = frequenciesCm1.Select(v => new NormalMode(v, [])).ToArray();
        for (var i = 0; i < modes.Length; i++)
            if (!double.IsFinite(modes[i].FrequencyCm1))
                throw new ArgumentException($"Wavenumber {i + 1} is not finite ({modes[i].FrequencyCm1}).", nameof(frequenciesCm1));
        return FromModes(molecule, modes) with { EigenSolver = GivenFrequenciesSolver };
    }

    /// <summary>
    /// The Cartesian Hessian (row-major 3N×3N, hartree/bohr²) that has exactly these vibrational modes and zero curvature along
    /// translations and rotations: H = M^½ (Σ λ_r q_r q_rᵀ) M^½ with q_r = M^½ x_r / ‖M^½ x_r‖ and λ_r from ν̃_r.
    /// Every mode must carry its displacement.
    /// </summary>
    public static double[] ToCartesianHessian(VibrationalAnalysis analysis)
    {
        ArgumentNullException.ThrowIfNull(analysis);
        var n = 3 * analysis.Molecule.AtomCount;
        var masses = analysis.MassesAmu;
        var h = new double[n * n];
        var q = new double[n];
        foreach (var mode in analysis.Modes)
        {
            if (mode.DisplacementCartesian.Length != analysis.Molecule.AtomCount)
                throw new ArgumentException($"Mode {mode.FrequencyCm1:F1} cm⁻¹ has no displacement; the Hessian cannot be rebuilt.", nameof(analysis));
            var norm = 0.0;
            for (var i = 0; i < n; i++)
            {
                q[i] = Math.Sqrt(masses[i / 3]) * mode.DisplacementCartesian[i / 3][i % 3];
                norm += q[i] * q[i];
            }
            norm = Math.Sqrt(norm);
            var w = mode.FrequencyCm1 / WavenumberPerSqrtAtomicEigenvalue;
            var lambda = Math.Sign(w) * w * w;
            for (var i = 0; i < n; i++)
            {
                var ai = lambda * q[i] / (norm * norm) * Math.Sqrt(masses[i / 3]);
                for (var j = 0; j < n; j++) h[i * n + j] += ai * q[j] * Math.Sqrt(masses[j / 3]);
            }
        }
        return h;
    }

    /// <summary>Wavenumber in cm⁻¹ of a mass-weighted Hessian eigenvalue in hartree/(bohr² amu); negative for negative λ.</summary>
    public static double WavenumberCm1(double eigenvalueHartreePerBohr2Amu) =>
        Math.Sign(eigenvalueHartreePerBohr2Amu) * Math.Sqrt(Math.Abs(eigenvalueHartreePerBohr2Amu)) * WavenumberPerSqrtAtomicEigenvalue;

    private static NormalMode ModeFromEigenpair(double lambda, ReadOnlySpan<double> q, double[] invSqrtMass, double[] masses, double[] x)
    {
        var atoms = masses.Length;
        var norm2 = 0.0;
        var invMu = 0.0;
        for (var i = 0; i < x.Length; i++)
        {
            x[i] = q[i] * invSqrtMass[i];
            norm2 += x[i] * x[i];
            invMu += q[i] * q[i] / masses[i / 3];
        }
        var norm = Math.Sqrt(norm2);
        // Fix the arbitrary eigenvector sign: largest component positive, so results do not depend on the solver.
        var largest = 0;
        for (var i = 1; i < x.Length; i++) if (Math.Abs(x[i]) > Math.Abs(x[largest]) + 1e-12) largest = i;
        if (x[largest] < 0) norm = -norm;
        var disp = new Vec3[atoms];
        for (var a = 0; a < atoms; a++) disp[a] = new Vec3(x[3 * a] / norm, x[3 * a + 1] / norm, x[3 * a + 2] / norm);

        var nu = WavenumberCm1(lambda);
        var reducedMass = 1.0 / invMu;
        var omega = 2.0 * Math.PI * PhysicalConstants.SpeedOfLightMetrePerSecond * 100.0 * nu;
        var forceNewtonPerMetre = Math.Sign(nu) * omega * omega * reducedMass * PhysicalConstants.AtomicMassConstantKilogram;
        return new NormalMode(nu, ImmutableCollectionsMarshal.AsImmutableArray(disp), reducedMass, forceNewtonPerMetre);
    }
}
