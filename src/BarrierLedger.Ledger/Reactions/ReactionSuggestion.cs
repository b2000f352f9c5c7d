using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Records;

namespace BarrierLedger.Ledger.Reactions;

/// <summary>
/// A first draft of a reaction from results just stored, for the builder to open pre-filled: one saddle-point state per
/// saddle-point result (its scans attached), and the minima split into reactants and products so that each side has the
/// saddle point's formula where such a split exists (the first minimum in the given order goes with the reactants). It is a
/// suggestion the member reviews; nothing is stored until the builder saves.
/// </summary>
public static class ReactionSuggestion
{
    /// <summary>Most minima tried in every split (2^n subsets).</summary>
    public const int MaxMinimaToSplit = 10;

    public static ReactionDefinition FromResults(StudyWorkspace w, IReadOnlyList<int> calculationIds, IReadOnlyList<int> scanIds)
    {
        ArgumentNullException.ThrowIfNull(w);
        var calcs = calculationIds.Select(id => w.Species.SelectMany(s => s.Calculations.Select(c => (Species: s, Calc: c))).FirstOrDefault(x => x.Calc.Id == id))
            .Where(x => x.Calc is not null && !x.Calc.Retired && !x.Species.Retired).ToList();
        var saddles = calcs.Where(x => x.Calc.Kind == CalculationKind.SaddlePoint).ToList();
        var saddleSpecies = saddles.Select(x => x.Species.Id).ToHashSet();
        var minima = calcs.Where(x => x.Calc.Kind is not (CalculationKind.SaddlePoint or CalculationKind.RelaxedScan) && !saddleSpecies.Contains(x.Species.Id))
            .Select(x => x.Species).DistinctBy(s => s.Id).ToList();
        var target = saddles.Select(x => x.Species.Formula).FirstOrDefault(f => f.Length > 0);

        var (reactants, products) = Split(minima, target);
        var states = new List<StateDefinition> { new("reactants", StateKind.Minimum, [.. reactants.Select(s => new TermDefinition(s.Id))]) };
        var scans = scanIds.Where(id => w.Scans.Any(s => s.Id == id && !s.Retired)).ToList();
        for (var i = 0; i < saddles.Count; i++)
        {
            var (species, calc) = saddles[i];
            states.Add(new StateDefinition(saddles.Count == 1 ? "TS" : $"TS{i + 1}", StateKind.SaddlePoint, [new TermDefinition(species.Id)], calc.Id, [],
                i == 0 ? scans : []));
            if (i < saddles.Count - 1) states.Add(new StateDefinition($"INT{i + 1}", StateKind.Minimum, []));
        }
        if (saddles.Count == 0) states.Add(new StateDefinition("TS", StateKind.SaddlePoint, []));
        states.Add(new StateDefinition("products", StateKind.Minimum, [.. products.Select(s => new TermDefinition(s.Id))]));
        var label = saddles.Count > 0 ? $"{string.Join(" + ", reactants.Select(s => s.Label).DefaultIfEmpty("?"))} → {string.Join(" + ", products.Select(s => s.Label).DefaultIfEmpty("?"))}" : "";
        return new ReactionDefinition(label.Length > 200 ? label[..200] : label, "", states);
    }

    private static (List<WorkspaceSpecies> Reactants, List<WorkspaceSpecies> Products) Split(List<WorkspaceSpecies> minima, string? target)
    {
        if (minima.Count == 0) return ([], []);
        if (target is null || minima.Count > MaxMinimaToSplit || minima.Any(m => m.Formula.Length == 0)) return ([.. minima.Take(1)], [.. minima.Skip(1)]);
        var want = Formula.Parse(target);
        var formulas = minima.Select(m => Formula.Parse(m.Formula)).ToList();
        Formula SumOf(IEnumerable<int> idx) => Formula.Sum(idx.Select(i => (formulas[i], 1)));
        List<(List<int> In, bool OtherBalances)> found = [];
        for (var mask = 1; mask < 1 << minima.Count; mask += 2) // odd masks: the first minimum is a reactant
        {
            var chosen = Enumerable.Range(0, minima.Count).Where(i => (mask & (1 << i)) != 0).ToList();
            if (SumOf(chosen) != want) continue;
            var rest = Enumerable.Range(0, minima.Count).Except(chosen).ToList();
            found.Add((chosen, rest.Count > 0 && SumOf(rest) == want));
        }
        // Prefer a split where both sides balance, then the one whose reactants come first in the given order.
        var best = found.OrderByDescending(f => f.OtherBalances).ThenBy(f => f.In.Count).FirstOrDefault();
        if (best.In is null) return ([.. minima.Take(1)], [.. minima.Skip(1)]);
        return ([.. best.In.Select(i => minima[i])], [.. Enumerable.Range(0, minima.Count).Except(best.In).Select(i => minima[i])]);
    }
}
