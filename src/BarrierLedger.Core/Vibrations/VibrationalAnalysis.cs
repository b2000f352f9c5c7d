using System.Collections.Immutable;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Vibrations;

/// <summary>
/// The vibrational modes of one structure.
/// </summary>
/// <param name="Molecule">The structure the modes belong to.</param>
/// <param name="Shape">Atom, linear or non-linear (decides 3, 5 or 6 rigid-body degrees of freedom).</param>
/// <param name="Modes">Vibrations only (translations and rotations removed), ascending by wavenumber, so imaginary modes
/// (negative wavenumbers) come first.</param>
/// <param name="RemovedModeCount">How many rigid-body (translation/rotation) modes were removed: 3, 5 or 6 from a Hessian,
/// 0 when the modes were given without them.</param>
/// <param name="EigenSolver">Which eigensolver produced the modes, or how they were given.</param>
public sealed record VibrationalAnalysis(
    Molecule Molecule,
    MolecularShape Shape,
    ImmutableArray<NormalMode> Modes,
    int RemovedModeCount,
    string EigenSolver)
{
    /// <summary>Atomic masses (amu) used for mass-weighting, one per atom; the most abundant isotopes unless overridden.</summary>
    public ImmutableArray<double> MassesAmu { get; init; } = [.. Inertia.MassesAmu(Molecule)];

    /// <summary>Modes with a negative (imaginary) wavenumber, most negative first.</summary>
    public ImmutableArray<NormalMode> ImaginaryModes => [.. Modes.Where(m => m.IsImaginary)];

    /// <summary>Wavenumbers (cm⁻¹) of the modes that are not imaginary, ascending.</summary>
    public ImmutableArray<double> RealFrequenciesCm1 => [.. Modes.Where(m => !m.IsImaginary).Select(m => m.FrequencyCm1)];

    /// <summary>All wavenumbers in cm⁻¹, ascending, imaginary as negative numbers.</summary>
    public ImmutableArray<double> FrequenciesCm1 => [.. Modes.Select(m => m.FrequencyCm1)];
}
