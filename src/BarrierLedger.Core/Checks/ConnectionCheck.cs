using System.Collections.Immutable;
using System.Globalization;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Paths;

namespace BarrierLedger.Core.Checks;

/// <summary>Stable codes of the connection check.</summary>
public static class ConnectionCheckCodes
{
    public const string BothSides = "connection.both-sides";
    public const string OneSide = "connection.one-side";
    public const string OtherStates = "connection.other-states";
    public const string CannotTell = "connection.cannot-tell";
    public const string LargeRmsd = "connection.large-rmsd";
    public const string SameBonds = "connection.same-bonds";
    public const string PathMissesSaddle = "connection.path-misses-saddle";
    public const string Reversed = "connection.reversed";
    public const string BondEvents = "connection.bond-events";
}

/// <summary>Which states the saddle point's IRC (or endpoint pair) connects.</summary>
public enum Connection
{
    /// <summary>One end reaches the state before the saddle point, the other the state after it.</summary>
    BothSides,
    /// <summary>One end reaches a neighbouring state; the other does not reach the other neighbour.</summary>
    OneSide,
    /// <summary>Neither end reaches a neighbouring state: the saddle point connects other minima (named when they are states of the study).</summary>
    OtherStates,
    /// <summary>The evidence cannot decide (a missing direction, a state without geometry, states of other atoms); the reasons say why.</summary>
    CannotTell,
}

/// <summary>
/// The input of <see cref="ConnectionCheck.Run"/>: the saddle geometry, its neighbouring states, the other minimum states of the
/// study that hold the same atoms (to name where an end lands), and either an IRC path or a forward/backward endpoint pair.
/// Every structure of the path or pair lists the saddle point's atoms in the saddle point's order; the states' species may use
/// any order (they are matched by <see cref="AtomMapping"/>). Spectator species (in a state but not in the saddle point's
/// structure) must already be left out of the states.
/// </summary>
public sealed record ConnectionCheckInput(
    Molecule Saddle,
    StateStructure? Before,
    StateStructure? After,
    IReadOnlyList<StateStructure> OtherStates,
    ReactionPath? Path = null,
    Molecule? ForwardEnd = null,
    Molecule? BackwardEnd = null);

/// <summary>Settings of the connection check.</summary>
/// <param name="Endpoints">Bonds, atom mapping and the RMSD above which a matched end is flagged (default 0.5 Å: common practice, no source).</param>
/// <param name="SaddleFrameRmsdAngstrom">
/// The path's frame nearest the saddle geometry must lie within this RMSD of it, or the path may start from another saddle
/// point. Default 0.3 Å: common practice, no source.
/// </param>
/// <param name="TieRmsdAngstrom">
/// Two states an end matches bond for bond whose RMSDs differ by no more than this are a tie (default 0.001 Å, below the precision
/// of most stored geometries: common practice, no source). A tie between the two neighbouring states (an identity reaction such as
/// H2 + H → H + H2, or a conformational change) is settled for the pair of ends, so that they reach different sides when they can.
/// </param>
public sealed record ConnectionCheckOptions(EndpointMatchOptions? Endpoints = null, double SaddleFrameRmsdAngstrom = 0.3, double TieRmsdAngstrom = 0.001)
{
    public static ConnectionCheckOptions Default { get; } = new();
}

/// <summary>One end of the path (or one of the endpoint pair) and where it lands.</summary>
/// <param name="Name">"first frame", "last frame", "forward end" or "backward end".</param>
/// <param name="Geometry">The end's structure.</param>
/// <param name="Reached">The state it reaches (bond for bond; among several, the lowest RMSD), or null.</param>
/// <param name="ReachedIsNeighbour">The reached state is the state before or after the saddle point.</param>
/// <param name="Comparisons">The end against every candidate state, neighbours first.</param>
public sealed record ConnectionEnd(string Name, Molecule Geometry, StateMatchResult? Reached, bool ReachedIsNeighbour, ImmutableArray<StateMatchResult> Comparisons);

/// <summary>The verdict of the connection check.</summary>
/// <param name="Connection">Both sides, one side, other states or cannot tell.</param>
/// <param name="Verdict">Passed / Needs attention / Failed, from the reasons.</param>
/// <param name="Reasons">Failures first.</param>
/// <param name="Headline">One line for lists and the review queue.</param>
/// <param name="Ends">The ends examined (two, one for a path that runs one way, none when nothing could be compared).</param>
/// <param name="BondEvents">Bonds forming and breaking between neighbouring frames of the path.</param>
/// <param name="SaddleFrameRmsdAngstrom">RMSD of the path's nearest frame to the saddle geometry, when a path was given.</param>
public sealed record ConnectionCheckResult(
    Connection Connection,
    Verdict Verdict,
    IReadOnlyList<CheckReason> Reasons,
    string Headline,
    ImmutableArray<ConnectionEnd> Ends,
    ImmutableArray<PathBondEvent> BondEvents,
    double? SaddleFrameRmsdAngstrom)
{
    public string Report() => CheckReport.Format(Verdict, Reasons);
}

/// <summary>
/// Does the saddle point connect the states it is drawn between? Each end of its IRC (the path's first and last frames, or the
/// forward and backward endpoints) is compared with the state before and the state after the saddle point and with the study's
/// other minimum states by <see cref="EndpointMatch.AgainstState"/> (bond graph from covalent radii, Cordero et al., Dalton
/// Trans. 2008, 2832; per-piece atom mapping; Kabsch RMSD). Verdicts: both sides (passed; an end further than
/// <see cref="EndpointMatchOptions.RmsdAttentionAngstrom"/> from its state needs attention), one side (failed), other states
/// (failed, naming them), cannot tell (needs attention, saying why). Thresholds: common practice, no source.
/// </summary>
public static class ConnectionCheck
{
    public static ConnectionCheckResult Run(ConnectionCheckInput input, ConnectionCheckOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(input);
        ArgumentNullException.ThrowIfNull(input.Saddle);
        ArgumentNullException.ThrowIfNull(input.OtherStates);
        var o = options ?? ConnectionCheckOptions.Default;
        var eo = o.Endpoints ?? EndpointMatchOptions.Default;
        var saddle = input.Saddle;
        var reasons = new List<CheckReason>();
        var bondEvents = ImmutableArray<PathBondEvent>.Empty;
        double? saddleRmsd = null;

        // The ends.
        var ends = new List<(string Name, Molecule Geometry)>();
        if (input.Path is { } path)
        {
            if (input.ForwardEnd is not null || input.BackwardEnd is not null)
                throw new ArgumentException("Give either a path or an endpoint pair, not both.", nameof(input));
            if (!path.HasGeometries)
                return CannotTell(reasons, "The IRC path carries no structures, so its ends cannot be compared with the states.", bondEvents, null);
            if (!SameAtomsInOrder(saddle, path.First.Geometry!, out var why))
                return CannotTell(reasons, $"The IRC path does not list the saddle point's atoms: {why}.", bondEvents, null);
            bondEvents = path.BondEvents(eo.Connectivity);
            var nearest = path.SaddleFrame ?? Enumerable.Range(0, path.Frames.Length).MinBy(i => Kabsch.Rmsd(path.Frames[i].Geometry!, saddle));
            saddleRmsd = Kabsch.Rmsd(path.Frames[nearest].Geometry!, saddle);
            if (saddleRmsd > o.SaddleFrameRmsdAngstrom)
                reasons.Add(new(ConnectionCheckCodes.PathMissesSaddle, CheckSeverity.Attention,
                    $"No frame of the path lies within {A(o.SaddleFrameRmsdAngstrom)} of the saddle geometry (the nearest, frame {nearest + 1}, is {A(saddleRmsd.Value)} away): " +
                    "the path may have been followed from another saddle point."));
            if (nearest > 0) ends.Add(("first frame", path.First.Geometry!));
            if (nearest < path.Frames.Length - 1) ends.Add(("last frame", path.Last.Geometry!));
            if (ends.Count == 1)
                reasons.Add(new(ConnectionCheckCodes.CannotTell, CheckSeverity.Attention,
                    $"The path starts at the saddle point and runs one way only (to its {ends[0].Name}); the other direction is missing, so only one side can be checked. Upload both directions."));
            if (bondEvents.Length > 0)
                reasons.Add(new(ConnectionCheckCodes.BondEvents, CheckSeverity.Info, "Along the path " + DescribeEvents(bondEvents, path, saddle) + "."));
        }
        else
        {
            if (input.ForwardEnd is null || input.BackwardEnd is null)
                throw new ArgumentException("Give an IRC path or both endpoints (forward and backward).", nameof(input));
            foreach (var (name, g) in new[] { ("forward end", input.ForwardEnd), ("backward end", input.BackwardEnd) })
            {
                if (!SameAtomsInOrder(saddle, g, out var why))
                    return CannotTell(reasons, $"The {name} does not list the saddle point's atoms: {why}.", bondEvents, null);
                ends.Add((name, g));
            }
        }

        // The neighbouring states must be comparable with the saddle point.
        var formula = Formula.Of(saddle);
        var problems = new List<string>();
        foreach (var (state, side) in new[] { (input.Before, "before"), (input.After, "after") })
        {
            if (state is null) problems.Add($"the state {side} the saddle point has no geometry for every species");
            else if (state.Formula != formula)
                problems.Add($"the state {side} it, {state.Label}, holds {state.Formula} but the saddle point {formula} ({state.Formula.DifferenceFrom(formula)})");
        }
        var candidates = new List<(StateStructure State, bool Neighbour)>();
        if (input.Before is { } b && b.Formula == formula) candidates.Add((b, true));
        if (input.After is { } a && a.Formula == formula) candidates.Add((a, true));
        candidates.AddRange(input.OtherStates.Where(s => s.Formula == formula).Select(s => (s, false)));

        // Each end against every candidate; it reaches the lowest-RMSD state with its bonds, a neighbour first among ties.
        var matches = ends.Select(e => candidates.Select(c => EndpointMatch.AgainstState(e.Geometry, c.State, eo)).ToArray()).ToList();
        var reachedIndex = matches.Select(m => Best(m, candidates, o.TieRmsdAngstrom)).ToArray();
        SettleNeighbourTie(ends.Select(e => e.Geometry).ToList(), matches, reachedIndex, candidates, o.TieRmsdAngstrom, eo.Connectivity);
        var examined = ends.Select((e, k) => new ConnectionEnd(e.Name, e.Geometry, reachedIndex[k] is { } i ? matches[k][i] : null,
            reachedIndex[k] is { } j && candidates[j].Neighbour, [.. matches[k]])).ToImmutableArray();

        if (input.Before is { } sb && input.After is { } sa && sb.Formula == formula && sa.Formula == formula)
        {
            var same = candidates.Count >= 2 && EndpointMatch.AgainstStateStructures(sb, sa, eo);
            if (same)
                reasons.Add(new(ConnectionCheckCodes.SameBonds, CheckSeverity.Attention,
                    $"{sb.Label} and {sa.Label} have the same bonds (a conformational change?), so bonds cannot tell the two sides apart; the RMSD values decide which side an end reaches."));
        }

        // Counted by candidate, not by label: the two sides of an identity reaction may carry the same label.
        var reachedNeighbours = reachedIndex.Where(i => i is { } n && candidates[n].Neighbour).Distinct().ToList();
        Connection connection;
        string headline;
        if (problems.Count > 0)
        {
            connection = Connection.CannotTell;
            reasons.Add(new(ConnectionCheckCodes.CannotTell, CheckSeverity.Attention, $"Cannot tell which states the saddle point connects: {string.Join("; ", problems)}."));
            foreach (var e in examined)
                reasons.Add(new(ConnectionCheckCodes.CannotTell, CheckSeverity.Info, $"The {e.Name} {Landing(e)}."));
            headline = "cannot tell: " + problems[0];
        }
        else if (examined.Length == 2)
        {
            var (e1, e2) = (examined[0], examined[1]);
            if (reachedNeighbours.Count == 2)
            {
                connection = Connection.BothSides;
                reasons.Add(new(ConnectionCheckCodes.BothSides, CheckSeverity.Info,
                    $"The saddle point connects both sides: the {e1.Name} reaches {e1.Reached!.State} ({e1.Reached.Explanation}) and the {e2.Name} reaches {e2.Reached!.State} ({e2.Reached.Explanation})."));
                headline = $"connects {e1.Reached.State} and {e2.Reached.State}";
                if (input.Path is null && reachedIndex[0] == 0) // candidate 0 is the state before
                    reasons.Add(new(ConnectionCheckCodes.Reversed, CheckSeverity.Info,
                        $"The forward end reaches the state before the saddle point ({input.Before!.Label}) and the backward end the state after it: the direction labels are the other way round, the chemistry is the same."));
            }
            else if (reachedNeighbours.Count == 1)
            {
                connection = Connection.OneSide;
                var hit = e1.ReachedIsNeighbour ? e1 : e2;
                var miss = ReferenceEquals(hit, e1) ? e2 : e1;
                var hitIndex = reachedIndex[ReferenceEquals(hit, e1) ? 0 : 1]!.Value;
                var missing = candidates.Select((c, i) => (c, i)).First(x => x.c.Neighbour && x.i != hitIndex).c.State.Label;
                var where = miss.ReachedIsNeighbour ? $"falls back to {miss.Reached!.State} as well" : Landing(miss);
                reasons.Add(new(ConnectionCheckCodes.OneSide, CheckSeverity.Failure,
                    $"The saddle point connects one side only: the {hit.Name} reaches {hit.Reached!.State}, but the {miss.Name} {where}, not {missing}. " +
                    "It is the saddle point of another reaction; find the one that leads to " + missing + "."));
                headline = miss.Reached is { } other && !miss.ReachedIsNeighbour
                    ? $"connects {hit.Reached.State} with {other.State}, not {missing}"
                    : miss.ReachedIsNeighbour ? $"both ends reach {hit.Reached.State}; never reaches {missing}"
                    : $"reaches {hit.Reached.State}; the other end reaches no state of the study, not {missing}";
            }
            else
            {
                connection = Connection.OtherStates;
                var named = examined.Where(e => e.Reached is not null).Select(e => e.Reached!.State).Distinct().ToList();
                reasons.Add(new(ConnectionCheckCodes.OtherStates, CheckSeverity.Failure,
                    $"The saddle point connects other states than {input.Before!.Label} and {input.After!.Label}: the {e1.Name} {Landing(e1)}, and the {e2.Name} {Landing(e2)}."));
                headline = named.Count > 0 ? $"connects {string.Join(" and ", named)}, not {input.Before.Label} and {input.After.Label}"
                    : $"connects minima that are not states of the study, not {input.Before.Label} and {input.After.Label}";
            }
        }
        else if (examined.Length == 1)
        {
            var e = examined[0];
            if (e.ReachedIsNeighbour)
            {
                connection = Connection.CannotTell;
                headline = $"reaches {e.Reached!.State}; the other direction is missing";
                reasons.Add(new(ConnectionCheckCodes.CannotTell, CheckSeverity.Info, $"The {e.Name} reaches {e.Reached.State} ({e.Reached.Explanation})."));
            }
            else
            {
                connection = Connection.OtherStates;
                headline = e.Reached is { } r ? $"leads to {r.State}, not {input.Before!.Label} or {input.After!.Label}" : $"leads to a minimum that is not a state of the study";
                reasons.Add(new(ConnectionCheckCodes.OtherStates, CheckSeverity.Failure,
                    $"The one direction given leads elsewhere: the {e.Name} {Landing(e)}, neither {input.Before!.Label} nor {input.After!.Label}."));
            }
        }
        else
        {
            connection = Connection.CannotTell;
            headline = "cannot tell: the path has no end beyond the saddle point";
            reasons.Add(new(ConnectionCheckCodes.CannotTell, CheckSeverity.Attention, "The path has no frame beyond the saddle point on either side, so it shows nothing about where the saddle point leads."));
        }

        foreach (var e in examined.Where(e => e.ReachedIsNeighbour && e.Reached!.RmsdAngstrom > eo.RmsdAttentionAngstrom))
            reasons.Add(new(ConnectionCheckCodes.LargeRmsd, CheckSeverity.Attention,
                $"The {e.Name} has the bonds of {e.Reached!.State} but lies {A(e.Reached.RmsdAngstrom)} from its optimised geometry after superposition (more than {A(eo.RmsdAttentionAngstrom)}): " +
                "another conformer, or an IRC not followed to the end. Optimise the end and compare again."));

        var ordered = reasons.OrderByDescending(r => r.Severity).ToList();
        return new ConnectionCheckResult(connection, CheckReason.VerdictOf(ordered), ordered, headline, examined, bondEvents, saddleRmsd);
    }

    /// <summary>The candidate an end reaches: same bonds, lowest RMSD; among states within <paramref name="tie"/> of it, a neighbour first.</summary>
    private static int? Best(StateMatchResult[] m, List<(StateStructure State, bool Neighbour)> candidates, double tie)
    {
        var same = Enumerable.Range(0, m.Length).Where(i => m[i].SameBonds).ToList();
        if (same.Count == 0) return null;
        var lowest = same.Min(i => m[i].RmsdAngstrom);
        return same.Where(i => m[i].RmsdAngstrom <= lowest + tie).OrderBy(i => candidates[i].Neighbour ? 0 : 1).ThenBy(i => m[i].RmsdAngstrom).First();
    }

    /// <summary>
    /// Both ends reach the same neighbour although one of them ties with the other neighbour (same bonds, RMSD within
    /// <paramref name="tie"/>): that end is moved to the other neighbour (the one that gives up least RMSD), so a symmetric pair of
    /// ends is not read as "one side". Only ends with different bonds (in the saddle point's atom order) are split: two ends with the
    /// same bonds are one minimum, and without a tie nothing changes either, so ends that really fall back to one state stay there.
    /// </summary>
    private static void SettleNeighbourTie(List<Molecule> ends, List<StateMatchResult[]> matches, int?[] reached,
        List<(StateStructure State, bool Neighbour)> candidates, double tie, ConnectivityOptions? bonds)
    {
        if (reached.Length != 2 || reached[0] is not { } a || reached[0] != reached[1] || !candidates[a].Neighbour) return;
        if (Connectivity.Of(ends[0], bonds).SameAs(Connectivity.Of(ends[1], bonds))) return;
        var other = Enumerable.Range(0, candidates.Count).Where(i => i != a && candidates[i].Neighbour).Cast<int?>().FirstOrDefault();
        if (other is not { } b) return;
        var movable = Enumerable.Range(0, 2)
            .Where(k => matches[k][b].SameBonds && matches[k][b].RmsdAngstrom <= matches[k][a].RmsdAngstrom + tie)
            .OrderBy(k => matches[k][b].RmsdAngstrom - matches[k][a].RmsdAngstrom).Cast<int?>().FirstOrDefault();
        if (movable is { } k) reached[k] = b;
    }

    private static ConnectionCheckResult CannotTell(List<CheckReason> reasons, string message, ImmutableArray<PathBondEvent> events, double? saddleRmsd)
    {
        reasons.Add(new(ConnectionCheckCodes.CannotTell, CheckSeverity.Attention, message));
        var ordered = reasons.OrderByDescending(r => r.Severity).ToList();
        return new ConnectionCheckResult(Connection.CannotTell, CheckReason.VerdictOf(ordered), ordered, "cannot tell: " + char.ToLowerInvariant(message[0]) + message[1..].TrimEnd('.'), [], events, saddleRmsd);
    }

    /// <summary>"lands on fluoroethane (…)" or "reaches no state of the study (compared with X: …)".</summary>
    private static string Landing(ConnectionEnd e)
    {
        if (e.Reached is { } r) return $"lands on {r.State} ({r.Explanation})";
        if (e.Comparisons.Length == 0) return "could not be compared with any state";
        var first = e.Comparisons[0];
        return $"reaches no state of the study (compared with {first.State}, {first.Explanation})";
    }

    private static string DescribeEvents(ImmutableArray<PathBondEvent> events, ReactionPath path, Molecule labels)
    {
        var parts = new List<string>();
        foreach (var ev in events.Take(6))
        {
            var at = $"at {(ev.Coordinate >= 0 ? "+" : "−")}{Math.Abs(ev.Coordinate).ToString("0.00", CultureInfo.InvariantCulture)} {path.Unit}";
            // A bond forms in the direction of travel away from the saddle point; read the path outwards from it.
            var outwards = ev.Coordinate >= 0;
            var formed = outwards ? ev.Formed : ev.Broken;
            var broken = outwards ? ev.Broken : ev.Formed;
            if (formed.Length > 0) parts.Add($"{string.Join(", ", formed.Select(b => b.Label(labels)))} form{(formed.Length == 1 ? "s" : "")} {at}");
            if (broken.Length > 0) parts.Add($"{string.Join(", ", broken.Select(b => b.Label(labels)))} break{(broken.Length == 1 ? "s" : "")} {at}");
        }
        if (events.Length > 6) parts.Add($"{events.Length - 6} more changes");
        return string.Join("; ", parts) + " (read outwards from the saddle point)";
    }

    internal static bool SameAtomsInOrder(Molecule reference, Molecule other, out string why)
    {
        if (reference.AtomCount != other.AtomCount)
        {
            why = $"it has {other.AtomCount} atoms, the saddle point {reference.AtomCount}";
            return false;
        }
        for (var i = 0; i < reference.AtomCount; i++)
            if (reference.Elements[i].AtomicNumber != other.Elements[i].AtomicNumber)
            {
                why = $"atom {i + 1} is {other.Elements[i].Symbol} there but {reference.Elements[i].Symbol} in the saddle point (an IRC keeps the saddle point's atom order)";
                return false;
            }
        why = "";
        return true;
    }

    private static string A(double x) => x.ToString("0.000", CultureInfo.InvariantCulture) + " Å";
}
