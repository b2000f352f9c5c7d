using BarrierLedger.Core.Kinetics;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Records;

namespace BarrierLedger.Ledger.Kinetics;

/// <summary>
/// A reaction's microkinetic model, built from its stored derivation: the network, the starting mixture the screen proposes, and
/// what could not be used, in words.
/// </summary>
/// <param name="Network">Species are the reaction's species (without the saddle points); one step per stored step.</param>
/// <param name="Substrate">Proposed limiting reactant (a species of the first state that is not given back at the end).</param>
/// <param name="Products">Species of the last state that were not in the first.</param>
/// <param name="Catalysts">Species of the first state that the last state gives back.</param>
/// <param name="StartingMolPerL">Proposed initial concentrations: 0.1 mol/L for reactants, 5 mol% of that for catalysts.</param>
/// <param name="StoredRateConstants">The stored Eyring k of each step (k_f at the model temperature), in step order.</param>
/// <param name="Problems">Why the model cannot be simulated (empty when it can).</param>
/// <param name="SigmaKcalPerMol">Uncertainty used for the energies (0: none set).</param>
public sealed record ReactionKineticsModel(
    ReactionNetwork Network, string? Substrate, IReadOnlyList<string> Products, IReadOnlyList<string> Catalysts,
    IReadOnlyDictionary<string, double> StartingMolPerL, IReadOnlyList<double?> StoredRateConstants, IReadOnlyList<string> Problems,
    double SigmaKcalPerMol)
{
    public bool CanSimulate => Problems.Count == 0;
}

/// <summary>
/// Builds the mass-action network of one reaction from the numbers the ledger stored for it (never re-deriving a barrier): each
/// state is an energy level with its stored ΔG and ΔH relative to the first state; each stored step minimum → saddle point →
/// minimum becomes an elementary step whose reactants are the species of the minimum before it that are not carried unchanged
/// into the saddle point (spectators such as a counter-ion drawn in every state cancel), and whose products are likewise those of
/// the minimum after it; its forward k is Core's Eyring constant from the stored ΔG‡ and κ(T), checked to be the derivation's stored
/// k at the model temperature (a step where they differ is refused), its reverse k follows by detailed balance from the stored ΔG_r.
/// A step the derivation gave no rate constant (ΔG‡ below zero, k above k_BT/h, molecularity above 3) is refused with the
/// derivation's own reason.
/// </summary>
public static class ReactionKinetics
{
    /// <summary>Proposed concentration of a reactant, mol/L (common practice for a screening run, no source).</summary>
    public const double DefaultReactantMolPerL = 0.1;

    /// <summary>Proposed catalyst loading, as a fraction of the reactant concentration (5 mol%, common practice, no source).</summary>
    public const double DefaultCatalystFraction = 0.05;

    public static ReactionKineticsModel Build(ReactionDetail detail, double sigmaKcalPerMol = 0.0)
    {
        ArgumentNullException.ThrowIfNull(detail);
        var problems = new List<string>();
        var states = detail.States.OrderBy(s => s.Position).ToList();
        var energies = detail.StateEnergies.ToDictionary(s => s.Position);
        var settings = detail.Model.Settings;
        if (!detail.Derived) problems.Add("The reaction has no derived energies yet.");
        else if (detail.Stale) problems.Add("The derived energies are out of date; wait for the recompute to finish.");
        if (detail.Steps.Count == 0) problems.Add("The pathway has no step minimum → saddle point → minimum.");

        var levels = new List<EnergyLevel>();
        foreach (var s in states)
        {
            if (!energies.TryGetValue(s.Position, out var e) || e.DeltaGHartree is not { } g)
            {
                problems.Add($"State {s.Label} has no Gibbs energy (thermal corrections are missing), so no rate constant can be formed.");
                continue;
            }
            levels.Add(new EnergyLevel(LevelKey(s.Position), Energy.FromHartree(g), e.DeltaHHartree is { } h ? Energy.FromHartree(h) : null, sigmaKcalPerMol));
        }

        var byPosition = states.ToDictionary(s => s.Position);
        var steps = new List<ElementaryStep>();
        var stored = new List<double?>();
        foreach (var d in detail.Steps.OrderBy(x => x.SaddlePosition))
        {
            if (!byPosition.TryGetValue(d.SaddlePosition - 1, out var from) || !byPosition.TryGetValue(d.SaddlePosition, out var ts)
                || !byPosition.TryGetValue(d.SaddlePosition + 1, out var to))
            {
                problems.Add($"Step {d.Label}: its states are not all in the pathway.");
                continue;
            }
            if (d.RateConstant is null && RefusalOf(detail, from, ts) is { } refused)
            {
                problems.Add($"Step {from.Label} → {to.Label}: the derivation gives no rate constant for it, so it cannot be simulated. {refused}");
                continue;
            }
            var reactants = Without(from, ts);
            var products = Without(to, ts);
            if (reactants.Count == 0 || products.Count == 0)
            {
                problems.Add($"Step {from.Label} → {to.Label}: no species changes on one side of {ts.Label}.");
                continue;
            }
            if (reactants.Sum(r => r.Coefficient) != d.Molecularity)
                problems.Add($"Step {from.Label} → {to.Label}: {reactants.Sum(r => r.Coefficient)} reacting molecules, but the stored molecularity is {d.Molecularity}.");
            TunnellingModel? tunnelling = null;
            if (Math.Abs(d.TransmissionCoefficient - 1.0) > 1e-12)
                tunnelling = settings.Tunnelling == TunnellingCorrection.Wigner && d.ImaginaryCm1 is { } nu && nu != 0
                    ? new WignerTunnelling(nu)
                    : new FixedTunnelling(d.TransmissionCoefficient);
            steps.Add(new ElementaryStep($"{from.Label} → {to.Label}", reactants, products,
                new EyringRates(LevelKey(from.Position), LevelKey(ts.Position), LevelKey(to.Position), tunnelling)));
            stored.Add(d.RateConstant);
        }

        var species = states.Where(s => s.Kind == StateKind.Minimum).SelectMany(s => s.Terms).Select(t => t.SpeciesLabel).Distinct(StringComparer.Ordinal).ToList();
        var first = states.FirstOrDefault()?.Terms.Select(t => t.SpeciesLabel).ToHashSet(StringComparer.Ordinal) ?? [];
        var last = states.LastOrDefault()?.Terms.Select(t => t.SpeciesLabel).ToHashSet(StringComparer.Ordinal) ?? [];
        var catalysts = first.Where(last.Contains).Order(StringComparer.Ordinal).ToList();
        var reactantsFirst = states.FirstOrDefault()?.Terms.Select(t => t.SpeciesLabel).Where(x => !last.Contains(x)).ToList() ?? [];
        var productsLast = states.LastOrDefault()?.Terms.Select(t => t.SpeciesLabel).Where(x => !first.Contains(x)).ToList() ?? [];
        var start = new Dictionary<string, double>(StringComparer.Ordinal);
        foreach (var x in first) start[x] = catalysts.Contains(x) ? DefaultReactantMolPerL * DefaultCatalystFraction : DefaultReactantMolPerL;

        var standard = new StandardConcentration(settings.StandardState);
        var network = new ReactionNetwork(species.Count == 0 ? ["(none)"] : species, steps, levels, settings.TemperatureKelvin, standard);
        if (problems.Count == 0)
        {
            try { network.Validate(); }
            catch (ArgumentException ex) { problems.Add(ex.Message); }
        }
        if (problems.Count == 0)
        {
            // One route to rate constants: at the model temperature every forward k the simulation uses must be the derivation's
            // stored k (the one the reaction page, exports and API show); a step whose k would differ is refused, never shown twice.
            var atModel = Microkinetics.RateConstants(network, settings.TemperatureKelvin);
            for (var i = 0; i < atModel.Count; i++)
                if (stored[i] is { } k0 && atModel[i] is { BarrierRaised: true, GibbsBarrier: { } raised })
                    problems.Add($"Step {atModel[i].Label}: its saddle point lies below the minimum after it (ΔG_r = {raised.KcalPerMol:0.0} kcal/mol is above " +
                        $"the stored ΔG‡), so the reverse step would have a negative barrier. The derivation's forward k ({k0:0.###E+0}) cannot be paired " +
                        "with a reverse k by detailed balance, and a raised barrier would be a second rate constant for the same step; it is not simulated. " +
                        "The saddle point, the minimum after it or the levels of theory need another look.");
                else if (stored[i] is { } k && Math.Abs(atModel[i].Forward / k - 1.0) > 1e-9)
                    problems.Add($"Step {atModel[i].Label}: the simulation's forward k ({atModel[i].Forward:0.###E+0}) differs from the derivation's stored k " +
                        $"({k:0.###E+0}) at {settings.TemperatureKelvin:0.##} K, so it is not simulated; recompute the reaction.");
        }
        return new ReactionKineticsModel(network, reactantsFirst.FirstOrDefault(), productsLast, catalysts, start, stored, problems, sigmaKcalPerMol);
    }

    /// <summary>Codes of the derivation's reasons for giving a step no rate constant.</summary>
    private static readonly string[] RefusalCodes = [Core.Pathways.PathwayEnergyCodes.NegativeBarrier, Core.Pathways.PathwayEnergyCodes.RateAboveLimit, Core.Pathways.PathwayEnergyCodes.NoRateConstant];

    // The derivation's own sentence for refusing the step from → saddle point (it names the step "Step from → saddle: …").
    private static string? RefusalOf(ReactionDetail detail, StateView from, StateView saddle) =>
        detail.ConsistencyReasons.FirstOrDefault(r => RefusalCodes.Contains(r.Code) && r.Message.StartsWith($"Step {from.Label} → {saddle.Label}:", StringComparison.Ordinal))?.Message;

    /// <summary>Level key of the state at a position.</summary>
    public static string LevelKey(int position) => $"state {position}";

    // Terms of a minimum minus those it shares with the saddle point (spectators), by coefficient.
    private static List<StepTerm> Without(StateView minimum, StateView saddle)
    {
        var inSaddle = saddle.Terms.GroupBy(t => t.SpeciesLabel).ToDictionary(g => g.Key, g => g.Sum(t => t.Coefficient), StringComparer.Ordinal);
        var result = new List<StepTerm>();
        foreach (var g in minimum.Terms.GroupBy(t => t.SpeciesLabel))
        {
            var left = g.Sum(t => t.Coefficient) - inSaddle.GetValueOrDefault(g.Key);
            if (left > 0) result.Add(new StepTerm(g.Key, left));
        }
        return result;
    }
}
