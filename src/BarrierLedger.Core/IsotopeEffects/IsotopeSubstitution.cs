using System.Collections.Immutable;
using System.Globalization;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Core.IsotopeEffects;

/// <summary>
/// One atom given another isotope: the 1-based atom number as everywhere in the ledger (C4 is the fourth atom of the file) and
/// the isotope it becomes.
/// </summary>
public sealed record IsotopeSubstitution(int AtomNumber, Isotope Isotope)
{
    /// <summary>"H7→D", "C4→¹³C": the atom as in the file, then the isotope.</summary>
    public string Describe() => $"{Isotope.Element.Symbol}{AtomNumber}→{(Isotope.AtomicNumber == 1 ? Isotope.ShortLabel : Isotope.DisplayLabel)}";

    /// <summary>"7=2H": the form <see cref="TryParseList"/> reads back.</summary>
    public override string ToString() => $"{AtomNumber.ToString(CultureInfo.InvariantCulture)}={Isotope.Label}";

    /// <summary>
    /// Reads a list such as "7=D, 4=13C" or "H7=D; C4=13C" (atom number, optionally after its element symbol, '=' then an isotope
    /// label; separated by commas, semicolons or spaces). False with the reason (which item, why) on bad text.
    /// </summary>
    public static bool TryParseList(string text, out ImmutableArray<IsotopeSubstitution> substitutions, out string error)
    {
        substitutions = [];
        var items = (text ?? "").Split([',', ';', ' ', '\t', '\n'], StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
        if (items.Length == 0)
        {
            error = "No substitution given: write atom=isotope, e.g. 7=D or H7=D, C4=13C.";
            return false;
        }
        var list = ImmutableArray.CreateBuilder<IsotopeSubstitution>(items.Length);
        for (var k = 0; k < items.Length; k++)
        {
            var item = items[k];
            var parts = item.Split('=');
            if (parts.Length != 2 || parts[0].Length == 0)
            {
                error = $"Item {k + 1} '{item}': expected atom=isotope, e.g. 7=D or H7=D.";
                return false;
            }
            var symbolLength = parts[0].TakeWhile(char.IsAsciiLetter).Count();
            var symbol = parts[0][..symbolLength];
            var atom = parts[0][symbolLength..];
            if (!int.TryParse(atom, NumberStyles.None, CultureInfo.InvariantCulture, out var number) || number < 1)
            {
                error = $"Item {k + 1} '{item}': '{parts[0]}' is not an atom number (1-based, optionally after its element, e.g. H7).";
                return false;
            }
            if (!Isotopes.TryParse(parts[1], out var isotope, out var isoError))
            {
                error = $"Item {k + 1} '{item}': {isoError}";
                return false;
            }
            if (symbol.Length > 0 && !string.Equals(symbol, isotope.Element.Symbol, StringComparison.OrdinalIgnoreCase))
            {
                error = $"Item {k + 1} '{item}': atom {symbol}{number} cannot become {isotope.Label}, an isotope of {isotope.Element.Symbol}.";
                return false;
            }
            list.Add(new IsotopeSubstitution(number, isotope));
        }
        substitutions = list.MoveToImmutable();
        error = "";
        return true;
    }

    /// <summary>As <see cref="TryParseList"/>; throws <see cref="ArgumentException"/> with the reason.</summary>
    public static ImmutableArray<IsotopeSubstitution> ParseList(string text) =>
        TryParseList(text, out var s, out var error) ? s : throw new ArgumentException(error, nameof(text));

    /// <summary>
    /// Atomic masses (amu, one per atom) of <paramref name="molecule"/> with the parent isotopes (the element table's masses) except
    /// where substituted. Throws <see cref="ArgumentException"/> for an atom number outside 1…N, an isotope of another element than
    /// the atom's, or an atom named twice.
    /// </summary>
    public static ImmutableArray<double> Masses(Molecule molecule, IReadOnlyList<IsotopeSubstitution> substitutions)
    {
        ArgumentNullException.ThrowIfNull(molecule);
        ArgumentNullException.ThrowIfNull(substitutions);
        var masses = Inertia.MassesAmu(molecule);
        var seen = new HashSet<int>();
        foreach (var s in substitutions)
        {
            if (s.AtomNumber < 1 || s.AtomNumber > molecule.AtomCount)
                throw new ArgumentException($"Atom {s.AtomNumber} does not exist: the structure has atoms 1–{molecule.AtomCount}.", nameof(substitutions));
            var element = molecule.Elements[s.AtomNumber - 1];
            if (element.AtomicNumber != s.Isotope.AtomicNumber)
                throw new ArgumentException(
                    $"Atom {molecule.AtomLabel(s.AtomNumber - 1)} is {element.Name.ToLowerInvariant()}; it cannot become {s.Isotope.Label}.", nameof(substitutions));
            if (!seen.Add(s.AtomNumber))
                throw new ArgumentException($"Atom {molecule.AtomLabel(s.AtomNumber - 1)} is substituted twice.", nameof(substitutions));
            masses[s.AtomNumber - 1] = s.Isotope.MassDa;
        }
        return [.. masses];
    }
}
