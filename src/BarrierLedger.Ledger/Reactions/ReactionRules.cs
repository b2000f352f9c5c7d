using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Ledger.Records;

namespace BarrierLedger.Ledger.Reactions;

/// <summary>A saddle-point state's calculation as the shape rules see it.</summary>
internal sealed record RuleCalculation(string Label, CalculationKind Kind, string Species, int AtomCount);

/// <summary>
/// One state as the shape rules see it, whoever wrote it (a bundle's labels or the builder's ids): its species by label with
/// coefficients, the calculation it names (null: names none; <see cref="Calculation"/> null while named: not found) and its atom pairs.
/// </summary>
internal sealed record RuleState(string Label, StateKind Kind, IReadOnlyList<(string Species, int Coefficient)> Terms, string? CalculationName,
    RuleCalculation? Calculation, IReadOnlyList<(int A, int B)> Pairs);

/// <summary>
/// The shape every stored pathway must have, checked for an upload and for the reaction builder alike: at least two states, each
/// with species and whole positive coefficients; a saddle-point state names a saddle-point calculation of one of its own species,
/// and its reaction-coordinate pairs are two different atoms of that calculation. The builder adds that state labels are given
/// and unique (a step is found by its saddle point's label) and that only a saddle point has bonds.
/// </summary>
internal static class ReactionRules
{
    /// <summary>Every broken rule as (0-based state or null for the whole pathway, message).</summary>
    public static List<(int? State, string Message)> Check(string where, IReadOnlyList<RuleState> states, string calculationNotFound, bool builder = false)
    {
        var problems = new List<(int?, string)>();
        if (states.Count < 2) problems.Add((null, $"{where} needs at least two states"));
        var labels = new HashSet<string>(StringComparer.Ordinal);
        for (var i = 0; i < states.Count; i++)
        {
            var s = states[i];
            void Add(string m) => problems.Add((i, m));
            if (builder && string.IsNullOrWhiteSpace(s.Label)) Add($"{where}, state {i + 1} has no label");
            else if (builder && !labels.Add(s.Label.Trim())) Add($"{where}, state '{s.Label}': another state has the same label; give each state its own");
            if (s.Terms.Count == 0) Add($"{where}, state '{s.Label}' has no species");
            foreach (var t in s.Terms)
                if (t.Coefficient < 1) Add($"{where}, state '{s.Label}': coefficient {t.Coefficient} of '{t.Species}' must be a whole number of 1 or more");
            if (builder && s.Kind == StateKind.Minimum && s.Pairs.Count > 0)
                Add($"{where}, state '{s.Label}' is a minimum; only a saddle point has forming or breaking bonds");
            if (s.Kind != StateKind.SaddlePoint) continue;
            if (s.CalculationName is null) { Add($"{where}, saddle-point state '{s.Label}' names no calculation"); continue; }
            if (s.Calculation is not { } c) { Add($"{where}, state '{s.Label}' names calculation '{s.CalculationName}', {calculationNotFound}"); continue; }
            if (c.Kind != CalculationKind.SaddlePoint) Add($"{where}, state '{s.Label}': calculation '{c.Label}' is a {c.Kind.Words()} calculation, not a saddle point");
            if (!s.Terms.Any(t => t.Species == c.Species))
                Add($"{where}, state '{s.Label}': calculation '{c.Label}' is of species '{c.Species}', which is not in this state");
            var n = c.AtomCount;
            foreach (var (a, b) in s.Pairs)
                if (a < 1 || b < 1 || a > n || b > n || a == b)
                    Add($"{where}, state '{s.Label}': reaction-coordinate pair {a}–{b} is not two different atoms between 1 and {n}");
            if (builder && s.Pairs.Select(p => (Math.Min(p.A, p.B), Math.Max(p.A, p.B))).Distinct().Count() < s.Pairs.Count)
                Add($"{where}, state '{s.Label}': the same bond is named twice");
        }
        return problems;
    }
}
