using System.Collections.Immutable;
using System.Globalization;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.Checks;

/// <summary>Stable codes of the endpoint match.</summary>
public static class EndpointMatchCodes
{
    public const string Matches = "endpoint.matches";
    public const string Swapped = "endpoint.swapped";
    public const string NoMatch = "endpoint.no-match";
    public const string SameMinimum = "endpoint.same-minimum";
    public const string LargeRmsd = "endpoint.large-rmsd";
}

/// <summary>Which listed minimum an endpoint matches.</summary>
public enum EndpointOutcome
{
    /// <summary>Same connectivity as the minimum it should reach (forward → product, backward → reactant).</summary>
    MatchesExpected,
    /// <summary>Same connectivity as the minimum on the other side.</summary>
    MatchesOtherSide,
    /// <summary>Same connectivity as neither minimum.</summary>
    MatchesNeither,
}

/// <summary>One endpoint against the two neighbouring minima.</summary>
/// <param name="Name">"forward" or "backward".</param>
/// <param name="Outcome">What it matches.</param>
/// <param name="RmsdToExpectedAngstrom">Kabsch RMSD to the minimum it should reach.</param>
/// <param name="RmsdToOtherAngstrom">Kabsch RMSD to the minimum on the other side.</param>
/// <param name="Formed">Bonds in the endpoint that the expected minimum lacks.</param>
/// <param name="Broken">Bonds of the expected minimum that the endpoint lacks.</param>
public sealed record EndpointSide(string Name, EndpointOutcome Outcome, double RmsdToExpectedAngstrom, double RmsdToOtherAngstrom,
    ImmutableArray<Bond> Formed, ImmutableArray<Bond> Broken);

/// <summary>The verdict of the endpoint match.</summary>
public sealed record EndpointMatchResult(Verdict Verdict, IReadOnlyList<CheckReason> Reasons, EndpointSide Forward, EndpointSide Backward, bool Swapped)
{
    public string Report() => CheckReport.Format(Verdict, Reasons);
}

/// <summary>Settings of the endpoint match.</summary>
/// <param name="RmsdAttentionAngstrom">
/// An endpoint with the right connectivity but a Kabsch RMSD above this from its minimum is flagged (a different conformer
/// or an endpoint that was not optimised to the end). Default 0.5 Å: common practice, no source.
/// </param>
/// <param name="Connectivity">How bonds are found.</param>
/// <param name="Mapping">How atoms are matched when a state's species list them in another order.</param>
public sealed record EndpointMatchOptions(double RmsdAttentionAngstrom = 0.5, ConnectivityOptions? Connectivity = null, AtomMappingOptions? Mapping = null)
{
    public static EndpointMatchOptions Default { get; } = new();
}

/// <summary>
/// Do the two ends of an IRC (or the two displaced optimisations) reach the reaction's neighbouring minima? Each endpoint is
/// compared with the reactant and the product by connectivity (<see cref="Connectivity"/>, atom order as given) and by Kabsch
/// RMSD (<see cref="Kabsch"/>). The forward end should reach the product and the backward end the reactant; when it is the
/// other way round the result says "swapped" (the chemistry may be right, the direction labels are not).
/// All structures must have the same atoms in the same order; otherwise <see cref="ArgumentException"/> says which atom differs.
/// </summary>
public static partial class EndpointMatch
{
    public static EndpointMatchResult Compare(Molecule forwardEnd, Molecule backwardEnd, Molecule reactant, Molecule product, EndpointMatchOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(forwardEnd);
        ArgumentNullException.ThrowIfNull(backwardEnd);
        ArgumentNullException.ThrowIfNull(reactant);
        ArgumentNullException.ThrowIfNull(product);
        var o = options ?? EndpointMatchOptions.Default;
        SameAtoms(reactant, "reactant", forwardEnd, "forward endpoint", nameof(forwardEnd));
        SameAtoms(reactant, "reactant", backwardEnd, "backward endpoint", nameof(backwardEnd));
        SameAtoms(reactant, "reactant", product, "product", nameof(product));

        var gR = Connectivity.Of(reactant, o.Connectivity);
        var gP = Connectivity.Of(product, o.Connectivity);
        var fwd = Side("forward", forwardEnd, product, gP, reactant, gR, o);
        var bwd = Side("backward", backwardEnd, reactant, gR, product, gP, o);
        var reasons = new List<CheckReason>();
        var swapped = fwd.Outcome == EndpointOutcome.MatchesOtherSide && bwd.Outcome == EndpointOutcome.MatchesOtherSide;
        var identicalMinima = gR.SameAs(gP);

        if (identicalMinima)
            reasons.Add(new(EndpointMatchCodes.SameMinimum, CheckSeverity.Attention,
                "The reactant and the product have the same bonds, so connectivity cannot tell the two sides apart (a conformational change?); only the RMSD values below distinguish them."));
        if (swapped && !identicalMinima)
        {
            reasons.Add(new(EndpointMatchCodes.Swapped, CheckSeverity.Attention,
                $"Swapped: the forward end matches the reactant (RMSD {A(fwd.RmsdToOtherAngstrom)}) and the backward end matches the product (RMSD {A(bwd.RmsdToOtherAngstrom)}). " +
                "The saddle point connects the right minima, but the direction of the mode is the opposite of the labels; swap them before using the path."));
        }
        else
        {
            foreach (var (side, expected, other) in new[] { (fwd, "product", "reactant"), (bwd, "reactant", "product") })
            {
                reasons.Add(side.Outcome switch
                {
                    EndpointOutcome.MatchesExpected => new(EndpointMatchCodes.Matches, CheckSeverity.Info,
                        $"The {side.Name} end has the bonds of the {expected} (RMSD {A(side.RmsdToExpectedAngstrom)} after superposition)."),
                    EndpointOutcome.MatchesOtherSide => new(EndpointMatchCodes.NoMatch, CheckSeverity.Failure,
                        $"The {side.Name} end falls back to the {other}, not the {expected}: both ends reach the same side, so this saddle point does not connect the two minima."),
                    _ => new(EndpointMatchCodes.NoMatch, CheckSeverity.Failure,
                        $"The {side.Name} end matches neither minimum; compared with the {expected}, {Differences(side, forwardEnd)}. " +
                        "The saddle point leads somewhere else: find the minimum it connects, or a different saddle point."),
                });
            }
        }
        foreach (var side in new[] { fwd, bwd })
        {
            var rmsd = swapped ? side.RmsdToOtherAngstrom : side.RmsdToExpectedAngstrom;
            var matched = swapped || side.Outcome == EndpointOutcome.MatchesExpected;
            if (matched && rmsd > o.RmsdAttentionAngstrom)
                reasons.Add(new(EndpointMatchCodes.LargeRmsd, CheckSeverity.Attention,
                    $"The {side.Name} end has the right bonds but lies {A(rmsd)} from its minimum after superposition (more than {A(o.RmsdAttentionAngstrom)}): " +
                    "a different conformer, or an endpoint not optimised to the end."));
        }
        var ordered = reasons.OrderByDescending(r => r.Severity).ToList();
        return new EndpointMatchResult(CheckReason.VerdictOf(ordered), ordered, fwd, bwd, swapped);
    }

    private static EndpointSide Side(string name, Molecule end, Molecule expected, Connectivity gExpected, Molecule other, Connectivity gOther, EndpointMatchOptions o)
    {
        var g = Connectivity.Of(end, o.Connectivity);
        var outcome = g.SameAs(gExpected) ? EndpointOutcome.MatchesExpected
            : g.SameAs(gOther) ? EndpointOutcome.MatchesOtherSide
            : EndpointOutcome.MatchesNeither;
        var (formed, broken) = gExpected.Compare(g);
        return new EndpointSide(name, outcome, Kabsch.Rmsd(end, expected), Kabsch.Rmsd(end, other), formed, broken);
    }

    private static string Differences(EndpointSide side, Molecule labels)
    {
        var parts = new List<string>();
        if (side.Formed.Length > 0) parts.Add($"it has {string.Join(", ", side.Formed.Select(b => b.Label(labels)))} in addition");
        if (side.Broken.Length > 0) parts.Add($"it lacks {string.Join(", ", side.Broken.Select(b => b.Label(labels)))}");
        return string.Join(" and ", parts);
    }

    private static void SameAtoms(Molecule reference, string referenceName, Molecule other, string otherName, string parameter)
    {
        var fr = Formula.Of(reference);
        var fo = Formula.Of(other);
        if (fr != fo)
            throw new ArgumentException($"The {otherName} is {fo} but the {referenceName} is {fr} ({fo.DifferenceFrom(fr)}); endpoints can only be matched between structures of the same atoms.", parameter);
        for (var i = 0; i < reference.AtomCount; i++)
            if (reference.Elements[i].AtomicNumber != other.Elements[i].AtomicNumber)
                throw new ArgumentException(
                    $"Atom {i + 1} is {other.Elements[i].Symbol} in the {otherName} but {reference.Elements[i].Symbol} in the {referenceName}: the atom order must be the same in every structure.", parameter);
    }

    private static string A(double x) => x.ToString("0.000", CultureInfo.InvariantCulture) + " Å";
}
