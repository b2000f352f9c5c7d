namespace BarrierLedger.Ledger.Derivation;

/// <summary>
/// One elementary step minimum → saddle point → minimum (Core <c>PathwayEnergies</c>): barriers from the minimum before, reaction
/// energies to the minimum after (hartree), molecularity, the Eyring rate constant in <see cref="RateConstantUnit"/> with κ, and
/// the half-life (s) for a unimolecular step, at the model temperature.
/// </summary>
public sealed record DerivedStep(int SaddlePosition, string Label, string From, string To, double BarrierEHartree, double? BarrierGHartree,
    double ReactionEHartree, double? ReactionGHartree, int Molecularity, double? RateConstant, string RateConstantUnit, double? HalfLifeSeconds,
    double? ImaginaryCm1, double TransmissionCoefficient, double? BarrierHHartree = null);
