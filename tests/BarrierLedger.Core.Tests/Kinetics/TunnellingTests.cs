using BarrierLedger.Core.Kinetics;
using BarrierLedger.Core.Tests.ReferenceData;
using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Tests.Kinetics;

public class TunnellingTests
{
    [Theory]
    [InlineData(1000.0)]
    [InlineData(-1000.0)]
    public void Wigner_For1000iAt298_Is1970_WhateverTheSign(double nu) =>
        Close.Absolute(KineticsReference.Wigner1000At298, Tunnelling.Wigner(nu, 298.15), KineticsReference.WignerTolerance,
            "Wigner κ(1000i cm⁻¹, 298.15 K)", "Wigner 1932; value in issue 3");

    // With a high barrier above the crossover temperature the truncation term vanishes and Skodje–Truhlar reduces to Bell's
    // infinite-parabola result κ = (u/2)/sin(u/2), u = hc|ν|/k_BT (R. P. Bell, Trans. Faraday Soc. 55, 1 (1959)):
    // for 1000i cm⁻¹ at 298.15 K, u/2 = 2.41284 and κ = 3.6232.
    [Fact]
    public void SkodjeTruhlar_WithAHighBarrier_ReducesToBell()
    {
        var kappa = Tunnelling.SkodjeTruhlar(-1000.0, Energy.FromKcalPerMol(40), Energy.FromKcalPerMol(45), 298.15);
        Close.Relative(3.6232, kappa, 1e-4, "Skodje–Truhlar κ, high barrier", "Bell 1959 parabolic barrier (u/2)/sin(u/2)");
    }

    // At high temperature (u small) all parabolic-barrier corrections share Wigner's leading term 1 + u²/24; Bell's series is
    // 1 + u²/24 + 7u⁴/5760 + …, so the two differ by about 7u⁴/5760.
    [Fact]
    public void SkodjeTruhlar_AtHighTemperature_AgreesWithWignerToLeadingOrder()
    {
        const double nu = 300.0, t = 1000.0;
        var u = 1.438776877 * nu / t;
        var st = Tunnelling.SkodjeTruhlar(nu, Energy.FromKcalPerMol(30), Energy.FromKcalPerMol(30), t);
        Close.Absolute(Tunnelling.Wigner(nu, t), st, 2 * 7 * Math.Pow(u, 4) / 5760, "Skodje–Truhlar vs Wigner, u = 0.43", "Wigner 1932 / Bell 1959 series");
    }

    // At the crossover β = α the two branches meet at κ = β(ΔV‡ − V) (limit of either expression).
    [Fact]
    public void SkodjeTruhlar_IsContinuousThroughTheCrossoverTemperature()
    {
        const double nu = 1000.0;
        var tc = Tunnelling.CrossoverTemperatureKelvin(nu);
        Close.Relative(228.988, tc, 1e-5, "crossover temperature for 1000i cm⁻¹", "T_c = hc|ν|/(2π k_B), CODATA 2018");
        var fwd = Energy.FromKcalPerMol(10);
        var rev = Energy.FromKcalPerMol(15);
        var below = Tunnelling.SkodjeTruhlar(nu, fwd, rev, tc * (1 - 1e-4));
        var at = Tunnelling.SkodjeTruhlar(nu, fwd, rev, tc);
        var above = Tunnelling.SkodjeTruhlar(nu, fwd, rev, tc * (1 + 1e-4));
        var limit = fwd.Hartree * PhysicalConstants.HartreeJoule / (PhysicalConstants.BoltzmannJoulePerKelvin * tc);
        Close.Relative(limit, at, 1e-9, "κ at T_c", "limit β(ΔV‡ − V)");
        Close.Relative(at, below, 2e-3, "κ just below T_c", "continuity");
        Close.Relative(at, above, 2e-3, "κ just above T_c", "continuity");
    }

    // For an endoergic step the relevant height is the barrier above the product, ΔV‡ − V = reverse barrier, so swapping which
    // side is exoergic must use the smaller of the two barriers in the truncation term.
    [Fact]
    public void SkodjeTruhlar_UsesTheSmallerBarrierInTheTruncation()
    {
        var exo = Tunnelling.SkodjeTruhlar(1500, Energy.FromKcalPerMol(12), Energy.FromKcalPerMol(20), 250);
        var endo = Tunnelling.SkodjeTruhlar(1500, Energy.FromKcalPerMol(20), Energy.FromKcalPerMol(12), 250);
        Close.Relative(exo, endo, 1e-12, "κ exoergic vs endoergic with the same smaller barrier", "Skodje & Truhlar 1981, V = max(0, ΔE)");
        Assert.True(exo > Tunnelling.Wigner(1500, 250), "deep tunnelling below T_c exceeds Wigner's estimate");
    }

    [Fact]
    public void BadInput_IsRejected()
    {
        Assert.Throws<ArgumentException>(() => Tunnelling.Wigner(0, 298.15));
        Assert.Throws<ArgumentException>(() => Tunnelling.Wigner(1000, -1));
        Assert.Throws<ArgumentException>(() => Tunnelling.SkodjeTruhlar(1000, Energy.FromKcalPerMol(-1), Energy.FromKcalPerMol(5), 298.15));
    }
}
