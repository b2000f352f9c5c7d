using BarrierLedger.Core.Kinetics;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Web.Components.Pages.Reaction;

namespace BarrierLedger.Web.Tests.Reaction;

public class SelectivityPanelTests
{
    private const string Level = "PBE0/def2-TZVP";

    // A reactant R (G = 0) with two competing saddle points, TSa at 15.0 and TSb at 16.5 kcal/mol, each to its own product.
    internal static ReactionDetail Detail(double? sigmaKcalPerMol, params (string Label, string Kind, double GKcal)[] states)
    {
        var settings = ModelSettings.Default with { TemperatureKelvin = 298.15, DisplayUnit = EnergyUnit.KcalPerMol, UncertaintyKcalPerMol = sigmaKcalPerMol };
        var derived = states.Select((s, i) => new DerivedState(i, s.Label, s.Kind, null, null, Energy.FromKcalPerMol(s.GKcal).Hartree, [], [], Level)).ToList();
        return new ReactionDetail(1, "XI", "", 1, "Study", "u", "Mira", false, 1, new EnergyModelView(settings, 1, false, 0, null, null),
            true, false, null, null, null, null, Level, true, [], [], derived, [], [], []);
    }

    private static string Flat(string markup) => System.Text.RegularExpressions.Regex.Replace(markup, @"\s+", " ");

    private static ReactionDetail TwoChannels(double? sigma) =>
        Detail(sigma, ("R", "Minimum", 0.0), ("TSa", "SaddlePoint", 15.0), ("Pa", "Minimum", -5.0), ("TSb", "SaddlePoint", 16.5), ("Pb", "Minimum", -6.0));

    // Curtin–Hammett ratio r = exp(ΔΔG‡/RT) (J. I. Seeman, Chem. Rev. 1983, 83, 83) for ΔΔG‡ = 1.5 kcal/mol at 298.15 K, R from CODATA
    // 2018, computed independently in Python: r = 12.574989; share of TSa r/(1+r) = 0.926335; with σ = 2 kcal/mol per saddle point,
    // σ(ΔΔG‡) = 2 and the central 95 % interval r·exp(∓1.959964·σ/RT) (z from Python statistics.NormalDist) = 0.016834 to 9393.66.
    [Fact]
    public void TwoSaddlePoints_ShowShares_RatioWithInterval_AndConditions()
    {
        using var ctx = new BunitContext();
        var panel = ctx.Render<SelectivityPanel>(p => p.Add(c => c.Reaction, TwoChannels(2.0)));

        Assert.Contains("TSa is favoured over TSb by 13 : 1", panel.Find("[data-testid=selectivity-answer]").TextContent);
        var shares = panel.FindAll("tbody tr").Select(tr => tr.TextContent.Replace("\n", " ").Trim()).ToArray();
        Assert.Equal(2, shares.Length);
        Assert.Contains("93 %", shares[0]);
        Assert.Contains("7.4 %", shares[1]);
        var text = Flat(panel.Markup);
        Assert.Contains("TSa : TSb = 12.57 : 1", text);
        Assert.Contains("ΔΔG‡ 1.50 kcal/mol", text);
        Assert.Contains("95 % interval 0.02 to 9.39 × 10³", text);
        Assert.Contains("common practice, no source", panel.Find("caption").TextContent);
        Assert.Contains("Curtin–Hammett conditions", panel.Find("[data-testid=curtin-hammett]").TextContent);
        Assert.DoesNotContain("; ee ", text);
    }

    // ee = (r − 1)/(r + 1) (Seeman 1983, with r above): 0.852670; at the interval's ends −0.966890 and 0.999787 (Python, as above).
    [Fact]
    public void EnantiomericChannels_ReportEeWithItsInterval()
    {
        using var ctx = new BunitContext();
        var panel = ctx.Render<SelectivityPanel>(p => p.Add(c => c.Reaction, TwoChannels(2.0)));
        panel.Find("[data-testid=enantiomeric]").Change(true);
        Assert.Contains("; ee 85 % (95 % interval -97 % to 100 %)", Flat(panel.Markup));
        Assert.Contains("ee 85 %", panel.Find("[data-testid=selectivity-answer]").TextContent);
    }

    [Fact]
    public void NoUncertaintySet_SaysSoInsteadOfAnInterval()
    {
        using var ctx = new BunitContext();
        var panel = ctx.Render<SelectivityPanel>(p => p.Add(c => c.Reaction, TwoChannels(null)));
        Assert.Contains($"12.57 : 1 (ΔΔG‡ 1.50 kcal/mol), {UncertainValue.NotSet}", Flat(panel.Markup));
        Assert.Contains(UncertainValue.NotSet, panel.Find("[data-testid=selectivity-answer]").TextContent);
        Assert.DoesNotContain("95 % interval", panel.Markup);
    }

    [Fact]
    public void OneChannelLeft_AsksForTwo_AndShowsNoResult()
    {
        using var ctx = new BunitContext();
        var panel = ctx.Render<SelectivityPanel>(p => p.Add(c => c.Reaction, TwoChannels(2.0)));
        panel.Find("[data-testid=channel-TSb]").Change(false);
        Assert.Equal("Choose at least two saddle points.", panel.Find("[role=alert]").TextContent.Trim());
        Assert.Empty(panel.FindAll("[data-testid=selectivity-answer]"));
    }

    // Channels declared in the definition are the ones preselected (not the first two saddle points), with their ee setting:
    // TSb (16.5) against TSc (17.5), ΔΔG‡ = 1.0 kcal/mol, r = exp(1.0/RT) = 5.4076 at 298.15 K and ee = (r − 1)/(r + 1) = 0.6879
    // (Seeman 1983; R from CODATA 2018; computed in Python).
    [Fact]
    public void DeclaredChannels_ArePreselectedWithTheirEeSetting()
    {
        using var ctx = new BunitContext();
        var detail = Detail(2.0, ("R", "Minimum", 0.0), ("TSa", "SaddlePoint", 15.0), ("Pa", "Minimum", -5.0), ("TSb", "SaddlePoint", 16.5),
            ("TSc", "SaddlePoint", 17.5), ("Pb", "Minimum", -6.0)) with { Kinetics = new KineticsSetup(["TSb", "TSc"], Enantiomeric: true) };
        var panel = ctx.Render<SelectivityPanel>(p => p.Add(c => c.Reaction, detail));

        Assert.False(panel.Find("[data-testid=channel-TSa]").HasAttribute("checked"));
        Assert.True(panel.Find("[data-testid=channel-TSb]").HasAttribute("checked"));
        Assert.True(panel.Find("[data-testid=channel-TSc]").HasAttribute("checked"));
        Assert.Contains("declared in the reaction's definition", panel.Find("[data-testid=channels-origin]").TextContent);
        Assert.Contains("TSb : TSc = 5.41 : 1 (ΔΔG‡ 1.00 kcal/mol)", Flat(panel.Markup));
        Assert.Contains("ee 69 %", panel.Find("[data-testid=selectivity-answer]").TextContent);
    }

    [Fact]
    public void NothingDeclared_SaysTheFirstTwoArePreselected()
    {
        using var ctx = new BunitContext();
        var panel = ctx.Render<SelectivityPanel>(p => p.Add(c => c.Reaction, TwoChannels(2.0)));
        Assert.Contains("declares no competing channels", panel.Find("[data-testid=channels-origin]").TextContent);
    }

    [Fact]
    public void OneSaddlePoint_SaysThereIsNothingToCompare()
    {
        using var ctx = new BunitContext();
        var panel = ctx.Render<SelectivityPanel>(p => p.Add(c => c.Reaction,
            Detail(2.0, ("R", "Minimum", 0.0), ("TS", "SaddlePoint", 20.0), ("P", "Minimum", -3.0))));
        Assert.Contains("fewer than two saddle points", panel.Markup);
        Assert.Empty(panel.FindAll("input"));
    }
}
