using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Tests.ReferenceData;

/// <summary>Structures built from <see cref="Spectroscopy"/>; orientation arbitrary on purpose so nothing relies on axes.</summary>
public static class TestMolecules
{
    public static Molecule Build(params (string Symbol, double X, double Y, double Z)[] atoms) =>
        new(atoms.Select(a => Elements.Get(a.Symbol)), atoms.Select(a => new Vec3(a.X, a.Y, a.Z)));

    /// <summary>A diatomic with bond length r along unit direction u, first atom at <paramref name="origin"/>.</summary>
    public static Molecule Diatomic(string a, string b, double r, Vec3 u, Vec3 origin) =>
        new([Elements.Get(a), Elements.Get(b)], [origin, origin + r * u.Normalized()]);

    public static Molecule HCl => Diatomic("H", "Cl", Spectroscopy.HClBondLengthAngstrom, new Vec3(1, 2, 2), new Vec3(0.3, -0.2, 0.5));
    public static Molecule N2 => Diatomic("N", "N", Spectroscopy.N2BondLengthAngstrom, new Vec3(0, 0, 1), Vec3.Zero);
    public static Molecule Ar => Build(("Ar", 1.0, 2.0, 3.0));

    public static Molecule H2O
    {
        get
        {
            var r = Spectroscopy.H2OBondLengthAngstrom;
            var half = Spectroscopy.H2OAngleDegrees / 2 * Math.PI / 180;
            return Build(("O", 0, 0, 0), ("H", r * Math.Sin(half), 0, r * Math.Cos(half)), ("H", -r * Math.Sin(half), 0, r * Math.Cos(half)));
        }
    }

    public static Molecule CO2
    {
        get
        {
            var r = Spectroscopy.CO2BondLengthAngstrom;
            var u = new Vec3(0.2, -0.5, 0.8).Normalized();
            return new Molecule([Elements.Get("O"), Elements.Get("C"), Elements.Get("O")], [-r * u, Vec3.Zero, r * u]);
        }
    }
}
