using System.Collections.Frozen;
using System.Globalization;

namespace BarrierLedger.Core.Chemistry;

/// <summary>
/// Isotope masses for isotopologues: every naturally occurring isotope of H–Rn, plus ³H (T) and ¹⁴C as labels, and for
/// Tc, Pm, Po, At and Rn the longest-lived isotope of the element table. Masses (Da) by row source (<see cref="MassSource"/>):
/// <list type="bullet">
/// <item>the parent (most abundant) isotope of each element: the element table's mass, so that the parent isotopologue has the
/// masses of every other frequency analysis;</item>
/// <item>²H, ³H, ¹³C, ¹⁴C, ¹⁵N, ¹⁷O, ¹⁸O, ³³S, ³⁴S, ³⁶S, ³⁷Cl, ⁸¹Br, the isotopes kinetic isotope effects use most: AME2020
/// (Huang et al., Chin. Phys. C 45, 030002 (2021)), typed from memory and cross-checked against AME2003 below (all within 10⁻⁵ Da),
/// and ²H and ³H against CODATA 2018 nuclear masses in the tests;</item>
/// <item>the other naturally occurring isotopes: AME2003 (Audi, Wapstra and Thibault, Nucl. Phys. A 729, 337 (2003)), as carried by
/// Debian's python3-periodictable 1.6.0, from which the rows were written once; the isotopic compositions likewise (IUPAC, Rosman
/// and Taylor 1998).</item>
/// </list>
/// Lookup by label: "2H", "D", "T", "13C", "C13", "37Cl", "18-O" (mass number before or after the symbol, case-insensitive symbol).
/// </summary>
public static partial class Isotopes
{
    private static readonly Isotope[] s_all = BuildTable();
    private static readonly FrozenDictionary<(int Z, int A), Isotope> s_byNuclide = s_all.ToFrozenDictionary(i => (i.AtomicNumber, i.MassNumber));
    private static readonly FrozenDictionary<int, Isotope> s_parent = s_all.Where(i => i.IsParent).ToFrozenDictionary(i => i.AtomicNumber);

    /// <summary>Every isotope in the table, by atomic number then mass number.</summary>
    public static IReadOnlyList<Isotope> All => s_all;

    /// <summary>The isotopes of one element in the table, lightest first.</summary>
    public static IReadOnlyList<Isotope> Of(Element element) => [.. s_all.Where(i => i.AtomicNumber == element.AtomicNumber)];

    /// <summary>The isotope whose mass the element table uses (the parent of every isotopologue).</summary>
    public static Isotope Parent(Element element) =>
        s_parent.TryGetValue(element.AtomicNumber, out var i) ? i : throw new ArgumentException($"No isotope of {element.Symbol} in the table.", nameof(element));

    /// <summary>The nuclide with this atomic number and mass number, if the table has it.</summary>
    public static bool TryGet(int atomicNumber, int massNumber, out Isotope isotope) =>
        s_byNuclide.TryGetValue((atomicNumber, massNumber), out isotope!);

    /// <summary>
    /// Reads "2H", "D", "T", "13C", "C13", "C-13", "13-C", "¹³C" (case-insensitive symbol). False with the reason when the text is
    /// not an isotope label or the table lacks the nuclide.
    /// </summary>
    public static bool TryParse(string text, out Isotope isotope, out string error)
    {
        isotope = null!;
        var t = (text ?? "").Trim().Replace("-", "", StringComparison.Ordinal);
        t = string.Concat(t.Select(c => "⁰¹²³⁴⁵⁶⁷⁸⁹".IndexOf(c) is var d and >= 0 ? (char)('0' + d) : c));
        if (t is "D" or "d") t = "2H";
        else if (t is "T" or "t") t = "3H";
        var digits = new string(t.Where(char.IsAsciiDigit).ToArray());
        var letters = new string(t.Where(char.IsAsciiLetter).ToArray());
        var wellFormed = digits.Length > 0 && letters.Length > 0 && digits.Length + letters.Length == t.Length
                         && (t.StartsWith(digits, StringComparison.Ordinal) || t.EndsWith(digits, StringComparison.Ordinal));
        if (!wellFormed)
        {
            error = $"'{text}' is not an isotope label: write the mass number and the symbol, e.g. 2H (or D), 3H (or T), 13C, 15N, 18O, 37Cl.";
            return false;
        }
        if (!Elements.TryGet(letters, out var element))
        {
            error = $"'{text}': unknown element symbol '{letters}'.";
            return false;
        }
        var massNumber = int.Parse(digits, CultureInfo.InvariantCulture);
        if (!TryGet(element.AtomicNumber, massNumber, out isotope))
        {
            var known = string.Join(", ", Of(element).Select(i => i.Label));
            error = $"'{text}': the isotope table has no {massNumber}{element.Symbol}; isotopes of {element.Symbol} in it: {known}.";
            return false;
        }
        error = "";
        return true;
    }

    /// <summary>As <see cref="TryParse"/>; throws <see cref="ArgumentException"/> with the reason.</summary>
    public static Isotope Parse(string text) =>
        TryParse(text, out var i, out var error) ? i : throw new ArgumentException(error, nameof(text));
}
