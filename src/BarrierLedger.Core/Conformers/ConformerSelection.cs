using System.Collections.Immutable;
using System.Globalization;
using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Kinetics;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Conformers;

/// <summary>How a species with several conformers enters the energies of a pathway (part of the energy model).</summary>
public enum ConformerChoice
{
    /// <summary>The species' energies are those of its lowest conformer (by G; by E when there are no thermal corrections).</summary>
    Lowest,
    /// <summary>
    /// The Boltzmann-weighted ensemble: G = −RT ln Σ exp(−G_i/RT), H and E the population-weighted averages (by E alone, with
    /// E = −RT ln Σ exp(−E_i/RT), when there are no thermal corrections).
    /// </summary>
    BoltzmannEnsemble,
}

/// <summary>Words for a conformer choice, as the model banner and export headers state it.</summary>
public static class ConformerChoiceText
{
    public static string Of(ConformerChoice c) => c switch
    {
        ConformerChoice.Lowest => "lowest conformer",
        ConformerChoice.BoltzmannEnsemble => "Boltzmann-weighted conformer ensemble",
        _ => throw new ArgumentOutOfRangeException(nameof(c), c, "Unknown conformer choice."),
    };

    /// <summary>The choice as the model banner and every export header state it, with the formula of the ensemble.</summary>
    public static string Sentence(ConformerChoice c) => c switch
    {
        ConformerChoice.Lowest => "conformers: lowest conformer of each species (by G)",
        ConformerChoice.BoltzmannEnsemble => "conformers: Boltzmann-weighted ensemble of each species, G = −RT ln Σ exp(−G_i/RT)",
        _ => throw new ArgumentOutOfRangeException(nameof(c), c, "Unknown conformer choice."),
    };
}

/// <summary>One conformer of a species as a derivation sees it: its absolute energies under the model (per molecule).</summary>
/// <param name="Label">The conformer's label.</param>
/// <param name="Electronic">Electronic energy at the model's level.</param>
/// <param name="Enthalpy">E + enthalpy correction, or null without a thermal correction.</param>
/// <param name="Gibbs">E + Gibbs correction, or null without a thermal correction (then it cannot join a G ensemble).</param>
/// <param name="CheckPassed">For a saddle-point conformer: its frequency check passed. Minima: true.</param>
/// <param name="DuplicateOf">Index of the conformer it duplicates (<see cref="ConformerMark.DuplicateOf"/>), or null.</param>
/// <param name="DuplicateNote">How close it is to that one, for messages ("RMSD 0.02 Å, ΔE 0.01 kcal/mol"), or null.</param>
public sealed record ConformerEnergies(string Label, Energy Electronic, Energy? Enthalpy, Energy? Gibbs, bool CheckPassed = true, int? DuplicateOf = null, string? DuplicateNote = null);

/// <summary>What <see cref="ConformerSelection.Select"/> made of a species' conformers.</summary>
/// <param name="Choice">The model's choice.</param>
/// <param name="ByGibbs">Conformers were compared by G (false: by E, no thermal corrections anywhere).</param>
/// <param name="Lowest">Index of the lowest conformer that takes part (the one used under <see cref="ConformerChoice.Lowest"/>).</param>
/// <param name="Included">Indices of the conformers that take part: those with G when any has G, else all. Under
/// <see cref="ConformerChoice.Lowest"/> the energies are <see cref="Lowest"/>'s alone.</param>
/// <param name="Populations">Boltzmann population of every conformer at the model temperature (0 for one that does not take part), in input order.</param>
/// <param name="Electronic">The species' electronic energy under the choice.</param>
/// <param name="Enthalpy">Its enthalpy, or null.</param>
/// <param name="Gibbs">Its Gibbs energy, or null.</param>
public sealed record ConformerSelectionResult(
    ConformerChoice Choice, bool ByGibbs, int Lowest, ImmutableArray<int> Included, ImmutableArray<double> Populations,
    Energy Electronic, Energy? Enthalpy, Energy? Gibbs)
{
    /// <summary>"conformer c2 (lowest of 3)" or "ensemble of 3 conformers (c1 61 %, c2 30 %, c3 9 %)".</summary>
    public string Describe(IReadOnlyList<ConformerEnergies> conformers)
    {
        ArgumentNullException.ThrowIfNull(conformers);
        var inv = CultureInfo.InvariantCulture;
        if (Choice == ConformerChoice.Lowest || Included.Length == 1)
            return Included.Length == 1 && conformers.Count == 1 ? $"conformer {conformers[Lowest].Label}"
                : $"conformer {conformers[Lowest].Label} (lowest of {Included.Length})";
        var parts = Included.OrderByDescending(i => Populations[i]).Select(i => $"{conformers[i].Label} {(100 * Populations[i]).ToString("0", inv)} %");
        return $"ensemble of {Included.Length} conformers ({string.Join(", ", parts)})";
    }
}

/// <summary>
/// The conformer choice of the energy model applied to one species (issue 21), and the checks a reviewer sees:
/// a lower conformer than the one the barrier uses, a saddle-point conformer near the one used that has not passed its frequency
/// check, duplicates counted twice in a Boltzmann sum. Populations and the ensemble energy come from <see cref="Boltzmann"/>.
/// </summary>
public static class ConformerSelection
{
    /// <summary>Reason codes (stable).</summary>
    public const string LowerConformerCode = "conformers.lower-conformer-exists";
    public const string UncheckedSaddleConformerCode = "conformers.unchecked-saddle-conformer";
    public const string DuplicatesInEnsembleCode = "conformers.duplicates-in-ensemble";

    /// <summary>A few words for a reason code of this class (for a list where the full sentence is one click or hover away), or null for another code.</summary>
    public static string? ShortText(string code) => code switch
    {
        LowerConformerCode => "a lower reactant conformer exists",
        UncheckedSaddleConformerCode => "an unchecked saddle-point conformer within 1 kcal/mol",
        DuplicatesInEnsembleCode => "duplicates counted twice in the Boltzmann sum",
        _ => null,
    };

    /// <summary>A saddle-point conformer this close to the one used must have passed its check (issue 21: 1 kcal/mol).</summary>
    public const double NearSaddleKcalPerMol = 1.0;

    /// <summary>Below this an energy difference is no difference (common practice, no source).</summary>
    private const double SameKcalPerMol = 0.05;

    /// <summary>
    /// The species' energies under <paramref name="choice"/>: conformers with G take part when any has G (else all, by E);
    /// Lowest takes the lowest one's E, H, G; the ensemble takes G_ens = −RT ln Σ exp(−G_i/RT) with H and E weighted by the
    /// populations p_i = exp(−G_i/RT)/Σ (thermodynamically G_ens = ⟨H⟩ − T(⟨S⟩ + S_conf), S_conf = −R Σ p_i ln p_i), or by E
    /// alone the same formula over E_i.
    /// </summary>
    public static ConformerSelectionResult Select(IReadOnlyList<ConformerEnergies> conformers, ConformerChoice choice, double temperatureKelvin)
    {
        ArgumentNullException.ThrowIfNull(conformers);
        if (conformers.Count == 0) throw new ArgumentException("A species needs at least one conformer.", nameof(conformers));
        var byGibbs = conformers.Any(c => c.Gibbs is not null);
        var included = Enumerable.Range(0, conformers.Count).Where(i => !byGibbs || conformers[i].Gibbs is not null).ToImmutableArray();
        Energy Key(int i) => byGibbs ? conformers[i].Gibbs!.Value : conformers[i].Electronic;
        var keys = included.Select(Key).ToList();
        var p = Boltzmann.Populations(keys, temperatureKelvin);
        var populations = new double[conformers.Count];
        for (var k = 0; k < included.Length; k++) populations[included[k]] = p[k];
        var lowest = included.OrderBy(i => Key(i).Hartree).ThenBy(i => i).First();
        if (choice == ConformerChoice.Lowest)
        {
            var c = conformers[lowest];
            return new ConformerSelectionResult(choice, byGibbs, lowest, included, [.. populations], c.Electronic, c.Enthalpy, c.Gibbs);
        }
        if (!byGibbs)
        {
            var e = Boltzmann.EnsembleFreeEnergy(keys, temperatureKelvin);
            return new ConformerSelectionResult(choice, false, lowest, included, [.. populations], e, null, null);
        }
        var g = Boltzmann.EnsembleFreeEnergy(keys, temperatureKelvin);
        var eAvg = Weighted(included, populations, i => conformers[i].Electronic, conformers[lowest].Electronic);
        Energy? h = included.All(i => conformers[i].Enthalpy is not null)
            ? Weighted(included, populations, i => conformers[i].Enthalpy!.Value, conformers[lowest].Enthalpy!.Value) : null;
        return new ConformerSelectionResult(choice, true, lowest, included, [.. populations], eAvg, h, g);
    }

    // Σ p_i x_i taken relative to a reference value, so hartree totals keep their digits.
    private static Energy Weighted(ImmutableArray<int> included, double[] p, Func<int, Energy> x, Energy reference) =>
        reference + Energy.FromHartree(included.Sum(i => p[i] * (x(i) - reference).Hartree));

    /// <summary>
    /// The reviewer-facing reasons for one species in one state:
    /// <list type="bullet">
    /// <item>minimum: a conformer that does not take part (no thermal correction) with an electronic energy below the lowest one
    /// that does, by more than 0.05 kcal/mol: its G is estimated with the thermal correction of the lowest one, and the effect on
    /// the state's G (so on every barrier measured from it) is stated;</item>
    /// <item>saddle point: a conformer within 1 kcal/mol of the lowest one used (by G when both have it, else by E), or below it,
    /// that has not passed its frequency check;</item>
    /// <item>Boltzmann ensemble: conformers marked as duplicates of another that also takes part, with the amount the
    /// repeated terms lower G.</item>
    /// </list>
    /// </summary>
    public static IReadOnlyList<CheckReason> Check(string state, string species, bool saddlePoint, IReadOnlyList<ConformerEnergies> conformers,
        ConformerSelectionResult selection, double temperatureKelvin)
    {
        ArgumentNullException.ThrowIfNull(conformers);
        ArgumentNullException.ThrowIfNull(selection);
        var inv = CultureInfo.InvariantCulture;
        // A minus sign, not a hyphen, as in the tool's other messages.
        string K(double kcal) => kcal.ToString("0.00", inv).Replace('-', '−');
        var reasons = new List<CheckReason>();
        var used = conformers[selection.Lowest];
        var inEnsemble = selection.Included.ToHashSet();

        if (!saddlePoint && selection.ByGibbs)
        {
            foreach (var i in Enumerable.Range(0, conformers.Count).Where(i => !inEnsemble.Contains(i)))
            {
                var c = conformers[i];
                var de = (c.Electronic - used.Electronic).KcalPerMol;
                if (de > -SameKcalPerMol) continue;
                // G estimated with the used conformer's thermal correction (the lower one has none of its own).
                var gEstimate = c.Electronic + (used.Gibbs!.Value - used.Electronic);
                double effect;
                if (selection.Choice == ConformerChoice.Lowest) effect = (used.Gibbs!.Value - gEstimate).KcalPerMol;
                else
                {
                    var with = selection.Included.Select(k => conformers[k].Gibbs!.Value).Append(gEstimate).ToList();
                    effect = (selection.Gibbs!.Value - Boltzmann.EnsembleFreeEnergy(with, temperatureKelvin)).KcalPerMol;
                }
                reasons.Add(new CheckReason(LowerConformerCode, CheckSeverity.Attention,
                    $"State {state}: a lower conformer of {species} exists than the one the barrier uses: {c.Label} lies {K(-de)} kcal/mol below " +
                    $"{used.Label} in electronic energy (ΔE = {K(de)} kcal/mol) but has no thermal correction, so it is left out. " +
                    $"With {used.Label}'s thermal correction its ΔG would be about {K(de)} kcal/mol, and including it would lower this state's G " +
                    $"by about {K(effect)} kcal/mol, raising ΔG‡ of every barrier measured from {state} by as much."));
            }
        }

        if (saddlePoint)
        {
            if (!used.CheckPassed)
                reasons.Add(new CheckReason(UncheckedSaddleConformerCode, CheckSeverity.Attention,
                    $"State {state}: the saddle-point conformer the barrier uses, {used.Label} of {species}, has not passed its frequency check."));
            foreach (var i in Enumerable.Range(0, conformers.Count).Where(i => i != selection.Lowest && !conformers[i].CheckPassed))
            {
                var c = conformers[i];
                var both = c.Gibbs is not null && used.Gibbs is not null;
                var d = both ? (c.Gibbs!.Value - used.Gibbs!.Value).KcalPerMol : (c.Electronic - used.Electronic).KcalPerMol;
                if (d > NearSaddleKcalPerMol) continue;
                var what = both ? "ΔG" : "ΔE";
                var role = inEnsemble.Contains(i) && selection.Choice == ConformerChoice.BoltzmannEnsemble
                    ? "it counts in the ensemble" : "if it is a true saddle point of this step it would change the barrier";
                reasons.Add(new CheckReason(UncheckedSaddleConformerCode, CheckSeverity.Attention,
                    $"State {state}: the saddle-point ensemble of {species} has a conformer within {K(NearSaddleKcalPerMol)} kcal/mol that was not checked: " +
                    $"{c.Label} ({what} = {(d >= 0 ? "+" : "")}{K(d)} kcal/mol from {used.Label}) has not passed its frequency check; {role}."));
            }
        }

        if (selection.Choice == ConformerChoice.BoltzmannEnsemble && selection.Included.Length > 1)
        {
            var repeated = selection.Included.Where(i => conformers[i].DuplicateOf is { } o && inEnsemble.Contains(o)).ToList();
            if (repeated.Count > 0)
            {
                Energy Key(int k) => selection.ByGibbs ? conformers[k].Gibbs!.Value : conformers[k].Electronic;
                var once = selection.Included.Where(i => !repeated.Contains(i)).Select(Key).ToList();
                var all = selection.Included.Select(Key).ToList();
                var lowered = (Boltzmann.EnsembleFreeEnergy(once, temperatureKelvin) - Boltzmann.EnsembleFreeEnergy(all, temperatureKelvin)).KcalPerMol;
                var pairs = string.Join("; ", repeated.Select(i => $"{conformers[i].Label} repeats {conformers[conformers[i].DuplicateOf!.Value].Label}"
                    + (conformers[i].DuplicateNote is { } n ? $" ({n})" : "")));
                reasons.Add(new CheckReason(DuplicatesInEnsembleCode, CheckSeverity.Attention,
                    $"State {state}: duplicates counted twice in the Boltzmann sum of {species}: {pairs}. The repeated " +
                    $"term{(repeated.Count == 1 ? "" : "s")} lower{(repeated.Count == 1 ? "s" : "")} its G by {K(lowered)} kcal/mol; retire the duplicate to count it once."));
            }
        }
        return reasons;
    }
}
