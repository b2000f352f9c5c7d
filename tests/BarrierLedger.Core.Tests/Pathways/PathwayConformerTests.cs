using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Conformers;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Core.Tests.ReferenceData;
using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Core.Units;
using static BarrierLedger.Core.Tests.Pathways.PathwayExamples;

namespace BarrierLedger.Core.Tests.Pathways;

/// <summary>
/// Species with several conformers in the one derivation (issue 21): the model's conformer choice makes the species' energies, and
/// the reviewer's conformer checks join the pathway's reasons. Thermal corrections are given as reported at the model's
/// temperature and standard state (298.15 K, 1 atm), so every G below is E + the given correction and the values are hand arithmetic.
/// </summary>
public class PathwayConformerTests
{
    private static readonly EnergyModel Lowest = new(ThermalSource.Reported);
    private static readonly EnergyModel Ensemble = new(ThermalSource.Reported, Conformers: ConformerChoice.BoltzmannEnsemble);

    private static ThermalCorrection T(double gibbsHartree, double enthalpyHartree = 0.12, double zpe = 0.13) =>
        new(Energy.FromHartree(zpe), Energy.FromHartree(enthalpyHartree), Energy.FromHartree(gibbsHartree), FreqLevel, 298.15);

    private static ConformerRecord C(string label, double e, ThermalCorrection? t, bool checkPassed = true, int? duplicateOf = null) =>
        new(label, Species("R", "C4H10", e, thermal: t), checkPassed, duplicateOf, duplicateOf is null ? null : "RMSD 0.01 Å");

    /// <summary>R → TS → P, R with the given conformers (its own record is the first of them), TS G = −158.35 + 0.098, P G = −158.41 + 0.10.</summary>
    private static Pathway Reaction(IReadOnlyList<ConformerRecord> reactant, SpeciesRecord? ts = null)
    {
        var r = reactant[0].Record with { Conformers = reactant.Count > 1 ? reactant : null };
        return new Pathway("conformers",
        [
            new("R", StateKind.Minimum, [new(r)]),
            new("TS", StateKind.SaddlePoint, [new(ts ?? Species("TS", "C4H10", -158.35, thermal: T(0.098)))]),
            new("P", StateKind.Minimum, [new(Species("P", "C4H10", -158.41, thermal: T(0.10)))]),
        ]);
    }

    [Fact]
    public void Lowest_ALowerReactantConformerRaisesTheBarrierByItsGibbsDifference()
    {
        // c1: G = −158.40 + 0.100 = −158.300; c2: G = −158.399 + 0.097 = −158.302, 0.002 Eh lower. TS: G = −158.252.
        // ΔG‡ with c1 alone = 0.048 Eh; with c2 added (the lowest, so the one used) = 0.050 Eh (hand arithmetic).
        var alone = PathwayEnergies.Derive(Reaction([C("c1", -158.40, T(0.100))]), Lowest);
        var both = PathwayEnergies.Derive(Reaction([C("c1", -158.40, T(0.100)), C("c2", -158.399, T(0.097))]), Lowest);

        Close.Absolute(0.048, alone.Steps[0].GibbsBarrier!.Value.Hartree, 1e-12, "ΔG‡ with c1 alone", "hand arithmetic");
        Close.Absolute(0.050, both.Steps[0].GibbsBarrier!.Value.Hartree, 1e-12, "ΔG‡ with c2 added", "hand arithmetic");
        Close.Absolute(-158.399, both.States[0].Electronic.Hartree, 1e-12, "E of the state is c2's", "c2 is the lowest by G");
        var use = both.States[0].Terms[0].Conformer!;
        Assert.Equal("c2", use.Lowest);
        Assert.Equal("conformer c2 (lowest of 2)", use.Description);
        Assert.Null(both.States[1].Terms[0].Conformer); // the saddle point has one conformer
        Assert.DoesNotContain(both.Reasons, x => x.Code.StartsWith("conformers.", StringComparison.Ordinal));
    }

    [Fact]
    public void Ensemble_OfButaneConformers_RaisesTheBarrierByTheTextbookEnsembleTerm()
    {
        // anti and the two gauche forms (mirror images, listed separately) with G(gauche) − G(anti) = 3.8 kJ/mol (McMurry, via
        // ConformerReference): G_ens − G_anti = −RT ln(1 + 2 exp(−ΔG/RT)) = −0.889806 kJ/mol at 298.15 K, so the barrier measured
        // from the ensemble is 0.889806 kJ/mol higher than from anti alone (lowest-conformer choice).
        var dg = Energy.FromKJPerMol(ConformerReference.ButaneGaucheAboveAntiKJPerMol).Hartree;
        var reactant = new[] { C("anti", -158.40, T(0.100)), C("gauche+", -158.40, T(0.100 + dg)), C("gauche-", -158.40, T(0.100 + dg)) };

        var lowest = PathwayEnergies.Derive(Reaction(reactant), Lowest);
        var ensemble = PathwayEnergies.Derive(Reaction(reactant), Ensemble);

        var rise = (ensemble.Steps[0].GibbsBarrier!.Value - lowest.Steps[0].GibbsBarrier!.Value).KJPerMol;
        Close.Absolute(-ConformerReference.ButaneEnsembleBelowAntiKJPerMol, rise, ConformerReference.ButaneTolerance, "barrier rise from the ensemble",
            "ConformerReference (McMurry 3.8 kJ/mol; hand computation)");
        var use = ensemble.States[0].Terms[0].Conformer!;
        Assert.Equal("ensemble of 3 conformers (anti 70 %, gauche+ 15 %, gauche- 15 %)", use.Description); // 0.698414 / 0.150793 each
        // E and H are the population-weighted averages: all equal here, so unchanged; the thermal source says it is an ensemble.
        Close.Absolute(-158.40, ensemble.States[0].Electronic.Hartree, 1e-12, "⟨E⟩", "equal electronic energies");
        Assert.EndsWith("Boltzmann ensemble of 3 conformers", ensemble.States[0].Terms[0].Species.Thermal!.Source);
        Assert.DoesNotContain(ensemble.Reasons, x => x.Code.StartsWith("conformers.", StringComparison.Ordinal));
    }

    [Fact]
    public void Reasons_LowerConformerWithoutCorrection_DuplicateInTheSum_UncheckedSaddleConformer()
    {
        // c3 is 0.003 Eh (1.88 kcal/mol) below c1 in E but has no thermal correction; c1b repeats c1.
        var reactant = new[] { C("c1", -158.40, T(0.100)), C("c1b", -158.40, T(0.100), duplicateOf: 0), C("c3", -158.403, null) };
        var ts = Species("TS", "C4H10", -158.35, thermal: T(0.098)) with
        {
            Conformers =
            [
                new("t1", Species("TS", "C4H10", -158.35, thermal: T(0.098))),
                new("t2", Species("TS", "C4H10", -158.3495, thermal: T(0.098)), CheckPassed: false), // +0.31 kcal/mol, not checked
            ],
        };

        var r = PathwayEnergies.Derive(Reaction(reactant, ts), Ensemble);

        var lower = Assert.Single(r.Reasons, x => x.Code == ConformerSelection.LowerConformerCode);
        Assert.StartsWith("State R: a lower conformer of R exists than the one the barrier uses: c3 lies 1.88 kcal/mol below c1", lower.Message);
        var dup = Assert.Single(r.Reasons, x => x.Code == ConformerSelection.DuplicatesInEnsembleCode);
        Assert.Contains("c1b repeats c1 (RMSD 0.01 Å)", dup.Message);
        // Two equal terms instead of one lower G by RT ln 2 = 0.592485 × 0.693147 = 0.41 kcal/mol (CODATA 2018 R, hand computation).
        Assert.Contains("lowers its G by 0.41 kcal/mol", dup.Message);
        var saddle = Assert.Single(r.Reasons, x => x.Code == ConformerSelection.UncheckedSaddleConformerCode);
        Assert.StartsWith("State TS: the saddle-point ensemble of TS has a conformer within 1.00 kcal/mol that was not checked: t2 (ΔG = +0.31 kcal/mol from t1)", saddle.Message);
        Assert.All([lower, dup, saddle], x => Assert.Equal(CheckSeverity.Attention, x.Severity));
        Assert.Equal(Verdict.NeedsAttention, r.Verdict);
    }
}
