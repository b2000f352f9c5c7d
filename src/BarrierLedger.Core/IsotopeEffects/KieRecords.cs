using System.Collections.Immutable;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Core.Units;
using BarrierLedger.Core.Vibrations;

namespace BarrierLedger.Core.IsotopeEffects;

/// <summary>Which tunnelling correction multiplies each isotopologue's rate constant in <see cref="KineticIsotopeEffect.Compute"/>.</summary>
public enum KieTunnelling
{
    /// <summary>No tunnelling (κ = 1 for both).</summary>
    None,
    /// <summary>Wigner, κ = 1 + u²/24 with each isotopologue's own imaginary frequency (<see cref="Kinetics.Tunnelling.Wigner"/>).</summary>
    Wigner,
    /// <summary>Bell's truncated parabola (<see cref="Kinetics.Tunnelling.Bell"/>) with each isotopologue's own zero-point-corrected barrier.</summary>
    Bell,
    /// <summary>Skodje–Truhlar (<see cref="Kinetics.Tunnelling.SkodjeTruhlar"/>) with each isotopologue's own zero-point-corrected barrier.</summary>
    SkodjeTruhlar,
}

/// <summary>
/// One structure of the step (the saddle point, or one reactant species that carries substituted atoms) with its stored Cartesian
/// Hessian and the substitutions that make the other isotopologue. Species without a substituted atom cancel from the ratio and
/// are left out.
/// </summary>
/// <param name="Label">How the structure is named on screen ("TS1", "A").</param>
/// <param name="Molecule">Geometry (Å), elements, charge and multiplicity.</param>
/// <param name="HessianHartreePerBohr2">Row-major 3N×3N Cartesian Hessian in hartree/bohr², as stored.</param>
/// <param name="Substitutions">Atoms (1-based, this structure's numbering) and their isotopes in the substituted isotopologue.</param>
/// <param name="SymmetryNumber">Rotational symmetry number σ of the parent isotopologue.</param>
/// <param name="SubstitutedSymmetryNumber">σ of the substituted isotopologue when the substitution lowers the symmetry (CH₄ 12 → CH₃D 3);
/// null for the same σ.</param>
public sealed record KieStructure(
    string Label,
    Molecule Molecule,
    double[] HessianHartreePerBohr2,
    ImmutableArray<IsotopeSubstitution> Substitutions,
    int SymmetryNumber = 1,
    int? SubstitutedSymmetryNumber = null);

/// <summary>
/// Settings of a kinetic-isotope-effect calculation: those of the energy model in force, plus what the tunnelling corrections need.
/// </summary>
/// <param name="TemperatureKelvin">T in K.</param>
/// <param name="Treatment">Low-mode treatment of the energy model (RRHO or quasi-RRHO), applied to each isotopologue's own modes.</param>
/// <param name="QuasiRrhoCutoffCm1">ω₀ of the quasi-RRHO damping function.</param>
/// <param name="Tunnelling">The correction that enters the headline KIE (the energy model's).</param>
/// <param name="ZeroPointBarrier">The parent's forward barrier with zero-point energies, V₀ = ΔE‡ + ΔZPE‡ per molecule (from the stored
/// derivation), for Bell and Skodje–Truhlar; the substituted isotopologue's V₀ is shifted by its own zero-point-energy change. Null when
/// not known: Bell then uses the infinite parabola and Skodje–Truhlar is not offered.</param>
/// <param name="ZeroPointReverseBarrier">The parent's reverse barrier with zero-point energies, for Skodje–Truhlar's endoergic case; null
/// to treat the step as not endoergic (said in the notes).</param>
/// <param name="BellTerms">Terms of Bell's series kept (<see cref="Kinetics.Tunnelling.BellDefaultTerms"/>).</param>
/// <param name="Solver">Eigensolver for the vibrational analyses (the same choice as every other frequency analysis).</param>
public sealed record KieOptions(
    double TemperatureKelvin = 298.15,
    ThermoTreatment Treatment = ThermoTreatment.Rrho,
    double QuasiRrhoCutoffCm1 = QuasiRrho.DefaultCutoffCm1,
    KieTunnelling Tunnelling = KieTunnelling.None,
    Energy? ZeroPointBarrier = null,
    Energy? ZeroPointReverseBarrier = null,
    int BellTerms = Kinetics.Tunnelling.BellDefaultTerms,
    EigenSolverChoice Solver = EigenSolverChoice.Auto);

/// <summary>
/// One structure's two isotopologues and its share of the KIE: every ratio is parent ÷ substituted.
/// </summary>
/// <param name="Label">As in <see cref="KieStructure.Label"/>.</param>
/// <param name="IsSaddlePoint">True for the saddle point (its factors go in the numerator of the KIE).</param>
/// <param name="Parent">Vibrational analysis with the parent masses.</param>
/// <param name="Substituted">Vibrational analysis of the same Hessian with the substituted masses (re-projected, same eigensolver).</param>
/// <param name="TranslationRotationRatio">(M_p/M_s)^{3/2} × (I_A I_B I_C)_p^{1/2}/(I_A I_B I_C)_s^{1/2} (non-linear; I_p/I_s linear).</param>
/// <param name="SymmetryRatio">σ_s/σ_p (q_rot ∝ 1/σ).</param>
/// <param name="ZeroPointRatio">exp[−(ZPE_p − ZPE_s)/k_B T], real modes only.</param>
/// <param name="ExcitationRatio">Π (1 − e^{−u_s}) / Π (1 − e^{−u_p}), u = h c ν̃ / k_B T, real modes only.</param>
/// <param name="FrequencyProductRatio">Π ν̃_p/ν̃_s over the real modes (the vibrational product's share).</param>
/// <param name="ProductRuleDeviation">|Π(ν̃_s/ν̃_p) ÷ [Π_atoms (m_p/m_s)^{3/2} (M_s/M_p)^{3/2} (I_s/I_p)] − 1| over all 3N − 6 (5) modes:
/// the Redlich–Teller product rule, 0 for an exactly invariant Hessian.</param>
/// <param name="ThermoParent">Thermal corrections of the parent under the model's treatment.</param>
/// <param name="ThermoSubstituted">Thermal corrections of the substituted isotopologue under the model's treatment.</param>
public sealed record KieStructureResult(
    string Label,
    bool IsSaddlePoint,
    VibrationalAnalysis Parent,
    VibrationalAnalysis Substituted,
    double TranslationRotationRatio,
    double SymmetryRatio,
    double ZeroPointRatio,
    double ExcitationRatio,
    double FrequencyProductRatio,
    double ProductRuleDeviation,
    ThermoResult ThermoParent,
    ThermoResult ThermoSubstituted);

/// <summary>A tunnelling correction's κ for both isotopologues and their ratio; <see cref="Note"/> says why one is missing.</summary>
public sealed record KieTunnellingFactor(KieTunnelling Correction, string Description, double? KappaParent, double? KappaSubstituted, string? Note)
{
    /// <summary>κ_p/κ_s, or null when the correction does not apply.</summary>
    public double? Ratio => KappaParent is { } p && KappaSubstituted is { } s ? p / s : null;
}

/// <summary>
/// A kinetic isotope effect k_parent/k_substituted and its Bigeleisen–Mayer factorisation:
/// KIE = SYM × MMI × ZPE × EXC × LOW × TUN, with MMI = (ν̃‡_p/ν̃‡_s) × VP by the Redlich–Teller product rule.
/// </summary>
/// <param name="Options">The settings used.</param>
/// <param name="Kie">k_p/k_s with every factor (the headline number).</param>
/// <param name="KieWithoutTunnelling">k_p/k_s of transition-state theory under the model's treatment: exp(−ΔΔG‡/RT).</param>
/// <param name="SymmetryFactor">Ratio of symmetry numbers (1 unless a substitution changes σ).</param>
/// <param name="MassMomentFactor">MMI: translational and rotational partition-function ratios, saddle point over reactants.</param>
/// <param name="ZeroPointFactor">ZPE: zero-point-energy factor, saddle point over reactants.</param>
/// <param name="ExcitationFactor">EXC: vibrational excitation factor, saddle point over reactants.</param>
/// <param name="LowModeFactor">LOW: what the model's quasi-RRHO treatment changes against RRHO (exactly 1 under RRHO up to round-off).</param>
/// <param name="TunnellingFactor">TUN: κ_p/κ_s of the model's correction (1 without).</param>
/// <param name="ImaginaryFrequencyRatio">ν̃‡_p/ν̃‡_s of the reaction-coordinate mode.</param>
/// <param name="VibrationalProductFactor">VP: Π(ν̃_p/ν̃_s) over the saddle point's real modes ÷ the same over the reactants' modes.</param>
/// <param name="ImaginaryParentCm1">|ν̃‡| of the parent in cm⁻¹.</param>
/// <param name="ImaginarySubstitutedCm1">|ν̃‡| of the substituted isotopologue in cm⁻¹.</param>
/// <param name="TunnellingFactors">Wigner, Bell and Skodje–Truhlar side by side (the model's choice is <see cref="TunnellingFactor"/>).</param>
/// <param name="Structures">Per-structure results: the saddle point first, then the reactants.</param>
/// <param name="ProductRuleWorstDeviation">Largest <see cref="KieStructureResult.ProductRuleDeviation"/>.</param>
/// <param name="Notes">Plain-language statements and warnings.</param>
public sealed record KieResult(
    KieOptions Options,
    double Kie,
    double KieWithoutTunnelling,
    double SymmetryFactor,
    double MassMomentFactor,
    double ZeroPointFactor,
    double ExcitationFactor,
    double LowModeFactor,
    double TunnellingFactor,
    double ImaginaryFrequencyRatio,
    double VibrationalProductFactor,
    double ImaginaryParentCm1,
    double ImaginarySubstitutedCm1,
    ImmutableArray<KieTunnellingFactor> TunnellingFactors,
    ImmutableArray<KieStructureResult> Structures,
    double ProductRuleWorstDeviation,
    ImmutableArray<string> Notes)
{
    /// <summary>The semiclassical RRHO KIE of Bigeleisen and Mayer: SYM × MMI × ZPE × EXC.</summary>
    public double SemiclassicalKie => SymmetryFactor * MassMomentFactor * ZeroPointFactor * ExcitationFactor;
}
