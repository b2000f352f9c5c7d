using System.Collections.Immutable;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Vibrations;

namespace BarrierLedger.Core.Tests.Checks;

/// <summary>Small invented saddle-point systems whose modes are written down by hand.</summary>
internal static class TestSystems
{
    /// <summary>Cl–H distance of the symmetric linear [Cl–H–Cl]⁻ saddle point used here (invented, of the right size).</summary>
    public const double ClHAngstrom = 1.48;

    /// <summary>Linear symmetric Cl1–H2–Cl3 (charge −1) along x.</summary>
    public static Molecule ClHCl() =>
        new([Elements.Get("Cl"), Elements.H, Elements.Get("Cl")], [new Vec3(-ClHAngstrom, 0, 0), Vec3.Zero, new Vec3(ClHAngstrom, 0, 0)], charge: -1);

    /// <summary>Normalised displacement from per-atom vectors.</summary>
    public static ImmutableArray<Vec3> Normalised(IEnumerable<Vec3> d)
    {
        var a = d.ToArray();
        var n = Math.Sqrt(a.Sum(v => v.LengthSquared));
        return [.. a.Select(v => v / n)];
    }

    /// <summary>
    /// Modes of linear A–B–A written down analytically (Wilson, Decius and Cross, Molecular Vibrations, 1955, linear XY2):
    /// antisymmetric stretch A: +x, B: −2 (m_A/m_B) x, A: +x (no net momentum); symmetric stretch A: −x, B: 0, A: +x;
    /// the two bends A: +y (+z), B: −2 (m_A/m_B) y (z), A: +y (z).
    /// </summary>
    public static IReadOnlyList<NormalMode> ClHClModes(double antisymmetricCm1, double symmetricCm1 = 320, double bendCm1 = 750)
    {
        var rho = Elements.Get("Cl").MostAbundantIsotopeMassDa / Elements.H.MostAbundantIsotopeMassDa;
        Vec3 X(double s) => new(s, 0, 0);
        Vec3 Y(double s) => new(0, s, 0);
        Vec3 Z(double s) => new(0, 0, s);
        return
        [
            new(antisymmetricCm1, Normalised([X(1), X(-2 * rho), X(1)])),
            new(symmetricCm1, Normalised([X(-1), X(0), X(1)])),
            new(bendCm1, Normalised([Y(1), Y(-2 * rho), Y(1)])),
            new(bendCm1, Normalised([Z(1), Z(-2 * rho), Z(1)])),
        ];
    }

    /// <summary>
    /// An invented hydrogen transfer from ethane to a chlorine atom: C1 (methyl carbon) with H3, H4, H5; C2 with H6, H7;
    /// H8 between C2 and Cl9 (C2–H8 1.40 Å, H8–Cl9 1.45 Å, ∠C2–H8–Cl9 165°). Staggered, tetrahedral angles.
    /// </summary>
    public static Molecule HydrogenTransfer()
    {
        const double rcc = 1.53, rch = 1.09;
        var t = Math.Acos(-1.0 / 3.0);
        Vec3 Dir(double polar, double azimuth) => new(Math.Sin(polar) * Math.Cos(azimuth), Math.Sin(polar) * Math.Sin(azimuth), Math.Cos(polar));
        var c1 = Vec3.Zero;
        var c2 = new Vec3(0, 0, rcc);
        var pos = new List<Vec3> { c1, c2 };
        for (var k = 0; k < 3; k++) pos.Add(c1 + rch * Dir(t, 2 * Math.PI * k / 3));                              // H3, H4, H5
        pos.Add(c2 + rch * Dir(Math.PI - t, Math.PI / 3));                                                       // H6
        pos.Add(c2 + rch * Dir(Math.PI - t, Math.PI));                                                           // H7
        var u = Dir(Math.PI - t, 5 * Math.PI / 3);
        pos.Add(c2 + 1.40 * u);                                                                                   // H8
        var v = u.Cross(new Vec3(0, 0, 1)).Normalized();
        var w = Math.Cos(15 * Math.PI / 180) * u + Math.Sin(15 * Math.PI / 180) * v;
        pos.Add(c2 + 1.40 * u + 1.45 * w);                                                                        // Cl9
        var h = Elements.H;
        return new Molecule([Elements.C, Elements.C, h, h, h, h, h, h, Elements.Get("Cl")], pos, multiplicity: 2);
    }

    /// <summary>The hydrogen-transfer mode: H8 moves along C2→Cl9, C2 and Cl9 recoil slightly.</summary>
    public static ImmutableArray<Vec3> TransferDisplacement(Molecule m)
    {
        var p = m.PositionsAngstrom;
        var u = (p[8] - p[1]).Normalized();
        var d = new Vec3[m.AtomCount];
        d[7] = (p[7] - p[1]).Normalized() + (p[8] - p[7]).Normalized();
        d[1] = -0.05 * u;
        d[8] = -0.02 * u;
        return Normalised(d);
    }

    /// <summary>The methyl rotor: H3, H4, H5 turn about the C1→C2 axis.</summary>
    public static ImmutableArray<Vec3> MethylRotation(Molecule m)
    {
        var p = m.PositionsAngstrom;
        var axis = (p[1] - p[0]).Normalized();
        var d = new Vec3[m.AtomCount];
        for (var i = 2; i <= 4; i++) d[i] = axis.Cross(p[i] - p[0]);
        return Normalised(d);
    }

    /// <summary>Modes of the hydrogen transfer: the transfer, the methyl rotor and two ordinary modes.</summary>
    public static IReadOnlyList<NormalMode> HydrogenTransferModes(Molecule m, double transferCm1, double rotorCm1)
    {
        var p = m.PositionsAngstrom;
        var ccStretch = new Vec3[m.AtomCount];
        ccStretch[0] = new Vec3(0, 0, -1);
        ccStretch[1] = new Vec3(0, 0, 1);
        var ch6 = new Vec3[m.AtomCount];
        ch6[5] = (p[5] - p[1]).Normalized();
        return
        [
            new(transferCm1, TransferDisplacement(m)),
            new(rotorCm1, MethylRotation(m)),
            new(980, Normalised(ccStretch)),
            new(3050, Normalised(ch6)),
        ];
    }

    /// <summary>
    /// A Cartesian Hessian (hartree/bohr², row-major 3N×3N) from a force field V = ½ Σ k_q q², taken at a stationary point:
    /// H = Σ k_q b_q b_qᵀ with b_q = ∂q/∂x (Wilson, Decius and Cross, Molecular Vibrations, 1955, ch. 4). Each coordinate is a
    /// function of the positions in Å; distances count in bohr (k in hartree/bohr²), angles in radians (k in hartree/rad²).
    /// b is taken by central differences (1e-5 Å).
    /// </summary>
    public static double[] ForceFieldHessian(Molecule m, IEnumerable<(double K, Func<Vec3[], double> Q, bool Angular)> terms)
    {
        var n = 3 * m.AtomCount;
        var h = new double[n * n];
        var pos = m.PositionsAngstrom.ToArray();
        const double step = 1e-5;
        foreach (var (k, q, angular) in terms)
        {
            var b = new double[n];
            for (var i = 0; i < n; i++)
            {
                var plus = (Vec3[])pos.Clone();
                var minus = (Vec3[])pos.Clone();
                plus[i / 3] = Shift(pos[i / 3], i % 3, step);
                minus[i / 3] = Shift(pos[i / 3], i % 3, -step);
                var diff = q(plus) - q(minus);
                if (angular) diff = InternalCoordinates.WrapDegrees(diff * 180 / Math.PI) * Math.PI / 180;
                // dq/dx per Å → per bohr: multiply by a0 in Å; a distance q is also converted from Å to bohr (divide by a0).
                b[i] = diff / (2 * step) * BarrierLedger.Core.Units.PhysicalConstants.BohrAngstrom / (angular ? 1.0 : BarrierLedger.Core.Units.PhysicalConstants.BohrAngstrom);
            }
            for (var i = 0; i < n; i++)
                for (var j = 0; j < n; j++)
                    h[i * n + j] += k * b[i] * b[j];
        }
        return h;
    }

    private static Vec3 Shift(Vec3 v, int c, double d) => c switch
    {
        0 => v with { X = v.X + d },
        1 => v with { Y = v.Y + d },
        _ => v with { Z = v.Z + d },
    };

    public static Func<Vec3[], double> Distance(int a, int b) => p => (p[a] - p[b]).Length;

    public static Func<Vec3[], double> AngleRad(int i, int j, int k) => p => InternalCoordinates.AngleDegrees(p[i], p[j], p[k]) * Math.PI / 180;

    public static Func<Vec3[], double> DihedralRad(int i, int j, int k, int l) => p => InternalCoordinates.DihedralDegrees(p[i], p[j], p[k], p[l]) * Math.PI / 180;
}
