using BarrierLedger.Core.Diagrams;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Records;

namespace BarrierLedger.Web.Components.Pages.Reaction;

/// <summary>The energy diagram's levels built from a reaction's derived states, for one quantity.</summary>
public static class DiagramData
{
    public const string Gibbs = "ΔG";
    public const string Enthalpy = "ΔH";
    public const string Electronic = "ΔE";

    /// <summary>
    /// One level per state in pathway order (by position), relative energies as derived (hartree per molecule), saddle points
    /// marked. When any state lacks the quantity, no level at all and <paramref name="missing"/> names those states: a diagram
    /// with a silent gap would read as a different pathway.
    /// </summary>
    /// <summary>
    /// Why the diagram lacks <paramref name="missing"/> of <paramref name="total"/> states. When none has a value the pathway
    /// had no energies to compare (a state without an energy at the model's level empties them all), not a lack of frequencies.
    /// </summary>
    public static string MissingReason(string quantity, int missing, int total) =>
        missing >= total
            ? "the pathway's energies could not be formed under the model in force; the consistency rule above says why"
            : quantity == Electronic ? "no electronic energy" : "no thermal corrections (no frequencies or program corrections)";

    public static IReadOnlyList<DiagramState> FromStates(IEnumerable<DerivedState> states, string quantity, out IReadOnlyList<string> missing)
    {
        var lacking = new List<string>();
        var levels = new List<DiagramState>();
        foreach (var s in states.OrderBy(s => s.Position))
        {
            var value = quantity switch
            {
                Electronic => s.DeltaEHartree,
                Enthalpy => s.DeltaHHartree,
                Gibbs => s.DeltaGHartree,
                _ => throw new ArgumentException($"Unknown quantity '{quantity}'; expected {Gibbs}, {Enthalpy} or {Electronic}.", nameof(quantity)),
            };
            if (value is { } v) levels.Add(new DiagramState(s.Label, Energy.FromHartree(v), s.Kind == nameof(StateKind.SaddlePoint)));
            else lacking.Add(s.Label);
        }
        missing = lacking;
        return lacking.Count > 0 ? [] : levels;
    }
}
