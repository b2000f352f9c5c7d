using BarrierLedger.Core.Chemistry;
using BarrierLedger.Ledger.Records;

namespace BarrierLedger.Ledger.Derivation;

/// <summary>
/// The one rule for which stored calculation supplies a species' electronic energy and its thermal correction under an energy
/// model. Everything that needs "the energy of this species" (the derivation of reactions, the point group kept on the
/// species) asks here; exports and screens read what the derivation stored.
/// </summary>
internal static class StateResolver
{
    /// <summary>
    /// The electronic energy: with a model energy level ("A" or "A//B"), the newest calculation at A (on a geometry from B when
    /// given), the state's own saddle calculation first; without one, the state's own calculation, else the newest optimised
    /// minimum or saddle point, else the newest calculation with an energy. Relaxed scans never supply one.
    /// </summary>
    public static CalcInput? EnergyCalculation(IEnumerable<CalcInput> calcs, string energyKey, string energyGeometryKey, CalcInput? preferred)
    {
        if (energyKey.Length > 0)
            return calcs.Where(c => c.EnergyHartree is not null && c.EnergyKey == energyKey && c.Kind != CalculationKind.RelaxedScan
                                    && (energyGeometryKey.Length == 0 || EnergyLevels.Key(c.GeometryKey) == energyGeometryKey))
                .OrderByDescending(c => preferred is not null && c.Id == preferred.Id).ThenByDescending(c => c.Id).FirstOrDefault();
        return preferred is { EnergyHartree: not null } ? preferred
            : calcs.Where(c => c.EnergyHartree is not null && c.Kind is CalculationKind.Minimum or CalculationKind.SaddlePoint).LastOrDefault()
              ?? calcs.Where(c => c.EnergyHartree is not null && c.Kind != CalculationKind.RelaxedScan).LastOrDefault();
    }

    /// <summary>
    /// The calculation whose geometry and frequencies give the thermal correction: with a model thermal level, the newest with
    /// frequencies at that level (its energy or geometry level), the state's own first; without one, the state's own calculation
    /// when it has frequencies, else the newest with frequencies. A single atom needs no frequencies.
    /// </summary>
    public static CalcInput? ThermalCalculation(IEnumerable<CalcInput> calcs, string thermalKey, CalcInput? preferred)
    {
        var withFreqs = calcs.Where(c => c.AtomicNumbers is { Length: > 0 } && (c.Frequencies is { Length: > 0 } || c.AtomicNumbers.Length == 1));
        return thermalKey.Length > 0
            ? withFreqs.Where(c => c.EnergyKey == thermalKey || EnergyLevels.Key(c.GeometryKey) == thermalKey)
                .OrderByDescending(c => preferred is not null && c.Id == preferred.Id).ThenByDescending(c => c.Id).FirstOrDefault()
            : (preferred is not null && withFreqs.Contains(preferred) ? preferred : withFreqs.LastOrDefault());
    }
}
