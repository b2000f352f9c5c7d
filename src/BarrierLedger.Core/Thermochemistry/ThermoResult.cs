using System.Collections.Immutable;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Thermochemistry;

/// <summary>
/// One degree-of-freedom class's share of the thermal properties (per mole; energies stored per molecule in hartree).
/// </summary>
/// <param name="ThermalEnergy">Internal energy U(T) − U(0 K, bottom of the well); for vibrations this includes the zero-point energy.</param>
/// <param name="EntropyJoulePerMoleKelvin">Entropy S in J mol⁻¹ K⁻¹.</param>
/// <param name="HeatCapacityJoulePerMoleKelvin">Constant-volume heat capacity C_V in J mol⁻¹ K⁻¹.</param>
public sealed record ThermoContribution(Energy ThermalEnergy, double EntropyJoulePerMoleKelvin, double HeatCapacityJoulePerMoleKelvin)
{
    /// <summary>No contribution (e.g. rotation of an atom).</summary>
    public static ThermoContribution None { get; } = new(Energy.Zero, 0.0, 0.0);
}

/// <summary>
/// Thermal corrections to add to an electronic energy (all <see cref="Energy"/> values per molecule, hartree inside):
/// E_tot = E_el + <see cref="ThermalEnergyCorrection"/>, H = E_el + <see cref="EnthalpyCorrection"/>, G = E_el + <see cref="GibbsCorrection"/>.
/// </summary>
/// <param name="Options">The options used.</param>
/// <param name="Shape">Atom, linear or non-linear, as detected.</param>
/// <param name="ZeroPointEnergy">Σ ½ h c ν̃ over the real modes (always harmonic, also under quasi-RRHO).</param>
/// <param name="ThermalEnergyCorrection">ZPE + translational + rotational + vibrational thermal energy.</param>
/// <param name="EnthalpyCorrection">Thermal energy + k_B T (pV of an ideal gas).</param>
/// <param name="GibbsCorrection">Enthalpy correction − T S.</param>
/// <param name="EntropyJoulePerMoleKelvin">Total entropy in J mol⁻¹ K⁻¹.</param>
/// <param name="Translational">Translational share (Sackur–Tetrode).</param>
/// <param name="Rotational">Rotational share (rigid rotor, classical limit, symmetry number σ).</param>
/// <param name="Vibrational">Vibrational share (harmonic or quasi-RRHO), ZPE included in its energy.</param>
/// <param name="Electronic">Electronic share: S = R ln(2S+1), no excited states.</param>
/// <param name="ExcludedImaginaryFrequenciesCm1">Imaginary (negative) wavenumbers left out of every sum, as given.</param>
/// <param name="ReferencePressurePascal">Pressure of the translational partition function (from the standard state).</param>
/// <param name="Notes">Plain-language warnings about what the numbers leave out (imaginary or very low modes, unusual σ).</param>
public sealed record ThermoResult(
    ThermoOptions Options,
    MolecularShape Shape,
    Energy ZeroPointEnergy,
    Energy ThermalEnergyCorrection,
    Energy EnthalpyCorrection,
    Energy GibbsCorrection,
    double EntropyJoulePerMoleKelvin,
    ThermoContribution Translational,
    ThermoContribution Rotational,
    ThermoContribution Vibrational,
    ThermoContribution Electronic,
    ImmutableArray<double> ExcludedImaginaryFrequenciesCm1,
    double ReferencePressurePascal,
    ImmutableArray<string> Notes)
{
    /// <summary>T·S per molecule.</summary>
    public Energy TemperatureTimesEntropy => EnthalpyCorrection - GibbsCorrection;

    /// <summary>Total constant-volume heat capacity in J mol⁻¹ K⁻¹.</summary>
    public double HeatCapacityJoulePerMoleKelvin =>
        Translational.HeatCapacityJoulePerMoleKelvin + Rotational.HeatCapacityJoulePerMoleKelvin
        + Vibrational.HeatCapacityJoulePerMoleKelvin + Electronic.HeatCapacityJoulePerMoleKelvin;
}
