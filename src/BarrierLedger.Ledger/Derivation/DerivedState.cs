namespace BarrierLedger.Ledger.Derivation;

/// <summary>
/// One state's energies relative to the pathway's first state, per molecule in hartree (null when not available).
/// <see cref="EnergyCalculationIds"/> and <see cref="ThermalCalculationIds"/> name the calculations used; <see cref="Terms"/>
/// gives each species' own values as the derivation used them (null in values stored before they were kept).
/// </summary>
public sealed record DerivedState(int Position, string Label, string Kind, double? DeltaEHartree, double? DeltaHHartree, double? DeltaGHartree,
    IReadOnlyList<int> EnergyCalculationIds, IReadOnlyList<int> ThermalCalculationIds, string LevelOfTheory, IReadOnlyList<DerivedTerm>? Terms = null);

/// <summary>
/// One species of a state as the derivation used it (hartree per molecule): its electronic energy and the calculation it came
/// from; the thermal correction applied (zero-point, enthalpy and Gibbs corrections, where it came from: "computed (…)" or
/// "reported") and its calculation, or nulls when there is none; the point group and σ used; for a species with several
/// conformers, which made its energies ("conformer c2 (lowest of 3)", "ensemble of 3 conformers (…)"; the calculations named
/// are those of its lowest conformer), else null.
/// </summary>
public sealed record DerivedTerm(int SpeciesId, string Label, int Coefficient, int EnergyCalculationId, double ElectronicHartree, string LevelOfTheory,
    int? ThermalCalculationId, double? ZeroPointHartree, double? EnthalpyCorrectionHartree, double? GibbsCorrectionHartree, string? ThermalSource,
    string? PointGroup, int SymmetryNumber, string? Conformer = null);
