using System.Globalization;
using BarrierLedger.Core.Chemistry;

namespace BarrierLedger.Core.Formats;

/// <summary>Number and element parsing rules shared by the text readers (documented in docs/formats.md).</summary>
internal static class Numbers
{
    /// <summary>
    /// Invariant culture, decimal point, optional exponent with E or e, and the Fortran D exponent (1.5D-03).
    /// NaN and infinities parse here; callers reject them with their own message.
    /// </summary>
    public static bool TryParseDouble(ReadOnlySpan<char> text, out double value)
    {
        if (double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out value)) return true;
        var d = text.IndexOfAny('D', 'd');
        if (d > 0 && d < text.Length - 1 && text.LastIndexOfAny('D', 'd') == d)
        {
            Span<char> copy = text.Length <= 128 ? stackalloc char[text.Length] : new char[text.Length];
            text.CopyTo(copy);
            copy[d] = 'E';
            return double.TryParse(copy, NumberStyles.Float, CultureInfo.InvariantCulture, out value);
        }
        return false;
    }

    public static bool TryParseInt(ReadOnlySpan<char> text, out int value) =>
        int.TryParse(text, NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out value);

    /// <summary>An element symbol (any case) or an atomic number.</summary>
    public static bool TryParseElement(string token, out Element element, out string error)
    {
        error = "";
        if (token.Length > 0 && char.IsAsciiDigit(token[0]))
        {
            if (TryParseInt(token, out var z) && Elements.TryGet(z, out element)) return true;
            element = null!;
            error = $"atomic number {TextInput.Quote(token)} is not in the element table";
            return false;
        }
        if (Elements.TryGet(token, out element)) return true;
        error = $"unknown element {TextInput.Quote(token)}: expected an element symbol such as C or Cl, or an atomic number";
        return false;
    }

    public static string Format(double v) => v.ToString("R", CultureInfo.InvariantCulture);
}
