namespace BarrierLedger.Core.Geometry;

/// <summary>Whether a structure is a single atom, linear (two rotational degrees of freedom) or non-linear (three).</summary>
public enum MolecularShape
{
    Atom,
    Linear,
    NonLinear,
}

/// <summary>
/// Mass distribution of a molecule with the masses frequency calculations use: the most abundant isotope of each element
/// (<see cref="Chemistry.Element.MostAbundantIsotopeMassDa"/>). Moments in amu·Å², positions in Å.
/// Definitions as in any textbook of rotational spectroscopy (e.g. Atkins' Physical Chemistry, "moments of inertia"):
/// R_cm = Σ mᵢrᵢ / Σ mᵢ; I_ab = Σ mᵢ (|rᵢ|² δ_ab − r_ia r_ib) with rᵢ relative to R_cm.
/// </summary>
public static class Inertia
{
    /// <summary>
    /// A structure is linear when its smallest principal moment is at most this many amu·Å² (common practice, no source:
    /// the smallest moment of a real non-linear molecule exceeds 0.5 amu·Å² (H₂O: about 0.6), while a linear structure
    /// written with 6 decimals in Å stays below 10⁻⁶).
    /// </summary>
    public const double DefaultLinearToleranceAmuAngstrom2 = 1e-3;

    /// <summary>Isotope masses in amu (Da), one per atom, in atom order.</summary>
    public static double[] MassesAmu(Molecule m)
    {
        var masses = new double[m.AtomCount];
        for (var i = 0; i < masses.Length; i++) masses[i] = m.Elements[i].MostAbundantIsotopeMassDa;
        return masses;
    }

    /// <summary>Total isotope mass in amu.</summary>
    public static double TotalMassAmu(Molecule m) => MassesAmu(m).Sum();

    /// <summary>Centre of mass in Å: R = Σ mᵢrᵢ / Σ mᵢ (isotope masses).</summary>
    public static Vec3 CentreOfMass(Molecule m) => CentreOfMass(m, MassesAmu(m));

    /// <summary>Centre of mass in Å with the given masses (amu, one per atom).</summary>
    public static Vec3 CentreOfMass(Molecule m, IReadOnlyList<double> massesAmu)
    {
        RequireAtoms(m);
        CheckMasses(m, massesAmu);
        var sum = Vec3.Zero;
        var total = 0.0;
        for (var i = 0; i < m.AtomCount; i++)
        {
            sum += massesAmu[i] * m.PositionsAngstrom[i];
            total += massesAmu[i];
        }
        return sum / total;
    }

    /// <summary>Inertia tensor about the centre of mass in amu·Å²: I_ab = Σ mᵢ (|rᵢ|² δ_ab − r_ia r_ib).</summary>
    public static double[,] TensorAmuAngstrom2(Molecule m) => TensorAmuAngstrom2(m, MassesAmu(m));

    /// <summary>Inertia tensor about the centre of mass in amu·Å², with the given masses (amu).</summary>
    public static double[,] TensorAmuAngstrom2(Molecule m, IReadOnlyList<double> massesAmu)
    {
        var com = CentreOfMass(m, massesAmu);
        var t = new double[3, 3];
        for (var i = 0; i < m.AtomCount; i++)
        {
            var r = m.PositionsAngstrom[i] - com;
            var mass = massesAmu[i];
            var r2 = r.LengthSquared;
            for (var a = 0; a < 3; a++)
                for (var b = 0; b < 3; b++)
                    t[a, b] += mass * ((a == b ? r2 : 0.0) - r[a] * r[b]);
        }
        return t;
    }

    /// <summary>Principal moments in amu·Å², ascending (I_A ≤ I_B ≤ I_C).</summary>
    public static double[] PrincipalMomentsAmuAngstrom2(Molecule m) => PrincipalAxes(m, MassesAmu(m)).MomentsAmuAngstrom2;

    /// <summary>Principal moments (amu·Å², ascending) and the matching unit axes, with the given masses (amu).</summary>
    public static (double[] MomentsAmuAngstrom2, Vec3[] Axes) PrincipalAxes(Molecule m, IReadOnlyList<double> massesAmu)
    {
        var (values, vectors) = SymmetricEigen3(TensorAmuAngstrom2(m, massesAmu));
        var axes = new Vec3[3];
        for (var k = 0; k < 3; k++) axes[k] = new Vec3(vectors[0, k], vectors[1, k], vectors[2, k]);
        // Round-off can leave a linear molecule's axial moment at −1e-17; a moment is never negative.
        for (var k = 0; k < 3; k++) values[k] = Math.Max(values[k], 0.0);
        return (values, axes);
    }

    /// <summary>
    /// Atom for one atom; linear when the smallest principal moment is at most <paramref name="linearToleranceAmuAngstrom2"/>;
    /// non-linear otherwise.
    /// </summary>
    public static MolecularShape Shape(Molecule m, double linearToleranceAmuAngstrom2 = DefaultLinearToleranceAmuAngstrom2)
    {
        RequireAtoms(m);
        if (m.AtomCount == 1) return MolecularShape.Atom;
        return PrincipalMomentsAmuAngstrom2(m)[0] <= linearToleranceAmuAngstrom2 ? MolecularShape.Linear : MolecularShape.NonLinear;
    }

    /// <summary>Number of rigid-body degrees of freedom (translations + rotations): 3 for an atom, 5 linear, 6 non-linear.</summary>
    public static int ExternalDegreesOfFreedom(MolecularShape shape) => shape switch
    {
        MolecularShape.Atom => 3,
        MolecularShape.Linear => 5,
        MolecularShape.NonLinear => 6,
        _ => throw new ArgumentOutOfRangeException(nameof(shape), shape, "Unknown shape."),
    };

    /// <summary>
    /// Rotational constant in cm⁻¹ for a principal moment in amu·Å²: B = h / (8π² c I), with h, c and the atomic mass
    /// constant from CODATA 2018 (h/(8π²c) = 16.857629 amu·Å²·cm⁻¹). Infinity for a zero moment.
    /// </summary>
    public static double RotationalConstantCm1(double momentAmuAngstrom2) =>
        Units.PhysicalConstants.PlanckJouleSecond
        / (8.0 * Math.PI * Math.PI * Units.PhysicalConstants.SpeedOfLightMetrePerSecond * 100.0
           * momentAmuAngstrom2 * Units.PhysicalConstants.AtomicMassConstantKilogram * 1e-20);

    private static void RequireAtoms(Molecule m)
    {
        if (m.AtomCount == 0) throw new ArgumentException("The molecule has no atoms.", nameof(m));
    }

    private static void CheckMasses(Molecule m, IReadOnlyList<double> massesAmu)
    {
        if (massesAmu.Count != m.AtomCount)
            throw new ArgumentException($"{massesAmu.Count} masses for {m.AtomCount} atoms.", nameof(massesAmu));
        for (var i = 0; i < massesAmu.Count; i++)
            if (!(massesAmu[i] > 0) || !double.IsFinite(massesAmu[i]))
                throw new ArgumentException($"Mass of atom {m.AtomLabel(i)} must be positive and finite, got {massesAmu[i]}.", nameof(massesAmu));
    }

    /// <summary>Cyclic Jacobi rotations for a symmetric 3×3 matrix; eigenvalues ascending, eigenvectors as columns.</summary>
    internal static (double[] Values, double[,] Vectors) SymmetricEigen3(double[,] matrix)
    {
        var a = (double[,])matrix.Clone();
        var v = new double[3, 3] { { 1, 0, 0 }, { 0, 1, 0 }, { 0, 0, 1 } };
        for (var sweep = 0; sweep < 50; sweep++)
        {
            var off = Math.Abs(a[0, 1]) + Math.Abs(a[0, 2]) + Math.Abs(a[1, 2]);
            var scale = Math.Abs(a[0, 0]) + Math.Abs(a[1, 1]) + Math.Abs(a[2, 2]);
            if (off <= 1e-15 * scale || off == 0.0) break;
            for (var p = 0; p < 2; p++)
                for (var q = p + 1; q < 3; q++)
                {
                    if (a[p, q] == 0.0) continue;
                    var theta = (a[q, q] - a[p, p]) / (2.0 * a[p, q]);
                    var t = Math.Sign(theta == 0 ? 1.0 : theta) / (Math.Abs(theta) + Math.Sqrt(theta * theta + 1.0));
                    var c = 1.0 / Math.Sqrt(t * t + 1.0);
                    var s = t * c;
                    for (var k = 0; k < 3; k++)
                    {
                        var akp = a[k, p];
                        var akq = a[k, q];
                        a[k, p] = c * akp - s * akq;
                        a[k, q] = s * akp + c * akq;
                    }
                    for (var k = 0; k < 3; k++)
                    {
                        var apk = a[p, k];
                        var aqk = a[q, k];
                        a[p, k] = c * apk - s * aqk;
                        a[q, k] = s * apk + c * aqk;
                    }
                    for (var k = 0; k < 3; k++)
                    {
                        var vkp = v[k, p];
                        var vkq = v[k, q];
                        v[k, p] = c * vkp - s * vkq;
                        v[k, q] = s * vkp + c * vkq;
                    }
                }
        }
        var order = new[] { 0, 1, 2 }.OrderBy(i => a[i, i]).ToArray();
        var values = order.Select(i => a[i, i]).ToArray();
        var vectors = new double[3, 3];
        for (var k = 0; k < 3; k++)
            for (var r = 0; r < 3; r++)
                vectors[r, k] = v[r, order[k]];
        return (values, vectors);
    }
}
