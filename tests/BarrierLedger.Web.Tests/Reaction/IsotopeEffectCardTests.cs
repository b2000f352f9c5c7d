using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.IsotopeEffects;
using BarrierLedger.Ledger.IsotopeEffects;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Web.Components.Pages.Reaction;

namespace BarrierLedger.Web.Tests.Reaction;

public class IsotopeEffectCardTests
{
    private static IsotopologueSetView Set(string subs) => new(1, 1, "D at H2", 1, "TS", IsotopeSubstitution.ParseList(subs),
        [new ReactantSubstitutions(5, "R", IsotopeSubstitution.ParseList(subs))], IsotopeMapping.SameAtomOrder, "Mira", DateTimeOffset.UnixEpoch, false);

    // A stretch of two atoms that becomes the reaction coordinate (two pair springs: a positive one for the minimum, a negative one for
    // the saddle point), so the card shows a real Core result.
    private static KieResult Result()
    {
        var m = new Molecule([Elements.C, Elements.H, Elements.Get("Cl")], [new Vec3(0, 0, 0), new Vec3(0, 0, 1.09), new Vec3(1.2, 0, -1.2)]);
        static double[] Springs(Molecule m, double ch)
        {
            var h = new double[81];
            void Add(int a, int b, double k)
            {
                k *= 5.29177210903e-11 * 5.29177210903e-11 / 4.3597447222071e-18;
                var u = (m.PositionsAngstrom[b] - m.PositionsAngstrom[a]).Normalized();
                for (var x = 0; x < 3; x++)
                    for (var y = 0; y < 3; y++)
                    {
                        var v = k * u[x] * u[y];
                        h[(3 * a + x) * 9 + 3 * a + y] += v; h[(3 * b + x) * 9 + 3 * b + y] += v;
                        h[(3 * a + x) * 9 + 3 * b + y] -= v; h[(3 * b + x) * 9 + 3 * a + y] -= v;
                    }
            }
            Add(0, 1, ch); Add(0, 2, 300); Add(1, 2, 40);
            return h;
        }
        var subs = IsotopeSubstitution.ParseList("2=D");
        return KineticIsotopeEffect.Compute(new KieStructure("TS", m, Springs(m, -150), subs), [new KieStructure("R", m, Springs(m, 450), subs)]);
    }

    [Fact]
    public void WithAResult_ShowsEveryFactorAndTheKie()
    {
        using var ctx = new BunitContext();
        var r = Result();
        var card = ctx.Render<IsotopeEffectCard>(p => p.Add(c => c.Effect, new IsotopeEffectView(Set("2=D"), r, null, ["Saddle point TS is not verified by a reviewer."], ["H2→D"])));
        var headers = card.FindAll("thead th").Select(th => th.TextContent.Trim()).ToArray();
        Assert.Equal(["SYM", "MMI", "ZPE", "EXC", "LOW", "TUN", "KIE"], headers[..7]);
        var cells = card.FindAll("tbody td").Select(td => td.TextContent.Trim()).ToArray();
        Assert.Equal(r.ZeroPointFactor.ToString("F3", System.Globalization.CultureInfo.InvariantCulture), cells[2]);
        Assert.Equal(r.Kie.ToString("F3", System.Globalization.CultureInfo.InvariantCulture), cells[6]);
        Assert.Contains("not verified", card.Markup);
        Assert.Contains("Primary: H2→D", card.Markup);
    }

    [Fact]
    public void WithoutAResult_SaysWhyAndShowsNoNumber()
    {
        using var ctx = new BunitContext();
        var card = ctx.Render<IsotopeEffectCard>(p => p.Add(c => c.Effect,
            new IsotopeEffectView(Set("2=D"), null, "R (r1) has frequencies but no Cartesian Hessian", [], [])));
        Assert.Contains("no Cartesian Hessian", card.Find("[data-testid=kie-unavailable]").TextContent);
        Assert.Empty(card.FindAll("table"));
    }
}
