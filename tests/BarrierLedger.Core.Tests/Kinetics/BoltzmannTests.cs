using BarrierLedger.Core.Kinetics;
using BarrierLedger.Core.Tests.ReferenceData;
using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Tests.Kinetics;

public class BoltzmannTests
{
    [Fact]
    public void TenToOneRatio_At298_Needs1364KcalPerMol()
    {
        var p = Boltzmann.Populations([Energy.FromKcalPerMol(-500.0), Energy.FromKcalPerMol(-500.0 + KineticsReference.TenToOneKcalPerMol)], 298.15);
        Close.Absolute(1.0, p.Sum(), 1e-15, "sum of populations", "normalisation");
        // 1.364 kcal/mol is RT ln 10 rounded: the ratio is 10 within 0.2 % (0.001 kcal/mol ↔ 0.17 %).
        Close.Relative(10.0, p[0] / p[1], 2e-3, "population ratio at 1.364 kcal/mol", "RT ln 10 textbook rule, from memory");
    }

    [Fact]
    public void LargeAbsoluteEnergies_DoNotOverflow()
    {
        var p = Boltzmann.Populations([Energy.FromHartree(-1500.123), Energy.FromHartree(-1500.123)], 298.15);
        Assert.Equal([0.5, 0.5], p);
    }

    // Two degenerate TS conformers and one reactant conformer: the effective barrier is lowered by RT ln 2 = 0.4107 kcal/mol at 298.15 K.
    [Fact]
    public void EffectiveBarrier_OfDegenerateTransitionStates_IsLoweredByRTln2()
    {
        var r = new[] { Energy.FromKcalPerMol(0) };
        var ts = new[] { Energy.FromKcalPerMol(18), Energy.FromKcalPerMol(18) };
        Close.Absolute(18 - 0.41068, Boltzmann.EffectiveBarrier(r, ts, 298.15).KcalPerMol, 1e-5, "effective barrier", "Curtin–Hammett, RT ln 2");
        // A reactant conformer 5 kcal/mol up changes nothing visible; one at the same energy raises the barrier by RT ln 2.
        Close.Absolute(18 - 0.41068 + 0.41068, Boltzmann.EffectiveBarrier([Energy.Zero, Energy.Zero], ts, 298.15).KcalPerMol, 1e-5,
            "effective barrier with two reactant conformers", "Curtin–Hammett, RT ln 2");
    }

    [Fact]
    public void EnsembleFreeEnergy_LiesBelowTheMinimumByAtMostRTlnN()
    {
        var g = new[] { Energy.FromKcalPerMol(1), Energy.FromKcalPerMol(0.3), Energy.FromKcalPerMol(2) };
        var ens = Boltzmann.EnsembleFreeEnergy(g, 298.15).KcalPerMol;
        Assert.InRange(ens, 0.3 - 0.5924849 * Math.Log(3), 0.3);
    }

    [Fact]
    public void Butane_AntiAndDoublyDegenerateGauche_GiveTheTextbookPopulationsAndEnsembleG()
    {
        // anti at 0, gauche 3.8 kJ/mol above with degeneracy 2 (the ±60° mirror-image forms), 298.15 K.
        var g = new[] { Energy.FromKJPerMol(0), Energy.FromKJPerMol(ConformerReference.ButaneGaucheAboveAntiKJPerMol) };
        var p = Boltzmann.Populations(g, [1, 2], 298.15);
        Close.Absolute(ConformerReference.ButaneAntiPopulation298, p[0], ConformerReference.ButaneTolerance, "anti population", "hand computation, ConformerReference");
        Close.Absolute(ConformerReference.ButaneGauchePopulation298, p[1], ConformerReference.ButaneTolerance, "gauche population (both forms)", "hand computation, ConformerReference");
        Close.Absolute(ConformerReference.ButaneAntiRoughly, p[0], ConformerReference.ButaneRoughTolerance, "anti population", "textbook 70 : 30, from memory");
        var ens = Boltzmann.EnsembleFreeEnergy(g, [1, 2], 298.15);
        Close.Absolute(ConformerReference.ButaneEnsembleBelowAntiKJPerMol, ens.KJPerMol, ConformerReference.ButaneTolerance,
            "G_ens − G_anti", "hand computation −RT ln(1 + 2x), ConformerReference");

        // Listing the two gauche forms separately is the same ensemble.
        var listed = new[] { g[0], g[1], g[1] };
        Close.Absolute(ens.KJPerMol, Boltzmann.EnsembleFreeEnergy(listed, 298.15).KJPerMol, 1e-12, "gauche listed twice against degeneracy 2", "definition");
        Close.Absolute(p[1] / 2, Boltzmann.Populations(listed, 298.15)[2], 1e-12, "one gauche form", "definition");
    }

    [Fact]
    public void Degeneracies_OfTheWrongCountOrBelowOne_AreRejected()
    {
        var g = new[] { Energy.Zero, Energy.FromKcalPerMol(1) };
        Assert.Contains("1 degeneracies for 2 energies", Assert.Throws<ArgumentException>(() => Boltzmann.Populations(g, [1], 298.15)).Message);
        Assert.Throws<ArgumentException>(() => Boltzmann.EnsembleFreeEnergy(g, [1, 0], 298.15));
    }

    [Fact]
    public void EmptyList_IsRejected() => Assert.Throws<ArgumentException>(() => Boltzmann.Populations([], 298.15));
}
