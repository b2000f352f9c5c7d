using System.Text.Json;
using System.Text.Json.Serialization;

namespace BarrierLedger.Ledger.Derivation;

/// <summary>
/// One state's energies relative to the pathway's first state, per molecule in hartree (null when not available).
/// <see cref="EnergyCalculationIds"/> and <see cref="ThermalCalculationIds"/> name the calculations used.
/// </summary>
public sealed record DerivedState(int Position, string Label, string Kind, double? DeltaEHartree, double? DeltaHHartree, double? DeltaGHartree,
    IReadOnlyList<int> EnergyCalculationIds, IReadOnlyList<int> ThermalCalculationIds, string LevelOfTheory);

/// <summary>
/// One elementary step at a saddle-point state: barriers from the preceding minimum, reaction energy to the following minimum
/// (hartree), and the Eyring rate constant (s⁻¹, with κ) and half-life (s) at the model temperature.
/// </summary>
public sealed record DerivedStep(int SaddlePosition, string Label, string From, string? To, double? BarrierEHartree, double? BarrierHHartree,
    double? BarrierGHartree, double? ReactionGHartree, double? RateConstantPerSecond, double? HalfLifeSeconds, double? ImaginaryCm1,
    double TransmissionCoefficient, IReadOnlyList<ConsistencyReason> Reasons);

/// <summary>Why a barrier or reaction energy may mislead. Blocking reasons make the reaction inconsistent.</summary>
public sealed record ConsistencyReason(string Code, bool Blocking, string Message);

/// <summary>Stable codes of consistency reasons.</summary>
public static class ConsistencyCodes
{
    public const string FormulaDiffers = "consistency.formula-differs";
    public const string ChargeDiffers = "consistency.charge-differs";
    public const string ElectronsDiffer = "consistency.electrons-differ";
    public const string FormulaUnknown = "consistency.formula-unknown";
    public const string MixedLevels = "consistency.mixed-levels";
    public const string MissingEnergy = "consistency.missing-energy";
    public const string MissingThermal = "consistency.missing-thermal";
    public const string SpinChanges = "consistency.spin-changes";
    public const string ReportedThermal = "consistency.reported-thermal";
}

internal static class DerivedJson
{
    public static readonly JsonSerializerOptions Options = new(JsonSerializerDefaults.Web)
    {
        DefaultIgnoreCondition = JsonIgnoreCondition.Never,
        NumberHandling = JsonNumberHandling.AllowNamedFloatingPointLiterals,
    };

    public static string Write<T>(T value) => JsonSerializer.Serialize(value, Options);

    public static T Read<T>(string json) => JsonSerializer.Deserialize<T>(json, Options)
        ?? throw new InvalidDataException("Stored derived values are empty.");
}
