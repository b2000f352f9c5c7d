using System.Globalization;
using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Chemistry;

namespace BarrierLedger.Core.Pathways;

/// <summary>Stable codes of the barrier-consistency check.</summary>
public static class ConsistencyCodes
{
    public const string FormulaDiffers = "consistency.formula-differs";
    public const string ChargeDiffers = "consistency.charge-differs";
    public const string ElectronsDiffer = "consistency.electrons-differ";
    public const string MixedElectronicLevels = "consistency.mixed-electronic-levels";
    public const string MixedThermalLevels = "consistency.mixed-thermal-levels";
    public const string MixedThermalTemperatures = "consistency.mixed-thermal-temperatures";
    public const string MissingThermal = "consistency.missing-thermal";
    public const string SpinChange = "consistency.spin-change";
}

/// <summary>The outcome of <see cref="BarrierConsistency.Check"/>: a verdict and every violation as a coded reason.</summary>
public sealed record ConsistencyResult(Verdict Verdict, IReadOnlyList<CheckReason> Reasons)
{
    public string Report() => CheckReport.Format(Verdict, Reasons);
}

/// <summary>
/// Can energies of these states be subtracted? Every state must have the same elemental formula, total charge and total
/// electron count as the first (mass and charge balance); every electronic energy must come from one level of theory, and
/// every thermal correction from one level and one temperature (otherwise the differences contain method error that does
/// not cancel). A change of spin multiplicity between states is named: the barrier then assumes the system crosses between
/// spin surfaces. Each violation is a coded reason that travels with any barrier derived from the pathway, never dropped.
/// </summary>
public static class BarrierConsistency
{
    /// <summary>Checks <paramref name="pathway"/>; with <paramref name="requireThermal"/> every species must carry thermal corrections.</summary>
    public static ConsistencyResult Check(Pathway pathway, bool requireThermal = false)
    {
        ArgumentNullException.ThrowIfNull(pathway);
        pathway.Validate();
        var reasons = new List<CheckReason>();
        var first = pathway.States[0];
        foreach (var s in pathway.States.Skip(1))
        {
            if (s.Formula != first.Formula)
                reasons.Add(new(ConsistencyCodes.FormulaDiffers, CheckSeverity.Failure,
                    $"State '{s.Label}' is {s.Formula} but the first state '{first.Label}' is {first.Formula} ({s.Formula.DifferenceFrom(first.Formula)}): " +
                    "atoms are not balanced, so an energy difference between them is meaningless. Add the missing species to the states."));
            if (s.Charge != first.Charge)
                reasons.Add(new(ConsistencyCodes.ChargeDiffers, CheckSeverity.Failure,
                    $"State '{s.Label}' has total charge {s.Charge} but '{first.Label}' has {first.Charge}: charge is not balanced."));
            if (s.ElectronCount != first.ElectronCount)
                reasons.Add(new(ConsistencyCodes.ElectronsDiffer, CheckSeverity.Failure,
                    $"State '{s.Label}' has {s.ElectronCount} electrons but '{first.Label}' has {first.ElectronCount}."));
        }

        var species = pathway.States.SelectMany(s => s.Terms.Select(t => t.Species)).Distinct().ToList();
        var electronic = GroupByLevel(species, sp => sp.ElectronicLevel);
        if (electronic.Count > 1)
            reasons.Add(new(ConsistencyCodes.MixedElectronicLevels, CheckSeverity.Failure,
                $"Electronic energies come from {electronic.Count} levels of theory: {Describe(electronic)}. " +
                "Energies from different levels cannot be subtracted; recompute the odd ones at one level."));

        var withThermal = species.Where(sp => sp.Thermal is not null).ToList();
        var missing = species.Where(sp => sp.Thermal is null).ToList();
        if (missing.Count > 0 && (requireThermal || withThermal.Count > 0))
            reasons.Add(new(ConsistencyCodes.MissingThermal, requireThermal ? CheckSeverity.Failure : CheckSeverity.Attention,
                $"{Names(missing)} {(missing.Count == 1 ? "has" : "have")} no thermal correction, so ΔH and ΔG cannot be given for the states that contain {(missing.Count == 1 ? "it" : "them")}."));
        if (withThermal.Count > 0)
        {
            var thermal = GroupByLevel(withThermal, sp => sp.Thermal!.Level);
            if (thermal.Count > 1)
                reasons.Add(new(ConsistencyCodes.MixedThermalLevels, CheckSeverity.Failure,
                    $"Thermal corrections come from {thermal.Count} levels of theory: {Describe(thermal)}. Use frequencies from one level for all species."));
            var temps = withThermal.GroupBy(sp => Math.Round(sp.Thermal!.TemperatureKelvin, 2)).ToList();
            if (temps.Count > 1)
                reasons.Add(new(ConsistencyCodes.MixedThermalTemperatures, CheckSeverity.Failure,
                    $"Thermal corrections were computed at {temps.Count} temperatures: " +
                    string.Join("; ", temps.Select(g => $"{g.Key.ToString("0.##", CultureInfo.InvariantCulture)} K for {Names(g)}")) + "."));
        }

        for (var i = 1; i < pathway.States.Count; i++)
        {
            var (a, b) = (pathway.States[i - 1], pathway.States[i]);
            var ma = a.Terms.SelectMany(t => Enumerable.Repeat(t.Species.Multiplicity, t.Coefficient)).Where(m => m > 1).Order().ToList();
            var mb = b.Terms.SelectMany(t => Enumerable.Repeat(t.Species.Multiplicity, t.Coefficient)).Where(m => m > 1).Order().ToList();
            if (ma.SequenceEqual(mb)) continue;
            var ra = Reachable(ma);
            var rb = Reachable(mb);
            var common = ra.Intersect(rb).Order().ToList();
            reasons.Add(common.Count > 0
                ? new(ConsistencyCodes.SpinChange, CheckSeverity.Info,
                    $"Spin multiplicities change from '{a.Label}' [{a.SpinText}] to '{b.Label}' [{b.SpinText}]; the parts can couple to a common total " +
                    $"multiplicity ({string.Join(" or ", common)}), so spin can be conserved. State the spin of each state in the manuscript.")
                : new(ConsistencyCodes.SpinChange, CheckSeverity.Attention,
                    $"Spin multiplicity changes from '{a.Label}' [{a.SpinText}] to '{b.Label}' [{b.SpinText}] and no common total spin exists: this step " +
                    "assumes the system crosses between spin surfaces. The barrier then depends on the crossing point, not only on these states."));
        }

        var ordered = reasons.OrderByDescending(r => r.Severity).ToList();
        return new ConsistencyResult(CheckReason.VerdictOf(ordered), ordered);
    }

    /// <summary>
    /// The total multiplicities 2S+1 that parts of multiplicities m_i can couple to (angular-momentum addition: S from |S₁ − S₂|
    /// to S₁ + S₂ in steps of one, applied part by part).
    /// </summary>
    private static HashSet<int> Reachable(IEnumerable<int> multiplicities)
    {
        var twoS = new HashSet<int> { 0 };
        foreach (var m in multiplicities)
        {
            var next = new HashSet<int>();
            foreach (var a in twoS)
                for (var t = Math.Abs(a - (m - 1)); t <= a + (m - 1); t += 2) next.Add(t);
            twoS = next;
        }
        return [.. twoS.Select(t => t + 1)];
    }

    private static List<(LevelOfTheory Level, List<SpeciesRecord> Species)> GroupByLevel(IEnumerable<SpeciesRecord> species, Func<SpeciesRecord, LevelOfTheory> level)
    {
        var groups = new List<(LevelOfTheory, List<SpeciesRecord>)>();
        foreach (var sp in species)
        {
            var l = level(sp);
            var g = groups.FindIndex(x => x.Item1.SameAs(l));
            if (g < 0) groups.Add((l, [sp])); else groups[g].Item2.Add(sp);
        }
        return groups;
    }

    private static string Describe(List<(LevelOfTheory Level, List<SpeciesRecord> Species)> groups) =>
        string.Join("; ", groups.Select(g => $"{g.Level} for {Names(g.Species)}"));

    private static string Names(IEnumerable<SpeciesRecord> species) => string.Join(", ", species.Select(s => s.Label));
}
