using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Pathways;

namespace BarrierLedger.Ledger.Derivation;

/// <summary>One state of a pathway that is not stored yet, as the builder holds it: species ids with coefficients, the saddle point's calculation and its atom pairs (1-based).</summary>
public sealed record PreviewState(string Label, StateKind Kind, int? SaddleCalculationId, IReadOnlyList<(int SpeciesId, int Coefficient)> Terms,
    IReadOnlyList<(int A, int B)> Pairs);

/// <summary>What the derivation gives for a pathway that is not stored yet (the same numbers and reasons a stored one gets), and the model used.</summary>
public sealed record DerivedPreview(double? BarrierGibbsHartree, double? ReactionGibbsHartree, double? BarrierElectronicHartree, double? RateConstantPerSecond,
    double? HalfLifeSeconds, double TemperatureKelvin, string LevelOfTheory, bool Consistent, IReadOnlyList<CheckReason> Consistency,
    IReadOnlyList<DerivedState> States, IReadOnlyList<DerivedStep> Steps, ModelSettings Model);
