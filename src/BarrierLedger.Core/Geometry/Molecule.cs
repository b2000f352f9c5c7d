using System.Collections.Immutable;
using BarrierLedger.Core.Chemistry;

namespace BarrierLedger.Core.Geometry;

/// <summary>
/// A molecular structure: elements with Cartesian positions in Å, total charge and spin multiplicity (2S+1).
/// Atom indices are 0-based in code; users see 1-based numbers with the element (C4).
/// </summary>
public sealed record Molecule
{
    public Molecule(IEnumerable<Element> elements, IEnumerable<Vec3> positionsAngstrom, int charge = 0, int multiplicity = 1)
    {
        Elements = [.. elements];
        PositionsAngstrom = [.. positionsAngstrom];
        if (Elements.Length != PositionsAngstrom.Length)
            throw new ArgumentException($"{Elements.Length} elements but {PositionsAngstrom.Length} positions.", nameof(positionsAngstrom));
        if (multiplicity < 1)
            throw new ArgumentException($"Spin multiplicity must be 1 or more, got {multiplicity}.", nameof(multiplicity));
        Charge = charge;
        Multiplicity = multiplicity;
    }

    public ImmutableArray<Element> Elements { get; }
    public ImmutableArray<Vec3> PositionsAngstrom { get; }
    public int Charge { get; init; }
    public int Multiplicity { get; init; }

    public int AtomCount => Elements.Length;

    /// <summary>Number of electrons: Σ Z − charge.</summary>
    public int ElectronCount => Elements.Sum(e => e.AtomicNumber) - Charge;

    /// <summary>
    /// The atoms listed (0-based), in that order, as a structure of their own. Charge 0 and multiplicity 1: a fragment's charge
    /// and spin cannot be read from its geometry.
    /// </summary>
    public Molecule Fragment(IReadOnlyList<int> atoms)
    {
        ArgumentNullException.ThrowIfNull(atoms);
        foreach (var a in atoms)
            if (a < 0 || a >= AtomCount) throw new ArgumentException($"Atom index {a} is outside 0..{AtomCount - 1}.", nameof(atoms));
        return new Molecule(atoms.Select(a => Elements[a]), atoms.Select(a => PositionsAngstrom[a]));
    }

    /// <summary>"C4" style label for a 0-based atom index.</summary>
    public string AtomLabel(int index) => $"{Elements[index].Symbol}{index + 1}";

    /// <summary>Same elements in the same order and positions within <paramref name="toleranceAngstrom"/>, same charge and multiplicity.</summary>
    public bool SameAs(Molecule other, double toleranceAngstrom = 1e-9)
    {
        if (other.AtomCount != AtomCount || other.Charge != Charge || other.Multiplicity != Multiplicity) return false;
        for (var i = 0; i < AtomCount; i++)
        {
            if (Elements[i].AtomicNumber != other.Elements[i].AtomicNumber) return false;
            if ((PositionsAngstrom[i] - other.PositionsAngstrom[i]).Length > toleranceAngstrom) return false;
        }
        return true;
    }

    public bool Equals(Molecule? other) => other is not null && SameAs(other, 0.0);
    public override int GetHashCode() => HashCode.Combine(AtomCount, Charge, Multiplicity);
}
