using System.Collections.Immutable;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Vibrations;

/// <summary>
/// One normal mode.
/// </summary>
/// <param name="FrequencyCm1">Harmonic wavenumber in cm⁻¹; negative for an imaginary mode (the trade writes 512i cm⁻¹ as −512).</param>
/// <param name="DisplacementCartesian">Cartesian displacement per atom (not mass-weighted), normalised to unit length over all 3N components.</param>
/// <param name="ReducedMassAmu">Reduced mass in amu, μ = 1 / Σᵢ qᵢ²/mᵢ for the unit mass-weighted eigenvector q (the usual output
/// convention; it refers to the unit Cartesian displacement, so for a diatomic it is μ_AB·M²/(m_A² + m_B²), not μ_AB); NaN when not known.</param>
/// <param name="ForceConstantMdynPerAngstrom">Force constant k = (2πcν̃)² μ along the unit Cartesian displacement, in mdyn/Å
/// (1 mdyn/Å = 100 N/m; negative for imaginary modes); NaN when not known.</param>
public sealed record NormalMode(
    double FrequencyCm1,
    ImmutableArray<Vec3> DisplacementCartesian,
    double ReducedMassAmu = double.NaN,
    double ForceConstantMdynPerAngstrom = double.NaN)
{
    /// <summary>True for a negative (imaginary) wavenumber.</summary>
    public bool IsImaginary => FrequencyCm1 < 0;
}
