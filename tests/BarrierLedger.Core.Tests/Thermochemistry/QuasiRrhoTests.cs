using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Tests.Thermochemistry;

// Limits as published: S. Grimme, Chem. Eur. J. 2012, 18, 9955 (entropy; w = 1/(1 + (ω₀/ν)^4), ω₀ = 100 cm⁻¹,
// B_av = 1e-44 kg m²) and Y.-P. Li et al., J. Phys. Chem. C 2015, 119, 1840 (energy → ½RT for a free rotor).
public class QuasiRrhoTests
{
    private const double T = 298.15;
    private const double R = PhysicalConstants.GasConstantJoulePerMoleKelvin;

    [Fact]
    public void DampingWeight_IsOneHalfAtTheCutoff()
    {
        Close.Absolute(0.5, QuasiRrho.DampingWeight(100.0), 1e-15, "w(ω₀)", "Grimme 2012");
        Close.Absolute(0.5, QuasiRrho.DampingWeight(50.0, cutoffCm1: 50.0), 1e-15, "w(ω₀) for ω₀ = 50", "Grimme 2012");
        Close.Absolute(1.0 / 17.0, QuasiRrho.DampingWeight(50.0), 1e-15, "w(ω₀/2) = 1/(1 + 2⁴)", "Grimme 2012, α = 4");
    }

    [Theory]
    [InlineData(1000.0)]
    [InlineData(3000.0)]
    public void Entropy_TendsToHarmonicFarAboveTheCutoff(double nu)
    {
        var ho = HarmonicOscillator.EntropyJoulePerMoleKelvin(nu, T);
        var fr = QuasiRrho.FreeRotorEntropyJoulePerMoleKelvin(nu, T);
        var q = QuasiRrho.EntropyJoulePerMoleKelvin(nu, T);
        // |q − ho| = (1 − w)|fr − ho| with 1 − w ≈ (ω₀/ν)⁴.
        Close.Absolute(ho, q, Math.Pow(100.0 / nu, 4) * Math.Abs(fr - ho) * 1.0001, $"qRRHO entropy at {nu} cm⁻¹", "Grimme 2012, w → 1");
        Close.Absolute(ho, q, 1e-3, $"qRRHO entropy at {nu} cm⁻¹ (absolute)", "Grimme 2012, w → 1");
    }

    [Theory]
    [InlineData(0.5)]
    [InlineData(2.0)]
    public void Entropy_TendsToFreeRotorFarBelowTheCutoff(double nu)
    {
        var fr = QuasiRrho.FreeRotorEntropyJoulePerMoleKelvin(nu, T);
        var q = QuasiRrho.EntropyJoulePerMoleKelvin(nu, T);
        Close.Relative(fr, q, 1e-6, $"qRRHO entropy at {nu} cm⁻¹", "Grimme 2012, w → 0");
        Assert.True(HarmonicOscillator.EntropyJoulePerMoleKelvin(nu, T) > fr, "the harmonic entropy diverges as ν → 0, the rotor's stays bounded");
    }

    // For a rotor much heavier than B_av the effective moment is B_av: S_R → R[½ + ln √(8π³ B_av k_B T/h²)], a ν-independent ceiling.
    [Fact]
    public void FreeRotorEntropy_IsCappedByTheAverageMoment()
    {
        var h = PhysicalConstants.PlanckJouleSecond;
        var ceiling = R * (0.5 + 0.5 * Math.Log(8 * Math.Pow(Math.PI, 3) * 1e-44 * PhysicalConstants.BoltzmannJoulePerKelvin * T / (h * h)));
        Close.Relative(ceiling, QuasiRrho.FreeRotorEntropyJoulePerMoleKelvin(1e-9, T), 1e-6, "S_R for ν → 0", "Grimme 2012, μ' = μB/(μ+B) → B");
    }

    [Fact]
    public void Energy_TendsToHalfRTBelow_AndHarmonicAbove()
    {
        Close.Relative(0.5 * R * T, QuasiRrho.ThermalEnergyJoulePerMole(0.5, T), 1e-4, "U at 0.5 cm⁻¹", "Li et al. 2015, free-rotor ½RT");
        Close.Relative(HarmonicOscillator.ThermalEnergyJoulePerMole(3000, T), QuasiRrho.ThermalEnergyJoulePerMole(3000, T), 2e-6 /* 1 − w = (100/3000)⁴ = 1.2e-6 */,
            "U at 3000 cm⁻¹", "Li et al. 2015, w → 1");
    }

    // Harmonic oscillator limits (McQuarrie ch. 8): classical limit x → 0 gives U → RT, C_V → R, S → R(1 − ln x).
    [Fact]
    public void HarmonicOscillator_HasItsClassicalLimit()
    {
        var nu = 0.01;
        var x = HarmonicOscillator.VibrationalTemperatureKelvin(nu) / T;
        Close.Relative(R * T, HarmonicOscillator.ThermalEnergyJoulePerMole(nu, T), 1e-4, "U classical limit", "McQuarrie, Statistical Mechanics");
        Close.Relative(R, HarmonicOscillator.HeatCapacityJoulePerMoleKelvin(nu, T), 1e-4, "C_V classical limit", "McQuarrie, Statistical Mechanics");
        Close.Relative(R * (1 - Math.Log(x)), HarmonicOscillator.EntropyJoulePerMoleKelvin(nu, T), 1e-4, "S classical limit", "McQuarrie, Statistical Mechanics");
        // Second radiation constant c₂ = hc/k_B = 1.438776877e-2 m K (CODATA 2018).
        Close.Relative(1.438776877, HarmonicOscillator.SecondRadiationConstantCmKelvin, 1e-9, "c₂ in cm K", "CODATA 2018");
    }
}
