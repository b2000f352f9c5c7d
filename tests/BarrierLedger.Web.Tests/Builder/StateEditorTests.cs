using BarrierLedger.Core.Pathways;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Reactions;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Web.Components.Pages.Builder;

namespace BarrierLedger.Web.Tests.Builder;

public class StateEditorTests
{
    private static WorkspaceSpecies Species(int id, string label, string formula) =>
        new(id, label, "", 0, 1, formula, 1, false, false, 1, []);

    private static readonly StudyWorkspace Study = new(1, "Study", "", false, 1, DateTimeOffset.UnixEpoch,
        [Species(10, "butadiene", "C4H6"), Species(11, "ethylene", "C2H4"), Species(12, "ethane", "C2H6"), Species(13, "cyclohexene", "C6H10")], [], []);

    private static IRenderedComponent<StateEditor> Render(BunitContext ctx, StateDraft state, StateBalance? balance, bool differs,
        IReadOnlyList<DefinitionProblem> problems, Action changed)
    {
        ctx.JSInterop.Mode = JSRuntimeMode.Loose;
        return ctx.Render<StateEditor>(p => p.Add(c => c.State, state).Add(c => c.Index, 2).Add(c => c.Count, 3).Add(c => c.Workspace, Study)
            .Add(c => c.Balance, balance).Add(c => c.BalanceDiffers, differs).Add(c => c.Problems, problems).Add(c => c.OnChanged, changed));
    }

    [Fact]
    public void TypedSpecies_UniquePrefixAddsIt_SecondTimeRaisesItsCoefficient_AmbiguousPrefixSaysWhich()
    {
        using var ctx = new BunitContext();
        var state = new StateDraft { Label = "products", Kind = StateKind.Minimum };
        var changes = 0;
        var cut = Render(ctx, state, null, false, [], () => changes++);

        cut.Find("#state-3-terms-add").Input("cyclo");
        cut.Find("#state-3-terms-add").KeyDown("Enter");
        cut.Find("#state-3-terms-add").Input("Cyclohexene");
        cut.FindAll("button").Single(b => b.TextContent == "+ add species").Click();
        cut.Find("#state-3-terms-add").Input("eth");
        cut.Find("#state-3-terms-add").KeyDown("Enter");

        var term = Assert.Single(state.Terms);
        Assert.Equal((13, 2), (term.SpeciesId, term.Coefficient));
        Assert.Equal(2, changes);
        Assert.Equal("'eth' fits ethylene, ethane: type more of the label", cut.Find(".term-picker [role=alert]").TextContent);
    }

    [Fact]
    public void Balance_DifferentFromTheFirstState_IsMarkedAndSaysSo()
    {
        using var ctx = new BunitContext();
        var state = new StateDraft { Label = "products", Kind = StateKind.Minimum };
        state.Terms.Add(new TermDraft { SpeciesId = 10 });

        var cut = Render(ctx, state, new StateBalance(2, "products", "C4H6", 0, 30, true), true, [], () => { });

        var balance = cut.Find("[data-testid=balance]");
        Assert.Contains("balance-off", balance.ClassList);
        Assert.Equal("≠ C4H6 · charge 0 · 30 electrons — not the same as state 1", balance.TextContent.Trim());
    }

    [Fact]
    public void Balance_SameAsTheFirstState_AndUnknownGeometry_AreSaidPlainly()
    {
        using var ctx = new BunitContext();
        var state = new StateDraft { Label = "products", Kind = StateKind.Minimum };
        state.Terms.Add(new TermDraft { SpeciesId = 13 });

        var same = Render(ctx, state, new StateBalance(2, "products", "C6H10", 0, 46, true), false, [], () => { });
        Assert.DoesNotContain("balance-off", same.Find("[data-testid=balance]").ClassList);
        Assert.Equal("= C6H10 · charge 0 · 46 electrons", same.Find("[data-testid=balance]").TextContent.Trim());

        using var ctx2 = new BunitContext();
        var unknown = Render(ctx2, state, new StateBalance(2, "products", "", 0, 0, false), false, [], () => { });
        Assert.Equal("Atoms: not known yet (a species has no geometry)", unknown.Find("[data-testid=balance]").TextContent.Trim());
    }

    [Fact]
    public void Problems_OfTheState_AreListedAndTheStateIsMarked()
    {
        using var ctx = new BunitContext();
        var state = new StateDraft { Label = "TS", Kind = StateKind.SaddlePoint };
        var cut = Render(ctx, state, null, false,
            [new DefinitionProblem(2, "reaction 'x', state 'TS' has no species"), new DefinitionProblem(2, "reaction 'x', saddle-point state 'TS' names no calculation")], () => { });

        Assert.Contains("has-problems", cut.Find("fieldset").ClassList);
        Assert.Equal(["reaction 'x', state 'TS' has no species", "reaction 'x', saddle-point state 'TS' names no calculation"],
            cut.FindAll("ul.problems li").Select(li => li.TextContent));
        // A saddle point without a calculation has no atoms to pick yet.
        Assert.Contains("Choose the saddle-point calculation first", cut.Markup);
    }
}
