using Xunit.Sdk;

namespace BarrierLedger.Core.Tests.Support;

/// <summary>
/// The one place tolerances are checked. Every call names what is compared and where the reference value comes from,
/// so a failure message reads like a lab notebook line.
/// </summary>
public static class Close
{
    /// <summary>|actual − expected| ≤ absoluteTolerance.</summary>
    public static void Absolute(double expected, double actual, double absoluteTolerance, string what, string source)
    {
        if (!double.IsFinite(actual) || Math.Abs(actual - expected) > absoluteTolerance)
            throw new XunitException(
                $"{what}: got {actual:R}, expected {expected:R} ± {absoluteTolerance:G3} (source: {source}); off by {actual - expected:G4}.");
    }

    /// <summary>|actual − expected| ≤ relativeTolerance × |expected|.</summary>
    public static void Relative(double expected, double actual, double relativeTolerance, string what, string source)
    {
        var scale = Math.Abs(expected);
        if (!double.IsFinite(actual) || Math.Abs(actual - expected) > relativeTolerance * scale)
            throw new XunitException(
                $"{what}: got {actual:R}, expected {expected:R} within relative {relativeTolerance:G3} (source: {source}); relative error {(actual - expected) / scale:G4}.");
    }
}
