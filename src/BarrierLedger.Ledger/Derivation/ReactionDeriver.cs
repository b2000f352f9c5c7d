using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Ledger.Storage;

namespace BarrierLedger.Ledger.Derivation;

/// <summary>The derived values of one reaction, ready to store.</summary>
internal sealed record DerivedReaction(
    int ReactionId, long InputsRevision, double? BarrierGibbsHartree, double? ReactionGibbsHartree, double? BarrierElectronicHartree,
    double? RateConstantPerSecond, double? HalfLifeSeconds, double TemperatureKelvin, string LevelOfTheory, bool Consistent,
    IReadOnlyList<CheckReason> Consistency, IReadOnlyList<DerivedState> States, IReadOnlyList<DerivedStep> Steps,
    string ModelFingerprint, string InputFingerprint)
{
    // Serialised as the values are made (on the deriving thread), so storing them is only the write.
    public string ConsistencyJson { get; } = DerivedJson.Write(Consistency);
    public string StatesJson { get; } = DerivedJson.Write(States);
    public string StepsJson { get; } = DerivedJson.Write(Steps);
}

/// <summary>
/// The derived values of one reaction under one energy model. The ledger's part is choosing the inputs (<see cref="StateResolver"/>:
/// which calculation supplies each species' energy, geometry and frequencies, σ, the reported correction as fallback, the saddle
/// point's imaginary frequency); every number is Core's <see cref="PathwayEnergies.Derive"/>: per-state E/H/G, per-step barriers
/// with κ, k and t½, the energetic span and the headline barrier with its k_eff and t½, and the consistency reasons. This class
/// only maps that result to what the ledger stores.
/// </summary>
internal sealed class ReactionDeriver(ModelSettings model, DerivationInputs inputs)
{
    private readonly StateResolver _resolver = new(model, inputs);

    public DerivedReaction Derive(ReactionInput r)
    {
        var reasons = new List<CheckReason>();
        var fingerprint = new System.Text.StringBuilder().Append(model.Fingerprint).Append('|').Append(r.Id);
        var states = new List<PathwayState>();
        var resolved = new List<List<(int SpeciesId, ResolvedSpecies Species)>>();
        var complete = true;
        foreach (var s in r.States)
        {
            var saddle = s.Kind == StateKind.SaddlePoint;
            var terms = new List<StateTerm>();
            var used = new List<(int, ResolvedSpecies)>();
            foreach (var (speciesId, coefficient) in s.Terms)
            {
                if (!inputs.Species.TryGetValue(speciesId, out var sp))
                {
                    reasons.Add(new(LedgerReasonCodes.MissingSpecies, CheckSeverity.Failure, $"State {s.Label}: one of its species is retired."));
                    complete = false;
                    continue;
                }
                var rs = _resolver.Resolve(sp, saddle ? s.SaddleCalculationId : null, s.Label);
                reasons.AddRange(rs.Reasons);
                fingerprint.Append('|').Append(speciesId).Append(':').Append(string.Join(":", rs.CalculationIds));
                if (rs.Record is null) { complete = false; continue; }
                terms.Add(new StateTerm(rs.Record, coefficient));
                used.Add((speciesId, rs));
            }
            states.Add(new PathwayState(s.Label, s.Kind, terms,
                saddle ? ImaginaryOf(s.SaddleCalculationId) : null));
            resolved.Add(used);
        }

        PathwayEnergyResult? result = null;
        if (complete)
        {
            try
            {
                result = PathwayEnergies.Derive(new Pathway(r.Id.ToString(System.Globalization.CultureInfo.InvariantCulture), states), _resolver.CoreModel);
                reasons.AddRange(result.Reasons);
            }
            catch (ArgumentException ex)
            {
                reasons.Add(new(LedgerReasonCodes.PathwayShape, CheckSeverity.Failure, ex.Message));
            }
        }

        var derivedStates = r.States.Select((s, i) =>
        {
            var e = result?.States[i];
            var terms = e is null ? null : e.Terms.Select((t, j) => Term(resolved[i][j].SpeciesId, resolved[i][j].Species, t)).ToList();
            return new DerivedState(s.Position, s.Label, s.Kind.ToString(), e?.RelativeElectronic.Hartree, e?.RelativeEnthalpy?.Hartree,
                e?.RelativeGibbs?.Hartree, terms is null ? [.. resolved[i].Select(x => x.Species.Energy!.Id)] : [.. terms.Select(t => t.EnergyCalculationId)],
                terms is null ? [.. resolved[i].Select(x => x.Species.Thermal?.Id ?? x.Species.Reported?.Id).OfType<int>()] : [.. terms.Select(t => t.ThermalCalculationId).OfType<int>()],
                string.Join("; ", states[i].Terms.Select(t => t.Species.ElectronicLevel.ToString()).Distinct()), terms);
        }).ToList();

        var steps = result is null ? [] : result.Steps.Select(step =>
        {
            var position = r.States.First(x => x.Label == step.SaddlePoint && x.Kind == StateKind.SaddlePoint).Position;
            return new DerivedStep(position, step.SaddlePoint, step.From, step.To, step.ElectronicBarrier.Hartree, step.GibbsBarrier?.Hartree,
                step.ElectronicReactionEnergy.Hartree, step.GibbsReactionEnergy?.Hartree, step.Molecularity, step.RateConstant, step.RateConstantUnit,
                step.HalfLifeSeconds, step.ImaginaryFrequencyCm1, step.TransmissionCoefficient, step.EnthalpyBarrier?.Hartree);
        }).ToList();

        var overall = result?.Overall;
        var levels = states.SelectMany(s => s.Terms).Select(t => t.Species.ElectronicLevel.ToString()).Distinct().Order(StringComparer.Ordinal).ToList();
        var levelText = string.Join("; ", levels);
        if (model.ThermalLevel.Trim().Length > 0) levelText += $" (thermal: {model.ThermalLevel})";
        var distinct = reasons.DistinctBy(x => x.Code + x.Message).OrderByDescending(x => x.Severity).ToList();
        return new DerivedReaction(r.Id, r.InputsRevision, overall?.GibbsBarrier?.Hartree, overall?.ReactionGibbs?.Hartree, overall?.ElectronicBarrier?.Hartree,
            overall?.RateConstantPerSecond, overall?.HalfLifeSeconds, model.TemperatureKelvin, levelText,
            result is not null && !distinct.Any(x => x.Blocking), distinct, derivedStates, steps, model.Fingerprint,
            ModelSettings.Hash(fingerprint.ToString()));
    }

    private static DerivedTerm Term(int speciesId, ResolvedSpecies all, TermEnergies t)
    {
        var rs = all.Of(t.Conformer?.Lowest);
        var sp = t.Species;
        var thermal = sp.Thermal;
        return new DerivedTerm(speciesId, sp.Label, t.Coefficient, rs.Energy!.Id, sp.ElectronicEnergy.Hartree, sp.ElectronicLevel.ToString(),
            rs.ThermalUsed(thermal)?.Id, thermal?.ZeroPoint.Hartree, thermal?.Enthalpy.Hartree, thermal?.Gibbs.Hartree, thermal?.Source,
            sp.PointGroup, sp.SymmetryNumber, t.Conformer?.Description);
    }

    private double? ImaginaryOf(int? calcId)
    {
        if (calcId is not { } id || !inputs.Calculations.TryGetValue(id, out var c) || c.Frequencies is null) return null;
        var f = Blobs.ToDoubles(c.Frequencies);
        return f.Length > 0 && f.Min() < 0 ? f.Min() : null;
    }
}
