using System.Globalization;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Kinetics;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;

namespace BarrierLedger.Ledger.Derivation;

/// <summary>The derived values of one reaction, ready to store.</summary>
internal sealed record DerivedReaction(
    int ReactionId, long InputsRevision, double? BarrierGibbsHartree, double? ReactionGibbsHartree, double? BarrierElectronicHartree,
    double? RateConstantPerSecond, double? HalfLifeSeconds, double TemperatureKelvin, string LevelOfTheory, bool Consistent,
    IReadOnlyList<ConsistencyReason> Consistency, IReadOnlyList<DerivedState> States, IReadOnlyList<DerivedStep> Steps,
    string ModelFingerprint, string InputFingerprint);

/// <summary>
/// Pathway energies for one reaction under one energy model (pure computation over loaded inputs):
/// for each species, the electronic energy from the model's energy level (or the state's own calculation) and the thermal
/// corrections from Core thermochemistry on stored frequencies (<see cref="Thermochemistry.Compute(Molecule, IReadOnlyList{double}, ThermoOptions)"/>);
/// each state is Σ coefficient × species value; steps take the barrier from the immediately preceding minimum; the
/// reaction's barrier is the highest saddle point above the lowest minimum before it (the energetic span of a
/// non-cyclic pathway, Kozuch and Shaik, Acc. Chem. Res. 2011, 44, 101), and k = κ k_B T/h exp(−ΔG‡/RT) (Core <see cref="Eyring"/>).
/// </summary>
internal sealed class ReactionDeriver(ModelSettings model, DerivationInputs inputs)
{
    private readonly Dictionary<(int CalcId, int Sigma), ThermoResult?> _thermo = [];
    private readonly string _energyKey = EnergyLevels.Key(model.EnergyLevel);
    private readonly string _thermalKey = EnergyLevels.Key(model.ThermalLevel);

    private sealed record SpeciesValue(CalcInput? Energy, CalcInput? ThermalCalc, double? HCorr, double? GCorr, bool Reported);

    public DerivedReaction Derive(ReactionInput r)
    {
        var reasons = new List<ConsistencyReason>();
        var states = new List<DerivedState>();
        var energies = new List<(double? E, double? H, double? G)>();
        var levels = new SortedSet<string>(StringComparer.Ordinal);
        var fingerprint = new System.Text.StringBuilder().Append(model.Fingerprint).Append('|').Append(r.Id);
        Formula? firstFormula = null;
        int? firstCharge = null, firstElectrons = null, firstUnpaired = null;
        var formulaKnown = true;

        foreach (var s in r.States)
        {
            double? e = 0, h = 0, g = 0;
            var eIds = new List<int>();
            var tIds = new List<int>();
            var stateLevels = new SortedSet<string>(StringComparer.Ordinal);
            var termFormulas = new List<(Formula, int)>();
            int charge = 0, electrons = 0, unpaired = 0;
            foreach (var (speciesId, coefficient) in s.Terms)
            {
                if (!inputs.Species.TryGetValue(speciesId, out var sp)) { e = h = g = null; continue; }
                var v = Value(sp, s.Kind == StateKind.SaddlePoint ? s.SaddleCalculationId : null);
                fingerprint.Append('|').Append(speciesId).Append(':').Append(v.Energy?.Id).Append(':').Append(v.ThermalCalc?.Id);
                if (v.Energy?.EnergyHartree is { } el)
                {
                    e += coefficient * el;
                    eIds.Add(v.Energy.Id);
                    stateLevels.Add(v.Energy.LevelOfTheory);
                    levels.Add(v.Energy.LevelOfTheory);
                }
                else
                {
                    e = h = g = null;
                    reasons.Add(new(ConsistencyCodes.MissingEnergy, true,
                        $"State {s.Label}: species {sp.Label} has no electronic energy" + (_energyKey.Length > 0 ? $" at {model.EnergyLevel}" : "") + ", so no energy can be given for this state."));
                }
                if (v.ThermalCalc is not null) tIds.Add(v.ThermalCalc.Id);
                if (v.HCorr is { } hc && v.GCorr is { } gc && v.Energy?.EnergyHartree is { } el2)
                {
                    h += coefficient * (el2 + hc);
                    g += coefficient * (el2 + gc);
                    if (v.Reported)
                        reasons.Add(new(ConsistencyCodes.ReportedThermal, false,
                            $"State {s.Label}: the thermal corrections of {sp.Label} are the ones reported with its calculation (no frequencies stored), at {ModelSettings.Num(model.TemperatureKelvin)} K; the model's treatment and standard state could not be applied to them."));
                }
                else
                {
                    if (h is not null && v.Energy?.EnergyHartree is not null)
                        reasons.Add(new(ConsistencyCodes.MissingThermal, true,
                            $"State {s.Label}: species {sp.Label} has no frequencies" + (_thermalKey.Length > 0 ? $" at {model.ThermalLevel}" : "") + ", so ΔH and ΔG are not available."));
                    h = g = null;
                }
                if (sp.Formula.Length == 0) formulaKnown = false;
                else termFormulas.Add((Formula.Parse(sp.Formula), coefficient));
                charge += coefficient * sp.Charge;
                var z = sp.Formula.Length == 0 ? 0 : Formula.Parse(sp.Formula).NuclearCharge;
                electrons += coefficient * (z - sp.Charge);
                unpaired += coefficient * (sp.Multiplicity - 1);
            }
            energies.Add((e, h, g));
            states.Add(new DerivedState(s.Position, s.Label, s.Kind.ToString(), null, null, null, eIds, tIds, string.Join("; ", stateLevels)));

            var formula = Formula.Sum(termFormulas);
            if (firstFormula is null)
            {
                firstFormula = formula; firstCharge = charge; firstElectrons = electrons; firstUnpaired = unpaired;
                continue;
            }
            if (formulaKnown && !formula.Equals(firstFormula))
                reasons.Add(new(ConsistencyCodes.FormulaDiffers, true,
                    $"State {s.Label} has formula {formula}, but {r.States[0].Label} has {firstFormula}: atoms are not conserved, so its energy cannot be compared."));
            if (charge != firstCharge)
                reasons.Add(new(ConsistencyCodes.ChargeDiffers, true, $"State {s.Label} has total charge {charge}, but {r.States[0].Label} has {firstCharge}."));
            else if (formulaKnown && electrons != firstElectrons)
                reasons.Add(new(ConsistencyCodes.ElectronsDiffer, true, $"State {s.Label} has {electrons} electrons, but {r.States[0].Label} has {firstElectrons}."));
            if (unpaired != firstUnpaired)
                reasons.Add(new(ConsistencyCodes.SpinChanges, false,
                    $"The number of unpaired electrons changes from {firstUnpaired} ({r.States[0].Label}) to {unpaired} ({s.Label}): the pathway crosses spin states, which a single-surface barrier does not describe."));
        }
        if (!formulaKnown)
            reasons.Add(new(ConsistencyCodes.FormulaUnknown, true, "Some species have no geometry stored, so conservation of atoms cannot be checked."));
        if (levels.Count > 1)
            reasons.Add(new(ConsistencyCodes.MixedLevels, true,
                $"Energies come from different levels of theory ({string.Join("; ", levels)}); differences between them are not barriers. Choose one level in the energy model."));

        // Relative values
        var e0 = energies.Count > 0 ? energies[0] : (null, null, null);
        for (var i = 0; i < states.Count; i++)
            states[i] = states[i] with
            {
                DeltaEHartree = energies[i].E - e0.E,
                DeltaHHartree = energies[i].H - e0.H,
                DeltaGHartree = energies[i].G - e0.G,
            };

        var steps = new List<DerivedStep>();
        double? bestG = null, bestE = null;
        double? bestImag = null;
        for (var i = 0; i < r.States.Length; i++)
        {
            var s = r.States[i];
            if (s.Kind != StateKind.SaddlePoint) continue;
            var prev = Enumerable.Range(0, i).LastOrDefault(j => r.States[j].Kind == StateKind.Minimum, -1);
            var next = Enumerable.Range(i + 1, r.States.Length - i - 1).FirstOrDefault(j => r.States[j].Kind == StateKind.Minimum, -1);
            var imag = ImaginaryOf(s.SaddleCalculationId);
            double? bg = prev >= 0 ? energies[i].G - energies[prev].G : null;
            var kappa = Kappa(imag);
            double? k = bg is { } b ? Eyring.RateConstant(Energy.FromHartree(b), model.TemperatureKelvin, kappa) : null;
            steps.Add(new DerivedStep(s.Position, s.Label, prev >= 0 ? r.States[prev].Label : "", next >= 0 ? r.States[next].Label : null,
                prev >= 0 ? energies[i].E - energies[prev].E : null,
                prev >= 0 ? energies[i].H - energies[prev].H : null,
                bg,
                prev >= 0 && next >= 0 ? energies[next].G - energies[prev].G : null,
                k, k is > 0 ? Eyring.HalfLifeSeconds(k.Value) : null, imag, kappa,
                [.. reasons.Where(x => x.Message.StartsWith($"State {s.Label}:", StringComparison.Ordinal))]));

            // Overall: highest saddle point above the lowest minimum before it.
            var lowestG = Enumerable.Range(0, i).Where(j => r.States[j].Kind == StateKind.Minimum).Select(j => energies[j].G).DefaultIfEmpty(null).Min();
            var lowestE = Enumerable.Range(0, i).Where(j => r.States[j].Kind == StateKind.Minimum).Select(j => energies[j].E).DefaultIfEmpty(null).Min();
            if (energies[i].G - lowestG is { } span && (bestG is null || span > bestG)) { bestG = span; bestImag = imag; }
            if (energies[i].E - lowestE is { } spanE && (bestE is null || spanE > bestE)) bestE = spanE;
        }
        var overallKappa = Kappa(bestImag);
        double? rate = bestG is { } bgo ? Eyring.RateConstant(Energy.FromHartree(bgo), model.TemperatureKelvin, overallKappa) : null;
        var last = energies.Count > 0 ? energies[^1] : (null, null, null);
        var distinct = reasons.DistinctBy(x => x.Message).ToList();
        var levelText = levels.Count == 0 ? "" : string.Join("; ", levels);
        if (_thermalKey.Length > 0) levelText += $" (thermal: {model.ThermalLevel})";
        return new DerivedReaction(r.Id, r.InputsRevision, bestG, last.G - e0.G, bestE, rate, rate is > 0 ? Eyring.HalfLifeSeconds(rate.Value) : null,
            model.TemperatureKelvin, levelText, !distinct.Any(x => x.Blocking), distinct, states, steps, model.Fingerprint,
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

    private SpeciesValue Value(SpeciesInput sp, int? preferredCalcId)
    {
        var calcs = inputs.CalculationsBySpecies[sp.Id];
        CalcInput? preferred = preferredCalcId is { } pid && inputs.Calculations.TryGetValue(pid, out var p) ? p : null;

        CalcInput? energy;
        if (_energyKey.Length > 0)
            energy = calcs.Where(c => c.EnergyHartree is not null && c.EnergyKey == _energyKey && c.Kind != CalculationKind.RelaxedScan)
                .OrderByDescending(c => preferred is not null && c.Id == preferred.Id).ThenByDescending(c => c.Id).FirstOrDefault();
        else
            energy = preferred is { EnergyHartree: not null } ? preferred
                : calcs.Where(c => c.EnergyHartree is not null && c.Kind is CalculationKind.Minimum or CalculationKind.SaddlePoint).LastOrDefault()
                  ?? calcs.Where(c => c.EnergyHartree is not null && c.Kind != CalculationKind.RelaxedScan).LastOrDefault();

        // An atom needs no frequencies: its thermochemistry is translation and electronic only.
        var withFreqs = calcs.Where(c => c.AtomicNumbers is { Length: > 0 } && (c.Frequencies is { Length: > 0 } || c.AtomicNumbers.Length == 1));
        CalcInput? thermal = _thermalKey.Length > 0
            ? withFreqs.Where(c => c.EnergyKey == _thermalKey || EnergyLevels.Key(c.GeometryKey) == _thermalKey)
                .OrderByDescending(c => preferred is not null && c.Id == preferred.Id).ThenByDescending(c => c.Id).FirstOrDefault()
            : (preferred is not null && withFreqs.Contains(preferred) ? preferred : withFreqs.LastOrDefault());
        if (thermal is not null && Thermo(thermal, sp) is { } t)
            return new SpeciesValue(energy, thermal, t.EnthalpyCorrection.Hartree, t.GibbsCorrection.Hartree, false);

        // No frequencies: program-reported corrections at the model temperature, said so.
        var reported = calcs.Where(c => c.EnthalpyCorrectionHartree is not null && c.GibbsCorrectionHartree is not null
                                        && c.ThermalTemperatureKelvin is { } tk && Math.Abs(tk - model.TemperatureKelvin) < 0.01).LastOrDefault();
        if (reported is not null)
            return new SpeciesValue(energy, reported, reported.EnthalpyCorrectionHartree, reported.GibbsCorrectionHartree, true);
        return new SpeciesValue(energy, null, null, null, false);
    }

    private ThermoResult? Thermo(CalcInput c, SpeciesInput sp)
    {
        if (_thermo.TryGetValue((c.Id, sp.SymmetryNumber), out var cached)) return cached;
        ThermoResult? result = null;
        var mol = Blobs.ToMolecule(c.AtomicNumbers, c.Positions, sp.Charge, sp.Multiplicity);
        if (mol is not null)
        {
            try { result = Thermochemistry.Compute(mol, Blobs.ToDoubles(c.Frequencies), model.ThermoOptions(sp.SymmetryNumber)); }
            catch (ArgumentException) { result = null; }
        }
        _thermo[(c.Id, sp.SymmetryNumber)] = result;
        return result;
    }

    internal static string Invariant(double x) => x.ToString("R", CultureInfo.InvariantCulture);
}
