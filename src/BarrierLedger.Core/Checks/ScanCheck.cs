using System.Globalization;
using BarrierLedger.Core.Scans;

namespace BarrierLedger.Core.Checks;

/// <summary>Stable code of the summary reason of a scan check (the other codes are the <see cref="ScanFlagCodes"/>).</summary>
public static class ScanCheckCodes
{
    public const string Maximum = "scan.maximum";
}

/// <summary>The verdict on a relaxed scan with its reasons.</summary>
public sealed record ScanCheckResult(Verdict Verdict, IReadOnlyList<CheckReason> Reasons)
{
    public string Report() => CheckReport.Format(Verdict, Reasons);
}

/// <summary>
/// The verdict on an analysed relaxed scan (<see cref="ScanAnalysis"/>): Failed when fewer than two points converged
/// (there is no profile); Needs attention for every flagged point (a jump, a non-converged point, an irregular step, a bond
/// change besides the scanned one, no interior maximum), each flag becoming a reason with the same code; Passed otherwise.
/// The highest maximum and its barriers are added as information.
/// </summary>
public static class ScanCheck
{
    public static ScanCheckResult Run(ScanProfile profile)
    {
        ArgumentNullException.ThrowIfNull(profile);
        var reasons = new List<CheckReason>();
        foreach (var f in profile.Flags)
            reasons.Add(new(f.Code, f.Code == ScanFlagCodes.TooFewPoints ? CheckSeverity.Failure : CheckSeverity.Attention, f.Message));
        if (profile.HighestMaximum is { } top)
        {
            var barriers = new List<string>();
            if (profile.BarrierFromFirst is { } b1) barriers.Add($"{K(b1.KcalPerMol)} kcal/mol above the first point");
            if (profile.BarrierFromLowestBefore is { } b2 && profile.LowestBeforeIndex is { } low)
                barriers.Add($"{K(b2.KcalPerMol)} kcal/mol above the lowest point before it (point {low + 1})");
            reasons.Add(new(ScanCheckCodes.Maximum, CheckSeverity.Info,
                $"Highest maximum at {top.Coordinate.ToString("0.000", CultureInfo.InvariantCulture)} {profile.Unit} ({profile.Interpolation} interpolation), " +
                $"{string.Join(", ", barriers)}; nearest point {top.NearestPointIndex + 1}."));
        }
        var ordered = reasons.OrderByDescending(r => r.Severity).ToList();
        return new ScanCheckResult(CheckReason.VerdictOf(ordered), ordered);
    }

    private static string K(double x) => x.ToString("0.00", CultureInfo.InvariantCulture);
}
