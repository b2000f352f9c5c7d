using BarrierLedger.Core.Tests.ReferenceData;
using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Tests.Units;

public class EnergyTests
{
    [Theory]
    [MemberData(nameof(Codata2018.HartreeEquivalents), MemberType = typeof(Codata2018))]
    public void OneHartree_MatchesCodata2018(EnergyUnit unit, double expected) =>
        Close.Relative(expected, Energy.FromHartree(1.0).In(unit), Codata2018.RelativeTolerance, $"1 Eh in {unit}", Codata2018.Source);

    [Fact]
    public void Constants_AreTheCodata2018Values()
    {
        Assert.Equal(Codata2018.Planck, PhysicalConstants.PlanckJouleSecond);
        Assert.Equal(Codata2018.Boltzmann, PhysicalConstants.BoltzmannJoulePerKelvin);
        Assert.Equal(Codata2018.Avogadro, PhysicalConstants.AvogadroPerMole);
        Assert.Equal(Codata2018.SpeedOfLight, PhysicalConstants.SpeedOfLightMetrePerSecond);
        Assert.Equal(Codata2018.ElementaryCharge, PhysicalConstants.ElementaryChargeCoulomb);
        Assert.Equal(Codata2018.HartreeJoule, PhysicalConstants.HartreeJoule);
        Assert.Equal(Codata2018.BohrMetre, PhysicalConstants.BohrMetre);
        Assert.Equal(Codata2018.AtomicMassConstantKilogram, PhysicalConstants.AtomicMassConstantKilogram);
        Close.Relative(Codata2018.GasConstant, PhysicalConstants.GasConstantJoulePerMoleKelvin, 1e-10, "R = N_A k_B", Codata2018.Source);
    }

    // Property: converting into any unit and back returns the value (relative 1e-14), and chained conversions agree.
    [Fact]
    public void UnitRoundTrips_ConserveTheEnergy()
    {
        var rng = new Random(2018);
        var units = Enum.GetValues<EnergyUnit>();
        for (var trial = 0; trial < 500; trial++)
        {
            var value = (rng.NextDouble() - 0.5) * Math.Pow(10, rng.Next(-6, 7));
            var from = units[rng.Next(units.Length)];
            var to = units[rng.Next(units.Length)];
            var e = Energy.From(value, from);
            Close.Relative(value, e.In(from), 1e-14, $"{value} {from} round trip", "property: conversion is invertible");
            var via = Energy.From(e.In(to), to);
            Close.Relative(e.Hartree, via.Hartree, 1e-14, $"{value} {from} via {to}", "property: conversion is invertible");
        }
    }

    [Fact]
    public void KcalAndKJ_DifferByTheThermochemicalCalorie() =>
        Close.Relative(4.184, Energy.FromKcalPerMol(1).KJPerMol, 1e-15, "kJ per kcal", "thermochemical calorie, exact");

    [Fact]
    public void Arithmetic_StaysInHartree()
    {
        var a = Energy.FromKcalPerMol(10);
        var b = Energy.FromKJPerMol(41.84);
        Close.Relative(20.0, (a + b).KcalPerMol, 1e-14, "10 kcal/mol + 41.84 kJ/mol", "thermochemical calorie");
        Assert.True(b - a < Energy.FromHartree(1e-15));
        Assert.Equal(0, (2 * a).CompareTo(a * 2));
    }

    [Theory]
    [InlineData("kcal/mol", EnergyUnit.KcalPerMol)]
    [InlineData(" Eh ", EnergyUnit.Hartree)]
    [InlineData("cm-1", EnergyUnit.Wavenumber)]
    [InlineData("kJ/mol", EnergyUnit.KJPerMol)]
    public void TryParseUnit_ReadsUsualSpellings(string text, EnergyUnit expected)
    {
        Assert.True(Energy.TryParseUnit(text, out var unit));
        Assert.Equal(expected, unit);
    }

    [Fact]
    public void TryParseUnit_RejectsUnknown() => Assert.False(Energy.TryParseUnit("furlongs", out _));
}
