using System.Collections.Immutable;
using System.Globalization;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Checks;

/// <summary>One species of a state with its optimised geometry and its coefficient.</summary>
public sealed record StateSpecies(string Label, Molecule Geometry, int Count = 1);

/// <summary>
/// A minimum state of a pathway as structures: "butadiene + ethylene" is two species, each with its own geometry in its own
/// atom order.
/// </summary>
/// <param name="Label">The state's label as drawn ("butadiene + ethylene").</param>
/// <param name="Species">The species with their coefficients (at least one).</param>
public sealed record StateStructure(string Label, IReadOnlyList<StateSpecies> Species)
{
    /// <summary>Σ coefficient × formula.</summary>
    public Formula Formula => Formula.Sum(Species.Select(s => (Formula.Of(s.Geometry), s.Count)));

    /// <summary>The species, each as often as its coefficient.</summary>
    public IEnumerable<StateSpecies> Instances => Species.SelectMany(s => Enumerable.Repeat(s, s.Count));
}

/// <summary>One connected piece of an endpoint matched to one species of a state.</summary>
/// <param name="Species">The species' label.</param>
/// <param name="Atoms">The piece's atoms, 0-based in the endpoint's numbering, ascending.</param>
/// <param name="Mapping">How the piece's atoms (in <paramref name="Atoms"/> order) map onto the species' atoms, and the RMSD.</param>
public sealed record FragmentMatch(string Species, ImmutableArray<int> Atoms, AtomMappingResult Mapping);

/// <summary>An endpoint compared with one state.</summary>
/// <param name="State">The state's label.</param>
/// <param name="SameAtoms">The endpoint and the state hold the same atoms (formula).</param>
/// <param name="SameBonds">Each connected piece of the endpoint is one species of the state, bond for bond.</param>
/// <param name="Fragments">The pieces with their species, when <paramref name="SameBonds"/>.</param>
/// <param name="RmsdAngstrom">
/// √(Σ_f n_f RMSD_f² / Σ_f n_f) over the pieces, each superposed on its species on its own (Kabsch): how far the endpoint's
/// molecules are from the state's optimised geometries, whatever their distance from each other. NaN unless <paramref name="SameBonds"/>.
/// </param>
/// <param name="Explanation">One sentence: how it matches, or what differs.</param>
public sealed record StateMatchResult(string State, bool SameAtoms, bool SameBonds, ImmutableArray<FragmentMatch> Fragments, double RmsdAngstrom, string Explanation);

public static partial class EndpointMatch
{
    /// <summary>
    /// Compares one endpoint (in its own atom order, usually the saddle point's) with a state made of one or more species. The
    /// endpoint's bond graph (<see cref="Connectivity"/>, covalent radii of Cordero et al., Dalton Trans. 2008, 2832) is split into
    /// connected pieces; the pieces must have the formulas of the state's species, and each piece must map onto its species bond
    /// for bond (<see cref="AtomMapping"/>: the same atom order when it fits, a graph-isomorphism mapping otherwise). Among the
    /// assignments of pieces to species the one with the lowest summed squared deviation is kept; the RMSD is then per piece
    /// (<see cref="StateMatchResult.RmsdAngstrom"/>).
    /// </summary>
    public static StateMatchResult AgainstState(Molecule end, StateStructure state, EndpointMatchOptions? options = null, Connectivity? endBonds = null)
    {
        ArgumentNullException.ThrowIfNull(end);
        ArgumentNullException.ThrowIfNull(state);
        if (state.Species.Count == 0) throw new ArgumentException($"State '{state.Label}' has no species.", nameof(state));
        var o = options ?? EndpointMatchOptions.Default;
        var g = endBonds ?? Connectivity.Of(end, o.Connectivity);
        var fe = Formula.Of(end);
        var fs = state.Formula;
        if (fe != fs)
            return new StateMatchResult(state.Label, false, false, [], double.NaN,
                $"it holds {fe}, the state {state.Label} holds {fs} ({fe.DifferenceFrom(fs)})");

        var pieces = g.Components().Select(atoms => (Atoms: atoms, Molecule: end.Fragment(atoms), Bonds: g.Subgraph(atoms))).ToList();
        var pieceFormulas = pieces.Select(p => Formula.Of(p.Molecule)).ToList();
        var instances = state.Instances.ToList();
        var speciesBonds = state.Species.ToDictionary(s => s, s => Connectivity.Of(s.Geometry, o.Connectivity));
        var instanceFormulas = instances.Select(s => Formula.Of(s.Geometry)).ToList();

        string PieceList() => string.Join(" + ", pieceFormulas.Select(f => f.ToString()));
        string SpeciesList() => string.Join(" + ", instances.Select((s, k) => $"{instanceFormulas[k]} ({s.Label})"));
        if (pieces.Count != instances.Count || !pieceFormulas.Select(f => f.ToString()).Order(StringComparer.Ordinal)
                .SequenceEqual(instanceFormulas.Select(f => f.ToString()).Order(StringComparer.Ordinal)))
        {
            var shape = pieces.Count == 1 ? $"it is one piece, {PieceList()}," : $"it falls into {pieces.Count} pieces, {PieceList()},";
            return new StateMatchResult(state.Label, true, false, [], double.NaN, $"{shape} where the state has {SpeciesList()}");
        }

        var mappings = new AtomMappingResult?[pieces.Count, instances.Count];
        for (var p = 0; p < pieces.Count; p++)
            for (var s = 0; s < instances.Count; s++)
            {
                if (pieceFormulas[p] != instanceFormulas[s]) continue;
                var previous = Enumerable.Range(0, s).FirstOrDefault(k => ReferenceEquals(instances[k], instances[s]), -1);
                mappings[p, s] = previous >= 0 ? mappings[p, previous]
                    : AtomMapping.Find(pieces[p].Molecule, pieces[p].Bonds, instances[s].Geometry, speciesBonds[instances[s]], o.Mapping);
            }

        // Assignment of pieces to species: few of each, so every assignment is tried.
        var best = (Cost: double.PositiveInfinity, Assignment: (int[]?)null);
        var assignment = new int[pieces.Count];
        var used = new bool[instances.Count];
        void Assign(int p, double cost)
        {
            if (cost >= best.Cost) return;
            if (p == pieces.Count) { best = (cost, (int[])assignment.Clone()); return; }
            for (var s = 0; s < instances.Count; s++)
            {
                if (used[s] || mappings[p, s] is not { Succeeded: true } m) continue;
                used[s] = true;
                assignment[p] = s;
                Assign(p + 1, cost + m.RmsdAngstrom * m.RmsdAngstrom * pieces[p].Atoms.Length);
                used[s] = false;
            }
        }
        Assign(0, 0);

        if (best.Assignment is null)
        {
            var p = Enumerable.Range(0, pieces.Count).First(k => Enumerable.Range(0, instances.Count).All(s => mappings[k, s] is not { Succeeded: true }));
            var s0 = Enumerable.Range(0, instances.Count).First(s => instanceFormulas[s] == pieceFormulas[p]);
            var what = pieces.Count == 1 ? "it" : $"its {pieceFormulas[p]} piece";
            var detail = SameOrderDifference(pieces[p].Atoms, pieces[p].Bonds, end, speciesBonds[instances[s0]], instances[s0]) ?? mappings[p, s0]!.Message;
            return new StateMatchResult(state.Label, true, false, [], double.NaN, $"{what} is not {instances[s0].Label}: {detail}");
        }

        var fragments = ImmutableArray.CreateBuilder<FragmentMatch>(pieces.Count);
        for (var p = 0; p < pieces.Count; p++)
        {
            var s = best.Assignment[p];
            fragments.Add(new FragmentMatch(instances[s].Label, pieces[p].Atoms, mappings[p, s]!));
        }
        var rmsd = Math.Sqrt(best.Cost / end.AtomCount);
        var order = fragments.All(f => f.Mapping.IsIdentity) ? "" : fragments.Count == 1 ? $"; {fragments[0].Mapping.Message}" : "; atoms matched by their bonds";
        var how = fragments.Count == 1
            ? $"it has the bonds of {fragments[0].Species} (RMSD {Angstrom(rmsd)} after superposition{order})"
            : $"its {fragments.Count} pieces have the bonds of {string.Join(", ", fragments.Select(f => f.Species))} (RMSD {Angstrom(rmsd)}, each piece superposed on its own{order})";
        return new StateMatchResult(state.Label, true, true, fragments.MoveToImmutable(), rmsd, how);
    }

    /// <summary>
    /// True when two states hold the same molecules bond for bond (a conformational change between them, which bonds cannot tell
    /// apart): <paramref name="first"/>'s species are laid side by side, far apart, and compared with <paramref name="second"/>.
    /// </summary>
    public static bool AgainstStateStructures(StateStructure first, StateStructure second, EndpointMatchOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(first);
        ArgumentNullException.ThrowIfNull(second);
        var elements = new List<Chemistry.Element>();
        var positions = new List<Vec3>();
        var k = 0;
        foreach (var s in first.Instances)
        {
            var shift = new Vec3(1000.0 * ++k, 0, 0);
            elements.AddRange(s.Geometry.Elements);
            positions.AddRange(s.Geometry.PositionsAngstrom.Select(p => p + shift));
        }
        return AgainstState(new Molecule(elements, positions), second, options).SameBonds;
    }

    /// <summary>When a piece lists the same elements in the same order as the species, the bonds it has and lacks, by atom label.</summary>
    private static string? SameOrderDifference(ImmutableArray<int> atoms, Connectivity pieceBonds, Molecule end, Connectivity speciesBonds, StateSpecies species)
    {
        var sp = species.Geometry;
        if (sp.AtomCount != atoms.Length) return null;
        for (var k = 0; k < atoms.Length; k++)
            if (end.Elements[atoms[k]].AtomicNumber != sp.Elements[k].AtomicNumber) return null;
        var (formed, broken) = speciesBonds.Compare(pieceBonds);
        string Label(Bond b) => new Bond(atoms[b.A], atoms[b.B]).Label(end);
        var parts = new List<string>();
        if (formed.Length > 0) parts.Add($"it has {string.Join(", ", formed.Select(Label))} in addition");
        if (broken.Length > 0) parts.Add($"it lacks {string.Join(", ", broken.Select(Label))}");
        return parts.Count == 0 ? null : string.Join(" and ", parts);
    }

    private static string Angstrom(double x) => x.ToString("0.000", CultureInfo.InvariantCulture) + " Å";
}
