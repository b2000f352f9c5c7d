using System.Globalization;
using BarrierLedger.Core.Diagrams;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Web.Components.Shared;

/// <summary>How numbers are written on screen: fixed decimals, true minus signs, rate constants in powers of ten, half-lives in words.</summary>
public static class Display
{
    public static string Energy(Energy? e, EnergyUnit unit, int decimals = 1) =>
        e is { } v ? EnergyDiagram.FormatValue(v.In(unit), decimals) : "—";

    public static string EnergyHartree(double? hartree, EnergyUnit unit, int decimals = 1) =>
        hartree is { } h ? Energy(Core.Units.Energy.FromHartree(h), unit, decimals) : "—";

    /// <summary>1.36e-2 → "1.36 × 10⁻²".</summary>
    public static string Scientific(double? value, int significant = 3)
    {
        if (value is not { } v || !double.IsFinite(v)) return "—";
        if (v == 0) return "0";
        var exponent = (int)Math.Floor(Math.Log10(Math.Abs(v)));
        var mantissa = v / Math.Pow(10, exponent);
        if (Math.Round(Math.Abs(mantissa), significant - 1) >= 10) { mantissa /= 10; exponent++; }
        var m = mantissa.ToString("F" + (significant - 1), CultureInfo.InvariantCulture);
        if (exponent == 0) return m;
        return $"{m} × 10{Superscript(exponent)}";
    }

    private static string Superscript(int n)
    {
        const string digits = "⁰¹²³⁴⁵⁶⁷⁸⁹";
        var s = Math.Abs(n).ToString(CultureInfo.InvariantCulture).Select(c => digits[c - '0']);
        return (n < 0 ? "⁻" : "") + string.Concat(s);
    }

    /// <summary>A half-life in the largest unit that keeps it readable: "51 s", "3.2 h", "4.1 d", "2.0 × 10³ yr".</summary>
    public static string Duration(double? seconds)
    {
        if (seconds is not { } s || !double.IsFinite(s)) return "—";
        const double minute = 60, hour = 3600, day = 86400, year = 365.25 * 86400;
        return s switch
        {
            < 1e-3 => Scientific(s) + " s",
            < 1 => $"{s * 1000:F0} ms",
            < minute => $"{s:F0} s",
            < hour => $"{s / minute:F1} min",
            < day => $"{s / hour:F1} h",
            < year => $"{s / day:F1} d",
            < 1000 * year => $"{s / year:F1} yr",
            _ => Scientific(s / year, 2) + " yr",
        };
    }

    public static string Kelvin(double? t) => t is { } v ? $"{v:F2} K" : "—";

    /// <summary>A calculation kind in words: "saddle point", "relaxed scan".</summary>
    public static string Kind(BarrierLedger.Core.Chemistry.CalculationKind kind) => BarrierLedger.Core.Chemistry.CalculationKindWords.Words(kind);

    /// <summary>Imaginary wavenumbers as written on screen ("512i, 38i cm⁻¹"), or what is missing.</summary>
    public static string Imaginary(IReadOnlyList<double> imaginaryCm1, int frequencyCount, bool hasHessian)
    {
        if (frequencyCount == 0) return hasHessian ? "Hessian stored" : "no frequencies";
        if (imaginaryCm1.Count == 0) return "none";
        return string.Join(", ", imaginaryCm1.Select(f => $"{-f:F0}i")) + " cm⁻¹";
    }

    /// <summary>A stored time in UTC, to the minute.</summary>
    public static string When(DateTimeOffset at) => at.UtcDateTime.ToString("yyyy-MM-dd HH:mm", CultureInfo.InvariantCulture) + " UTC";
}
