using BarrierLedger.Core.Conformers;
using BarrierLedger.Core.Tests.ReferenceData;
using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Tests.Conformers;

public class ConformerSelectionTests
{
    private static readonly Energy Zero = Energy.FromHartree(-158.4);

    private static ConformerEnergies C(string label, double eKcal, double? gCorrKcal, double hCorrKcal = 0, bool passed = true, int? duplicateOf = null) =>
        new(label, Zero + Energy.FromKcalPerMol(eKcal),
            gCorrKcal is null ? null : Zero + Energy.FromKcalPerMol(eKcal + hCorrKcal),
            gCorrKcal is null ? null : Zero + Energy.FromKcalPerMol(eKcal + gCorrKcal.Value), passed, duplicateOf);

    /// <summary>RT at 298.15 K in kcal/mol: 8.314462618 × 298.15 / 4184 = 0.5924849 (CODATA 2018 R, thermochemical calorie).</summary>
    private const double RT = 0.5924849;

    [Fact]
    public void Lowest_TakesTheConformerWithTheLowestG()
    {
        var c = new[] { C("c1", 0, 10), C("c2", 1, 8.5), C("c3", -0.5, 11.2) };
        var s = ConformerSelection.Select(c, ConformerChoice.Lowest, 298.15);
        Assert.Equal(1, s.Lowest); // G: 10, 9.5, 10.7
        Close.Absolute(9.5, (s.Gibbs!.Value - Zero).KcalPerMol, 1e-9, "G of the lowest conformer", "construction");
        Close.Absolute(1.0, (s.Electronic - Zero).KcalPerMol, 1e-9, "its E", "construction");
        Assert.Equal("conformer c2 (lowest of 3)", s.Describe(c));
        Close.Absolute(1.0, s.Populations.Sum(), 1e-12, "populations", "normalisation");
    }

    [Fact]
    public void Ensemble_OfButane_GivesTheHandComputedEnsembleG()
    {
        // anti and the two gauche forms listed separately, G from the textbook difference of 3.8 kJ/mol (ConformerReference).
        var dg = ConformerReference.ButaneGaucheAboveAntiKJPerMol / 4.184;
        var c = new[] { C("anti", 0, 0), C("g+", dg, 0), C("g-", dg, 0) };
        var s = ConformerSelection.Select(c, ConformerChoice.BoltzmannEnsemble, 298.15);
        Close.Absolute(ConformerReference.ButaneEnsembleBelowAntiKJPerMol, (s.Gibbs!.Value - Zero).KJPerMol, ConformerReference.ButaneTolerance,
            "G_ens − G_anti", "hand computation, ConformerReference");
        Close.Absolute(ConformerReference.ButaneAntiPopulation298, s.Populations[0], ConformerReference.ButaneTolerance, "anti population", "hand computation");
        // E is the population-weighted average: here E = G, so ⟨E⟩ = p_gauche × ΔG.
        Close.Absolute(ConformerReference.ButaneGauchePopulation298 * ConformerReference.ButaneGaucheAboveAntiKJPerMol, (s.Electronic - Zero).KJPerMol, 1e-5,
            "⟨E⟩", "hand computation: 0.301586 × 3.8 kJ/mol");
        Assert.Equal("ensemble of 3 conformers (anti 70 %, g+ 15 %, g- 15 %)", s.Describe(c));
    }

    [Fact]
    public void Ensemble_WithoutThermalCorrections_UsesElectronicEnergies()
    {
        var c = new[] { C("a", 0, null), C("b", 0, null) };
        var s = ConformerSelection.Select(c, ConformerChoice.BoltzmannEnsemble, 298.15);
        Assert.False(s.ByGibbs);
        Assert.Null(s.Gibbs);
        Close.Absolute(-RT * Math.Log(2), (s.Electronic - Zero).KcalPerMol, 1e-6, "E ensemble of two equal conformers", "−RT ln 2, hand computation");
    }

    [Fact]
    public void Check_LowerConformerWithoutThermalCorrection_IsNamedWithItsEffect()
    {
        // c1 used (G = 0 + 10); c2 has only an electronic energy, 1.8 kcal/mol lower: with c1's correction G would be 8.2.
        var c = new[] { C("c1", 0, 10), C("c2", -1.8, null) };
        var lowest = ConformerSelection.Select(c, ConformerChoice.Lowest, 298.15);
        var r = Assert.Single(ConformerSelection.Check("R", "A", false, c, lowest, 298.15));
        Assert.Equal(ConformerSelection.LowerConformerCode, r.Code);
        Assert.Contains("a lower conformer of A exists than the one the barrier uses: c2 lies 1.80 kcal/mol below c1", r.Message);
        Assert.Contains("lower this state's G by about 1.80 kcal/mol", r.Message);

        // In an ensemble of c1 alone, adding c2 at 8.2: G_ens' = 8.2 − RT ln(1 + exp(−1.8/RT)) → lowered by 1.8 + RT ln(1 + e^(−1.8/RT)).
        var ens = ConformerSelection.Select(c, ConformerChoice.BoltzmannEnsemble, 298.15);
        var expected = 1.8 + RT * Math.Log(1 + Math.Exp(-1.8 / RT));
        var e = Assert.Single(ConformerSelection.Check("R", "A", false, c, ens, 298.15));
        Assert.Contains($"lower this state's G by about {expected:0.00} kcal/mol", e.Message);

        // Not lower, or a saddle point: nothing of this kind.
        Assert.Empty(ConformerSelection.Check("R", "A", false, [C("c1", 0, 10), C("c2", 0.5, null)], lowest, 298.15));
    }

    [Fact]
    public void Check_SaddlePointConformerNearTheUsedOneWithoutAPassingCheck_IsNamed()
    {
        var c = new[] { C("t1", 0, 5), C("t2", 0.6, 5, passed: false), C("t3", 1.5, 5, passed: false), C("t4", -2, null, passed: false) };
        var s = ConformerSelection.Select(c, ConformerChoice.Lowest, 298.15);
        var r = ConformerSelection.Check("TS1", "TS-A", true, c, s, 298.15);
        Assert.Equal(2, r.Count);
        Assert.All(r, x => Assert.Equal(ConformerSelection.UncheckedSaddleConformerCode, x.Code));
        Assert.Contains("t2 (ΔG = +0.60 kcal/mol from t1)", r[0].Message);
        Assert.Contains("has a conformer within 1.00 kcal/mol that was not checked", r[0].Message);
        Assert.Contains("t4 (ΔE = −2.00 kcal/mol from t1)", r[1].Message); // below the used one, judged by E
    }

    [Fact]
    public void Check_DuplicatesInABoltzmannSum_StateHowMuchTheyLowerG()
    {
        var c = new[] { C("c1", 0, 10), C("c1 again", 0.01, 10, duplicateOf: 0) with { DuplicateNote = "RMSD 0.02 Å" }, C("c2", 2, 10) };
        var ens = ConformerSelection.Select(c, ConformerChoice.BoltzmannEnsemble, 298.15);
        var r = Assert.Single(ConformerSelection.Check("R", "A", false, c, ens, 298.15));
        Assert.Equal(ConformerSelection.DuplicatesInEnsembleCode, r.Code);
        Assert.Contains("duplicates counted twice in the Boltzmann sum of A: c1 again repeats c1 (RMSD 0.02 Å)", r.Message);
        // Hand computation: with x_k = exp(−ΔG_k/RT), lowered = RT ln[(1 + x(0.01) + x(2)) / (1 + x(2))]
        // = 0.59248 × ln(2.01746 / 1.03420) = 0.59248 × 0.66821 = 0.3959 kcal/mol (a little under RT ln 2 = 0.4107, as c1 again sits 0.01 above c1).
        double X(double d) => Math.Exp(-d / RT);
        var lowered = RT * Math.Log((1 + X(0.01) + X(2)) / (1 + X(2)));
        Assert.Contains($"lowers its G by {lowered:0.00} kcal/mol", r.Message);
        Assert.Equal("0.40", lowered.ToString("0.00", System.Globalization.CultureInfo.InvariantCulture));
        // Under the lowest-conformer choice a duplicate changes nothing and is not reported here.
        Assert.Empty(ConformerSelection.Check("R", "A", false, c, ConformerSelection.Select(c, ConformerChoice.Lowest, 298.15), 298.15));
    }

    [Fact]
    public void Select_NoConformers_IsRejected() =>
        Assert.Throws<ArgumentException>(() => ConformerSelection.Select([], ConformerChoice.Lowest, 298.15));
}
