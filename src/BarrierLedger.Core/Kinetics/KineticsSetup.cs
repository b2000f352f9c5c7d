using System.Globalization;

namespace BarrierLedger.Core.Kinetics;

/// <summary>
/// What a reaction's definition says about its kinetics, so nobody picks it on screen each time: the saddle points (state labels)
/// that compete from one state (for the selectivity, under Curtin–Hammett conditions), whether they give enantiomers (report ee),
/// and the conditions a chemist would run it at (the kinetics section's starting temperature and time span).
/// </summary>
/// <param name="CompetingChannels">Labels of saddle-point states of the reaction that compete (two or more), or empty.</param>
/// <param name="Enantiomeric">True when the (two) channels give the two enantiomers of one product.</param>
/// <param name="TemperatureKelvin">Temperature of the run, or null for the energy model's.</param>
/// <param name="TimeHours">Time span of the run, or null for 24 h.</param>
public sealed record KineticsSetup(IReadOnlyList<string>? CompetingChannels = null, bool Enantiomeric = false, double? TemperatureKelvin = null, double? TimeHours = null)
{
    /// <summary>Highest temperature accepted (K).</summary>
    public const double MaximumKelvin = 2000.0;

    /// <summary>Longest time span accepted (h): 100 years.</summary>
    public const double MaximumHours = 100 * 365.25 * 24;

    /// <summary>The channels, never null.</summary>
    [System.Text.Json.Serialization.JsonIgnore] public IReadOnlyList<string> Channels => CompetingChannels ?? [];

    /// <summary>True when nothing is set.</summary>
    [System.Text.Json.Serialization.JsonIgnore] public bool IsEmpty => Channels.Count == 0 && !Enantiomeric && TemperatureKelvin is null && TimeHours is null;

    /// <summary>
    /// Problems with this setup for a reaction whose states are <paramref name="states"/> (label, is a saddle point), each as
    /// (the key it concerns, what is wrong); empty when it can be stored.
    /// </summary>
    public IReadOnlyList<(string Key, string Message)> Problems(IReadOnlyList<(string Label, bool IsSaddlePoint)> states)
    {
        ArgumentNullException.ThrowIfNull(states);
        var problems = new List<(string, string)>();
        var seen = new HashSet<string>(StringComparer.Ordinal);
        foreach (var c in Channels)
        {
            var label = (c ?? "").Trim();
            var matches = states.Where(s => s.Label.Trim() == label).ToList();
            if (matches.Count == 0)
                problems.Add(("competing_channels", $"names '{label}', which is not a state of this reaction; expected one of its saddle points: {SaddleList(states)}"));
            else if (!matches.Any(s => s.IsSaddlePoint))
                problems.Add(("competing_channels", $"names '{label}', which is a minimum; a competing channel is a saddle point ({SaddleList(states)})"));
            else if (matches.Count > 1)
                problems.Add(("competing_channels", $"names '{label}', which labels {matches.Count} states; give the saddle points distinct labels"));
            if (!seen.Add(label)) problems.Add(("competing_channels", $"names '{label}' twice"));
        }
        if (Channels.Count == 1) problems.Add(("competing_channels", "names one saddle point; competing channels come two or more at a time"));
        if (Enantiomeric && Channels.Count != 2)
            problems.Add(("enantiomeric", $"needs exactly two competing channels (the two enantiomers), found {Channels.Count}"));
        if (TemperatureKelvin is { } t && !(t > 0 && t <= MaximumKelvin))
            problems.Add(("temperature_kelvin", $"is {t.ToString(CultureInfo.InvariantCulture)}; expected a temperature above 0 and at most {MaximumKelvin:0} K"));
        if (TimeHours is { } h && !(h > 0 && h <= MaximumHours))
            problems.Add(("time_hours", $"is {h.ToString(CultureInfo.InvariantCulture)}; expected a time span above 0 and at most {MaximumHours:0} h (100 years)"));
        return problems;
    }

    private static string SaddleList(IReadOnlyList<(string Label, bool IsSaddlePoint)> states)
    {
        var saddles = states.Where(s => s.IsSaddlePoint).Select(s => $"'{s.Label.Trim()}'").ToList();
        return saddles.Count == 0 ? "(it has none)" : string.Join(", ", saddles);
    }
}
