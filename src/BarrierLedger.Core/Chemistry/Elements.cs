namespace BarrierLedger.Core.Chemistry;

/// <summary>
/// The element table (H–Rn at least). Lookup by symbol (case-insensitive on input, canonical on output) or atomic number.
/// </summary>
public static partial class Elements
{
    private static readonly Element[] s_byNumber = BuildTable();
    private static readonly Dictionary<string, Element> s_bySymbol =
        s_byNumber.Where(e => e is not null).ToDictionary(e => e.Symbol, StringComparer.OrdinalIgnoreCase);

    /// <summary>All elements in the table, by atomic number.</summary>
    public static IReadOnlyList<Element> All => s_byNumber.Where(e => e is not null).ToArray();

    public static bool TryGet(string symbol, out Element element)
    {
        if (s_bySymbol.TryGetValue(symbol.Trim(), out var e)) { element = e; return true; }
        element = null!;
        return false;
    }

    public static bool TryGet(int atomicNumber, out Element element)
    {
        if (atomicNumber > 0 && atomicNumber < s_byNumber.Length && s_byNumber[atomicNumber] is { } e) { element = e; return true; }
        element = null!;
        return false;
    }

    /// <summary>The element with this symbol; throws <see cref="ArgumentException"/> for an unknown symbol.</summary>
    public static Element Get(string symbol) =>
        TryGet(symbol, out var e) ? e : throw new ArgumentException($"Unknown element symbol '{symbol}'.", nameof(symbol));

    /// <summary>The element with this atomic number; throws <see cref="ArgumentException"/> if it is not in the table.</summary>
    public static Element Get(int atomicNumber) =>
        TryGet(atomicNumber, out var e) ? e : throw new ArgumentException($"No element with atomic number {atomicNumber} in the table.", nameof(atomicNumber));

    public static Element H => Get(1);
    public static Element C => Get(6);
    public static Element N => Get(7);
    public static Element O => Get(8);
}
