using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Conformers;

/// <summary>Settings of the conformer comparison (<see cref="ConformerAlignment"/>, <see cref="ConformerEnsemble"/>).</summary>
/// <param name="DuplicateRmsdAngstrom">
/// Two conformers closer than this (RMSD after superposition and renumbering of equivalent atoms) are the same structure.
/// Default 0.1 Å (issue 21; common practice, no source).
/// </param>
/// <param name="DuplicateEnergyKcalPerMol">
/// ... and, to count as duplicates (or as mirror images), their energies differ by less than this. Default 0.1 kcal/mol (issue 21;
/// common practice, no source).
/// </param>
/// <param name="HeavyAtomsOnly">
/// Compare heavy atoms only (hydrogens are left out of the RMSD; a structure with fewer than three heavy atoms is compared on all
/// atoms). Default true: hydrogen positions differ between programs and optimisations more than they tell conformers apart.
/// </param>
/// <param name="Mapping">Limits of the graph search that lists the structure's equivalent-atom permutations.</param>
/// <param name="Connectivity">How bonds are found (the equivalence of atoms comes from the bond graph).</param>
public sealed record ConformerOptions(
    double DuplicateRmsdAngstrom = 0.1,
    double DuplicateEnergyKcalPerMol = 0.1,
    bool HeavyAtomsOnly = true,
    AtomMappingOptions? Mapping = null,
    ConnectivityOptions? Connectivity = null)
{
    public static ConformerOptions Default { get; } = new();

    internal void Validate(string parameter)
    {
        if (!(DuplicateRmsdAngstrom > 0) || !double.IsFinite(DuplicateRmsdAngstrom))
            throw new ArgumentException($"The duplicate RMSD threshold must be positive, got {DuplicateRmsdAngstrom} Å.", parameter);
        if (!(DuplicateEnergyKcalPerMol > 0) || !double.IsFinite(DuplicateEnergyKcalPerMol))
            throw new ArgumentException($"The duplicate energy threshold must be positive, got {DuplicateEnergyKcalPerMol} kcal/mol.", parameter);
    }
}
