using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Demo;

/// <summary>
/// Hand-built demo geometries with standard bond lengths and angles (typical textbook values, from memory): C–H 1.08–1.10 Å,
/// C=C 1.33–1.34, C–C 1.50–1.54, C=O 1.21, C–O 1.36, O–H 0.97, C–N 1.46, C–F 1.39, C–Cl 1.79, C–I 2.14, H–F 0.92.
/// Saddle points have their forming and breaking bonds partly formed. Atom numbers in the comments are 1-based, as users see them.
/// </summary>
internal static class DemoStructures
{
    private static Element C => Elements.C;
    private static Element H => Elements.H;
    private static Element N => Elements.N;
    private static Element O => Elements.O;
    private static Element F => Elements.Get("F");
    private static Element Cl => Elements.Get("Cl");
    private static Element I => Elements.Get("I");

    private static Molecule Done(GeometryBuilder g, int charge = 0) => GeometryBuilder.Rounded(g.Build(charge));

    public static Molecule Atom(Element e, int charge)
    {
        var g = new GeometryBuilder();
        g.At(e, Vec3.Zero);
        return Done(g, charge);
    }

    public static Molecule Fluoride => Atom(F, -1);
    public static Molecule Chloride => Atom(Cl, -1);
    public static Molecule Iodide => Atom(I, -1);

    /// <summary>Ethylene C1=C2, H3–H6.</summary>
    public static Molecule Ethylene
    {
        get
        {
            var g = new GeometryBuilder();
            var c1 = g.At(C, new Vec3(-0.6655, 0, 0));
            var c2 = g.At(C, new Vec3(0.6655, 0, 0));
            foreach (var (c, sx) in new[] { (c1, -1.0), (c2, 1.0) })
                foreach (var sy in new[] { 1.0, -1.0 })
                    g.At(H, g[c] + 1.086 * new Vec3(sx * Math.Cos(58.7 * Math.PI / 180), sy * Math.Sin(58.7 * Math.PI / 180), 0));
            return Done(g);
        }
    }

    /// <summary>s-trans-1,3-butadiene C1=C2–C3=C4, H5–H10.</summary>
    public static Molecule Butadiene
    {
        get
        {
            var g = new GeometryBuilder();
            var c1 = g.At(C, new Vec3(0, 0, 0));
            var c2 = g.At(C, new Vec3(1.340, 0, 0));
            var c3 = g.At(C, GeometryBuilder.Place(new Vec3(0, 1, 0), g[c1], g[c2], 1.458, 123.8, 0));
            var c4 = g.Z(C, c3, 1.340, c2, 123.8, c1, 180);
            g.Z(H, c1, 1.085, c2, 121.5, c3, 0);
            g.Z(H, c1, 1.085, c2, 121.5, c3, 180);
            g.Z(H, c2, 1.088, c3, 116.7, c4, 0);
            g.Z(H, c3, 1.088, c2, 116.7, c1, 0);
            g.Z(H, c4, 1.085, c3, 121.5, c2, 0);
            g.Z(H, c4, 1.085, c3, 121.5, c2, 180);
            return Done(g);
        }
    }

    /// <summary>
    /// Diels–Alder saddle point: diene C1=C2–C3=C4 (z = 0) above ethylene C5=C6, forming bonds C1–C6 and C4–C5 at 2.27 Å,
    /// mirror plane x = 0; H7–H12 on the diene, H13–H16 on ethylene.
    /// </summary>
    public static Molecule DielsAlderSaddle => DielsAlder(2.27);

    /// <summary>The Diels–Alder pair with both forming distances at <paramref name="forming"/> Å (ethylene moved along the approach).</summary>
    public static Molecule DielsAlder(double forming)
    {
        var g = new GeometryBuilder();
        var half = 0.705;
        var c1 = new Vec3(-half - 1.385 * Math.Cos(57 * Math.PI / 180), 0, 0);
        var c2 = new Vec3(-half, 1.385 * Math.Sin(57 * Math.PI / 180), 0);
        var ethX = 0.69;
        var yE = -0.35;
        var dx = c1.X + ethX;
        var zE = -Math.Sqrt(forming * forming - dx * dx - yE * yE);
        Vec3 M(Vec3 v) => v with { X = -v.X };
        g.At(C, c1);
        g.At(C, c2);
        g.At(C, M(c2));
        g.At(C, M(c1));
        var c5 = new Vec3(ethX, yE, zE);
        g.At(C, c5);
        g.At(C, M(c5));
        // Diene hydrogens: terminal CH2 tilted away from the dienophile (the inner H more, as the ends turn outwards); inner CH in plane.
        var u = (c2 - c1).Normalized();
        var side = new Vec3(0, 0, 1).Cross(u);
        Vec3 Tilt(Vec3 d, Vec3 away, double deg) => (Math.Cos(deg * Math.PI / 180) * d + Math.Sin(deg * Math.PI / 180) * away).Normalized();
        var h7 = c1 + 1.082 * Tilt(-Math.Cos(60 * Math.PI / 180) * u + Math.Sin(60 * Math.PI / 180) * side, new Vec3(0, 0, 1), 12);
        var h8 = c1 + 1.082 * Tilt(-Math.Cos(55 * Math.PI / 180) * u - Math.Sin(55 * Math.PI / 180) * side, new Vec3(0, 0, 1), 30);
        var h9 = c2 + 1.087 * -((c1 - c2).Normalized() + (M(c2) - c2).Normalized()).Normalized();
        g.At(H, h7);
        g.At(H, h8);
        g.At(H, h9);
        g.At(H, M(h9));
        g.At(H, M(h7));
        g.At(H, M(h8));
        // Ethylene hydrogens, tilted 12° away from the diene (−z).
        foreach (var sy in new[] { 1.0, -1.0 })
        {
            var d = new Vec3(Math.Cos(59 * Math.PI / 180), sy * Math.Sin(59 * Math.PI / 180), 0);
            g.At(H, c5 + 1.083 * Tilt(d, new Vec3(0, 0, -1), 12));
        }
        foreach (var sy in new[] { 1.0, -1.0 })
        {
            var d = new Vec3(Math.Cos(59 * Math.PI / 180), sy * Math.Sin(59 * Math.PI / 180), 0);
            g.At(H, M(c5 + 1.083 * Tilt(d, new Vec3(0, 0, -1), 12)));
        }
        return Done(g);
    }

    /// <summary>Cyclohexene (half-chair) numbered as the Diels–Alder pair: C2=C3, new bonds C1–C6 and C4–C5; H7–H16.</summary>
    public static Molecule Cyclohexene
    {
        get
        {
            var g = new GeometryBuilder();
            var c1 = g.At(C, new Vec3(-1.498, -1.251, 0));
            var c2 = g.At(C, new Vec3(-0.670, 0, 0));
            var c3 = g.At(C, new Vec3(0.670, 0, 0));
            var c4 = g.At(C, new Vec3(1.498, -1.251, 0));
            var c5 = g.At(C, new Vec3(0.680, -2.4957, -0.35));
            var c6 = g.At(C, new Vec3(-0.680, -2.4957, 0.35));
            g.Methylene(c1, c2, c6);
            g.TrigonalH(c2, c1, c3, 1.087);
            g.TrigonalH(c3, c2, c4, 1.087);
            g.Methylene(c4, c3, c5);
            g.Methylene(c5, c4, c6);
            g.Methylene(c6, c5, c1);
            return Done(g);
        }
    }

    /// <summary>Chloromethane C1, Cl2, H3–H5.</summary>
    public static Molecule Chloromethane => Methyl(Cl, 1.785, 108.5);

    /// <summary>Iodomethane C1, I2, H3–H5.</summary>
    public static Molecule Iodomethane => Methyl(I, 2.140, 107.8);

    /// <summary>Fluoromethane C1, F2, H3–H5.</summary>
    public static Molecule Fluoromethane => Methyl(F, 1.390, 109.0);

    private static Molecule Methyl(Element x, double r, double xch)
    {
        var g = new GeometryBuilder();
        g.At(C, Vec3.Zero);
        g.At(x, new Vec3(0, 0, r));
        foreach (var phi in new[] { 0.0, 120.0, 240.0 })
            g.At(H, 1.088 * GeometryBuilder.Polar(xch, phi));
        return Done(g);
    }

    /// <summary>
    /// Collinear S<sub>N</sub>2 saddle point X···CH3···Y⁻: C1 at the origin, Y2 (leaving) on +z, X3 (entering) on −z,
    /// H4–H6 nearly planar, still bent away from the leaving group by <paramref name="lean"/> degrees (reactant-like).
    /// </summary>
    public static Molecule Sn2Saddle(Element leaving, double rLeaving, Element entering, double rEntering, double lean)
    {
        var g = new GeometryBuilder();
        g.At(C, Vec3.Zero);
        g.At(leaving, new Vec3(0, 0, rLeaving));
        g.At(entering, new Vec3(0, 0, -rEntering));
        foreach (var phi in new[] { 0.0, 120.0, 240.0 })
            g.At(H, 1.074 * GeometryBuilder.Polar(90 + lean, phi));
        return Done(g, -1);
    }

    /// <summary>[I···CH3···Cl]⁻: C1, Cl2 leaving (2.38 Å), I3 entering (2.68 Å).</summary>
    public static Molecule IodideSaddle => Sn2Saddle(Cl, 2.38, I, 2.68, 1.5);

    /// <summary>[F···CH3···I]⁻: C1, I2 leaving (2.50 Å), F3 entering (2.08 Å), an early saddle point.</summary>
    public static Molecule FluorideSaddle => Sn2Saddle(I, 2.50, F, 2.08, 6.0);

    /// <summary>Dimethylamine N1, C2, C3, H4 (on N), H5–H7 (on C2), H8–H10 (on C3).</summary>
    public static Molecule Dimethylamine
    {
        get
        {
            var g = new GeometryBuilder();
            var n1 = g.At(N, Vec3.Zero);
            var c2 = g.At(C, new Vec3(1.455, 0, 0));
            var c3 = g.At(C, GeometryBuilder.Place(new Vec3(0, 0, 1), g[c2], g[n1], 1.455, 112.2, 0));
            var h4 = g.Z(H, n1, 1.014, c2, 109.0, c3, 122.0);
            foreach (var phi in new[] { 180.0, 60.0, -60.0 }) g.Z(H, c2, 1.094, n1, 110.0, h4, phi);
            foreach (var phi in new[] { 180.0, 60.0, -60.0 }) g.Z(H, c3, 1.094, n1, 110.0, h4, phi);
            return Done(g);
        }
    }

    /// <summary>Trimethylammonium N1, C2–C4, H5 (on N), H6–H14 (three per methyl), staggered.</summary>
    public static Molecule Trimethylammonium
    {
        get
        {
            var g = new GeometryBuilder();
            var n1 = g.At(N, Vec3.Zero);
            var h = new Vec3(0, 0, 1.025);
            var cs = new[] { 0.0, 120.0, 240.0 }.Select(phi => g.At(C, 1.493 * GeometryBuilder.Polar(107.8, phi))).ToArray();
            var h5 = g.At(H, h);
            foreach (var c in cs)
                foreach (var phi in new[] { 180.0, 60.0, -60.0 }) g.Z(H, c, 1.090, n1, 109.0, h5, phi);
            return Done(g, 1);
        }
    }

    /// <summary>
    /// Methyl transfer from chloromethane to dimethylamine: N1, C2 (the moving methyl carbon), Cl3, H4–H6 (on C2), C7, C8 (the
    /// N-methyls), H9 (on N), H10–H12 (on C7), H13–H15 (on C8). N1–C2 2.05 Å forming, C2–Cl3 2.38 Å breaking, collinear on z.
    /// </summary>
    public static Molecule MenshutkinSaddle
    {
        get
        {
            var g = new GeometryBuilder();
            var n1 = g.At(N, Vec3.Zero);
            var c2 = g.At(C, new Vec3(0, 0, 2.05));
            g.At(Cl, new Vec3(0, 0, 2.05 + 2.38));
            foreach (var phi in new[] { 60.0, 180.0, 300.0 }) g.At(H, g[c2] + 1.073 * GeometryBuilder.Polar(86.5, phi));
            var c7 = g.At(C, 1.472 * GeometryBuilder.Polar(107.5, 0));
            var c8 = g.At(C, 1.472 * GeometryBuilder.Polar(107.5, 120));
            g.At(H, 1.018 * GeometryBuilder.Polar(106.0, 240));
            foreach (var phi in new[] { 180.0, 60.0, -60.0 }) g.Z(H, c7, 1.090, n1, 109.5, c2, phi);
            foreach (var phi in new[] { 180.0, 60.0, -60.0 }) g.Z(H, c8, 1.090, n1, 109.5, c2, phi);
            return Done(g, 0);
        }
    }

    /// <summary>
    /// Fluoroethane C1 (CH2F), C2 (CH3), F3, H4, H5 (on C1), H6–H8 (on C2). <paramref name="methylPhase"/> is the dihedral
    /// F3–C1–C2–H6: 180 staggered (the minimum), 0 eclipsed (the rotational saddle point).
    /// </summary>
    public static Molecule Fluoroethane(double methylPhase)
    {
        var g = new GeometryBuilder();
        var c1 = g.At(C, Vec3.Zero);
        var c2 = g.At(C, new Vec3(1.515, 0, 0));
        var f3 = g.At(F, GeometryBuilder.Place(new Vec3(0, 0, 1), g[c2], g[c1], 1.398, 109.6, 90));
        g.Z(H, c1, 1.093, c2, 111.8, f3, 120.5);
        g.Z(H, c1, 1.093, c2, 111.8, f3, -120.5);
        foreach (var offset in new[] { 0.0, 120.0, -120.0 }) g.Z(H, c2, 1.092, c1, 110.6, f3, methylPhase + offset);
        return Done(g);
    }

    /// <summary>Hydrogen fluoride H1, F2.</summary>
    public static Molecule HydrogenFluoride
    {
        get
        {
            var g = new GeometryBuilder();
            g.At(H, Vec3.Zero);
            g.At(F, new Vec3(0, 0, 0.917));
            return Done(g);
        }
    }

    /// <summary>Cyclobutene C1=C2, C2–C3, C3–C4 (the bond that opens), C4–C1; H5 (C1), H6 (C2), H7, H8 (C3), H9, H10 (C4).</summary>
    public static Molecule Cyclobutene
    {
        get
        {
            var g = new GeometryBuilder();
            var c1 = g.At(C, new Vec3(-0.671, 0, 0));
            var c2 = g.At(C, new Vec3(0.671, 0, 0));
            var c3 = g.At(C, new Vec3(0.783, -1.520, 0));
            var c4 = g.At(C, new Vec3(-0.783, -1.520, 0));
            g.TrigonalH(c1, c4, c2, 1.083);
            g.TrigonalH(c2, c1, c3, 1.083);
            g.Methylene(c3, c2, c4, 1.094, 109.0);
            g.Methylene(c4, c3, c1, 1.094, 109.0);
            return Done(g);
        }
    }

    /// <summary>
    /// Conrotatory ring-opening saddle point of cyclobutene, numbered as <see cref="Cyclobutene"/>: C3···C4 2.14 Å, C2 axis
    /// along y, the CH2 groups turned the same way.
    /// </summary>
    public static Molecule CyclobuteneOpeningSaddle
    {
        get
        {
            var g = new GeometryBuilder();
            var c1 = g.At(C, new Vec3(-0.693, 0, 0));
            var c2 = g.At(C, new Vec3(0.693, 0, 0));
            var c3 = g.At(C, new Vec3(1.057, -1.352, 0.167));
            var c4 = g.At(C, new Vec3(-1.057, -1.352, -0.167));
            g.TrigonalH(c1, c4, c2, 1.085);
            g.TrigonalH(c2, c1, c3, 1.085);
            // C2 rotation about y maps C3→C4 and C2→C1 and keeps dihedrals, so both ends use the same values.
            foreach (var (c, b, a) in new[] { (c3, c2, c1), (c4, c1, c2) })
            {
                g.Z(H, c, 1.084, b, 119.0, a, 128.0);
                g.Z(H, c, 1.086, b, 117.0, a, -58.0);
            }
            return Done(g);
        }
    }

    /// <summary>s-cis-gauche butadiene numbered as <see cref="Cyclobutene"/> (C3=C2–C1=C4, dihedral 38°): where the ring opening leads.</summary>
    public static Molecule GaucheButadieneFromRing
    {
        get
        {
            var g = new GeometryBuilder();
            var c1 = g.At(C, new Vec3(-0.733, 0, 0));
            var c2 = g.At(C, new Vec3(0.733, 0, 0));
            var c3 = g.At(C, GeometryBuilder.Place(new Vec3(-1, -1, 0.4), g[c1], g[c2], 1.341, 124.5, 19));
            var c4 = g.Z(C, c1, 1.341, c2, 124.5, c3, 38);
            g.Z(H, c1, 1.088, c2, 116.5, c3, -142);
            g.Z(H, c2, 1.088, c1, 116.5, c4, -142);
            g.Z(H, c3, 1.085, c2, 121.5, c1, 180);
            g.Z(H, c3, 1.085, c2, 121.5, c1, 0);
            g.Z(H, c4, 1.085, c1, 121.5, c2, 180);
            g.Z(H, c4, 1.085, c1, 121.5, c2, 0);
            return Done(g);
        }
    }

    /// <summary>Acetaldehyde C1 (carbonyl), C2 (methyl), O3, H4 (methyl H syn to O, the one that moves), H5 (on C1), H6, H7.</summary>
    public static Molecule Acetaldehyde
    {
        get
        {
            var g = new GeometryBuilder();
            var c1 = g.At(C, Vec3.Zero);
            var c2 = g.At(C, new Vec3(1.503, 0, 0));
            var o3 = g.At(O, GeometryBuilder.Place(new Vec3(0, 0, 1), g[c2], g[c1], 1.210, 124.5, 90));
            g.Z(H, c2, 1.091, c1, 110.5, o3, 0);
            g.Z(H, c1, 1.111, c2, 115.0, o3, 180);
            g.Z(H, c2, 1.095, c1, 109.8, o3, 121.5);
            g.Z(H, c2, 1.095, c1, 109.8, o3, -121.5);
            return Done(g);
        }
    }

    /// <summary>
    /// 1,3-hydrogen shift saddle point, numbered as <see cref="Acetaldehyde"/>: a planar four-membered ring C1–C2···H4···O3 with
    /// C2···H4 1.40 Å breaking and O3···H4 1.27 Å forming.
    /// </summary>
    public static Molecule HydrogenShiftSaddle
    {
        get
        {
            var g = new GeometryBuilder();
            var c1 = g.At(C, Vec3.Zero);
            var c2 = g.At(C, new Vec3(1.420, 0, 0));
            var o3 = g.At(O, 1.290 * new Vec3(Math.Cos(104 * Math.PI / 180), Math.Sin(104 * Math.PI / 180), 0));
            var baseLen = (g[o3] - g[c2]).Length;
            var along = (1.40 * 1.40 - 1.27 * 1.27 + baseLen * baseLen) / (2 * baseLen);
            var height = Math.Sqrt(1.40 * 1.40 - along * along);
            var e = (g[o3] - g[c2]).Normalized();
            var perp = new Vec3(-e.Y, e.X, 0);
            var foot = g[c2] + along * e;
            // Of the two mirror positions, the one away from C1 closes the ring.
            var h4pos = (foot + height * perp - g[c1]).Length > (foot - height * perp - g[c1]).Length ? foot + height * perp : foot - height * perp;
            g.At(H, h4pos);
            g.TrigonalH(c1, c2, o3, 1.090);
            var (h6, h7) = GeometryBuilder.Tetrahedral(g[c2], g[c1], h4pos, 1.088, 114.0);
            g.At(H, h6);
            g.At(H, h7);
            return Done(g);
        }
    }

    /// <summary>Vinyl alcohol (syn), numbered as <see cref="Acetaldehyde"/>: C1=C2, C1–O3, O3–H4, H5 (on C1), H6, H7 (on C2).</summary>
    public static Molecule VinylAlcohol
    {
        get
        {
            var g = new GeometryBuilder();
            var c1 = g.At(C, Vec3.Zero);
            var c2 = g.At(C, new Vec3(1.333, 0, 0));
            var o3 = g.At(O, GeometryBuilder.Place(new Vec3(0, 0, 1), g[c2], g[c1], 1.362, 126.5, 90));
            g.Z(H, o3, 0.967, c1, 108.5, c2, 0);
            g.Z(H, c1, 1.085, c2, 122.0, o3, 180);
            g.Z(H, c2, 1.082, c1, 121.5, o3, 0);
            g.Z(H, c2, 1.082, c1, 120.0, o3, 180);
            return Done(g);
        }
    }

    /// <summary>
    /// Oxirane (ethylene oxide) C1, C2, O3, H4–H7 (H4, H5 on C1; H6, H7 on C2): C–C 1.470 Å, C–O 1.431 Å, C–H 1.085 Å, H–C–H 116°.
    /// Standard values for a three-membered ring, rounded (from memory); the demo only needs a plausible, consistent minimum.
    /// </summary>
    public static Molecule Oxirane
    {
        get
        {
            var g = new GeometryBuilder();
            var c1 = g.At(C, Vec3.Zero);
            var c2 = g.At(C, new Vec3(1.470, 0, 0));
            var o3 = g.At(O, new Vec3(0.735, 0, Math.Sqrt(1.431 * 1.431 - 0.735 * 0.735)));
            var (h4, h5) = GeometryBuilder.Tetrahedral(g[c1], g[c2], g[o3], 1.085, 116.0);
            g.At(H, h4);
            g.At(H, h5);
            var (h6, h7) = GeometryBuilder.Tetrahedral(g[c2], g[c1], g[o3], 1.085, 116.0);
            g.At(H, h6);
            g.At(H, h7);
            return Done(g);
        }
    }
    /// <summary>
    /// 1-Halobutane numbered C1–C4 (C1 carries the halogen), X5, H6, H7 (on C1), H8, H9 (on C2), H10, H11 (on C3), H12–H14 (on C4);
    /// <paramref name="tau1"/> is the dihedral X5–C1–C2–C3 and <paramref name="tau2"/> C1–C2–C3–C4 (180 anti, ±65 gauche).
    /// C–C 1.520–1.530 Å, C–C–C 112.5–112.8°, C–X–C 111.0°, methylene H–C–H 107.5°, methyl staggered.
    /// </summary>
    public static Molecule Halobutane(Element x, double rCX, double tau1, double tau2)
    {
        var c1 = Vec3.Zero;
        var c2 = new Vec3(1.520, 0, 0);
        var xPos = GeometryBuilder.Place(new Vec3(0, 0, 1), c2, c1, rCX, 111.0, 90);
        return Butyl(c1, c2, xPos, x, null, tau1, tau2, 0);
    }

    /// <summary>1-Chlorobutane in the conformer given by its two dihedrals (see <see cref="Halobutane"/>).</summary>
    public static Molecule Chlorobutane(double tau1, double tau2) => Halobutane(Cl, 1.795, tau1, tau2);

    /// <summary>1-Iodobutane, all anti (numbered as <see cref="Halobutane"/>, I5).</summary>
    public static Molecule Iodobutane => Halobutane(I, 2.140, 180, 180);

    /// <summary>
    /// Iodide displacing chloride from 1-chlorobutane: C1–C4, Cl5, I6, H7, H8 (on C1), H9–H15 as in <see cref="Halobutane"/>; C1 at the origin,
    /// Cl5 leaving on +z (2.38 Å), I6 entering on −z (2.68 Å), C2, H7 and H8 nearly planar around C1 (bent 1.5° away from
    /// chlorine, as the methyl case <see cref="IodideSaddle"/>), C1–C2 1.495 Å. The chain points away from both halogens
    /// (Cl5–C1–C2–C3 90°); <paramref name="tau2"/> is C1–C2–C3–C4.
    /// </summary>
    public static Molecule ChlorobutaneIodideSaddle(double tau2)
    {
        var c1 = Vec3.Zero;
        var c2 = 1.495 * GeometryBuilder.Polar(91.5, 0);
        var cl = new Vec3(0, 0, 2.38);
        var i = new Vec3(0, 0, -2.68);
        return Butyl(c1, c2, cl, Cl, (i, [1.074 * GeometryBuilder.Polar(91.5, 120), 1.074 * GeometryBuilder.Polar(91.5, 240)]), 90, tau2, -1);
    }

    private static Molecule Butyl(Vec3 c1, Vec3 c2, Vec3 xPos, Element x, (Vec3 Iodine, Vec3[] C1Hydrogens)? saddle, double tau1, double tau2, int charge)
    {
        var c3 = GeometryBuilder.Place(xPos, c1, c2, 1.528, 112.5, tau1);
        var c4 = GeometryBuilder.Place(c1, c2, c3, 1.530, 112.8, tau2);
        var g = new GeometryBuilder();
        var a1 = g.At(C, c1);
        var a2 = g.At(C, c2);
        var a3 = g.At(C, c3);
        var a4 = g.At(C, c4);
        var a5 = g.At(x, xPos);
        if (saddle is { } s)
        {
            g.At(I, s.Iodine);
            foreach (var h in s.C1Hydrogens) g.At(H, c1 + h);
        }
        else g.Methylene(a1, a5, a2);
        g.Methylene(a2, a1, a3);
        g.Methylene(a3, a2, a4);
        foreach (var phi in new[] { 180.0, 60.0, -60.0 }) g.Z(H, a4, 1.093, a3, 111.0, a2, phi);
        return Done(g, charge);
    }
}
