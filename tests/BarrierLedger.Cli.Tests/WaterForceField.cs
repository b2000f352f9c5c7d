using System.Globalization;
using System.Text;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Cli.Tests;

/// <summary>
/// Water with a diagonal valence force field: two O–H stretches (f_r) and the H–O–H bend (f_θ), no interaction constants.
/// At the reference geometry the Cartesian Hessian is exactly H = Σ_q f_q b_q b_qᵀ with b_q = ∂q/∂x (Wilson, Decius and
/// Cross, Molecular Vibrations, 1955, ch. 4); b_q is taken here by central differences of q(x), error ~h².
/// f_r = 8.45 mdyn/Å and f_θ = 0.76 mdyn·Å/rad² are typical water values (from memory; only their use below matters).
/// </summary>
internal static class WaterForceField
{
    public const double RAngstrom = 0.9572;
    public const double ThetaDegrees = 104.52;
    /// <summary>8.45 mdyn/Å = 845 N/m in hartree/bohr² (1 Eh/a₀² = E_h/a₀² N/m, CODATA 2018).</summary>
    public static readonly double StretchHartreePerBohr2 = 845.0 / (PhysicalConstants.HartreeJoule / (PhysicalConstants.BohrMetre * PhysicalConstants.BohrMetre));
    /// <summary>0.76 mdyn·Å/rad² = 0.76 aJ/rad² in hartree/rad².</summary>
    public static readonly double BendHartreePerRad2 = 0.76e-18 / PhysicalConstants.HartreeJoule;

    public static Molecule Molecule()
    {
        var half = ThetaDegrees / 2 * Math.PI / 180;
        return new Molecule([Elements.O, Elements.H, Elements.H],
            [new Vec3(0, 0, 0.0656), new Vec3(RAngstrom * Math.Sin(half), 0, 0.0656 - RAngstrom * Math.Cos(half)), new Vec3(-RAngstrom * Math.Sin(half), 0, 0.0656 - RAngstrom * Math.Cos(half))]);
    }

    /// <summary>Internal coordinates (bohr, rad) of a flat 9-vector of Cartesian coordinates in bohr.</summary>
    private static double[] Internals(double[] x)
    {
        Vec3 P(int a) => new(x[3 * a], x[3 * a + 1], x[3 * a + 2]);
        var r1 = P(1) - P(0);
        var r2 = P(2) - P(0);
        return [r1.Length, r2.Length, Math.Acos(r1.Dot(r2) / (r1.Length * r2.Length))];
    }

    /// <summary>Row-major 9×9 Cartesian Hessian in hartree/bohr².</summary>
    public static double[] Hessian()
    {
        var mol = Molecule();
        var x = mol.PositionsAngstrom.SelectMany(p => new[] { p.X, p.Y, p.Z }).Select(v => v / PhysicalConstants.BohrAngstrom).ToArray();
        var f = new[] { StretchHartreePerBohr2, StretchHartreePerBohr2, BendHartreePerRad2 };
        const double h = 1e-5;
        var b = new double[3, 9];
        for (var i = 0; i < 9; i++)
        {
            var xp = (double[])x.Clone(); xp[i] += h;
            var xm = (double[])x.Clone(); xm[i] -= h;
            var qp = Internals(xp);
            var qm = Internals(xm);
            for (var q = 0; q < 3; q++) b[q, i] = (qp[q] - qm[q]) / (2 * h);
        }
        var hess = new double[81];
        for (var i = 0; i < 9; i++)
            for (var j = 0; j < 9; j++)
                for (var q = 0; q < 3; q++)
                    hess[9 * i + j] += f[q] * b[q, i] * b[q, j];
        return hess;
    }

    /// <summary>A hand-written QCSchema AtomicResult (hessian driver) for this water.</summary>
    public static string QcSchemaJson()
    {
        var mol = Molecule();
        string N(double v) => v.ToString("R", CultureInfo.InvariantCulture);
        var geom = string.Join(", ", mol.PositionsAngstrom.SelectMany(p => new[] { p.X, p.Y, p.Z }).Select(v => N(v / PhysicalConstants.BohrAngstrom)));
        var hess = string.Join(", ", Hessian().Select(N));
        var sb = new StringBuilder();
        sb.AppendLine("{");
        sb.AppendLine("  \"schema_name\": \"qcschema_output\",");
        sb.AppendLine("  \"schema_version\": 1,");
        sb.AppendLine("  \"molecule\": {");
        sb.AppendLine("    \"schema_name\": \"qcschema_molecule\", \"schema_version\": 2,");
        sb.AppendLine("    \"symbols\": [\"O\", \"H\", \"H\"],");
        sb.AppendLine($"    \"geometry\": [{geom}],");
        sb.AppendLine("    \"molecular_charge\": 0.0,");
        sb.AppendLine("    \"molecular_multiplicity\": 1");
        sb.AppendLine("  },");
        sb.AppendLine("  \"driver\": \"hessian\",");
        sb.AppendLine("  \"model\": { \"method\": \"valence-force-field\", \"basis\": \"none\" },");
        sb.AppendLine("  \"keywords\": {},");
        sb.AppendLine("  \"properties\": { \"return_energy\": -76.4 },");
        sb.AppendLine($"  \"return_result\": [{hess}],");
        sb.AppendLine("  \"success\": true,");
        sb.AppendLine("  \"provenance\": { \"creator\": \"hand-written test\", \"version\": \"1\", \"routine\": \"WaterForceField\" }");
        sb.AppendLine("}");
        return sb.ToString();
    }
}
