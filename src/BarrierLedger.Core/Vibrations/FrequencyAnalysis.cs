using System.Buffers;
using System.Collections.Immutable;
using System.Numerics;
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
        var masses = ResolveMasses(molecule, options);
        CheckSize(molecule, hessianHartreePerBohr2);

        var shape = ShapeOf(molecule, masses, options.LinearToleranceAmuAngstrom2);
        var invSqrtMass = new double[n];
        for (var i = 0; i < n; i++) invSqrtMass[i] = 1.0 / Math.Sqrt(masses[i / 3]);

        // The working matrix comes from the shared pool: for large n a fresh 3N×3N array costs more in page faults and GC than the
        // projection itself. Every element is overwritten before use, and nothing refers to it after the modes are copied out.
        var f = ArrayPool<double>.Shared.Rent(n * n);
        try
        {
            var scan = SymmetriseAndMassWeight(hessianHartreePerBohr2, n, invSqrtMass, f);
            if (scan.NonFiniteIndex >= 0)
            {
                var i = scan.NonFiniteIndex;
                throw new HessianException(HessianProblem.NonFinite,
                    $"Hessian element at row {i / n + 1}, column {i % n + 1} ({Coordinate(molecule, i / n)}, {Coordinate(molecule, i % n)}) is {hessianHartreePerBohr2[i]}.");
            }
            if (scan.WorstAsymmetry > options.AsymmetryToleranceHartreePerBohr2)
            {
                var (h, wi, wj) = (hessianHartreePerBohr2, scan.WorstRow, scan.WorstColumn);
                throw new HessianException(HessianProblem.Asymmetric,
                    $"Hessian is not symmetric: H[{wi + 1},{wj + 1}] = {h[wi * n + wj]:G6} but H[{wj + 1},{wi + 1}] = {h[wj * n + wi]:G6} " +
                    $"({Coordinate(molecule, wi)} / {Coordinate(molecule, wj)}), difference {scan.WorstAsymmetry:G3} hartree/bohr² exceeds the tolerance " +
                    $"{options.AsymmetryToleranceHartreePerBohr2:G3}.");
            }
            // The ∞-norm bounds the spectrum; the shift must lie above it.
            var shift = 2.0 * scan.NormInf + 1.0;

            var d = RigidBodyBasis(molecule, masses, shape);
            var k = d.Length / n;
            ProjectAndShift(f, n, d, k, shift);

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
        var (shape, kept, removed) = DropRigidBodyModes(molecule, modes, nameof(modes));
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
        return new NormalMode(nu, ImmutableCollectionsMarshal.AsImmutableArray(disp), reducedMass, forceNewtonPerMetre / 100.0);
    }

    /// <summary>
    /// Rows of the orthonormal k×3N basis of mass-weighted translations and rotations, row-major in one array.
    /// </summary>
    private static double[] RigidBodyBasis(Molecule molecule, double[] masses, MolecularShape shape)
    {
        var atoms = molecule.AtomCount;
        var n = 3 * atoms;
        var vectors = new List<double[]>();
        for (var alpha = 0; alpha < 3; alpha++)
        {
            var t = new double[n];
            for (var a = 0; a < atoms; a++) t[3 * a + alpha] = Math.Sqrt(masses[a]);
            vectors.Add(t);
        }
        if (shape != MolecularShape.Atom)
        {
            var com = Inertia.CentreOfMass(molecule, masses);
            var (_, axes) = Inertia.PrincipalAxes(molecule, masses);
            // For a linear molecule the axis with the smallest moment is the molecular axis: no rotation about it.
            for (var p = shape == MolecularShape.Linear ? 1 : 0; p < 3; p++)
            {
                var r = new double[n];
                for (var a = 0; a < atoms; a++)
                {
                    var v = axes[p].Cross(molecule.PositionsAngstrom[a] - com) * Math.Sqrt(masses[a]);
                    r[3 * a] = v.X;
                    r[3 * a + 1] = v.Y;
                    r[3 * a + 2] = v.Z;
                }
                vectors.Add(r);
            }
        }
        // Modified Gram–Schmidt, twice (the vectors are orthogonal in exact arithmetic; this removes round-off).
        for (var pass = 0; pass < 2; pass++)
            for (var c = 0; c < vectors.Count; c++)
            {
                var v = vectors[c];
                for (var b = 0; b < c; b++)
                {
                    var dot = Dot(v, vectors[b]);
                    for (var i = 0; i < n; i++) v[i] -= dot * vectors[b][i];
                }
                var norm = Math.Sqrt(Dot(v, v));
                if (norm < 1e-8)
                    throw new InvalidOperationException($"Rigid-body motion {c + 1} vanishes for a {shape} structure; the geometry may have coincident atoms.");
                for (var i = 0; i < n; i++) v[i] /= norm;
            }
        var d = new double[vectors.Count * n];
        for (var c = 0; c < vectors.Count; c++) vectors[c].CopyTo(d, c * n);
        return d;
    }

    /// <summary>In place: F ← F − Dᵀ Wᵀ − W D with G = F Dᵀ, M = D G + s·1, W = G − ½ Dᵀ M (a rank-2k update, O(n²k)).</summary>
    private static void ProjectAndShift(double[] f, int n, double[] d, int k, double shift)
    {
        // G (n×k), row-major: G[i,c] = Σ_j F[i,j] D[c,j]
        var g = new double[n * k];
        for (var i = 0; i < n; i++)
        {
            var row = f.AsSpan(i * n, n);
            for (var c = 0; c < k; c++) g[i * k + c] = Dot(row, d.AsSpan(c * n, n));
        }
        // M (k×k) = D G + s·1
        var m = new double[k * k];
        for (var c = 0; c < k; c++)
            for (var e = 0; e < k; e++)
            {
                var sum = 0.0;
                for (var i = 0; i < n; i++) sum += d[c * n + i] * g[i * k + e];
                m[c * k + e] = sum + (c == e ? shift : 0.0);
            }
        // Symmetrise M against round-off.
        for (var c = 0; c < k; c++)
            for (var e = c + 1; e < k; e++)
                m[c * k + e] = m[e * k + c] = 0.5 * (m[c * k + e] + m[e * k + c]);
        // W (n×k) = G − ½ Dᵀ M, stored transposed (k×n) so the update loop reads rows contiguously.
        var wt = new double[k * n];
        for (var i = 0; i < n; i++)
            for (var c = 0; c < k; c++)
            {
                var sum = 0.0;
                for (var e = 0; e < k; e++) sum += d[e * n + i] * m[e * k + c];
                wt[c * n + i] = g[i * k + c] - 0.5 * sum;
            }
        // F[i,j] −= Σ_c D[c,i] W[j,c] + W[i,c] D[c,j]
        Span<double> di = stackalloc double[k];
        Span<double> wi = stackalloc double[k];
        for (var i = 0; i < n; i++)
        {
            for (var c = 0; c < k; c++) { di[c] = d[c * n + i]; wi[c] = wt[c * n + i]; }
            var row = f.AsSpan(i * n, n);
            for (var c = 0; c < k; c++)
            {
                SubtractTwo(row, di[c], wt.AsSpan(c * n, n), wi[c], d.AsSpan(c * n, n));
            }
        }
    }

    private static double Dot(ReadOnlySpan<double> a, ReadOnlySpan<double> b)
    {
        var i = 0;
        var sum = 0.0;
        if (Vector.IsHardwareAccelerated && a.Length >= 2 * Vector<double>.Count)
        {
            var acc = Vector<double>.Zero;
            var va = MemoryMarshal.Cast<double, Vector<double>>(a);
            var vb = MemoryMarshal.Cast<double, Vector<double>>(b);
            for (var v = 0; v < va.Length; v++) acc += va[v] * vb[v];
            sum = Vector.Sum(acc);
            i = va.Length * Vector<double>.Count;
        }
        for (; i < a.Length; i++) sum += a[i] * b[i];
        return sum;
    }

    /// <summary>row[j] −= a·x[j] + b·y[j].</summary>
    private static void SubtractTwo(Span<double> row, double a, ReadOnlySpan<double> x, double b, ReadOnlySpan<double> y)
    {
        var j = 0;
        if (Vector.IsHardwareAccelerated && row.Length >= 2 * Vector<double>.Count)
        {
            var vr = MemoryMarshal.Cast<double, Vector<double>>(row);
            var vx = MemoryMarshal.Cast<double, Vector<double>>(x);
            var vy = MemoryMarshal.Cast<double, Vector<double>>(y);
            var va = new Vector<double>(a);
            var vbb = new Vector<double>(b);
            for (var v = 0; v < vr.Length; v++) vr[v] -= va * vx[v] + vbb * vy[v];
            j = vr.Length * Vector<double>.Count;
        }
        for (; j < row.Length; j++) row[j] -= a * x[j] + b * y[j];
    }

    private static double[] ResolveMasses(Molecule molecule, HessianOptions options)
    {
        if (options.MassesAmu is null) return Inertia.MassesAmu(molecule);
        if (options.MassesAmu.Count != molecule.AtomCount)
            throw new HessianException(HessianProblem.BadMasses, $"{options.MassesAmu.Count} masses given for {molecule.AtomCount} atoms.", nameof(options));
        for (var i = 0; i < molecule.AtomCount; i++)
            if (!(options.MassesAmu[i] > 0) || !double.IsFinite(options.MassesAmu[i]))
                throw new HessianException(HessianProblem.BadMasses,
                    $"Mass of atom {molecule.AtomLabel(i)} must be positive and finite, got {options.MassesAmu[i]}.", nameof(options));
        return [.. options.MassesAmu];
    }

    private static void CheckSize(Molecule molecule, double[] h)
    {
        var n = 3 * molecule.AtomCount;
        if (h.Length == n * n) return;
        var side = Math.Sqrt(h.Length);
        var hint = side == Math.Floor(side) ? $" (a {side}×{side} matrix, which fits {side / 3:0.##} atoms)" : "";
        throw new HessianException(HessianProblem.SizeMismatch,
            $"Hessian has {h.Length} elements{hint}, but {molecule.AtomCount} atoms need 3N×3N = {n}×{n} = {n * n}.");
    }

    private readonly record struct HessianScan(double WorstAsymmetry, int WorstRow, int WorstColumn, int NonFiniteIndex, double NormInf);

    /// <summary>
    /// F_ij = F_ji = ½(H_ij + H_ji)/√(m_i m_j) into <paramref name="f"/>, and in the same pass the largest |H_ij − H_ji| with its
    /// position, the first non-finite element and the ∞-norm of F. Works on 32×32 tiles of the upper triangle: reading H column-wise
    /// element by element would miss the cache on every access for large n.
    /// </summary>
    private static HessianScan SymmetriseAndMassWeight(double[] h, int n, double[] invSqrtMass, double[] f)
    {
        const int tile = 32;
        var worst = 0.0;
        var (worstRow, worstColumn) = (0, 0);
        var nonFinite = -1;
        var rowSums = new double[n];
        for (var bi = 0; bi < n; bi += tile)
        {
            var iEnd = Math.Min(bi + tile, n);
            for (var bj = bi; bj < n; bj += tile)
            {
                var jEnd = Math.Min(bj + tile, n);
                for (var i = bi; i < iEnd; i++)
                {
                    var rowI = i * n;
                    var wI = 0.5 * invSqrtMass[i];
                    var sumI = 0.0;
                    for (var j = bj == bi ? i : bj; j < jEnd; j++)
                    {
                        var a = h[rowI + j];
                        var b = h[j * n + i];
                        if (!double.IsFinite(a) || !double.IsFinite(b))
                        {
                            var index = double.IsFinite(a) ? j * n + i : rowI + j;
                            if (nonFinite < 0 || index < nonFinite) nonFinite = index;
                            continue;
                        }
                        var diff = Math.Abs(a - b);
                        if (diff > worst) { worst = diff; worstRow = i; worstColumn = j; }
                        var v = (a + b) * wI * invSqrtMass[j];
                        f[rowI + j] = v;
                        f[j * n + i] = v;
                        var abs = Math.Abs(v);
                        sumI += abs;
                        if (j != i) rowSums[j] += abs;
                    }
                    rowSums[i] += sumI;
                }
            }
        }
        return new HessianScan(worst, worstRow, worstColumn, nonFinite, rowSums.Length == 0 ? 0.0 : rowSums.Max());
    }

    private static string Coordinate(Molecule m, int index) => $"{m.AtomLabel(index / 3)} {"xyz"[index % 3]}";

    private static MolecularShape ShapeOf(Molecule molecule, double[] masses, double linearTolerance)
    {
        if (molecule.AtomCount == 1) return MolecularShape.Atom;
        var (moments, _) = Inertia.PrincipalAxes(molecule, masses);
        return moments[0] <= linearTolerance ? MolecularShape.Linear : MolecularShape.NonLinear;
    }

    private static (MolecularShape Shape, IReadOnlyList<NormalMode> Kept, int Removed) DropRigidBodyModes(
        Molecule molecule, IReadOnlyList<NormalMode> modes, string paramName)
    {
        if (molecule.AtomCount == 0) throw new ArgumentException("The molecule has no atoms.", nameof(molecule));
        var shape = Inertia.Shape(molecule);
        var external = Inertia.ExternalDegreesOfFreedom(shape);
        var n = 3 * molecule.AtomCount;
        if (modes.Count == n)
        {
            var byMagnitude = modes.OrderBy(m => Math.Abs(m.FrequencyCm1)).ToArray();
            return (shape, byMagnitude[external..], external);
        }
        if (modes.Count > n - external)
            throw new ArgumentException(
                $"{modes.Count} modes given for a {shape} structure of {molecule.AtomCount} atoms: expected at most 3N − {external} = {n - external} " +
                $"vibrations, or all 3N = {n} including translations and rotations.", paramName);
        return (shape, modes, 0);
    }
}
