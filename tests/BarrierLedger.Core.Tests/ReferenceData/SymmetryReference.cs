using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Tests.ReferenceData;

/// <summary>
/// Molecules built from textbook geometries, with the point group and rotational symmetry number σ a textbook gives them.
/// Point groups: F. A. Cotton, Chemical Applications of Group Theory, 3rd ed. (Wiley 1990), ch. 3 examples; σ: D. A. McQuarrie,
/// Statistical Mechanics (Harper &amp; Row 1976), ch. 8, table of rotational symmetry numbers, and the σ-by-point-group table of
/// Fernández-Ramos et al., Theor. Chem. Acc. 2007, 118, 813 (Table 1). Both from memory.
/// Bond lengths and angles: experimental gas-phase structures as tabulated in the CRC Handbook of Chemistry and Physics
/// ("Bond lengths and angles in gas-phase molecules") and in Herzberg, Molecular Spectra and Molecular Structure II/III, from memory.
/// </summary>
public static class SymmetryReference
{
    public const string GroupSource = "Cotton, Chemical Applications of Group Theory (1990), ch. 3, from memory";
    public const string SigmaSource = "McQuarrie, Statistical Mechanics (1976), ch. 8; Fernández-Ramos et al. 2007 Table 1; from memory";
    public const string GeometrySource = "gas-phase experimental structures, CRC Handbook / Herzberg, from memory";

    /// <summary>One reference molecule: a name, the structure, its Schoenflies symbol and σ.</summary>
    public sealed record Case(string Name, Molecule Molecule, string PointGroup, int SymmetryNumber)
    {
        public override string ToString() => Name;
    }

    private const double Deg = Math.PI / 180;

    private static Molecule Build(IEnumerable<(string Symbol, Vec3 Position)> atoms, int charge = 0) =>
        new(atoms.Select(a => Elements.Get(a.Symbol)), atoms.Select(a => a.Position), charge);

    private static Vec3 V(double x, double y, double z) => new(x, y, z);

    /// <summary>Water: r(O–H) 0.9572 Å, ∠HOH 104.52° (<see cref="Spectroscopy"/>).</summary>
    public static Molecule Water => TestMolecules.H2O;

    /// <summary>Ammonia: r(N–H) 1.012 Å, ∠HNH 106.7°.</summary>
    public static Molecule Ammonia => Pyramid("N", "H", 1.012, 106.7);

    /// <summary>Methane: r(C–H) 1.087 Å, tetrahedral.</summary>
    public static Molecule Methane
    {
        get
        {
            var d = 1.087 / Math.Sqrt(3);
            return Build([("C", V(0, 0, 0)), ("H", V(d, d, d)), ("H", V(d, -d, -d)), ("H", V(-d, d, -d)), ("H", V(-d, -d, d))]);
        }
    }

    /// <summary>Benzene: r(C–C) 1.397 Å, r(C–H) 1.084 Å, regular hexagon.</summary>
    public static Molecule Benzene => Build(Enumerable.Range(0, 6).SelectMany(k =>
    {
        var (c, s) = (Math.Cos(60 * k * Deg), Math.Sin(60 * k * Deg));
        return new[] { ("C", V(1.397 * c, 1.397 * s, 0)), ("H", V(2.481 * c, 2.481 * s, 0)) };
    }));

    /// <summary>Carbon dioxide: r(C=O) 1.1600 Å, linear.</summary>
    public static Molecule CarbonDioxide => TestMolecules.CO2;

    /// <summary>Hydrogen cyanide: r(C–H) 1.065 Å, r(C≡N) 1.153 Å, linear.</summary>
    public static Molecule HydrogenCyanide => Build([("H", V(0, 0, -1.065)), ("C", V(0, 0, 0)), ("N", V(0, 0, 1.153))]);

    /// <summary>Ethylene: r(C=C) 1.339 Å, r(C–H) 1.086 Å, ∠HCH 117.6°, planar.</summary>
    public static Molecule Ethylene
    {
        get
        {
            const double cc = 1.339, ch = 1.086;
            var a = 117.6 / 2 * Deg;
            return Build([
                ("C", V(0, 0, cc / 2)), ("C", V(0, 0, -cc / 2)),
                ("H", V(0, ch * Math.Sin(a), cc / 2 + ch * Math.Cos(a))), ("H", V(0, -ch * Math.Sin(a), cc / 2 + ch * Math.Cos(a))),
                ("H", V(0, ch * Math.Sin(a), -cc / 2 - ch * Math.Cos(a))), ("H", V(0, -ch * Math.Sin(a), -cc / 2 - ch * Math.Cos(a))),
            ]);
        }
    }

    /// <summary>Ethane: r(C–C) 1.536 Å, r(C–H) 1.091 Å, ∠CCH 111.2°; staggered (H–C–C–H 60°) or eclipsed (0°).</summary>
    public static Molecule Ethane(bool staggered)
    {
        const double cc = 1.536, ch = 1.091;
        var tilt = (180 - 111.2) * Deg;
        var atoms = new List<(string, Vec3)> { ("C", V(0, 0, cc / 2)), ("C", V(0, 0, -cc / 2)) };
        for (var k = 0; k < 3; k++)
        {
            var phi = 120 * k * Deg;
            atoms.Add(("H", V(ch * Math.Sin(tilt) * Math.Cos(phi), ch * Math.Sin(tilt) * Math.Sin(phi), cc / 2 + ch * Math.Cos(tilt))));
            var psi = phi + (staggered ? 60 * Deg : 0);
            atoms.Add(("H", V(ch * Math.Sin(tilt) * Math.Cos(psi), ch * Math.Sin(tilt) * Math.Sin(psi), -cc / 2 - ch * Math.Cos(tilt))));
        }
        return Build(atoms);
    }

    /// <summary>Allene: r(C=C) 1.308 Å, r(C–H) 1.087 Å, ∠HCH 118.2°, the two CH₂ planes perpendicular.</summary>
    public static Molecule Allene
    {
        get
        {
            const double cc = 1.308, ch = 1.087;
            var a = 118.2 / 2 * Deg;
            var (s, c) = (ch * Math.Sin(a), ch * Math.Cos(a));
            return Build([
                ("C", V(0, 0, 0)), ("C", V(0, 0, cc)), ("C", V(0, 0, -cc)),
                ("H", V(s, 0, cc + c)), ("H", V(-s, 0, cc + c)), ("H", V(0, s, -cc - c)), ("H", V(0, -s, -cc - c)),
            ]);
        }
    }

    /// <summary>Hydrogen peroxide: r(O–O) 1.475 Å, r(O–H) 0.950 Å, ∠OOH 94.8°, dihedral H–O–O–H 111.5°.</summary>
    public static Molecule HydrogenPeroxide
    {
        get
        {
            const double oo = 1.475, oh = 0.950;
            var bend = (94.8 - 90) * Deg; // the O–H bond leans this far beyond the perpendicular to O–O
            var half = 111.5 / 2 * Deg;
            var (perp, along) = (oh * Math.Cos(bend), oh * Math.Sin(bend));
            return Build([
                ("O", V(0, oo / 2, 0)), ("O", V(0, -oo / 2, 0)),
                ("H", V(perp * Math.Cos(half), oo / 2 + along, perp * Math.Sin(half))),
                ("H", V(perp * Math.Cos(half), -oo / 2 - along, -perp * Math.Sin(half))),
            ]);
        }
    }

    /// <summary>Dichloromethane: r(C–H) 1.087 Å, r(C–Cl) 1.765 Å, ∠HCH 112.0°, ∠ClCCl 111.8°.</summary>
    public static Molecule Dichloromethane
    {
        get
        {
            var h = 112.0 / 2 * Deg;
            var cl = 111.8 / 2 * Deg;
            return Build([
                ("C", V(0, 0, 0)),
                ("H", V(1.087 * Math.Sin(h), 0, 1.087 * Math.Cos(h))), ("H", V(-1.087 * Math.Sin(h), 0, 1.087 * Math.Cos(h))),
                ("Cl", V(0, 1.765 * Math.Sin(cl), -1.765 * Math.Cos(cl))), ("Cl", V(0, -1.765 * Math.Sin(cl), -1.765 * Math.Cos(cl))),
            ]);
        }
    }

    /// <summary>Sulfur hexafluoride: r(S–F) 1.561 Å, octahedral.</summary>
    public static Molecule SulfurHexafluoride
    {
        get
        {
            const double r = 1.561;
            return Build([("S", V(0, 0, 0)), ("F", V(r, 0, 0)), ("F", V(-r, 0, 0)), ("F", V(0, r, 0)), ("F", V(0, -r, 0)), ("F", V(0, 0, r)), ("F", V(0, 0, -r))]);
        }
    }

    /// <summary>trans-Diazene: r(N=N) 1.247 Å, r(N–H) 1.029 Å, ∠NNH 106.9°, planar, H atoms trans.</summary>
    public static Molecule TransDiazene
    {
        get
        {
            const double nn = 1.247, nh = 1.029;
            var out1 = (180 - 106.9) * Deg;
            var h = V(nn / 2 + nh * Math.Cos(out1), nh * Math.Sin(out1), 0);
            return Build([("N", V(nn / 2, 0, 0)), ("N", V(-nn / 2, 0, 0)), ("H", h), ("H", -h)]);
        }
    }

    /// <summary>
    /// Cyclohexane chair: r(C–C) 1.536 Å, ∠CCC 111.4°, r(C–H) 1.097 Å; carbons alternately above and below the mean plane,
    /// axial C–H parallel to the three-fold axis, equatorial C–H 19.5° out of the mean plane (tetrahedral carbon).
    /// </summary>
    public static Molecule CyclohexaneChair
    {
        get
        {
            const double cc = 1.536, ch = 1.097;
            var theta = 111.4 * Deg;
            // Ring atoms at (R cos 60k, R sin 60k, ±h): |C_k C_k+1|² = R² + 4h², and the ring angle gives R² = (2/3) L² (1 − cos θ).
            var r = Math.Sqrt(2.0 / 3.0 * cc * cc * (1 - Math.Cos(theta)));
            var hz = Math.Sqrt(cc * cc - r * r) / 2;
            var tilt = 19.5 * Deg;
            var atoms = new List<(string, Vec3)>();
            for (var k = 0; k < 6; k++)
            {
                var sign = k % 2 == 0 ? 1.0 : -1.0;
                var radial = V(Math.Cos(60 * k * Deg), Math.Sin(60 * k * Deg), 0);
                var c = r * radial + V(0, 0, sign * hz);
                atoms.Add(("C", c));
                atoms.Add(("H", c + V(0, 0, sign * ch)));
                atoms.Add(("H", c + ch * (Math.Cos(tilt) * radial + V(0, 0, -sign * Math.Sin(tilt)))));
            }
            return Build(atoms);
        }
    }

    /// <summary>Bromochlorofluoromethane, a stereocentre: C–H 1.09, C–F 1.35, C–Cl 1.77, C–Br 1.93 Å along tetrahedral directions.</summary>
    public static Molecule Bromochlorofluoromethane
    {
        get
        {
            var s = 1 / Math.Sqrt(3);
            return Build([
                ("C", V(0, 0, 0)), ("H", 1.09 * V(s, s, s)), ("F", 1.35 * V(s, -s, -s)), ("Cl", 1.77 * V(-s, s, -s)), ("Br", 1.93 * V(-s, -s, s)),
            ]);
        }
    }

    /// <summary>Boron trifluoride: r(B–F) 1.307 Å, trigonal planar.</summary>
    public static Molecule BoronTrifluoride => Build(new[] { ("B", V(0, 0, 0)) }.Concat(Enumerable.Range(0, 3)
        .Select(k => ("F", 1.307 * V(Math.Cos(120 * k * Deg), Math.Sin(120 * k * Deg), 0)))));

    /// <summary>Xenon tetrafluoride: r(Xe–F) 1.95 Å, square planar.</summary>
    public static Molecule XenonTetrafluoride => Build([("Xe", V(0, 0, 0)), ("F", V(1.95, 0, 0)), ("F", V(-1.95, 0, 0)), ("F", V(0, 1.95, 0)), ("F", V(0, -1.95, 0))]);

    /// <summary>Chloromethane: r(C–H) 1.086 Å, r(C–Cl) 1.781 Å, ∠HCH 110.5°.</summary>
    public static Molecule Chloromethane
    {
        get
        {
            var m = Pyramid("C", "H", 1.086, 110.5);
            return new Molecule([.. m.Elements, Elements.Get("Cl")], [.. m.PositionsAngstrom, V(0, 0, 1.781)]);
        }
    }

    /// <summary>
    /// Dodecahydro-closo-dodecaborate(2−): B₁₂ icosahedron with r(B–B) 1.78 Å, each B–H 1.20 Å pointing away from the centre.
    /// The icosahedron's vertices are the cyclic permutations of (0, ±1, ±φ) (edge 2).
    /// </summary>
    public static Molecule Dodecaborate
    {
        get
        {
            var phi = (1 + Math.Sqrt(5)) / 2;
            var vertices = new List<Vec3>();
            foreach (var a in new[] { -1.0, 1.0 })
                foreach (var b in new[] { -phi, phi })
                {
                    vertices.Add(V(0, a, b));
                    vertices.Add(V(a, b, 0));
                    vertices.Add(V(b, 0, a));
                }
            var scale = 1.78 / 2;
            var atoms = vertices.Select(v => ("B", scale * v)).Concat(vertices.Select(v => ("H", scale * v + 1.20 * v.Normalized())));
            return Build(atoms, charge: -2);
        }
    }

    /// <summary>
    /// Buckminsterfullerene C₆₀ (truncated icosahedron, every bond 1.42 Å here): the even permutations of (0, ±1, ±3φ),
    /// (±1, ±(2 + φ), ±2φ) and (±φ, ±2, ±φ³) for edge 2.
    /// </summary>
    public static Molecule Fullerene
    {
        get
        {
            var phi = (1 + Math.Sqrt(5)) / 2;
            var points = new List<Vec3>();
            foreach (var (x, y, z) in new[] { (0.0, 1.0, 3 * phi), (1.0, 2 + phi, 2 * phi), (phi, 2.0, phi * phi * phi) })
                foreach (var sx in Signs(x))
                    foreach (var sy in Signs(y))
                        foreach (var sz in Signs(z))
                        {
                            var p = V(sx * x, sy * y, sz * z);
                            foreach (var q in new[] { p, V(p.Y, p.Z, p.X), V(p.Z, p.X, p.Y) })
                                if (!points.Any(o => (o - q).Length < 1e-9)) points.Add(q);
                        }
            return Build(points.Select(p => ("C", 1.42 / 2 * p)));
        }
    }

    private static double[] Signs(double v) => v == 0 ? [1.0] : [1.0, -1.0];

    /// <summary>The ≥ 15 textbook molecules of the σ check.</summary>
    public static IReadOnlyList<Case> Textbook { get; } =
    [
        new("H2O", Water, "C2v", 2),
        new("NH3", Ammonia, "C3v", 3),
        new("CH4", Methane, "Td", 12),
        new("C6H6", Benzene, "D6h", 12),
        new("CO2", CarbonDioxide, "D∞h", 2),
        new("HCN", HydrogenCyanide, "C∞v", 1),
        new("C2H4", Ethylene, "D2h", 4),
        new("C2H6 staggered", Ethane(staggered: true), "D3d", 6),
        new("C2H6 eclipsed", Ethane(staggered: false), "D3h", 6),
        new("allene", Allene, "D2d", 4),
        new("H2O2", HydrogenPeroxide, "C2", 2),
        new("CH2Cl2", Dichloromethane, "C2v", 2),
        new("SF6", SulfurHexafluoride, "Oh", 24),
        new("trans-N2H2", TransDiazene, "C2h", 2),
        new("cyclohexane chair", CyclohexaneChair, "D3d", 6),
        new("CHFClBr", Bromochlorofluoromethane, "C1", 1),
        new("BF3", BoronTrifluoride, "D3h", 6),
        new("XeF4", XenonTetrafluoride, "D4h", 8),
        new("CH3Cl", Chloromethane, "C3v", 3),
        new("B12H12(2-)", Dodecaborate, "Ih", 60),
        new("C60", Fullerene, "Ih", 60),
    ];

    /// <summary>A pyramid: apex atom at the origin, three ligands at distance r with ligand–apex–ligand angle α, below the apex.</summary>
    private static Molecule Pyramid(string apex, string ligand, double r, double angleDegrees)
    {
        // cos α = cos²β + sin²β cos 120° for ligands at polar angle β from the axis: sin²β = (1 − cos α) / 1.5.
        var sinBeta = Math.Sqrt((1 - Math.Cos(angleDegrees * Deg)) / 1.5);
        var cosBeta = Math.Sqrt(1 - sinBeta * sinBeta);
        return Build(new[] { (apex, V(0, 0, 0)) }.Concat(Enumerable.Range(0, 3).Select(k =>
            (ligand, V(r * sinBeta * Math.Cos(120 * k * Deg), r * sinBeta * Math.Sin(120 * k * Deg), -r * cosBeta)))));
    }
}
