using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Ledger.Records;

/// <summary>The tunnelling correction that multiplies each Eyring rate constant: none (κ from the model alone), or Wigner's
/// κ from the saddle point's imaginary frequency (<see cref="Core.Kinetics.Tunnelling.Wigner"/>).</summary>
public enum TunnellingCorrection
{
    None,
    Wigner,
}

/// <summary>
/// Which calculations supply the energies and the thermal corrections, at what temperature and standard state, with which
/// treatment, shown in which unit, checked with which thresholds. One group default (StudyId null) plus per-study overrides.
/// </summary>
public class EnergyModel : IVersioned
{
    public int Id { get; set; }
    /// <summary>Null for the group default.</summary>
    public int? StudyId { get; set; }
    /// <summary>Level of theory whose electronic energies are used (its energy part); empty: each state's own calculation.</summary>
    public string EnergyLevel { get; set; } = "";
    /// <summary>Level of theory whose frequencies give the thermal corrections; empty: any calculation of the species with frequencies.</summary>
    public string ThermalLevel { get; set; } = "";
    public double TemperatureKelvin { get; set; } = 298.15;
    public StandardState StandardState { get; set; } = StandardState.Solution1Molar;
    public ThermoTreatment Treatment { get; set; } = ThermoTreatment.QuasiRrhoEntropy;
    public double QuasiRrhoCutoffCm1 { get; set; } = 100.0;
    public TunnellingCorrection Tunnelling { get; set; } = TunnellingCorrection.None;
    public EnergyUnit DisplayUnit { get; set; } = EnergyUnit.KcalPerMol;
    /// <summary>An imaginary mode at or above this |ν̃| is significant (saddle-point check).</summary>
    public double SignificantImaginaryCm1 { get; set; } = 100.0;
    /// <summary>Scan jump threshold in kcal/mol.</summary>
    public double ScanJumpKcalPerMol { get; set; } = 2.0;
    /// <summary>σ (kcal/mol) of a barrier at levels not listed below; null: no uncertainty set. New models start at 2 kcal/mol (common practice, no source).</summary>
    public double? UncertaintyKcalPerMol { get; set; } = 2.0;
    /// <summary>σ per level of theory, one "level = σ" line each.</summary>
    public string UncertaintyByLevel { get; set; } = "";
    /// <summary>How a species with several conformers enters the energies: its lowest conformer, or the Boltzmann-weighted ensemble.</summary>
    public BarrierLedger.Core.Conformers.ConformerChoice Conformers { get; set; } = BarrierLedger.Core.Conformers.ConformerChoice.Lowest;
    public DateTimeOffset UpdatedAt { get; set; }
    public string UpdatedByUserId { get; set; } = "";
    public long Version { get; set; }
}
