using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Formats;

/// <summary>
/// Plausibility checks every reader applies to what it read: atoms on top of each other, energies that cannot be
/// total electronic energies in hartree, and Hessians of the wrong size or not symmetric. Each returns messages; the
/// caller decides the location (line or JSON path).
/// </summary>
public static class StructureChecks
{
    /// <summary>Two atoms closer than this (Å) are reported as duplicates: no chemical bond is shorter than ~0.5 Å (H₂ is 0.74 Å).</summary>
    public const double DuplicateDistanceAngstrom = 0.01;

    /// <summary>
    /// Thomas–Fermi total energy of a neutral atom, E ≈ −0.7687 Z^(7/3) hartree (from memory; Thomas–Fermi theory
    /// overbinds, so it lies below the true energy for every element: O −98 vs −75 Eh, Rn ≈ −25,000 vs ≈ −23,600 Eh).
    /// </summary>
    public static double ThomasFermiAtomHartree(int atomicNumber) => -0.7687 * Math.Pow(atomicNumber, 7.0 / 3.0);

    /// <summary>
    /// The lowest total electronic energy (hartree) we accept for <paramref name="molecule"/>:
    /// 1.5 × Σ Thomas–Fermi atom energies, minus 1 Eh per atom for bonding.
    /// Rule: common practice, no source. Any all-electron, effective-core-potential or semi-empirical total energy
    /// lies well above it, while the same number in kcal/mol, kJ/mol or eV falls below it for all but the smallest
    /// molecules.
    /// </summary>
    public static double LowestPlausibleEnergyHartree(Molecule molecule) =>
        1.5 * molecule.Elements.Sum(e => ThomasFermiAtomHartree(e.AtomicNumber)) - molecule.AtomCount;

    /// <summary>
    /// Why <paramref name="energyHartree"/> cannot be a total electronic energy of <paramref name="molecule"/> in hartree,
    /// or null when it can. Non-finite, zero or positive values are refused, as are values below
    /// <see cref="LowestPlausibleEnergyHartree"/>.
    /// </summary>
    public static string? ImplausibleEnergy(double energyHartree, Molecule? molecule)
    {
        if (!double.IsFinite(energyHartree)) return $"energy is {Numbers.Format(energyHartree)}, expected a finite number";
        if (energyHartree >= 0)
            return $"energy {Numbers.Format(energyHartree)} is not negative, so it cannot be a total electronic energy in hartree " +
                   "(a relative energy or a value in another unit?)";
        if (molecule is not null && molecule.AtomCount > 0)
        {
            var low = LowestPlausibleEnergyHartree(molecule);
            if (energyHartree < low)
                return $"energy {Numbers.Format(energyHartree)} is below {low:0.#} Eh, the lowest plausible total energy for " +
                       $"{FormulaOf(molecule)} (is it in kcal/mol, kJ/mol or eV rather than hartree?)";
        }
        return null;
    }

    /// <summary>Pairs of 0-based atom indices closer than <see cref="DuplicateDistanceAngstrom"/>. Sort-and-sweep along x, O(N log N) for ordinary geometries.</summary>
    public static IReadOnlyList<(int First, int Second)> DuplicateAtoms(Molecule molecule, int maxPairs = 20)
    {
        var pos = molecule.PositionsAngstrom;
        var order = Enumerable.Range(0, pos.Length).Where(i => pos[i].IsFinite).OrderBy(i => pos[i].X).ToArray();
        var pairs = new List<(int, int)>();
        for (var a = 0; a < order.Length && pairs.Count < maxPairs; a++)
        {
            var i = order[a];
            for (var b = a + 1; b < order.Length; b++)
            {
                var j = order[b];
                if (pos[j].X - pos[i].X > DuplicateDistanceAngstrom) break;
                if ((pos[j] - pos[i]).Length < DuplicateDistanceAngstrom)
                {
                    pairs.Add((Math.Min(i, j), Math.Max(i, j)));
                    if (pairs.Count >= maxPairs) break;
                }
            }
        }
        return pairs;
    }

    /// <summary>Messages for duplicate atoms, each naming both atoms as users count them (C4, H7).</summary>
    /// <summary>
    /// Farthest an atom may lie from the origin, in Å. The largest molecules a group optimises span a few hundred Å; a
    /// coordinate beyond this is a unit mix-up or a corrupt file, and squared distances of such numbers overflow.
    /// Common practice, no source.
    /// </summary>
    public const double MaxCoordinateAngstrom = 1.0e4;

    /// <summary>Why a coordinate cannot belong to a molecule (beyond <see cref="MaxCoordinateAngstrom"/>), or null.</summary>
    public static string? ImplausibleCoordinate(double angstrom) =>
        Math.Abs(angstrom) > MaxCoordinateAngstrom
            ? $"{Numbers.Format(angstrom)} Å lies beyond ±{MaxCoordinateAngstrom:0} Å of the origin, which no molecule does (a unit mix-up or a corrupt file?)"
            : null;

    /// <summary>The first atoms that lie beyond <see cref="MaxCoordinateAngstrom"/>, then atoms at the same position.</summary>
    public static IEnumerable<string> GeometryMessages(Molecule molecule)
    {
        var far = 0;
        for (var i = 0; i < molecule.AtomCount && far < 20; i++)
        {
            var p = molecule.PositionsAngstrom[i];
            var worst = Math.Max(Math.Abs(p.X), Math.Max(Math.Abs(p.Y), Math.Abs(p.Z)));
            if (ImplausibleCoordinate(worst) is { } why) { far++; yield return $"atom {molecule.AtomLabel(i)}: {why}"; }
        }
        if (far > 0) yield break; // distances between such atoms mean nothing
        foreach (var m in DuplicateAtomMessages(molecule)) yield return m;
    }

    public static IEnumerable<string> DuplicateAtomMessages(Molecule molecule) =>
        DuplicateAtoms(molecule).Select(p =>
            $"atoms {molecule.AtomLabel(p.First)} and {molecule.AtomLabel(p.Second)} are at the same position " +
            $"(closer than {DuplicateDistanceAngstrom} Å): a duplicated atom?");

    /// <summary>Relative asymmetry above which a Hessian is refused: max|Hij − Hji| / max|H|. Common practice, no source.</summary>
    public const double HessianAsymmetryError = 1e-3;

    /// <summary>Relative asymmetry above which a warning is given (finite-difference Hessians are slightly asymmetric). Common practice, no source.</summary>
    public const double HessianAsymmetryWarning = 1e-6;

    /// <summary>
    /// Checks a row-major Cartesian Hessian against <paramref name="atomCount"/>: size (3N)², finite entries, symmetry.
    /// Returns (errors, warnings).
    /// </summary>
    public static (List<string> Errors, List<string> Warnings) CheckHessian(IReadOnlyList<double> hessian, int atomCount)
    {
        var errors = new List<string>();
        var warnings = new List<string>();
        var n = 3 * atomCount;
        if (hessian.Count != (long)n * n)
        {
            var side = Math.Sqrt(hessian.Count);
            var hint = side == Math.Floor(side) && side % 3 == 0
                ? $" (that is a Hessian for {(int)side / 3} atoms; the geometry has {atomCount})"
                : "";
            errors.Add($"Hessian has {hessian.Count} entries, expected (3 × {atomCount})² = {(long)n * n} for {atomCount} atoms{hint}");
            return (errors, warnings);
        }
        var scale = 0.0;
        for (var k = 0; k < hessian.Count; k++)
        {
            if (!double.IsFinite(hessian[k]))
            {
                errors.Add($"Hessian entry [{k / n},{k % n}] is {Numbers.Format(hessian[k])}, expected a finite number");
                return (errors, warnings);
            }
            scale = Math.Max(scale, Math.Abs(hessian[k]));
        }
        var worst = 0.0;
        int wi = 0, wj = 0;
        for (var i = 0; i < n; i++)
            for (var j = i + 1; j < n; j++)
            {
                var d = Math.Abs(hessian[i * n + j] - hessian[j * n + i]);
                if (d > worst) { worst = d; wi = i; wj = j; }
            }
        var rel = scale > 0 ? worst / scale : 0;
        var msg = $"Hessian is not symmetric: entries [{wi},{wj}] and [{wj},{wi}] differ by {worst:G3} ({rel:G2} of the largest entry)";
        if (rel > HessianAsymmetryError) errors.Add(msg + $"; more than {HessianAsymmetryError:G1} is refused");
        else if (rel > HessianAsymmetryWarning) warnings.Add(msg + "; it will be symmetrised");
        return (errors, warnings);
    }

    /// <summary>Hill-order formula (C, H, then alphabetical) for messages.</summary>
    public static string FormulaOf(Molecule molecule)
    {
        var counts = molecule.Elements.GroupBy(e => e.Symbol).ToDictionary(g => g.Key, g => g.Count());
        IEnumerable<string> order = counts.ContainsKey("C")
            ? new[] { "C", "H" }.Where(counts.ContainsKey).Concat(counts.Keys.Where(k => k is not "C" and not "H").Order(StringComparer.Ordinal))
            : counts.Keys.Order(StringComparer.Ordinal);
        return string.Concat(order.Select(s => counts[s] == 1 ? s : s + counts[s]));
    }
}
