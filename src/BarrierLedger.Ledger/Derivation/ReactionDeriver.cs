using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Kinetics;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using CoreStateKind = BarrierLedger.Core.Pathways.StateKind;
using CoreEnergyModel = BarrierLedger.Core.Pathways.EnergyModel;

namespace BarrierLedger.Ledger.Derivation;

/// <summary>The derived values of one reaction, ready to store.</summary>
internal sealed record DerivedReaction(
    int ReactionId, long InputsRevision, double? BarrierGibbsHartree, double? ReactionGibbsHartree, double? BarrierElectronicHartree,
    double? RateConstantPerSecond, double? HalfLifeSeconds, double TemperatureKelvin, string LevelOfTheory, bool Consistent,
    IReadOnlyList<ConsistencyReason> Consistency, IReadOnlyList<DerivedState> States, IReadOnlyList<DerivedStep> Steps,
    string ModelFingerprint, string InputFingerprint)
{
    // Serialised as the values are made (on the deriving thread), so storing them is only the write.
    public string ConsistencyJson { get; } = DerivedJson.Write(Consistency);
    public string StatesJson { get; } = DerivedJson.Write(States);
    public string StepsJson { get; } = DerivedJson.Write(Steps);
}

/// <summary>
/// Pathway energies for one reaction under one energy model. The ledger's part is choosing the inputs: for each species the
/// electronic energy from the model's energy level (else the state's own calculation) and thermal corrections computed by Core
/// thermochemistry from the stored frequencies at the model's level, temperature, standard state and treatment (else the
/// program-reported ones, flagged). The science is Core's <see cref="PathwayEnergies.Derive"/>: state energies, steps with
/// Eyring rate constants, the energetic span, and the consistency reasons.
/// The reaction's headline barrier is the energetic span δE (Kozuch and Shaik, Acc. Chem. Res. 2011, 44, 101), or the highest
/// step barrier when the span cannot be formed; its k is the effective first-order κ (k_B T/h) exp(−ΔG‡/RT) (Core <see cref="Eyring"/>)
/// with t½ = ln 2 / k.
/// </summary>
internal sealed class ReactionDeriver(ModelSettings model, DerivationInputs inputs)
{
    private readonly Dictionary<(int CalcId, int Sigma), ThermalCorrection?> _thermo = [];
    private readonly Dictionary<string, Formula> _formulas = new(StringComparer.Ordinal);
    private readonly Dictionary<string, LevelOfTheory> _levels = new(StringComparer.Ordinal);
    // "A//B" in the model means energies at A on geometries from B: calculations store A as their energy level and B
    // as their geometry level, so both parts are matched, each on its own.
    private readonly string _energyKey = EnergyLevels.Key(model.EnergyLevel.Split("//", 2)[0]);
    private readonly string _energyGeometryKey = model.EnergyLevel.Contains("//", StringComparison.Ordinal)
        ? EnergyLevels.Key(model.EnergyLevel.Split("//", 2)[1]) : "";
    private readonly string _thermalKey = EnergyLevels.Key(model.ThermalLevel);
    private readonly ThermoOptions _thermoOptions = model.ThermoOptions(1);

    public DerivedReaction Derive(ReactionInput r)
    {
        var reasons = new List<ConsistencyReason>();
        var fingerprint = new System.Text.StringBuilder().Append(model.Fingerprint).Append('|').Append(r.Id);
        var states = new List<PathwayState>();
        var usedIds = new List<(List<int> E, List<int> T)>();
        var complete = true;
        foreach (var s in r.States)
        {
            var terms = new List<StateTerm>();
            var ids = (new List<int>(), new List<int>());
            foreach (var (speciesId, coefficient) in s.Terms)
            {
                if (!inputs.Species.TryGetValue(speciesId, out var sp))
                {
                    reasons.Add(new(LedgerReasonCodes.MissingSpecies, "Failure", $"State {s.Label}: one of its species is retired."));
                    complete = false;
                    continue;
                }
                var (record, energyCalc, thermalCalc) = Species(sp, s.Kind == Records.StateKind.SaddlePoint ? s.SaddleCalculationId : null, reasons, s.Label);
                fingerprint.Append('|').Append(speciesId).Append(':').Append(energyCalc?.Id).Append(':').Append(thermalCalc?.Id);
                if (record is null) { complete = false; continue; }
                if (energyCalc is not null) ids.Item1.Add(energyCalc.Id);
                if (thermalCalc is not null) ids.Item2.Add(thermalCalc.Id);
                terms.Add(new StateTerm(record, coefficient));
            }
            states.Add(new PathwayState(s.Label, s.Kind == Records.StateKind.SaddlePoint ? CoreStateKind.SaddlePoint : CoreStateKind.Minimum, terms));
            usedIds.Add(ids);
        }

        PathwayEnergyResult? result = null;
        if (complete)
        {
            try
            {
                result = PathwayEnergies.Derive(new Pathway(r.Id.ToString(System.Globalization.CultureInfo.InvariantCulture), states),
                    new CoreEnergyModel(ThermalSource.Reported, _thermoOptions));
                reasons.AddRange(result.Reasons.Select(x => new ConsistencyReason(x.Code, x.Severity.ToString(), x.Message)));
            }
            catch (ArgumentException ex)
            {
                reasons.Add(new(LedgerReasonCodes.PathwayShape, "Failure", ex.Message));
            }
        }

        var derivedStates = r.States.Select((s, i) =>
        {
            var e = result?.States[i];
            return new DerivedState(s.Position, s.Label, s.Kind.ToString(), e?.RelativeElectronic.Hartree, e?.RelativeEnthalpy?.Hartree,
                e?.RelativeGibbs?.Hartree, usedIds[i].E, usedIds[i].T,
                string.Join("; ", states[i].Terms.Select(t => t.Species.ElectronicLevel.ToString()).Distinct()));
        }).ToList();

        var steps = new List<DerivedStep>();
        double? bestStepG = null;
        double? bestStepE = null;
        double? bestImag = null;
        if (result is not null)
        {
            foreach (var step in result.Steps)
            {
                var index = r.States.Select((s, i) => (s, i)).First(x => x.s.Label == step.SaddlePoint && x.s.Kind == Records.StateKind.SaddlePoint).i;
                var imag = ImaginaryOf(r.States[index].SaddleCalculationId);
                var kappa = Kappa(imag);
                steps.Add(new DerivedStep(r.States[index].Position, step.SaddlePoint, step.From, step.To, step.ElectronicBarrier.Hartree,
                    step.GibbsBarrier?.Hartree, step.ElectronicReactionEnergy.Hartree, step.GibbsReactionEnergy?.Hartree, step.Molecularity,
                    step.RateConstant * kappa, step.RateConstantUnit, step.HalfLifeSeconds / kappa, imag, kappa));
                if (step.GibbsBarrier is { } g && (bestStepG is null || g.Hartree > bestStepG)) { bestStepG = g.Hartree; bestImag = imag; }
                if (bestStepE is null || step.ElectronicBarrier.Hartree > bestStepE) bestStepE = step.ElectronicBarrier.Hartree;
            }
        }

        double? barrierG = result?.OverallSpan?.EnergeticSpanEnergy.Hartree ?? bestStepG;
        if (result?.OverallSpan is { } span)
        {
            var tdts = r.States.FirstOrDefault(s => s.Label == span.Tdts.Label && s.Kind == Records.StateKind.SaddlePoint);
            bestImag = ImaginaryOf(tdts?.SaddleCalculationId);
        }
        var overallKappa = Kappa(bestImag);
        double? rate = barrierG is { } bg ? Eyring.RateConstant(Energy.FromHartree(bg), model.TemperatureKelvin, overallKappa) : null;
        var levels = states.SelectMany(s => s.Terms).Select(t => t.Species.ElectronicLevel.ToString()).Distinct().Order(StringComparer.Ordinal).ToList();
        var levelText = string.Join("; ", levels);
        if (_thermalKey.Length > 0) levelText += $" (thermal: {model.ThermalLevel})";
        var distinct = reasons.DistinctBy(x => x.Code + x.Message).OrderBy(x => x.Severity switch { "Failure" => 0, "Attention" => 1, _ => 2 }).ToList();
        return new DerivedReaction(r.Id, r.InputsRevision, barrierG, result?.States[^1].RelativeGibbs?.Hartree, bestStepE,
            rate, rate is > 0 ? Eyring.HalfLifeSeconds(rate.Value) : null, model.TemperatureKelvin, levelText,
            result is not null && !distinct.Any(x => x.Blocking), distinct, derivedStates, steps, model.Fingerprint,
            ModelSettings.Hash(fingerprint.ToString()));
    }

    private double Kappa(double? imaginaryCm1) =>
        model.Tunnelling == TunnellingCorrection.Wigner && imaginaryCm1 is { } v && v < 0 ? Tunnelling.Wigner(Math.Abs(v), model.TemperatureKelvin) : 1.0;

    private double? ImaginaryOf(int? calcId)
    {
        if (calcId is not { } id || !inputs.Calculations.TryGetValue(id, out var c) || c.Frequencies is null) return null;
        var f = Blobs.ToDoubles(c.Frequencies);
        return f.Length > 0 && f.Min() < 0 ? f.Min() : null;
    }

    // One record instance per species and preferred calculation, built once: a species shared by several states (a
    // catalyst, a spectator) is resolved once and reports its reasons once per state.
    private readonly Dictionary<(int, int?), (SpeciesRecord?, CalcInput?, CalcInput?, List<ConsistencyReason>)> _records = [];

    private (SpeciesRecord? Record, CalcInput? Energy, CalcInput? Thermal) Species(SpeciesInput sp, int? preferredCalcId, List<ConsistencyReason> reasons, string state)
    {
        // The state's saddle calculation is preferred only for its own species: in "TS1 + fluoride" it says nothing about
        // fluoride, whose record must then be the same instance as in every other state.
        if (preferredCalcId is { } pid && (!inputs.Calculations.TryGetValue(pid, out var pc) || pc.SpeciesId != sp.Id)) preferredCalcId = null;
        if (!_records.TryGetValue((sp.Id, preferredCalcId), out var entry))
        {
            var own = new List<ConsistencyReason>();
            var (r, e, t) = BuildSpecies(sp, preferredCalcId, own, state);
            _records[(sp.Id, preferredCalcId)] = entry = (r, e, t, own);
        }
        reasons.AddRange(entry.Item4);
        return (entry.Item1, entry.Item2, entry.Item3);
    }

    private (SpeciesRecord? Record, CalcInput? Energy, CalcInput? Thermal) BuildSpecies(SpeciesInput sp, int? preferredCalcId, List<ConsistencyReason> reasons, string state)
    {
        var calcs = inputs.CalculationsBySpecies[sp.Id];
        CalcInput? preferred = preferredCalcId is { } pid && inputs.Calculations.TryGetValue(pid, out var p) ? p : null;

        var energy = StateResolver.EnergyCalculation(calcs, _energyKey, _energyGeometryKey, preferred);
        if (energy is null)
        {
            reasons.Add(new(LedgerReasonCodes.MissingEnergy, "Failure",
                $"State {state}: species {sp.Label} has no electronic energy" + (_energyKey.Length > 0 ? $" at {model.EnergyLevel}" : "") + ", so the pathway has no energies."));
            return (null, null, null);
        }
        if (sp.Formula.Length == 0)
            reasons.Add(new(LedgerReasonCodes.FormulaUnknown, "Failure", $"Species {sp.Label} has no geometry stored, so conservation of atoms cannot be checked."));

        var thermal = StateResolver.ThermalCalculation(calcs, _thermalKey, preferred);
        ThermalCorrection? correction = thermal is null ? null : Thermal(thermal, sp);
        if (correction is null)
        {
            // No frequencies: the program-reported corrections (Core flags a temperature that is not the model's).
            thermal = calcs.Where(c => c.EnthalpyCorrectionHartree is not null && c.GibbsCorrectionHartree is not null && c.ThermalTemperatureKelvin is not null)
                .OrderByDescending(c => Math.Abs(c.ThermalTemperatureKelvin!.Value - model.TemperatureKelvin) < 0.01).ThenByDescending(c => c.Id).FirstOrDefault();
            if (thermal is not null)
                // Programs report gas-phase corrections at 1 atm (common practice, no source); Core converts the standard state.
                correction = new ThermalCorrection(Energy.FromHartree(thermal.ZeroPointHartree ?? 0), Energy.FromHartree(thermal.EnthalpyCorrectionHartree!.Value),
                    Energy.FromHartree(thermal.GibbsCorrectionHartree!.Value), Level(thermal.LevelOfTheory), thermal.ThermalTemperatureKelvin!.Value,
                    StandardState.Gas1Atm, "reported");
        }
        var record = new SpeciesRecord(sp.Label, FormulaOf(sp.Formula), sp.Charge, sp.Multiplicity, Energy.FromHartree(energy.EnergyHartree!.Value),
            Level(energy.LevelOfTheory), correction, SymmetryNumber: sp.SymmetryNumber);
        return (record, energy, correction is null ? null : thermal);
    }

    private ThermalCorrection? Thermal(CalcInput c, SpeciesInput sp)
    {
        if (_thermo.TryGetValue((c.Id, sp.SymmetryNumber), out var cached)) return cached;
        ThermalCorrection? result = null;
        var mol = Blobs.ToMolecule(c.AtomicNumbers, c.Positions, sp.Charge, sp.Multiplicity);
        if (mol is not null)
        {
            try
            {
                var t = Thermochemistry.Compute(mol, Blobs.ToDoubles(c.Frequencies), _thermoOptions with { SymmetryNumber = Math.Max(1, sp.SymmetryNumber) });
                var level = Level(c.LevelOfTheory);
                result = new ThermalCorrection(t.ZeroPointEnergy, t.EnthalpyCorrection, t.GibbsCorrection, level.GeometryLevel ?? level,
                    model.TemperatureKelvin, model.StandardState, $"computed ({model.Treatment})");
            }
            catch (ArgumentException) { result = null; }
        }
        _thermo[(c.Id, sp.SymmetryNumber)] = result;
        return result;
    }

    private Formula FormulaOf(string text)
    {
        if (text.Length == 0) return Formula.Empty;
        if (!_formulas.TryGetValue(text, out var f)) _formulas[text] = f = Formula.Parse(text);
        return f;
    }

    private LevelOfTheory Level(string text)
    {
        if (!_levels.TryGetValue(text, out var l)) _levels[text] = l = LevelOfTheory.TryParse(text, out var parsed, out _) ? parsed : new LevelOfTheory(text, "");
        return l;
    }
}
