using System.Globalization;
using BarrierLedger.Core.Conformers;
using BarrierLedger.Core.Geometry;
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
/// <param name="LevelOfTheory">The level of the energy compared.</param>
/// <param name="RelativeKcalPerMol">Its energy above the lowest conformer compared, kcal/mol; null when it has none at the common level.</param>
/// <param name="Population">Boltzmann population at the model temperature among the conformers compared (duplicates counted as listed); null when not compared.</param>
/// <param name="DuplicateOf">Label of the conformer it repeats, or null.</param>
/// <param name="EnantiomerOf">Label of a conformer it is the mirror image of, or null.</param>
/// <param name="Problem">Why it could not be compared with the others by geometry, or null.</param>
public sealed record ConformerRow(string Label, IReadOnlyList<int> CalculationIds, int? GeometryCalculationId, Molecule? Geometry, string LevelOfTheory,
    double? RelativeKcalPerMol, double? Population, string? DuplicateOf, string? EnantiomerOf, string? Problem)
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
public sealed record SpeciesConformers(double TemperatureKelvin, string EnergyBasis, IReadOnlyList<ConformerRow> Rows, IReadOnlyList<string> Notes, string? Summary);

/// <summary>
/// The species page's conformer table: the species' live calculations grouped by conformer (<see cref="ConformerSet"/>), each
/// conformer's energy relative to the lowest and its Boltzmann population at the study's model temperature
/// (<see cref="ConformerSelection.Select"/>), and the duplicate and mirror-image marks recomputed from the stored structures.
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
        return Describe(set, head.Label, model.TemperatureKelvin);
    }

    /// <summary>
    /// Energies: each conformer's representative calculation (the structure compared) at the level most of them share; conformers at
    /// another level or without an energy get none. Populations p_i = exp(−ΔE_i/RT)/Σ over those, every listed conformer counted.
    /// </summary>
    internal static SpeciesConformers Describe(ConformerSet set, string species, double temperatureKelvin)
    {
        var inv = CultureInfo.InvariantCulture;
        var groups = set.Conformers;
        var withEnergy = Enumerable.Range(0, groups.Length).Where(k => groups[k].EnergyHartree is not null).ToList();
        var key = withEnergy.GroupBy(k => groups[k].EnergyKey).OrderByDescending(g => g.Count()).ThenBy(g => g.Min()).FirstOrDefault()?.Key;
        var compared = withEnergy.Where(k => groups[k].EnergyKey == key).ToList();
        var relative = new double?[groups.Length];
        var population = new double?[groups.Length];
        var basis = "No conformer has an energy stored yet.";
        if (compared.Count > 0)
        {
            var energies = compared.Select(k => new ConformerEnergies(groups[k].Label, Energy.FromHartree(groups[k].EnergyHartree!.Value), null, null)).ToList();
            var selection = ConformerSelection.Select(energies, ConformerChoice.BoltzmannEnsemble, temperatureKelvin);
            var lowest = energies[selection.Lowest].Electronic;
            for (var i = 0; i < compared.Count; i++)
            {
                relative[compared[i]] = (energies[i].Electronic - lowest).KcalPerMol;
                population[compared[i]] = selection.Populations[i];
            }
            var level = groups[compared[0]].LevelOfTheory;
            basis = string.Format(inv, "ΔE: electronic energy of each conformer's structure at {0}, relative to the lowest; population: Boltzmann weight " +
                "exp(−ΔE/RT) at {1:0.##} K (the study's model temperature), every listed conformer counted, duplicates included; no thermal corrections.",
                level.Length > 0 ? level : "the stored level", temperatureKelvin);
            var other = withEnergy.Count - compared.Count;
            if (other > 0) basis += $" {other} conformer{(other == 1 ? " has its" : "s have their")} energy at another level and {(other == 1 ? "is" : "are")} left out.";
        }
        var rows = groups.Select((g, k) => new ConformerRow(g.Label, g.CalculationIds, g.GeometryCalculationId, g.Geometry, g.LevelOfTheory,
            relative[k], population[k], set.DuplicateOf(k), set.EnantiomerOf(k), ProblemOf(set, k))).ToList();
        return new SpeciesConformers(temperatureKelvin, basis, rows, set.Notes(species), set.Comparison?.Summary);
    }

    private static string? ProblemOf(ConformerSet set, int k)
    {
        if (set.Conformers[k].Geometry is null) return "no structure stored";
        var i = set.Compared.IndexOf(k);
        return set.Comparison is { } c && i >= 0 && !c.Conformers[i].Comparable ? c.Conformers[i].Problem : null;
    }
}
