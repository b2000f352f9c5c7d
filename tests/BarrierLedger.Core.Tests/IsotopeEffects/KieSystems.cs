using System.Collections.Immutable;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.IsotopeEffects;
using BarrierLedger.Core.Tests.Vibrations;

namespace BarrierLedger.Core.Tests.IsotopeEffects;

/// <summary>
/// Model reactants and saddle points with exactly invariant Hessians (pair springs at their rest lengths, <see cref="SpringHessians"/>);
/// a saddle point is the same spring network with one pair's constant made negative, which gives one imaginary mode along it.
/// </summary>
public static class KieSystems
{
    /// <summary>
    /// H–CCl₃ (tetrahedral, C–H 1.09 Å, C–Cl 1.77 Å) with a C–H stretch near 2900 cm⁻¹, and a saddle point of the same geometry in which
    /// the C–H spring is negative: the C–H stretch is lost at the saddle point and every other spring is unchanged.
    /// </summary>
    public static (Molecule Molecule, double[] Reactant, double[] SaddlePoint) HydrogenLoss(double chForceNewtonPerMetre = 415.0)
    {
        var tet = Math.Acos(-1.0 / 3.0);
        var atoms = new List<(string, Vec3)> { ("C", Vec3.Zero), ("H", new Vec3(0, 0, 1.09)) };
        for (var k = 0; k < 3; k++)
        {
            var phi = 2 * Math.PI * k / 3;
            atoms.Add(("Cl", 1.77 * new Vec3(Math.Sin(tet) * Math.Cos(phi), Math.Sin(tet) * Math.Sin(phi), Math.Cos(tet))));
        }
        var m = new Molecule(atoms.Select(a => Elements.Get(a.Item1)), atoms.Select(a => a.Item2 + new Vec3(0.3, -1.1, 0.7)));
        List<(int, int, double)> Springs(double ch) =>
        [
            (0, 1, ch), (0, 2, 320), (0, 3, 320), (0, 4, 320),
            (1, 2, 40), (1, 3, 40), (1, 4, 40),
            (2, 3, 60), (3, 4, 60), (2, 4, 60),
        ];
        return (m, SpringHessians.Build(m, Springs(chForceNewtonPerMetre)), SpringHessians.Build(m, Springs(-150.0)));
    }

    /// <summary>A random cluster (C, H, N, O, Cl cycled) as a reactant, and the same with the spring between atoms 1 and 2 made
    /// strongly negative as a saddle point.</summary>
    public static (Molecule Molecule, double[] Reactant, double[] SaddlePoint) Cluster(int atoms, int stream)
    {
        var (m, reactant) = SpringHessians.RandomCluster(atoms, stream);
        var saddle = (double[])reactant.Clone();
        var extra = SpringHessians.Build(m, [(0, 1, -2500.0)]);
        for (var i = 0; i < saddle.Length; i++) saddle[i] += extra[i];
        return (m, reactant, saddle);
    }

    /// <summary>The first atom (1-based) of an element in a structure.</summary>
    public static int FirstAtom(Molecule m, string symbol) => m.Elements.IndexOf(Elements.Get(symbol)) + 1;

    public static KieStructure Structure(string label, Molecule m, double[] h, params (int Atom, string Isotope)[] subs) =>
        new(label, m, h, [.. subs.Select(s => new IsotopeSubstitution(s.Atom, Isotopes.Parse(s.Isotope)))]);

    public static ImmutableArray<IsotopeSubstitution> Subs(params (int Atom, string Isotope)[] subs) =>
        [.. subs.Select(s => new IsotopeSubstitution(s.Atom, Isotopes.Parse(s.Isotope)))];
}
