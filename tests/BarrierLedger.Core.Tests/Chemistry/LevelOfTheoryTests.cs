using BarrierLedger.Core.Chemistry;

namespace BarrierLedger.Core.Tests.Chemistry;

/// <summary>
/// How the trade writes levels of theory ("method/basis", a solvation model in parentheses, "A//B" for a single point on
/// a geometry from B) is common practice, no source; these cases pin the parsing to that notation.
/// </summary>
public class LevelOfTheoryTests
{
    [Theory]
    [InlineData("wB97X-D/def2-TZVP", "wB97X-D", "def2-TZVP", "")]
    [InlineData("wB97X-D/def2-TZVP (SMD, water)", "wB97X-D", "def2-TZVP", "SMD, water")]
    [InlineData("DLPNO-CCSD(T)/def2-TZVP (PCM, water)", "DLPNO-CCSD(T)", "def2-TZVP", "PCM, water")]
    [InlineData("CCSD(T)/cc-pVTZ", "CCSD(T)", "cc-pVTZ", "")]
    [InlineData("B3LYP/6-31G(d)", "B3LYP", "6-31G(d)", "")]
    [InlineData("B3LYP/6-31+G(d,p) (CPCM, toluene)", "B3LYP", "6-31+G(d,p)", "CPCM, toluene")]
    [InlineData("CCSD(T)", "CCSD(T)", "", "")]
    public void Parse_KeepsParenthesesOfMethodAndBasis_TakesOnlyASpacedTrailingGroupAsSolvation(string text, string method, string basis, string solvation)
    {
        var level = LevelOfTheory.Parse(text);
        Assert.Equal(method, level.Method);
        Assert.Equal(basis, level.Basis);
        Assert.Equal(solvation, level.Solvation);
        Assert.Equal(text, level.ToString());
    }

    [Fact]
    public void Parse_SinglePointOnGeometry_KeepsBothLevels()
    {
        var level = LevelOfTheory.Parse("DLPNO-CCSD(T)/def2-QZVPP (PCM, acetonitrile)//wB97X-D/def2-SVP");
        Assert.Equal("DLPNO-CCSD(T)", level.Method);
        Assert.Equal("PCM, acetonitrile", level.Solvation);
        Assert.NotNull(level.GeometryLevel);
        Assert.Equal("wB97X-D", level.GeometryLevel!.Method);
        Assert.Equal("def2-SVP", level.GeometryLevel.Basis);
        Assert.True(level.SameAs(LevelOfTheory.Parse("dlpno-ccsd(t)/def2-qzvpp (PCM,acetonitrile)//wb97x-d/def2-svp")));
        Assert.False(level.SameAs(LevelOfTheory.Parse("DLPNO-CCSD(T)/def2-QZVPP (PCM, acetonitrile)//wB97X-D/def2-TZVP")));
    }

    [Theory]
    [InlineData("")]
    [InlineData("   ")]
    [InlineData("/def2-SVP")]
    public void TryParse_RefusesEmptyOrMethodless(string text) => Assert.False(LevelOfTheory.TryParse(text, out _, out _));
}
