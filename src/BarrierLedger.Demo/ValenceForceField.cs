using System.Collections.Immutable;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Demo;

/// <summary>One internal coordinate with its weight in a force-field term.</summary>
public sealed record WeightedCoordinate(InternalCoordinate Coordinate, double Weight);

/// <summary>
/// One quadratic term E = ½ K (Σ c_i Δq_i)² of a valence force field. Stretches in Å, bends and torsions in radians;
/// K in aJ/Å² (= mdyn/Å) for stretch combinations and aJ/rad² (= mdyn·Å/rad²) for bends and torsions. K may be negative:
/// that is how a saddle point is made (negative curvature along the combination).
/// </summary>
public sealed record ForceFieldTerm(ImmutableArray<WeightedCoordinate> Combination, double K, string Label);

/// <summary>
/// Negative curvature along a combination of distances at a saddle point: the term ½ K (Σ c_i Δr_i)² with the c_i normalised
/// and K chosen so that the curvature along the combination, including the pairs' own stretch terms, is
/// <paramref name="NetCurvatureAttojoulePerAngstrom2"/> (negative).
/// </summary>
/// <param name="Pairs">0-based atom pairs with their signs/weights (forming +1, breaking −1 for a transfer).</param>
/// <param name="NetCurvatureAttojoulePerAngstrom2">Curvature along the normalised combination, aJ/Å², negative.</param>
public sealed record ReactionCurvature(IReadOnlyList<(int A, int B, double Weight)> Pairs, double NetCurvatureAttojoulePerAngstrom2);

/// <summary>
/// Replaces the torsion terms about bond A–B by one term on the mean of its dihedrals (a rigid turn of one side) with
/// curvature <paramref name="CurvatureAttojoulePerRad2"/>; negative for a rotational saddle or a soft imaginary rotor mode.
/// </summary>
public sealed record TorsionCurvature(int A, int B, double CurvatureAttojoulePerRad2);

/// <summary>What the force field is asked to produce beyond a plain minimum.</summary>
/// <param name="PartialBonds">Atom pairs treated as (partly formed) bonds even if longer than covalent radii suggest.</param>
/// <param name="Reaction">Negative-curvature combinations (one per saddle-point reaction mode).</param>
/// <param name="Torsions">Torsion overrides.</param>
public sealed record ForceFieldSpec(
    IReadOnlyList<(int A, int B)>? PartialBonds = null,
    IReadOnlyList<ReactionCurvature>? Reaction = null,
    IReadOnlyList<TorsionCurvature>? Torsions = null)
{
    public static ForceFieldSpec Minimum { get; } = new();
}

/// <summary>
/// A small valence force field written for the demo data: a stretch for every bond, a bend for every bond angle (angles within
/// 10° of linear are left out, their bending is carried by the neighbouring angles), a torsion for every proper dihedral and an
/// out-of-plane term at every planar three-connected atom. At the reference geometry every coordinate sits at its reference
/// value, so the gradient vanishes and the Cartesian Hessian is exactly H = Bᵀ F B, with B = ∂q/∂x the Wilson B matrix
/// (Wilson, Decius and Cross, Molecular Vibrations, 1955, ch. 4), taken here by central differences.
/// <para>
/// Force constants are rough textbook magnitudes (from memory): a bond's stretch constant falls off exponentially with its
/// length beyond the single-bond length of its atom pair (a Badger-like rule, so double bonds are stiffer and partial bonds at a
/// saddle point softer); bends 0.3–0.55 aJ/rad²; torsions 0.01 aJ/rad² per dihedral about a single bond and 0.08 about a double
/// bond. They give frequencies of the right order, not spectroscopic accuracy; their purpose is Hessians with the intended
/// number and character of imaginary modes.
/// </para>
/// </summary>
public static class ValenceForceField
{
    /// <summary>hartree/bohr² per aJ/Å²: (10⁻¹⁸ J / E_h) × (a₀/Å)² with CODATA 2018 constants.</summary>
    public static readonly double HartreePerBohr2PerAttojoulePerAngstrom2 =
        1e-18 / PhysicalConstants.HartreeJoule * PhysicalConstants.BohrAngstrom * PhysicalConstants.BohrAngstrom;

    private const double StepAngstrom = 1e-5;
    private const double LinearBendLimitDegrees = 170.0;

    /// <summary>The terms of the force field for <paramref name="molecule"/> as asked by <paramref name="spec"/>.</summary>
    public static IReadOnlyList<ForceFieldTerm> Terms(Molecule molecule, ForceFieldSpec? spec = null)
    {
        ArgumentNullException.ThrowIfNull(molecule);
        spec ??= ForceFieldSpec.Minimum;
        var n = molecule.AtomCount;
        var pos = molecule.PositionsAngstrom;
        var partial = new HashSet<Bond>();
        foreach (var (a, b) in spec.PartialBonds ?? [])
        {
            CheckAtoms(n, nameof(spec), a, b);
            partial.Add(new Bond(a, b));
        }
        foreach (var rc in spec.Reaction ?? [])
            foreach (var (a, b, _) in rc.Pairs)
            {
                CheckAtoms(n, nameof(spec), a, b);
                partial.Add(new Bond(a, b));
            }
        var graph = new Connectivity(n, Connectivity.Of(molecule).Bonds.Concat(partial));
        var overrides = new Dictionary<Bond, double>();
        foreach (var t in spec.Torsions ?? [])
        {
            CheckAtoms(n, nameof(spec), t.A, t.B);
            if (!graph.AreBonded(t.A, t.B))
                throw new ArgumentException($"Torsion override about atoms {t.A + 1}–{t.B + 1}, which are not bonded.", nameof(spec));
            overrides[new Bond(t.A, t.B)] = t.CurvatureAttojoulePerRad2;
        }

        var terms = new List<ForceFieldTerm>();
        var stretchK = new Dictionary<Bond, double>();
        foreach (var bond in graph.Bonds)
        {
            var k = StretchConstant(molecule, bond.A, bond.B);
            stretchK[bond] = k;
            terms.Add(Single(InternalCoordinate.Stretch(bond.A, bond.B), k, $"stretch {bond.Label(molecule)}"));
        }
        foreach (var q in InternalCoordinates.Angles(graph))
        {
            var angle = q.ValueAt(pos);
            if (angle > LinearBendLimitDegrees) continue;
            var (i, j, k) = (q.Atoms[0], q.Atoms[1], q.Atoms[2]);
            var hydrogens = (molecule.Elements[i].AtomicNumber == 1 ? 1 : 0) + (molecule.Elements[k].AtomicNumber == 1 ? 1 : 0);
            var kb = hydrogens switch { 0 => 0.55, 1 => 0.42, _ => 0.32 };
            if (partial.Contains(new Bond(i, j)) || partial.Contains(new Bond(j, k))) kb *= 0.35;
            terms.Add(Single(q, kb, $"bend {q.Label(molecule)}"));
        }
        foreach (var group in InternalCoordinates.ProperDihedrals(molecule, graph).GroupBy(q => new Bond(q.Atoms[1], q.Atoms[2])))
        {
            var list = group.ToList();
            if (overrides.TryGetValue(group.Key, out var kt))
            {
                // Mean of the dihedrals about the bond: a rigid turn of one side by δ changes it by δ.
                terms.Add(new ForceFieldTerm([.. list.Select(q => new WeightedCoordinate(q, 1.0 / list.Count))], kt,
                    $"torsion about {group.Key.Label(molecule)} (override)"));
                continue;
            }
            var perDihedral = partial.Contains(group.Key) ? 0.004 : stretchK[group.Key] > 7.0 ? 0.08 : 0.01;
            foreach (var q in list) terms.Add(Single(q, perDihedral, $"torsion {q.Label(molecule)}"));
        }
        foreach (var t in overrides.Keys)
            if (!InternalCoordinates.ProperDihedrals(molecule, graph).Any(q => new Bond(q.Atoms[1], q.Atoms[2]) == t))
                throw new ArgumentException($"Torsion override about {t.Label(molecule)}, which has no proper dihedral.", nameof(spec));
        for (var c = 0; c < n; c++)
        {
            var nb = graph.Neighbours(c);
            if (nb.Length != 3) continue;
            var sum = InternalCoordinates.AngleDegrees(pos[nb[0]], pos[c], pos[nb[1]])
                      + InternalCoordinates.AngleDegrees(pos[nb[1]], pos[c], pos[nb[2]])
                      + InternalCoordinates.AngleDegrees(pos[nb[0]], pos[c], pos[nb[2]]);
            if (sum < 350.0) continue;
            var q = InternalCoordinate.Torsion(nb[0], c, nb[1], nb[2]);
            terms.Add(Single(q, 0.12, $"out-of-plane at {molecule.AtomLabel(c)}"));
        }
        foreach (var rc in spec.Reaction ?? [])
        {
            var norm = Math.Sqrt(rc.Pairs.Sum(p => p.Weight * p.Weight));
            if (!(norm > 0)) throw new ArgumentException("A reaction combination needs non-zero weights.", nameof(spec));
            if (!(rc.NetCurvatureAttojoulePerAngstrom2 < 0)) throw new ArgumentException("A reaction curvature must be negative.", nameof(spec));
            var own = rc.Pairs.Sum(p => Math.Pow(p.Weight / norm, 2) * stretchK[new Bond(p.A, p.B)]);
            terms.Add(new ForceFieldTerm(
                [.. rc.Pairs.Select(p => new WeightedCoordinate(InternalCoordinate.Stretch(p.A, p.B), p.Weight / norm))],
                rc.NetCurvatureAttojoulePerAngstrom2 - own,
                "reaction " + string.Join(" ", rc.Pairs.Select(p => $"{(p.Weight >= 0 ? "+" : "−")}{new Bond(p.A, p.B).Label(molecule)}"))));
        }
        return terms;
    }

    /// <summary>
    /// The Cartesian Hessian (row-major 3N×3N, hartree/bohr², atom-major x₁ y₁ z₁ x₂ …) of <paramref name="terms"/> at
    /// <paramref name="molecule"/>'s geometry: Σ_terms K (Bᵀc)(Bᵀc)ᵀ, converted from aJ/Å².
    /// </summary>
    public static double[] CartesianHessian(Molecule molecule, IReadOnlyList<ForceFieldTerm> terms)
    {
        ArgumentNullException.ThrowIfNull(molecule);
        ArgumentNullException.ThrowIfNull(terms);
        var n3 = 3 * molecule.AtomCount;
        var h = new double[n3 * n3];
        var pos = molecule.PositionsAngstrom.ToArray();
        var cache = new Dictionary<InternalCoordinate, double[]>();
        var g = new double[n3];
        foreach (var term in terms)
        {
            Array.Clear(g);
            foreach (var wc in term.Combination)
            {
                if (!cache.TryGetValue(wc.Coordinate, out var b)) cache[wc.Coordinate] = b = BRow(wc.Coordinate, pos);
                for (var i = 0; i < n3; i++) g[i] += wc.Weight * b[i];
            }
            var k = term.K * HartreePerBohr2PerAttojoulePerAngstrom2;
            for (var i = 0; i < n3; i++)
            {
                if (g[i] == 0) continue;
                var ki = k * g[i];
                for (var j = 0; j < n3; j++) h[i * n3 + j] += ki * g[j];
            }
        }
        // Exact symmetry (the rank-1 updates are symmetric up to rounding only).
        for (var i = 0; i < n3; i++)
            for (var j = i + 1; j < n3; j++)
            {
                var v = 0.5 * (h[i * n3 + j] + h[j * n3 + i]);
                h[i * n3 + j] = v;
                h[j * n3 + i] = v;
            }
        return h;
    }

    /// <summary>Terms and Hessian in one call.</summary>
    public static double[] CartesianHessian(Molecule molecule, ForceFieldSpec? spec = null) =>
        CartesianHessian(molecule, Terms(molecule, spec));

    /// <summary>
    /// Stretch constant (aJ/Å²) of bond a–b at its length r: k₁ exp(−(r − r₁)/0.3 Å), with the pair's single-bond length r₁
    /// and constant k₁ from a small table (typical textbook values, from memory), else r₁ = sum of covalent radii, k₁ = 4.5.
    /// </summary>
    public static double StretchConstant(Molecule molecule, int a, int b)
    {
        var ea = molecule.Elements[a];
        var eb = molecule.Elements[b];
        var key = string.CompareOrdinal(ea.Symbol, eb.Symbol) <= 0 ? $"{ea.Symbol}-{eb.Symbol}" : $"{eb.Symbol}-{ea.Symbol}";
        var (r1, k1) = key switch
        {
            "C-H" => (1.09, 4.9),
            "C-C" => (1.54, 4.5),
            "C-N" => (1.47, 4.9),
            "C-O" => (1.43, 5.0),
            "C-F" => (1.38, 5.8),
            "C-Cl" => (1.78, 3.4),
            "C-I" => (2.14, 2.3),
            "H-N" => (1.01, 6.4),
            "H-O" => (0.96, 7.8),
            "F-H" => (0.92, 9.7),
            _ => (ea.CovalentRadiusAngstrom + eb.CovalentRadiusAngstrom, 4.5),
        };
        var r = (molecule.PositionsAngstrom[a] - molecule.PositionsAngstrom[b]).Length;
        return k1 * Math.Exp(-(r - r1) / 0.3);
    }

    private static ForceFieldTerm Single(InternalCoordinate q, double k, string label) => new([new WeightedCoordinate(q, 1.0)], k, label);

    /// <summary>∂q/∂x by central differences; Å/Å for a stretch, rad/Å for a bend or torsion.</summary>
    private static double[] BRow(InternalCoordinate q, Vec3[] pos)
    {
        var b = new double[3 * pos.Length];
        foreach (var atom in q.Atoms.Distinct())
        {
            var saved = pos[atom];
            for (var c = 0; c < 3; c++)
            {
                pos[atom] = Shift(saved, c, StepAngstrom);
                var plus = q.ValueAt(pos);
                pos[atom] = Shift(saved, c, -StepAngstrom);
                var minus = q.ValueAt(pos);
                pos[atom] = saved;
                var diff = plus - minus;
                if (q.Kind != InternalKind.Stretch) diff = InternalCoordinates.WrapDegrees(diff) * Math.PI / 180;
                b[3 * atom + c] = diff / (2 * StepAngstrom);
            }
        }
        return b;
    }

    private static Vec3 Shift(Vec3 v, int c, double h) => c switch
    {
        0 => v with { X = v.X + h },
        1 => v with { Y = v.Y + h },
        _ => v with { Z = v.Z + h },
    };

    private static void CheckAtoms(int n, string param, params int[] atoms)
    {
        foreach (var a in atoms)
            if (a < 0 || a >= n) throw new ArgumentException($"Atom {a + 1} does not exist; the molecule has {n} atoms.", param);
        if (atoms.Length == 2 && atoms[0] == atoms[1]) throw new ArgumentException($"Atom {atoms[0] + 1} paired with itself.", param);
    }
}
