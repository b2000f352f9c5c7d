using System.Collections.Immutable;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Vibrations;

/// <summary>
/// One normal mode.
/// </summary>
/// <param name="FrequencyCm1">Harmonic wavenumber in cm⁻¹; negative for an imaginary mode (the trade writes 512i cm⁻¹ as −512).</param>
/// <param name="DisplacementCartesian">Cartesian displacement per atom (not mass-weighted), normalised to unit length over all 3N components.</param>
/// <param name="ReducedMassDalton">Reduced mass in daltons (Da, the unified atomic mass unit), μ = 1 / Σᵢ qᵢ²/mᵢ for the unit
/// mass-weighted eigenvector q; it refers to the unit Cartesian displacement, so for a diatomic it is μ_AB·M²/(m_A² + m_B²), not μ_AB.
/// NaN when not known.</param>
/// <param name="ForceConstantNewtonPerMetre">Force constant k = (2πcν̃)² μ along the unit Cartesian displacement, in N/m (SI);
/// negative for imaginary modes; NaN when not known.</param>
public sealed record NormalMode(
    double FrequencyCm1,
    ImmutableArray<Vec3> DisplacementCartesian,
    double ReducedMassDalton = double.NaN,
    double ForceConstantNewtonPerMetre = double.NaN)
{
    /// <summary>True for a negative (imaginary) wavenumber.</summary>
    public bool IsImaginary => FrequencyCm1 < 0;
}
