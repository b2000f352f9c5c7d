using System.Collections.Immutable;
using System.Globalization;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Conformers;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Conformers;

/// <summary>One live calculation as the conformer grouping reads it.</summary>
internal sealed record ConformerCalc(int Id, string Conformer, CalculationKind Kind, double? EnergyHartree, string EnergyKey, byte[]? AtomicNumbers, byte[]? Positions,
    string LevelOfTheory = "");

/// <summary>One conformer of a species: its label, its calculations, and the one whose geometry (and energy) stands for it.</summary>
/// <param name="Label">The conformer's label; empty for calculations given without one.</param>
/// <param name="CalculationIds">Its live calculations, oldest first.</param>
/// <param name="GeometryCalculationId">The calculation whose geometry represents it: the newest optimised structure (minimum or saddle
/// point), else the newest frequency job, IRC endpoint or single point with a geometry; null when none has one.</param>
/// <param name="Geometry">That geometry.</param>
/// <param name="EnergyHartree">That calculation's electronic energy.</param>
/// <param name="EnergyKey">Its energy level (normalised), for telling whether two conformers' energies can be compared.</param>
/// <param name="LevelOfTheory">That calculation's level of theory as stored, for people.</param>
public sealed record ConformerGroup(string Label, ImmutableArray<int> CalculationIds, int? GeometryCalculationId, Molecule? Geometry, double? EnergyHartree, string EnergyKey,
    string LevelOfTheory = "");

/// <summary>The conformers of one species and what they are to each other.</summary>
/// <param name="Conformers">The conformers in the order they were stored (the unlabelled one first).</param>
/// <param name="Comparison">Duplicates and mirror images among those with a geometry (indices into <see cref="Compared"/>); null when fewer than two have one.</param>
/// <param name="Compared">Indices into <see cref="Conformers"/> of the conformers that were compared, in comparison order.</param>
/// <param name="EnergiesCompared">Their energies took part (all at one level); false: geometry alone decided.</param>
public sealed record ConformerSet(ImmutableArray<ConformerGroup> Conformers, ConformerComparison? Comparison, ImmutableArray<int> Compared, bool EnergiesCompared)
{
    /// <summary>The label of the conformer that <paramref name="conformer"/> duplicates, or null.</summary>
    public string? DuplicateOf(int conformer) => Mark(conformer) is { DuplicateOf: { } d } ? Conformers[Compared[d]].Label : null;

    /// <summary>The label of a conformer that <paramref name="conformer"/> is the mirror image of, or null.</summary>
    public string? EnantiomerOf(int conformer) => Mark(conformer) is { EnantiomerOf: { } e } ? Conformers[Compared[e]].Label : null;

    /// <summary>The comparison's pair for two conformers (indices into <see cref="Conformers"/>), or null when they are simply distinct.</summary>
    public ConformerPair? Pair(int a, int b)
    {
        if (Comparison is null) return null;
        int i = Compared.IndexOf(a), j = Compared.IndexOf(b);
        if (i < 0 || j < 0) return null;
        var (lo, hi) = i < j ? (i, j) : (j, i);
        return Comparison.Pairs.FirstOrDefault(p => p.First == lo && p.Second == hi);
    }

    private ConformerMark? Mark(int conformer)
    {
        var k = Compared.IndexOf(conformer);
        return k < 0 || Comparison is null ? null : Comparison.Conformers[k];
    }

    /// <summary>
    /// Sentences for the upload result and the species page: every duplicate with what it repeats (RMSD, ΔE), every mirror-image
    /// pair, every conformer that could not be compared. Empty for a species with one conformer.
    /// </summary>
    public IReadOnlyList<string> Notes(string species)
    {
        var inv = CultureInfo.InvariantCulture;
        var notes = new List<string>();
        if (Comparison is not { } c) return notes;
        string L(int k) => Conformers[Compared[k]].Label is { Length: > 0 } l ? l : "(unlabelled)";
        foreach (var p in c.Pairs)
        {
            var de = p.EnergyDifferenceKcalPerMol is { } d ? string.Format(inv, ", ΔE {0:0.00} kcal/mol", d) : "";
            notes.Add(p.Relation switch
            {
                ConformerRelation.Duplicate => string.Format(inv, "species {0}: conformer {1} duplicates {2} (RMSD {3:0.000} Å{4})", species, L(p.Second), L(p.First), p.RmsdAngstrom, de),
                ConformerRelation.Enantiomer => string.Format(inv, "species {0}: conformers {1} and {2} are mirror images (RMSD {3:0.000} Å, {4:0.000} Å after inversion{5})",
                    species, L(p.First), L(p.Second), p.RmsdAngstrom, p.MirrorRmsdAngstrom, de),
                _ => string.Format(inv, "species {0}: conformers {1} and {2} have the same structure (RMSD {3:0.000} Å) but energies {4} apart; " +
                    "another calculation of one structure, or an error", species, L(p.First), L(p.Second), p.RmsdAngstrom, de.TrimStart(',', ' ')),
            });
        }
        foreach (var m in c.Conformers.Where(m => !m.Comparable))
            notes.Add($"species {species}: conformer {L(m.Index)} cannot be compared with the others: {m.Problem}");
        if (!EnergiesCompared && c.Pairs.Length > 0)
            notes.Add($"species {species}: the conformers' energies are at different levels of theory, so geometry alone decided");
        return notes;
    }

    /// <summary>Groups a species' live calculations by conformer and compares the conformers' geometries (<see cref="ConformerEnsemble"/>).</summary>
    internal static ConformerSet Of(IEnumerable<ConformerCalc> calcs, int charge, int multiplicity, ConformerOptions? options = null)
    {
        var groups = calcs.GroupBy(c => c.Conformer, StringComparer.Ordinal).OrderBy(g => g.Key.Length == 0 ? 0 : 1)
            .ThenBy(g => g.Min(c => c.Id)).Select(g =>
            {
                var ordered = g.OrderBy(c => c.Id).ToList();
                var rep = ordered.Where(c => c.AtomicNumbers is { Length: > 0 } && c.Kind is CalculationKind.Minimum or CalculationKind.SaddlePoint).LastOrDefault()
                          ?? ordered.Where(c => c.AtomicNumbers is { Length: > 0 } && c.Kind != CalculationKind.RelaxedScan).LastOrDefault();
                var mol = rep is null ? null : Blobs.ToMolecule(rep.AtomicNumbers, rep.Positions, charge, multiplicity);
                return new ConformerGroup(g.Key, [.. ordered.Select(c => c.Id)], rep?.Id, mol, rep?.EnergyHartree, rep?.EnergyKey ?? "", rep?.LevelOfTheory ?? "");
            }).ToImmutableArray();
        var compared = Enumerable.Range(0, groups.Length).Where(k => groups[k].Geometry is not null).ToImmutableArray();
        if (compared.Length < 2) return new ConformerSet(groups, null, compared, false);
        var withEnergy = compared.All(k => groups[k].EnergyHartree is not null) && compared.Select(k => groups[k].EnergyKey).Distinct().Count() == 1;
        var energies = compared.Select(k => withEnergy ? Energy.FromHartree(groups[k].EnergyHartree!.Value) : (Energy?)null).ToList();
        var comparison = ConformerEnsemble.Compare([.. compared.Select(k => groups[k].Geometry!)], energies, options);
        return new ConformerSet(groups, comparison, compared, withEnergy);
    }

    /// <summary>The conformer sets of the given species (live calculations only), in two queries.</summary>
    internal static async Task<Dictionary<int, ConformerSet>> LoadAsync(LedgerDbContext db, IReadOnlyCollection<int> speciesIds, CancellationToken ct)
    {
        var species = await db.Species.AsNoTracking().Where(s => EF.Parameter(speciesIds).Contains(s.Id))
            .Select(s => new { s.Id, s.Charge, s.Multiplicity }).ToListAsync(ct);
        var calcs = (await db.Calculations.AsNoTracking().Where(c => EF.Parameter(speciesIds).Contains(c.SpeciesId) && !c.Retired)
            .Select(c => new { c.SpeciesId, Calc = new ConformerCalc(c.Id, c.Conformer, c.Kind, c.EnergyHartree, c.EnergyLevelKey, c.AtomicNumbers, c.PositionsAngstrom, c.LevelOfTheory) })
            .ToListAsync(ct)).ToLookup(c => c.SpeciesId, c => c.Calc);
        return species.ToDictionary(s => s.Id, s => Of(calcs[s.Id], s.Charge, s.Multiplicity));
    }
}
