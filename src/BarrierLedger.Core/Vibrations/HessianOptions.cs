namespace BarrierLedger.Core.Vibrations;

/// <summary>Which symmetric eigensolver diagonalises the mass-weighted Hessian.</summary>
public enum EigenSolverChoice
{
    /// <summary>Native LAPACK <c>dsyevd</c> from OpenBLAS when it can be loaded, else the managed MathNet solver.</summary>
    Auto,
    /// <summary>Native LAPACK only; fails when <c>libopenblas.so.0</c> cannot be loaded.</summary>
    Native,
    /// <summary>MathNet.Numerics managed <c>Evd</c> only.</summary>
    Managed,
}

/// <summary>
/// Options for <see cref="FrequencyAnalysis.FromHessian"/>.
/// </summary>
/// <param name="AsymmetryToleranceHartreePerBohr2">
/// Largest |H_ij − H_ji| accepted before symmetrising, in hartree/bohr². Default 1e-3 (common practice, no source:
/// finite-difference Hessians are asymmetric by 10⁻⁶–10⁻⁴; a transposed block or a wrong atom order gives 10⁻² and more).
/// </param>
/// <param name="Solver">Eigensolver to use; see <see cref="EigenSolverChoice"/>.</param>
/// <param name="MassesAmu">Atomic masses in amu, one per atom, for isotopologues; null for the most abundant isotopes.</param>
/// <param name="LinearToleranceAmuAngstrom2">Smallest principal moment (amu·Å²) up to which the structure counts as linear.</param>
public sealed record HessianOptions(
    double AsymmetryToleranceHartreePerBohr2 = 1e-3,
    EigenSolverChoice Solver = EigenSolverChoice.Auto,
    IReadOnlyList<double>? MassesAmu = null,
    double LinearToleranceAmuAngstrom2 = Geometry.Inertia.DefaultLinearToleranceAmuAngstrom2)
{
    /// <summary>Default options: tolerance 10⁻³ hartree/bohr², automatic solver, isotope masses.</summary>
    public static HessianOptions Default { get; } = new();
}
