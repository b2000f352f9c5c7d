using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Kinetics;

namespace BarrierLedger.Ledger.Tests.Kinetics;

public class EnergyUncertaintyTests
{
    private const string Levels = "DLPNO-CCSD(T)/def2-TZVP//wB97X-D/def2-SVP = 1.0\n# comment line\n\nB3LYP-D3/def2-SVP = 3";

    [Fact]
    public void SigmaFor_NamedLevelWholeOrSinglePointPart_ElseTheDefault()
    {
        var u = EnergyUncertainty.From(ModelSettings.Default with { UncertaintyKcalPerMol = 2.0, UncertaintyByLevel = Levels });
        Assert.Equal(1.0, u.SigmaFor("DLPNO-CCSD(T)/def2-TZVP//wB97X-D/def2-SVP"));
        // Whitespace and case do not matter (EnergyLevels.Key); the single-point part alone finds a "sp // geometry" entry.
        Assert.Equal(3.0, u.SigmaFor("b3lyp-d3 / def2-svp // PBE/def2-SVP"));
        Assert.Equal(2.0, u.SigmaFor("M06-2X/def2-TZVP"));
        // Mixed levels ("; ") take the largest σ of their parts.
        Assert.Equal(3.0, u.SigmaFor("DLPNO-CCSD(T)/def2-TZVP//wB97X-D/def2-SVP; B3LYP-D3/def2-SVP"));
        Assert.Contains("set for B3LYP-D3/def2-SVP", u.Describe("B3LYP-D3/def2-SVP"));
        Assert.Contains("common practice, no source", u.Describe("M06-2X/def2-TZVP"));
    }

    [Fact]
    public void NoDefault_LevelsNotListedSayNoUncertaintySet()
    {
        var u = EnergyUncertainty.From(ModelSettings.Default with { UncertaintyKcalPerMol = null, UncertaintyByLevel = "" });
        Assert.Equal(0.0, u.SigmaFor("M06-2X/def2-TZVP"));
        Assert.Equal("no uncertainty set", u.Describe("M06-2X/def2-TZVP"));
        Assert.False(u.RateConstant(1.0, "M06-2X/def2-TZVP", 298.15).IsSet);
        Assert.Equal("Uncertainty: no uncertainty set", (ModelSettings.Default with { UncertaintyKcalPerMol = 0 }).DescribeUncertainty());
    }

    // A new energy model starts at σ = 2 kcal/mol, labelled as common practice with no source.
    [Fact]
    public void NewModel_StartsAtTheCommonPracticeDefault_SaidSo()
    {
        Assert.Equal(EnergyUncertainty.CommonPracticeKcalPerMol, ModelSettings.Default.UncertaintyKcalPerMol);
        Assert.Contains("common practice, no source", ModelSettings.Default.DescribeUncertainty());
    }

    // 95 % interval of k with σ = 1 kcal/mol at 298.15 K: factor e^{zσ/RT}, z = 1.959964 (NIST/SEMATECH e-Handbook §1.3.6.7.1),
    // RT = 0.592485 kcal/mol (CODATA 2018 R, thermochemical calorie), e^{3.30804} = 27.3315 (independent computation with Python's statistics.NormalDist and math.exp).
    [Fact]
    public void RateConstant_IntervalUsesTheLevelsSigma()
    {
        var u = EnergyUncertainty.From(ModelSettings.Default with { UncertaintyByLevel = Levels });
        var k = u.RateConstant(1.0e-3, "DLPNO-CCSD(T)/def2-TZVP//wB97X-D/def2-SVP", 298.15);
        Assert.Equal(1.0e-3 / 27.3315, k.Lower, 1e-3 * 1e-3 / 27.3315);
        Assert.Equal(1.0e-3 * 27.3315, k.Upper, 1e-3 * 1e-3 * 27.3315);
        var t = u.Time(100, "DLPNO-CCSD(T)/def2-TZVP//wB97X-D/def2-SVP", 298.15);
        Assert.Equal(100 * 27.3315, t.Upper, 1e-3 * 100 * 27.3315);
    }

    [Theory]
    [InlineData(null, "no equals sign", "line 1")]
    [InlineData(null, "B3LYP/def2-SVP = lots", "line 1")]
    [InlineData(null, "B3LYP/def2-SVP = 1\nb3lyp/def2-svp = 2", "listed twice")]
    [InlineData(null, "B3LYP/def2-SVP = 12", "between 0 and 10")]
    [InlineData(-1.0, "", "between 0 and 10")]
    public void BadSettings_AreRefusedWithTheLine(double? sigma, string levels, string expected)
    {
        var settings = ModelSettings.Default with { UncertaintyKcalPerMol = sigma, UncertaintyByLevel = levels };
        Assert.Contains(settings.Validate(), e => e.Contains(expected, StringComparison.Ordinal));
        Assert.Throws<ArgumentException>(() => EnergyUncertainty.From(settings));
        Assert.Equal("Uncertainty: no uncertainty set", settings.DescribeUncertainty());
    }
}
