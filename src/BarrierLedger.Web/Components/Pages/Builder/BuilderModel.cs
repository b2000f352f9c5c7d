using BarrierLedger.Core.Pathways;
using BarrierLedger.Ledger.Reactions;
using BarrierLedger.Ledger.Records;

namespace BarrierLedger.Web.Components.Pages.Builder;

/// <summary>A species in a state being edited, with its coefficient.</summary>
public sealed class TermDraft
{
    public int SpeciesId { get; set; }
    public int Coefficient { get; set; } = 1;
}

/// <summary>One state being edited in the builder (mutable; becomes a <see cref="StateDefinition"/> for the preview and the save).</summary>
public sealed class StateDraft
{
    public string Label { get; set; } = "";
    public StateKind Kind { get; set; }
    public List<TermDraft> Terms { get; } = [];
    public int? SaddleCalculationId { get; set; }
    public List<AtomPair> Pairs { get; } = [];
    public List<int> ScanIds { get; } = [];

    public StateDefinition ToDefinition() => new(Label.Trim(), Kind, [.. Terms.Select(t => new TermDefinition(t.SpeciesId, t.Coefficient))],
        Kind == StateKind.SaddlePoint ? SaddleCalculationId : null, Kind == StateKind.SaddlePoint ? [.. Pairs] : [], Kind == StateKind.SaddlePoint ? [.. ScanIds] : []);

    public static StateDraft From(StateDefinition s)
    {
        var d = new StateDraft { Label = s.Label, Kind = s.Kind, SaddleCalculationId = s.SaddleCalculationId };
        d.Terms.AddRange(s.Terms.Select(t => new TermDraft { SpeciesId = t.SpeciesId, Coefficient = t.Coefficient }));
        d.Pairs.AddRange(s.Pairs);
        d.ScanIds.AddRange(s.Scans);
        return d;
    }
}

/// <summary>The whole reaction being edited.</summary>
public sealed class ReactionDraft
{
    public string Label { get; set; } = "";
    public string Description { get; set; } = "";
    public List<StateDraft> States { get; } = [];
    /// <summary>The kinetics setup the definition came with (declared in a bundle or the API), carried through an edit unchanged.</summary>
    public Core.Kinetics.KineticsSetup? Kinetics { get; set; }

    public ReactionDefinition ToDefinition() => new(Label.Trim(), Description.Trim(), [.. States.Select(s => s.ToDefinition())], Kinetics);

    public static ReactionDraft From(ReactionDefinition d)
    {
        var r = new ReactionDraft { Label = d.Label, Description = d.Description, Kinetics = d.Kinetics };
        r.States.AddRange(d.States.Select(StateDraft.From));
        return r;
    }

    /// <summary>A new pathway's start: reactants, a saddle point, products.</summary>
    public static ReactionDraft Blank()
    {
        var r = new ReactionDraft();
        r.States.Add(new StateDraft { Label = "reactants", Kind = StateKind.Minimum });
        r.States.Add(new StateDraft { Label = "TS", Kind = StateKind.SaddlePoint });
        r.States.Add(new StateDraft { Label = "products", Kind = StateKind.Minimum });
        return r;
    }
}
