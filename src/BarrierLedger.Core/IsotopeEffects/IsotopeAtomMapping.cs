using System.Collections.Immutable;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.IsotopeEffects;

/// <summary>
/// Finding the substituted atoms of a saddle point in its reactant state. The only rule applied without asking: the saddle point lists
/// its atoms in the order of the reactant species written one after the other (the usual way a saddle-point search is set up from
/// its reactants), checked element by element. When it does not hold, the caller must ask for the reactant-side atoms.
/// </summary>
public static class IsotopeAtomMapping
{
    /// <summary>
    /// Substitutions per reactant (same order as <paramref name="reactants"/>; an empty list for a reactant without substituted atoms),
    /// or null with the reason in <paramref name="why"/> when the atom counts or elements do not match atom by atom.
    /// </summary>
    public static ImmutableArray<ImmutableArray<IsotopeSubstitution>>? ByAtomOrder(
        Molecule saddlePoint, IReadOnlyList<Molecule> reactants, IReadOnlyList<IsotopeSubstitution> substitutions, out string why)
    {
        ArgumentNullException.ThrowIfNull(saddlePoint);
        ArgumentNullException.ThrowIfNull(reactants);
        ArgumentNullException.ThrowIfNull(substitutions);
        var elements = reactants.SelectMany(r => r.Elements).ToList();
        if (elements.Count != saddlePoint.AtomCount)
        {
            why = $"the saddle point has {saddlePoint.AtomCount} atoms and the reactant species together {elements.Count}.";
            return null;
        }
        for (var i = 0; i < elements.Count; i++)
            if (elements[i].AtomicNumber != saddlePoint.Elements[i].AtomicNumber)
            {
                why = $"atom {i + 1} is {saddlePoint.AtomLabel(i)} in the saddle point but {elements[i].Symbol} in the reactant species written one after the other.";
                return null;
            }
        var result = reactants.Select(_ => new List<IsotopeSubstitution>()).ToArray();
        foreach (var s in substitutions)
        {
            var offset = 0;
            for (var k = 0; k < reactants.Count; k++)
            {
                var n = reactants[k].AtomCount;
                if (s.AtomNumber > offset && s.AtomNumber <= offset + n)
                {
                    result[k].Add(new IsotopeSubstitution(s.AtomNumber - offset, s.Isotope));
                    break;
                }
                offset += n;
            }
        }
        why = "";
        return [.. result.Select(r => r.ToImmutableArray())];
    }
}
