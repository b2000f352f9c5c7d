using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Core.Units;
using BarrierLedger.Core.Conformers;
using BarrierLedger.Ledger.Conformers;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using CoreEnergyModel = BarrierLedger.Core.Pathways.EnergyModel;

namespace BarrierLedger.Ledger.Derivation;

/// <summary>
/// One species resolved for a state under an energy model: the Core record the derivation computes with (electronic energy,
/// geometry and frequencies for the thermal correction, the program-reported correction as fallback, σ), the calculations it
/// came from, and the reasons found while choosing them. <see cref="Record"/> is null when the species has no usable energy.
/// </summary>
internal sealed record ResolvedSpecies(SpeciesRecord? Record, CalcInput? Energy, CalcInput? Thermal, CalcInput? Reported, IReadOnlyList<CheckReason> Reasons)
{
    /// <summary>For a species with several conformers: each conformer resolved on its own calculations, by label (the record carries them too).</summary>
    public IReadOnlyDictionary<string, ResolvedSpecies>? Conformers { get; init; }

    /// <summary>The resolution of the conformer a derivation used (<paramref name="label"/>), or this one.</summary>
    public ResolvedSpecies Of(string? label) => label is not null && Conformers is not null && Conformers.TryGetValue(label, out var c) ? c : this;

    /// <summary>Every calculation behind it, for the input fingerprint: energy, thermal and reported, of each conformer.</summary>
    public IEnumerable<int?> CalculationIds => Conformers is null ? [Energy?.Id, Thermal?.Id, Reported?.Id]
        : Conformers.OrderBy(c => c.Key, StringComparer.Ordinal).SelectMany(c => new int?[] { c.Value.Energy?.Id, c.Value.Thermal?.Id, c.Value.Reported?.Id });

    /// <summary>The calculation behind the thermal correction the derivation actually applied (see <see cref="ThermalCorrection.IsComputed"/>).</summary>
    public CalcInput? ThermalUsed(ThermalCorrection? applied) => applied is null ? null : applied.IsComputed ? Thermal : Reported;
}

/// <summary>
/// The one rule for which stored calculation supplies a species' electronic energy and its thermal correction under an energy
/// model. Everything that needs "the energy of this species" (the derivation of reactions, the point group kept on the
/// species, the supporting-information export of a species in no reaction) asks here; exports and screens read what the
/// derivation stored. One instance per model and inputs; it keeps one record per species and preferred calculation, so a
/// species shared by several states (a catalyst, a spectator) is the same record in each.
/// </summary>
internal sealed class StateResolver(ModelSettings model, DerivationInputs inputs)
{
    // "A//B" in the model means energies at A on geometries from B: calculations store A as their energy level and B
    // as their geometry level, so both parts are matched, each on its own.
    private readonly string _energyKey = EnergyLevels.Key(model.EnergyLevel.Split("//", 2)[0]);
    private readonly string _energyGeometryKey = model.EnergyLevel.Contains("//", StringComparison.Ordinal)
        ? EnergyLevels.Key(model.EnergyLevel.Split("//", 2)[1]) : "";
    private readonly string _thermalKey = EnergyLevels.Key(model.ThermalLevel);
    private readonly Dictionary<(int, int?), ResolvedSpecies> _resolved = [];
    private readonly Dictionary<string, Formula> _formulas = new(StringComparer.Ordinal);
    private readonly Dictionary<string, LevelOfTheory> _levels = new(StringComparer.Ordinal);

    /// <summary>The Core energy model these settings stand for: thermal corrections computed (else reported), the model's tunnelling.</summary>
    public CoreEnergyModel CoreModel { get; } = new(ThermalSource.Computed, model.ThermoOptions(1), 1.0,
        model.Tunnelling == TunnellingCorrection.Wigner ? StepTunnelling.Wigner : StepTunnelling.None, model.Conformers);

    public DerivationInputs Inputs => inputs;

    /// <summary>
    /// The species as a state uses it. <paramref name="preferredCalcId"/> is the state's own saddle calculation; it is preferred
    /// only for its own species (in "TS1 + fluoride" it says nothing about fluoride). <paramref name="state"/> names the state
    /// in the reasons.
    /// </summary>
    public ResolvedSpecies Resolve(SpeciesInput sp, int? preferredCalcId, string state)
    {
        if (preferredCalcId is { } pid && (!inputs.Calculations.TryGetValue(pid, out var pc) || pc.SpeciesId != sp.Id)) preferredCalcId = null;
        if (!_resolved.TryGetValue((sp.Id, preferredCalcId), out var r)) _resolved[(sp.Id, preferredCalcId)] = r = Build(sp, preferredCalcId, state);
        return r;
    }

    private ResolvedSpecies Build(SpeciesInput sp, int? preferredCalcId, string state)
    {
        var calcs = inputs.CalculationsBySpecies[sp.Id];
        CalcInput? preferred = preferredCalcId is { } pid && inputs.Calculations.TryGetValue(pid, out var p) ? p : null;
        return calcs.Select(c => c.Conformer).Distinct(StringComparer.Ordinal).Skip(1).Any()
            ? BuildConformers(sp, [.. calcs], preferred, state)
            : BuildOne(sp, calcs, preferred, state);
    }

    /// <summary>
    /// A species with several conformers (issue 21): each conformer (its calculations by label) is resolved by the same rules as a
    /// species, the state's own saddle calculation preferred within its conformer; duplicates come from the stored structures
    /// (<see cref="ConformerSet"/>) and a saddle-point conformer counts as checked when one of its saddle-point calculations passed
    /// its frequency check. Core applies the model's conformer choice (<see cref="PathwayEnergies"/>). A conformer without an
    /// electronic energy at the model's level is left out, and said so.
    /// </summary>
    private ResolvedSpecies BuildConformers(SpeciesInput sp, List<CalcInput> calcs, CalcInput? preferred, string state)
    {
        var set = ConformerSet.Of(calcs.Select(c => new ConformerCalc(c.Id, c.Conformer, c.Kind, c.EnergyHartree, c.EnergyKey, c.AtomicNumbers, c.Positions, c.LevelOfTheory)),
            sp.Charge, sp.Multiplicity);
        var byLabel = calcs.ToLookup(c => c.Conformer, StringComparer.Ordinal);
        var resolved = new Dictionary<string, ResolvedSpecies>(StringComparer.Ordinal);
        var order = new List<(int SetIndex, string Label)>();
        var reasons = new List<CheckReason>();
        for (var k = 0; k < set.Conformers.Length; k++)
        {
            var label = set.Conformers[k].Label;
            var group = byLabel[label].ToList();
            var rs = BuildOne(sp, group, preferred is not null && group.Contains(preferred) ? preferred : null, state);
            if (rs.Record is null)
            {
                reasons.Add(new(LedgerReasonCodes.ConformerLeftOut, CheckSeverity.Info,
                    $"State {state}: conformer {Name(label)} of {sp.Label} has no electronic energy" + (_energyKey.Length > 0 ? $" at {model.EnergyLevel}" : "") + ", so it is left out."));
                continue;
            }
            resolved[label] = rs;
            order.Add((k, label));
        }
        if (order.Count == 0) return BuildOne(sp, calcs, preferred, state);
        if (order.Count == 1) return resolved[order[0].Label] with { Reasons = [.. resolved[order[0].Label].Reasons, .. reasons] };

        var list = order.Select(o =>
        {
            var rs = resolved[o.Label];
            var saddleCalcs = byLabel[o.Label].Where(c => c.Kind == CalculationKind.SaddlePoint).ToList();
            var checkPassed = saddleCalcs.Count == 0 || saddleCalcs.Any(c => inputs.PassedChecks.Contains(c.Id));
            int? duplicateOf = null;
            string? note = null;
            if (set.DuplicateOf(o.SetIndex) is { } d && order.FindIndex(x => x.Label == d) is var di and >= 0)
            {
                duplicateOf = di;
                if (set.Pair(o.SetIndex, order[di].SetIndex) is { } pair)
                    note = string.Format(System.Globalization.CultureInfo.InvariantCulture, "RMSD {0:0.000} Å", pair.RmsdAngstrom)
                           + (pair.EnergyDifferenceKcalPerMol is { } de ? string.Format(System.Globalization.CultureInfo.InvariantCulture, ", ΔE {0:0.00} kcal/mol", Math.Abs(de)) : "");
            }
            return new ConformerRecord(Name(o.Label), rs.Record!, checkPassed, duplicateOf, note);
        }).ToList();
        // The species' own record stands for it (formula, charge, level) and carries its conformers; Core picks or weighs them.
        var first = resolved[order[0].Label];
        var own = first.Reasons.Concat(order.Skip(1).SelectMany(o => resolved[o.Label].Reasons).Where(x => x.Code == LedgerReasonCodes.FormulaUnknown)).Concat(reasons);
        return first with
        {
            Record = first.Record! with { Conformers = list },
            Reasons = [.. own.DistinctBy(x => x.Code + x.Message)],
            Conformers = order.ToDictionary(o => Name(o.Label), o => resolved[o.Label], StringComparer.Ordinal),
        };
    }

    private static string Name(string label) => label.Length > 0 ? label : "(unlabelled)";

    private ResolvedSpecies BuildOne(SpeciesInput sp, IEnumerable<CalcInput> calcs, CalcInput? preferred, string state)
    {
        var reasons = new List<CheckReason>();

        var energy = EnergyCalculation(calcs, _energyKey, _energyGeometryKey, preferred);
        if (energy is null)
        {
            reasons.Add(new(LedgerReasonCodes.MissingEnergy, CheckSeverity.Failure,
                $"State {state}: species {sp.Label} has no electronic energy" + (_energyKey.Length > 0 ? $" at {model.EnergyLevel}" : "") + ", so the pathway has no energies."));
            return new(null, null, null, null, reasons);
        }
        if (sp.Formula.Length == 0)
            reasons.Add(new(LedgerReasonCodes.FormulaUnknown, CheckSeverity.Failure, $"Species {sp.Label} has no geometry stored, so conservation of atoms cannot be checked."));

        var thermal = ThermalCalculation(calcs, _thermalKey, preferred);
        var reported = ReportedCalculation(calcs, model.TemperatureKelvin);
        var molecule = thermal is null ? null : Blobs.ToMolecule(thermal.AtomicNumbers, thermal.Positions, sp.Charge, sp.Multiplicity);
        var thermalLevel = thermal is null ? null : Level(thermal.LevelOfTheory);
        var record = new SpeciesRecord(sp.Label, FormulaOf(sp.Formula), sp.Charge, sp.Multiplicity, Energy.FromHartree(energy.EnergyHartree!.Value),
            Level(energy.LevelOfTheory),
            // Programs report gas-phase corrections at 1 atm (common practice, no source); Core converts the standard state.
            reported is null ? null : new ThermalCorrection(Energy.FromHartree(reported.ZeroPointHartree ?? 0), Energy.FromHartree(reported.EnthalpyCorrectionHartree!.Value),
                Energy.FromHartree(reported.GibbsCorrectionHartree!.Value), Level(reported.LevelOfTheory), reported.ThermalTemperatureKelvin!.Value, StandardState.Gas1Atm, "reported"),
            molecule, molecule is null ? null : Blobs.ToDoubles(thermal!.Frequencies), thermalLevel is null ? null : thermalLevel.GeometryLevel ?? thermalLevel,
            Math.Max(1, sp.SymmetryNumber), sp.PointGroup);
        return new(record, energy, molecule is null ? null : thermal, reported, reasons);
    }

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

    /// <summary>
    /// The program-reported thermal correction used when none can be computed: the newest at the model temperature, else the
    /// newest at any temperature (Core then says that its temperature is not the model's).
    /// </summary>
    public static CalcInput? ReportedCalculation(IEnumerable<CalcInput> calcs, double temperatureKelvin) =>
        calcs.Where(c => c.EnthalpyCorrectionHartree is not null && c.GibbsCorrectionHartree is not null && c.ThermalTemperatureKelvin is not null)
            .OrderByDescending(c => Math.Abs(c.ThermalTemperatureKelvin!.Value - temperatureKelvin) < 0.01).ThenByDescending(c => c.Id).FirstOrDefault();

    private Formula FormulaOf(string text)
    {
        if (text.Length == 0) return Formula.Empty;
        if (!_formulas.TryGetValue(text, out var f)) _formulas[text] = f = Formula.Parse(text);
        return f;
    }

    public LevelOfTheory Level(string text)
    {
        if (!_levels.TryGetValue(text, out var l)) _levels[text] = l = LevelOfTheory.TryParse(text, out var parsed, out _) ? parsed : new LevelOfTheory(text, "");
        return l;
    }
}
