using System.Globalization;
using System.Text.RegularExpressions;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Ledger.Reactions;

namespace BarrierLedger.Web.Components.Pages.Builder;

/// <summary>
/// Reads bonds typed as people write them: "C1–C6", "C1-C6, C4–C5", "1-6; 4-5" (1-based atom numbers as in the file, the
/// element optional but checked when given). Writes them back the same way.
/// </summary>
public static partial class BondText
{
    [GeneratedRegex(@"^\s*([A-Za-z]{0,2})\s*(\d+)\s*[-–—]\s*([A-Za-z]{0,2})\s*(\d+)\s*$")]
    private static partial Regex PairPattern();

    /// <summary>The pairs in <paramref name="text"/>, or false with what is wrong and where.</summary>
    public static bool TryParse(string text, Molecule molecule, out IReadOnlyList<AtomPair> pairs, out string error)
    {
        var found = new List<AtomPair>();
        pairs = found;
        error = "";
        var parts = (text ?? "").Split([',', ';', '\n'], StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
        if (parts.Length == 0) { error = "type a bond as two atoms, e.g. C1–C6"; return false; }
        foreach (var part in parts)
        {
            var m = PairPattern().Match(part);
            if (!m.Success) { error = $"'{part}' is not two atoms joined by a dash (e.g. C1–C6)"; return false; }
            if (!Atom(m.Groups[1].Value, m.Groups[2].Value, molecule, out var a, out error) || !Atom(m.Groups[3].Value, m.Groups[4].Value, molecule, out var b, out error))
                return false;
            if (a == b) { error = $"'{part}' names atom {a} twice; a bond joins two different atoms"; return false; }
            found.Add(new AtomPair(a, b));
        }
        return true;
    }

    private static bool Atom(string symbol, string number, Molecule molecule, out int index, out string error)
    {
        error = "";
        index = int.Parse(number, CultureInfo.InvariantCulture);
        if (index < 1 || index > molecule.AtomCount)
        {
            error = $"there is no atom {index}: the saddle point has atoms 1 to {molecule.AtomCount}";
            return false;
        }
        var actual = molecule.Elements[index - 1].Symbol;
        if (symbol.Length > 0 && !string.Equals(symbol, actual, StringComparison.OrdinalIgnoreCase))
        {
            error = $"atom {index} is {molecule.AtomLabel(index - 1)}, not {symbol}{index}";
            return false;
        }
        return true;
    }

    /// <summary>"C1–C6" for a pair, with the elements of <paramref name="molecule"/> when known.</summary>
    public static string Label(AtomPair p, Molecule? molecule) =>
        molecule is not null && p.A <= molecule.AtomCount && p.B <= molecule.AtomCount
            ? $"{molecule.AtomLabel(p.A - 1)}–{molecule.AtomLabel(p.B - 1)}"
            : $"{p.A}–{p.B}";
}
