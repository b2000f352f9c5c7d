using System.Collections.Immutable;
using System.Text;
using BarrierLedger.Core.Chemistry;

namespace BarrierLedger.Core.Geometry;

/// <summary>
/// An elemental formula: how many atoms of each element, keyed by element symbol. Written in Hill order
/// (Hill, J. Am. Chem. Soc. 1900, 22, 478): with carbon present, C first, then H, then the other symbols
/// alphabetically; without carbon, all symbols alphabetically (H included). A count of one is not written.
/// Two formulas are equal when every element count is equal.
/// </summary>
public sealed class Formula : IEquatable<Formula>
{
    private readonly ImmutableSortedDictionary<string, int> _counts;

    private Formula(ImmutableSortedDictionary<string, int> counts) => _counts = counts;

    /// <summary>The empty formula (no atoms).</summary>
    public static Formula Empty { get; } = new(ImmutableSortedDictionary.Create<string, int>(StringComparer.Ordinal));

    /// <summary>Element symbol → number of atoms; only non-zero counts are kept.</summary>
    public IReadOnlyDictionary<string, int> Counts => _counts;

    /// <summary>Total number of atoms.</summary>
    public int AtomCount => _counts.Values.Sum();

    /// <summary>Σ Z over all atoms (the electron count of the neutral species).</summary>
    public int NuclearCharge => _counts.Sum(kv => Elements.Get(kv.Key).AtomicNumber * kv.Value);

    /// <summary>The number of atoms of <paramref name="symbol"/> (0 if absent).</summary>
    public int this[string symbol] => _counts.TryGetValue(Elements.Get(symbol).Symbol, out var n) ? n : 0;

    /// <summary>The formula of a molecule.</summary>
    public static Formula Of(Molecule molecule)
    {
        ArgumentNullException.ThrowIfNull(molecule);
        return FromCounts(molecule.Elements.GroupBy(e => e.Symbol).Select(g => (g.Key, g.Count())));
    }

    /// <summary>A formula from (symbol, count) pairs; repeated symbols add up. Throws <see cref="ArgumentException"/> for an unknown symbol or a negative total.</summary>
    public static Formula FromCounts(IEnumerable<(string Symbol, int Count)> counts)
    {
        ArgumentNullException.ThrowIfNull(counts);
        var b = new SortedDictionary<string, int>(StringComparer.Ordinal);
        foreach (var (symbol, count) in counts)
        {
            if (!Elements.TryGet(symbol, out var e))
                throw new ArgumentException($"Unknown element symbol '{symbol}' in formula.", nameof(counts));
            b[e.Symbol] = b.GetValueOrDefault(e.Symbol) + count;
        }
        foreach (var (symbol, n) in b)
            if (n < 0) throw new ArgumentException($"Formula has a negative count of {symbol} ({n}).", nameof(counts));
        return new(b.Where(kv => kv.Value != 0).ToImmutableSortedDictionary(kv => kv.Key, kv => kv.Value, StringComparer.Ordinal));
    }

    /// <summary>
    /// The formula of a sum of species with integer coefficients, e.g. 1 × C2H4 + 2 × H2O.
    /// Coefficients must be positive (a species that leaves a state is simply not in its sum).
    /// </summary>
    public static Formula Sum(IEnumerable<(Formula Formula, int Coefficient)> terms)
    {
        ArgumentNullException.ThrowIfNull(terms);
        var all = new List<(string, int)>();
        foreach (var (f, c) in terms)
        {
            if (c <= 0) throw new ArgumentException($"Coefficient must be positive, got {c} for {f}.", nameof(terms));
            all.AddRange(f._counts.Select(kv => (kv.Key, kv.Value * c)));
        }
        return FromCounts(all);
    }

    /// <summary>
    /// Reads a plain formula such as "C2H4O", "CH3Cl" or "H2O" (element symbols each followed by an optional count;
    /// no brackets, charges or hydrates). Throws <see cref="FormatException"/> saying where it stopped.
    /// </summary>
    public static Formula Parse(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        var counts = new List<(string, int)>();
        var i = 0;
        var t = text.Trim();
        if (t.Length == 0) throw new FormatException("Formula is empty.");
        while (i < t.Length)
        {
            if (!char.IsAsciiLetterUpper(t[i]))
                throw new FormatException($"Formula '{text}': expected an element symbol at position {i + 1}, found '{t[i]}'.");
            var start = i++;
            while (i < t.Length && char.IsAsciiLetterLower(t[i])) i++;
            var symbol = t[start..i];
            if (!Elements.TryGet(symbol, out _))
                throw new FormatException($"Formula '{text}': unknown element '{symbol}' at position {start + 1}.");
            var numStart = i;
            while (i < t.Length && char.IsAsciiDigit(t[i])) i++;
            var n = i > numStart ? int.Parse(t[numStart..i], System.Globalization.CultureInfo.InvariantCulture) : 1;
            counts.Add((symbol, n));
        }
        return FromCounts(counts);
    }

    /// <summary>The Hill-order text, e.g. "C2H6O", "ClH" (no carbon: alphabetical).</summary>
    public override string ToString()
    {
        if (_counts.Count == 0) return "";
        var sb = new StringBuilder();
        void Append(string s) { sb.Append(s); if (_counts[s] != 1) sb.Append(_counts[s]); }
        var hasCarbon = _counts.ContainsKey("C");
        if (hasCarbon)
        {
            Append("C");
            if (_counts.ContainsKey("H")) Append("H");
        }
        foreach (var s in _counts.Keys)
            if (!hasCarbon || (s != "C" && s != "H")) Append(s);
        return sb.ToString();
    }

    /// <summary>Element by element difference this − other as text ("+H2 −O"), empty when equal; for error messages.</summary>
    public string DifferenceFrom(Formula other)
    {
        ArgumentNullException.ThrowIfNull(other);
        var parts = new List<string>();
        foreach (var s in _counts.Keys.Union(other._counts.Keys).Order(StringComparer.Ordinal))
        {
            var d = _counts.GetValueOrDefault(s) - other._counts.GetValueOrDefault(s);
            if (d != 0) parts.Add($"{(d > 0 ? "+" : "−")}{s}{(Math.Abs(d) == 1 ? "" : Math.Abs(d).ToString(System.Globalization.CultureInfo.InvariantCulture))}");
        }
        return string.Join(" ", parts);
    }

    public bool Equals(Formula? other) =>
        other is not null && other._counts.Count == _counts.Count && _counts.All(kv => other._counts.GetValueOrDefault(kv.Key) == kv.Value);

    public override bool Equals(object? obj) => Equals(obj as Formula);

    public override int GetHashCode()
    {
        var h = new HashCode();
        foreach (var kv in _counts) { h.Add(kv.Key); h.Add(kv.Value); }
        return h.ToHashCode();
    }

    public static bool operator ==(Formula? a, Formula? b) => a is null ? b is null : a.Equals(b);
    public static bool operator !=(Formula? a, Formula? b) => !(a == b);
}
