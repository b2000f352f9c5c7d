using System.Collections.Immutable;
using System.Globalization;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Conformers;

/// <summary>What two conformers of one species are to each other.</summary>
public enum ConformerRelation
{
    /// <summary>Different structures.</summary>
    Distinct,
    /// <summary>The same structure twice: RMSD and energy difference both below their thresholds.</summary>
    Duplicate,
    /// <summary>Mirror images: RMSD above the threshold, RMSD after inversion below it, the same energy.</summary>
    Enantiomer,
    /// <summary>The same structure by geometry, but the energies differ by more than the threshold (another calculation, or an error).</summary>
    SameStructureOtherEnergy,
}

/// <summary>A pair of conformers that is not simply distinct.</summary>
/// <param name="First">0-based index of the first conformer (the lower index).</param>
/// <param name="Second">0-based index of the second.</param>
/// <param name="RmsdAngstrom">Permutation-aware RMSD after superposition, Å.</param>
/// <param name="MirrorRmsdAngstrom">The same after mirroring the first (NaN when not needed).</param>
/// <param name="EnergyDifferenceKcalPerMol">E(second) − E(first) in kcal/mol; null when an energy is missing.</param>
/// <param name="Relation">Duplicate, enantiomer, or the same structure with another energy.</param>
public sealed record ConformerPair(int First, int Second, double RmsdAngstrom, double MirrorRmsdAngstrom, double? EnergyDifferenceKcalPerMol, ConformerRelation Relation);

/// <summary>The marks of one conformer.</summary>
/// <param name="Index">0-based position in the ensemble.</param>
/// <param name="Comparable">It could be compared (same atoms and bonds as the ensemble's reference).</param>
/// <param name="DuplicateOf">The conformer it duplicates (the lowest in energy of its duplicate set, then the first listed); null when it is unique or is that one.</param>
/// <param name="EnantiomerOf">A conformer it is the mirror image of; null when none.</param>
/// <param name="Problem">Why it could not be compared; null when it could.</param>
public sealed record ConformerMark(int Index, bool Comparable, int? DuplicateOf, int? EnantiomerOf, string? Problem)
{
    /// <summary>It repeats another conformer and should count once.</summary>
    public bool IsDuplicate => DuplicateOf is not null;
}

/// <summary>The outcome of <see cref="ConformerEnsemble.Compare(IReadOnlyList{Molecule}, IReadOnlyList{Energy?}, ConformerOptions?)"/>.</summary>
/// <param name="Conformers">One mark per conformer, in input order.</param>
/// <param name="Pairs">Every pair that is a duplicate, an enantiomer or the same structure with another energy, ordered by first then second.</param>
/// <param name="HeavyAtomsOnly">The RMSD was over heavy atoms only.</param>
/// <param name="EquivalentPermutations">Bond-preserving self-mappings of the structure every pair was compared under.</param>
/// <param name="Exhaustive">Every such mapping was tried (false for structures of very high topological symmetry).</param>
/// <param name="Options">The thresholds used.</param>
public sealed record ConformerComparison(
    ImmutableArray<ConformerMark> Conformers,
    ImmutableArray<ConformerPair> Pairs,
    bool HeavyAtomsOnly,
    int EquivalentPermutations,
    bool Exhaustive,
    ConformerOptions Options)
{
    /// <summary>Indices of the conformers that count in an ensemble: comparable and not a duplicate of another.</summary>
    public IEnumerable<int> Unique => Conformers.Where(c => c.Comparable && !c.IsDuplicate).Select(c => c.Index);

    /// <summary>One sentence: how many conformers, duplicates and mirror-image pairs.</summary>
    public string Summary
    {
        get
        {
            var inv = CultureInfo.InvariantCulture;
            var dup = Conformers.Count(c => c.IsDuplicate);
            var mirror = Pairs.Count(p => p.Relation == ConformerRelation.Enantiomer);
            var odd = Conformers.Count(c => !c.Comparable);
            var parts = new List<string> { $"{Conformers.Length} conformer{(Conformers.Length == 1 ? "" : "s")}" };
            parts.Add(dup == 0 ? "no duplicates" : $"{dup} duplicate{(dup == 1 ? "" : "s")}");
            if (mirror > 0) parts.Add($"{mirror} mirror-image pair{(mirror == 1 ? "" : "s")}");
            if (odd > 0) parts.Add($"{odd} not comparable (other atoms or bonds)");
            var how = HeavyAtomsOnly ? "heavy-atom RMSD" : "all-atom RMSD";
            return string.Join(", ", parts) + string.Format(inv, " ({0} below {1:0.###} Å and ΔE below {2:0.###} kcal/mol)", how,
                Options.DuplicateRmsdAngstrom, Options.DuplicateEnergyKcalPerMol);
        }
    }
}

/// <summary>
/// Duplicates and mirror images in a conformer ensemble (issue 21): two conformers whose permutation-aware RMSD
/// (<see cref="ConformerAlignment"/>) is below <see cref="ConformerOptions.DuplicateRmsdAngstrom"/> and whose energies differ by less
/// than <see cref="ConformerOptions.DuplicateEnergyKcalPerMol"/> are duplicates; two whose RMSD is above it but whose RMSD after
/// inversion is below it, at the same energy, are enantiomers (mirror-image conformers, which have equal energies by symmetry).
/// Thresholds: common practice, no source.
/// </summary>
public static class ConformerEnsemble
{
    /// <summary>Compares every pair of <paramref name="geometries"/>; <paramref name="energies"/> (same order, null where unknown) decide duplicates.</summary>
    public static ConformerComparison Compare(IReadOnlyList<Molecule> geometries, IReadOnlyList<Energy?> energies, ConformerOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(geometries);
        ArgumentNullException.ThrowIfNull(energies);
        if (energies.Count != geometries.Count)
            throw new ArgumentException($"{energies.Count} energies for {geometries.Count} conformers.", nameof(energies));
        var o = options ?? ConformerOptions.Default;
        var alignment = ConformerAlignment.Prepare(geometries, o);
        return Compare(alignment, energies, o);
    }

    /// <summary>The same on an ensemble already prepared (the alignment is kept for overlays).</summary>
    public static ConformerComparison Compare(ConformerAlignment alignment, IReadOnlyList<Energy?> energies, ConformerOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(alignment);
        ArgumentNullException.ThrowIfNull(energies);
        if (energies.Count != alignment.Count)
            throw new ArgumentException($"{energies.Count} energies for {alignment.Count} conformers.", nameof(energies));
        var o = options ?? ConformerOptions.Default;
        o.Validate(nameof(options));
        for (var k = 0; k < energies.Count; k++)
            if (energies[k] is { } e && !double.IsFinite(e.Hartree)) throw new ArgumentException($"The energy of conformer {k + 1} is not finite.", nameof(energies));

        var n = alignment.Count;
        var pairs = new List<ConformerPair>();
        var parent = Enumerable.Range(0, n).ToArray();
        int Root(int a) { while (parent[a] != a) a = parent[a] = parent[parent[a]]; return a; }
        var mirrorOf = new int?[n];
        for (var i = 0; i < n; i++)
        {
            if (!alignment.IsComparable(i)) continue;
            for (var j = i + 1; j < n; j++)
            {
                if (!alignment.IsComparable(j)) continue;
                double? de = energies[i] is { } ei && energies[j] is { } ej ? (ej - ei).KcalPerMol : null;
                var sameEnergy = de is null || Math.Abs(de.Value) < o.DuplicateEnergyKcalPerMol;
                var rmsd = alignment.Rmsd(i, j);
                if (rmsd < o.DuplicateRmsdAngstrom)
                {
                    var relation = sameEnergy ? ConformerRelation.Duplicate : ConformerRelation.SameStructureOtherEnergy;
                    pairs.Add(new ConformerPair(i, j, rmsd, double.NaN, de, relation));
                    if (sameEnergy) parent[Root(j)] = Root(i);
                    continue;
                }
                if (!sameEnergy) continue; // mirror images have equal energies; no need to look
                var mirror = alignment.MirrorRmsd(i, j);
                if (mirror < o.DuplicateRmsdAngstrom)
                {
                    pairs.Add(new ConformerPair(i, j, rmsd, mirror, de, ConformerRelation.Enantiomer));
                    mirrorOf[i] ??= j;
                    mirrorOf[j] ??= i;
                }
            }
        }

        // Each duplicate set keeps its lowest-energy member (then the first listed); the others point to it.
        var keep = new Dictionary<int, int>();
        for (var k = 0; k < n; k++)
        {
            if (!alignment.IsComparable(k)) continue;
            var root = Root(k);
            if (!keep.TryGetValue(root, out var best) || Lower(k, best)) keep[root] = k;
        }
        bool Lower(int a, int b) => (energies[a], energies[b]) switch
        {
            ({ } ea, { } eb) when ea.Hartree != eb.Hartree => ea.Hartree < eb.Hartree,
            _ => a < b,
        };
        var marks = Enumerable.Range(0, n).Select(k =>
        {
            if (!alignment.IsComparable(k)) return new ConformerMark(k, false, null, null, alignment.Numbering[k].Message);
            var kept = keep[Root(k)];
            return new ConformerMark(k, true, kept == k ? null : kept, mirrorOf[k], null);
        }).ToImmutableArray();
        return new ConformerComparison(marks, [.. pairs], alignment.HeavyAtomsOnly, alignment.Symmetry.SkeletonMappings.Length, alignment.Symmetry.Exhaustive, o);
    }
}
