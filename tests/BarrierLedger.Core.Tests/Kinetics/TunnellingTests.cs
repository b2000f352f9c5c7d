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

    // Bell's infinite parabola is x/sin x with x = u/2, whose series is 1 + x²/6 + 7x⁴/360 + 31x⁶/15120 + … (Abramowitz & Stegun,
    // Handbook of Mathematical Functions, 4.3.68, the series of csc); the first two terms are Wigner's correction.
    [Theory]
    [InlineData(300.0, 1000.0)]
    [InlineData(800.0, 600.0)]
    public void Bell_InfiniteParabola_MatchesTheCosecantSeries_AndWignerToSecondOrder(double nu, double t)
    {
        var x = 0.5 * 1.438776877 * nu / t;
        var series = 1 + x * x / 6 + 7 * Math.Pow(x, 4) / 360 + 31 * Math.Pow(x, 6) / 15120;
        var bell = Tunnelling.Bell(nu, t);
        Close.Absolute(series, bell, 2 * Math.Pow(x, 8) / 10, "Bell infinite parabola", "Abramowitz & Stegun 4.3.68");
        Close.Absolute(Tunnelling.Wigner(nu, t), bell, 2 * 7 * Math.Pow(x, 4) / 360, "Bell vs Wigner", "Wigner 1932: first two terms of the series");
    }

    // Skodje and Truhlar's κ for an exoergic step (J. Phys. Chem. 85, 624 (1981), eq. 14) is Bell's series cut after its first term.
    [Theory]
    [InlineData(1200.0, 298.15, 8.0)]
    [InlineData(1800.0, 450.0, 3.0)]
    public void Bell_WithOneTerm_IsSkodjeTruhlarForAnExoergicStep(double nu, double t, double barrierKcal)
    {
        var v0 = Energy.FromKcalPerMol(barrierKcal);
        var st = Tunnelling.SkodjeTruhlar(nu, v0, v0 + Energy.FromKcalPerMol(5), t);
        Close.Relative(st, Tunnelling.Bell(nu, t, v0, 1), 1e-12, "Bell, one term", "Skodje & Truhlar 1981 eq. 14");
    }

    // Bell's Q is the Boltzmann average of the parabolic-barrier transmission G(W) = 1/(1 + exp[2π(V₀ − W)/(h c ν̃)]) from W = 0,
    // relative to the classical step (Bell, The Tunnel Effect in Chemistry, 1980, eq. 2.5): Q = β e^{βV₀} ∫₀^∞ G(W) e^{−βW} dW.
    // Computed here by plain quadrature, an independent path; the series with enough terms must agree.
    [Theory]
    [InlineData(1200.0, 298.15, 6.0)]
    [InlineData(2000.0, 500.0, 2.0)]
    public void Bell_WithManyTerms_EqualsTheQuadratureOfTheParabolicTransmission(double nu, double t, double barrierKcal)
    {
        var kT = PhysicalConstants.BoltzmannJoulePerKelvin * t;
        var hcnu = PhysicalConstants.PlanckJouleSecond * PhysicalConstants.SpeedOfLightMetrePerSecond * 100 * nu;
        var v0 = Energy.FromKcalPerMol(barrierKcal).Hartree * PhysicalConstants.HartreeJoule;
        // In units of k_B T: Q = ∫₀^∞ e^{b} e^{−w} / (1 + exp[a(b − w)]) dw, a = 2π k_B T/(h c ν̃), b = V₀/k_B T.
        var a = 2 * Math.PI * kT / hcnu;
        var b = v0 / kT;
        double F(double w) => Math.Exp(b - w - Math.Log(1 + Math.Exp(a * (b - w))));
        var q = MathNet.Numerics.Integrate.DoubleExponential(F, 0, b + 80, 1e-13);
        Close.Relative(q, Tunnelling.Bell(nu, t, Energy.FromKcalPerMol(barrierKcal), 30), 1e-9, "Bell series, 30 terms", "quadrature of Bell 1980 eq. 2.5");
    }

    [Fact]
    public void Bell_BelowTheCrossoverTemperature_RefusesWithTheReason()
    {
        var ex = Assert.Throws<ArgumentException>(() => Tunnelling.Bell(2000.0, 200.0));
        Assert.Contains("crossover temperature", ex.Message);
    }
}
