using System.Globalization;
using BarrierLedger.Core.Conformers;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Conformers;

/// <summary>One conformer as the species page lists it.</summary>
/// <param name="Label">Its label ("" for calculations given without one).</param>
/// <param name="CalculationIds">Its live calculations, oldest first.</param>
/// <param name="GeometryCalculationId">The calculation whose structure stands for it, or null when none has a geometry.</param>
/// <param name="Geometry">That structure.</param>
/// <param name="LevelOfTheory">The level of that calculation.</param>
/// <param name="RelativeKcalPerMol">Its G (or E, see <see cref="SpeciesConformers.ByGibbs"/>) above the lowest conformer that takes part, kcal/mol; null when it does not take part.</param>
/// <param name="Population">Boltzmann population at the model temperature among those that take part (duplicates counted as listed); null when it does not.</param>
/// <param name="DuplicateOf">Label of the conformer it repeats, or null.</param>
/// <param name="EnantiomerOf">Label of a conformer it is the mirror image of, or null.</param>
/// <param name="Problem">Why it could not be compared with the others by geometry, or null.</param>
/// <param name="Used">The energy model uses it: the lowest conformer, or every one in the ensemble.</param>
/// <param name="LeftOut">Why it takes no part in the energies (no energy at the model's level, no thermal correction), or null.</param>
public sealed record ConformerRow(string Label, IReadOnlyList<int> CalculationIds, int? GeometryCalculationId, Molecule? Geometry, string LevelOfTheory,
    double? RelativeKcalPerMol, double? Population, string? DuplicateOf, string? EnantiomerOf, string? Problem, bool Used = false, string? LeftOut = null)
{
    /// <summary>The label for people: "(unlabelled)" for the conformer given without one.</summary>
    public string Name => Label.Length > 0 ? Label : "(unlabelled)";
}

/// <summary>The conformers of one species with their energies, populations and marks.</summary>
/// <param name="TemperatureKelvin">The study's model temperature the populations are taken at.</param>
/// <param name="EnergyBasis">What the energies and populations compare, in words (shown above the table).</param>
/// <param name="Rows">One row per conformer, in the order they were stored.</param>
/// <param name="Notes">Duplicates, mirror images and conformers that could not be compared, in sentences.</param>
/// <param name="Summary">One sentence on the comparison, or null when fewer than two conformers have a structure.</param>
/// <param name="ByGibbs">The energies compared are Gibbs energies (false: electronic energies, no thermal corrections).</param>
/// <param name="Choice">What the energy model makes of them (<see cref="ConformerSelectionResult.Describe"/>), or null.</param>
public sealed record SpeciesConformers(double TemperatureKelvin, string EnergyBasis, IReadOnlyList<ConformerRow> Rows, IReadOnlyList<string> Notes, string? Summary,
    bool ByGibbs = false, string? Choice = null);

/// <summary>
/// The species page's conformer table: the species' live calculations grouped by conformer (<see cref="ConformerSet"/>) with the
/// duplicate and mirror-image marks recomputed from the stored structures, and each conformer's energies exactly as a reaction
/// would use them: the one resolver (<see cref="StateResolver"/>) and the one Core derivation (<see cref="PathwayEnergies.SpeciesEnergies"/>,
/// which applies <see cref="ConformerSelection.Select"/> under the study's energy model).
/// </summary>
public sealed class ConformerQueryService(IDbContextFactory<LedgerDbContext> factory)
{
    /// <summary>The conformers of a species; null when there is no such species.</summary>
    public async Task<SpeciesConformers?> GetAsync(int speciesId, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        var head = await db.Species.AsNoTracking().Where(s => s.Id == speciesId).Select(s => new { s.StudyId, s.Label }).FirstOrDefaultAsync(ct);
        if (head is null) return null;
        var (model, _) = await DerivationService.EffectiveModelAsync(db, head.StudyId, ct);
        var set = (await ConformerSet.LoadAsync(db, [speciesId], ct))[speciesId];
        var inputs = await DerivationInputs.ForReactionsAsync(db, [], ct, [speciesId]);
        var resolver = new StateResolver(model, inputs);
        ConformerUse? use = null;
        if (inputs.Species.TryGetValue(speciesId, out var sp) && resolver.Resolve(sp, null, sp.Label).Record is { } record)
            use = PathwayEnergies.SpeciesEnergies(record, resolver.CoreModel, out _).Conformer;
        return Describe(set, head.Label, model, use);
    }

    internal static SpeciesConformers Describe(ConformerSet set, string species, ModelSettings model, ConformerUse? use)
    {
        var inv = CultureInfo.InvariantCulture;
        var t = model.TemperatureKelvin;
        var rows = new List<ConformerRow>();
        var basis = "Fewer than two conformers have an energy under the energy model, so there is nothing to compare.";
        var byGibbs = use?.Selection.ByGibbs ?? false;
        var index = use is null ? [] : use.Energies.Select((e, i) => (e.Label, i)).ToDictionary(x => x.Label, x => x.i, StringComparer.Ordinal);
        if (use is not null)
        {
            var q = byGibbs ? "G" : "E";
            basis = string.Format(inv, "Δ{0}: {1} of each conformer under the study's energy model, relative to the lowest; population: Boltzmann weight " +
                "exp(−Δ{0}/RT) at {2:0.##} K (the model temperature), every listed conformer counted, duplicates included{3}. The model uses: {4}.",
                q, byGibbs ? "Gibbs energy (electronic energy plus thermal correction)" : "electronic energy (no conformer has a thermal correction)", t,
                byGibbs ? "; a conformer without a thermal correction takes no part" : "", use.Description);
        }
        for (var k = 0; k < set.Conformers.Length; k++)
        {
            var g = set.Conformers[k];
            var name = g.Label.Length > 0 ? g.Label : "(unlabelled)";
            double? relative = null, population = null;
            var used = false;
            string? leftOut = null;
            if (use is { } u && index.TryGetValue(name, out var i))
            {
                var sel = u.Selection;
                if (sel.Included.Contains(i))
                {
                    Energy Key(int j) => byGibbs ? u.Energies[j].Gibbs!.Value : u.Energies[j].Electronic;
                    relative = (Key(i) - Key(sel.Lowest)).KcalPerMol;
                    population = sel.Populations[i];
                    used = sel.Choice == ConformerChoice.BoltzmannEnsemble || i == sel.Lowest;
                }
                else leftOut = string.Format(inv, "no thermal correction (ΔE {0:+0.00;−0.00} kcal/mol)", (u.Energies[i].Electronic - u.Energies[sel.Lowest].Electronic).KcalPerMol);
            }
            else if (use is not null) leftOut = "no electronic energy under the energy model";
            rows.Add(new ConformerRow(g.Label, g.CalculationIds, g.GeometryCalculationId, g.Geometry, g.LevelOfTheory, relative, population,
                set.DuplicateOf(k), set.EnantiomerOf(k), ProblemOf(set, k), used, leftOut));
        }
        return new SpeciesConformers(t, basis, rows, set.Notes(species), set.Comparison?.Summary, byGibbs, use?.Description);
    }

    private static string? ProblemOf(ConformerSet set, int k)
    {
        if (set.Conformers[k].Geometry is null) return "no structure stored";
        var i = set.Compared.IndexOf(k);
        return set.Comparison is { } c && i >= 0 && !c.Conformers[i].Comparable ? c.Conformers[i].Problem : null;
    }
}
