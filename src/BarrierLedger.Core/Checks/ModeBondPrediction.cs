using System.Collections.Immutable;
using System.Globalization;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Vibrations;

namespace BarrierLedger.Core.Checks;

/// <summary>Stable codes of the bond-change prediction from the imaginary mode.</summary>
public static class ModePredictionCodes
{
    public const string Agrees = "mode-prediction.agrees";
    public const string AgreesInKind = "mode-prediction.agrees-in-kind";
    public const string Disagrees = "mode-prediction.disagrees";
    public const string CannotTell = "mode-prediction.cannot-tell";
}

/// <summary>How the bonds the mode makes and breaks compare with the neighbouring states.</summary>
public enum ModePredictionOutcome
{
    /// <summary>Displaced one way the saddle point has the bonds of one neighbouring state, the other way those of the other.</summary>
    Agrees,
    /// <summary>The same numbers of each kind of bond form and break as between the states, but the displaced structures are not the states bond for bond.</summary>
    AgreesInKind,
    /// <summary>The mode forms and breaks other bonds than those that differ between the states.</summary>
    Disagrees,
    /// <summary>The states cannot be compared (no geometry, other atoms).</summary>
    CannotTell,
}

/// <summary>Settings of the prediction.</summary>
/// <param name="DistanceChangeAngstrom">
/// The displacement is scaled so that the interatomic distance that changes fastest along the mode changes by this much each way.
/// Default 0.5 Å: common practice, no source (enough to carry a forming bond at 2.2 Å inside the 1.2 × radius-sum cut-off, small
/// enough to leave the other bonds intact).
/// </param>
/// <param name="MaxAmplitudeAngstrom">The displacement's length √Σ|Δrᵢ|² never exceeds this. Default 1.5 Å: common practice, no source.</param>
/// <param name="Endpoints">Bonds and atom mapping.</param>
/// <param name="LongContactFactor">Pairs considered for the fastest-changing distance (see <see cref="DistanceChangeOptions"/>).</param>
public sealed record ModePredictionOptions(double DistanceChangeAngstrom = 0.5, double MaxAmplitudeAngstrom = 1.5, EndpointMatchOptions? Endpoints = null, double LongContactFactor = 2.0)
{
    public static ModePredictionOptions Default { get; } = new();
}

/// <summary>The prediction and its comparison with the states.</summary>
/// <param name="Outcome">Agrees, agrees in kind, disagrees, cannot tell.</param>
/// <param name="Reasons">One reason with a stable code (info when it agrees, attention otherwise).</param>
/// <param name="AmplitudeAngstrom">The length of the displacement used each way, Å.</param>
/// <param name="Plus">The saddle geometry displaced by +amplitude along the mode.</param>
/// <param name="Minus">Displaced by −amplitude.</param>
/// <param name="PlusOnly">Bonds present at +amplitude and absent at −amplitude.</param>
/// <param name="MinusOnly">Bonds present at −amplitude and absent at +amplitude.</param>
/// <param name="StateChange">Bond counts by kind, after minus before ("C–C" → +2), when both states are comparable.</param>
public sealed record ModePrediction(
    ModePredictionOutcome Outcome,
    IReadOnlyList<CheckReason> Reasons,
    double AmplitudeAngstrom,
    Molecule Plus,
    Molecule Minus,
    ImmutableArray<Bond> PlusOnly,
    ImmutableArray<Bond> MinusOnly,
    IReadOnlyDictionary<string, int>? StateChange)
{
    /// <summary>"C1–C6, C4–C5 form one way and break the other" style text.</summary>
    public string Describe(Molecule labels)
    {
        if (PlusOnly.IsEmpty && MinusOnly.IsEmpty) return "no bond forms or breaks either way";
        var parts = new List<string>();
        if (PlusOnly.Length > 0) parts.Add($"{string.Join(", ", PlusOnly.Select(b => b.Label(labels)))} present one way");
        if (MinusOnly.Length > 0) parts.Add($"{string.Join(", ", MinusOnly.Select(b => b.Label(labels)))} present the other way");
        return string.Join(", ", parts);
    }
}

/// <summary>
/// Which bonds the imaginary mode makes and breaks, without an IRC: the saddle geometry is displaced both ways along the mode's
/// Cartesian displacement d (normalised), x± = x₀ ± A d, with A chosen so that the fastest-changing interatomic distance (bonded
/// pairs and long contacts, <see cref="DistanceChanges"/>) changes by <see cref="ModePredictionOptions.DistanceChangeAngstrom"/>,
/// at most <see cref="ModePredictionOptions.MaxAmplitudeAngstrom"/>; the bond graphs of x₊ and x₋ (covalent radii, Cordero et al.,
/// Dalton Trans. 2008, 2832) are compared with the neighbouring states (<see cref="EndpointMatch.AgainstState"/>, bonds only) and,
/// failing that, by the numbers of each kind of bond (C–C, C–H, …) that form and break. It catches gross cases (a mode that makes
/// no bond, or other bonds than the reaction), not subtle ones; the IRC remains the evidence (<see cref="ConnectionCheck"/>).
/// </summary>
public static class ModeBondPrediction
{
    public static ModePrediction Run(Molecule saddle, NormalMode mode, StateStructure? before, StateStructure? after, ModePredictionOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(saddle);
        ArgumentNullException.ThrowIfNull(mode);
        var o = options ?? ModePredictionOptions.Default;
        if (!(o.DistanceChangeAngstrom > 0) || !(o.MaxAmplitudeAngstrom > 0)) throw new ArgumentException("Distance change and amplitude must be positive.", nameof(options));
        if (mode.DisplacementCartesian.Length != saddle.AtomCount)
            throw new ArgumentException($"The mode has {mode.DisplacementCartesian.Length} atom displacements but the saddle point {saddle.AtomCount} atoms.", nameof(mode));
        var eo = o.Endpoints ?? EndpointMatchOptions.Default;
        var d = mode.DisplacementCartesian;
        var norm = Math.Sqrt(d.Sum(v => v.LengthSquared));
        if (!(norm > 0)) throw new ArgumentException("The mode's displacement is zero.", nameof(mode));
        var unit = d.Select(v => v / norm).ToArray();
        var g0 = Connectivity.Of(saddle, eo.Connectivity);
        var changes = DistanceChanges.Along(saddle, unit, new DistanceChangeOptions(o.LongContactFactor, eo.Connectivity), g0);
        var fastest = changes.IsEmpty ? 0 : Math.Abs(changes[0].ChangePerUnitDisplacement);
        var amplitude = fastest > 0 ? Math.Min(o.DistanceChangeAngstrom / fastest, o.MaxAmplitudeAngstrom) : o.MaxAmplitudeAngstrom;
        Molecule Displaced(double s) => new(saddle.Elements, saddle.PositionsAngstrom.Select((p, i) => p + s * unit[i]), saddle.Charge, saddle.Multiplicity);
        var plus = Displaced(amplitude);
        var minus = Displaced(-amplitude);
        var gPlus = Connectivity.Of(plus, eo.Connectivity);
        var gMinus = Connectivity.Of(minus, eo.Connectivity);
        var (plusOnly, minusOnly) = gMinus.Compare(gPlus);
        var amp = amplitude.ToString("0.00", CultureInfo.InvariantCulture);
        var predicted = Describe(plusOnly, minusOnly, saddle);

        var formula = Formula.Of(saddle);
        if (before is null || after is null || before.Formula != formula || after.Formula != formula)
        {
            var why = before is null || after is null ? "a neighbouring state has no geometry for every species" : "the neighbouring states do not hold the saddle point's atoms";
            return new ModePrediction(ModePredictionOutcome.CannotTell,
                [new(ModePredictionCodes.CannotTell, CheckSeverity.Info, $"Displaced by ±{amp} Å along the imaginary mode, {predicted}; {why}, so this cannot be compared with the reaction.")],
                amplitude, plus, minus, plusOnly, minusOnly, null);
        }

        var stateChange = KindChange(before, after, eo);
        bool Is(Molecule m, Connectivity g, StateStructure s) => EndpointMatch.AgainstState(m, s, eo, g).SameBonds;
        var forward = Is(minus, gMinus, before) && Is(plus, gPlus, after);
        var backward = Is(minus, gMinus, after) && Is(plus, gPlus, before);
        var predictedKinds = KindChangeOf(saddle, plusOnly, minusOnly);
        var states = $"{before.Label} → {after.Label}";
        if (forward || backward)
        {
            return new ModePrediction(ModePredictionOutcome.Agrees,
                [new(ModePredictionCodes.Agrees, CheckSeverity.Info,
                    $"The imaginary mode leads to the states drawn: displaced by ±{amp} Å along it, the saddle point has the bonds of {before.Label} one way and of {after.Label} the other ({predicted}).")],
                amplitude, plus, minus, plusOnly, minusOnly, stateChange);
        }
        var negated = predictedKinds.ToDictionary(kv => kv.Key, kv => -kv.Value);
        if (predictedKinds.Count > 0 && (SameCounts(predictedKinds, stateChange) || SameCounts(negated, stateChange)))
        {
            return new ModePrediction(ModePredictionOutcome.AgreesInKind,
                [new(ModePredictionCodes.AgreesInKind, CheckSeverity.Info,
                    $"Displaced by ±{amp} Å along the imaginary mode, {predicted}: the same kinds of bonds change as between {states} ({Kinds(stateChange)}), " +
                    "though the displaced structures are not the states bond for bond. The IRC decides.")],
                amplitude, plus, minus, plusOnly, minusOnly, stateChange);
        }
        var leading = DistanceChanges.Leading(changes).Select(c => c.Describe()).ToList();
        return new ModePrediction(ModePredictionOutcome.Disagrees,
            [new(ModePredictionCodes.Disagrees, CheckSeverity.Attention,
                $"The imaginary mode does not make the reaction's bond changes: displaced by ±{amp} Å along it, {predicted}, while {states} " +
                $"{(stateChange.Count == 0 ? "changes no bond (a conformational change)" : "changes " + Kinds(stateChange))}. " +
                (leading.Count > 0 ? $"The distances that change most along the mode: {string.Join("; ", leading)}. " : "") +
                "The saddle point may belong to another reaction: follow its IRC.")],
            amplitude, plus, minus, plusOnly, minusOnly, stateChange);
    }

    private static string Describe(ImmutableArray<Bond> plusOnly, ImmutableArray<Bond> minusOnly, Molecule labels)
    {
        if (plusOnly.IsEmpty && minusOnly.IsEmpty) return "no bond forms or breaks";
        var parts = new List<string>();
        if (plusOnly.Length > 0) parts.Add($"{string.Join(", ", plusOnly.Select(b => b.Label(labels)))} {(plusOnly.Length == 1 ? "forms" : "form")} one way");
        if (minusOnly.Length > 0) parts.Add($"{string.Join(", ", minusOnly.Select(b => b.Label(labels)))} {(minusOnly.Length == 1 ? "forms" : "form")} the other way");
        return string.Join(" and ", parts);
    }

    /// <summary>Bond counts by kind of the state after minus the state before.</summary>
    private static Dictionary<string, int> KindChange(StateStructure before, StateStructure after, EndpointMatchOptions o)
    {
        var result = new Dictionary<string, int>(StringComparer.Ordinal);
        void Add(StateStructure s, int sign)
        {
            foreach (var sp in s.Species)
                foreach (var (k, n) in AtomMapping.BondKinds(sp.Geometry, Connectivity.Of(sp.Geometry, o.Connectivity)))
                    result[k] = result.GetValueOrDefault(k) + sign * n * sp.Count;
        }
        Add(after, 1);
        Add(before, -1);
        foreach (var k in result.Where(kv => kv.Value == 0).Select(kv => kv.Key).ToList()) result.Remove(k);
        return result;
    }

    private static Dictionary<string, int> KindChangeOf(Molecule m, ImmutableArray<Bond> plusOnly, ImmutableArray<Bond> minusOnly)
    {
        var result = new Dictionary<string, int>(StringComparer.Ordinal);
        foreach (var (bonds, sign) in new[] { (plusOnly, 1), (minusOnly, -1) })
            foreach (var b in bonds)
            {
                var k = AtomMapping.PairKey(m.Elements[b.A].Symbol, m.Elements[b.B].Symbol);
                result[k] = result.GetValueOrDefault(k) + sign;
            }
        foreach (var k in result.Where(kv => kv.Value == 0).Select(kv => kv.Key).ToList()) result.Remove(k);
        return result;
    }

    private static bool SameCounts(IReadOnlyDictionary<string, int> a, IReadOnlyDictionary<string, int> b) =>
        a.Count == b.Count && a.All(kv => b.TryGetValue(kv.Key, out var v) && v == kv.Value);

    /// <summary>"+2 C–C, −1 C–F" (bonds gained and lost by kind).</summary>
    public static string Kinds(IReadOnlyDictionary<string, int> change) =>
        change.Count == 0 ? "no bond" : string.Join(", ", change.OrderBy(kv => kv.Key, StringComparer.Ordinal)
            .Select(kv => $"{(kv.Value > 0 ? "+" : "−")}{Math.Abs(kv.Value)} {kv.Key}"));
}
