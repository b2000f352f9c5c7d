namespace BarrierLedger.Core.Text;

/// <summary>
/// What a person or a file may put in a label (species, calculation, state, reaction, study, conformer, level of theory) and
/// in free text (descriptions, notes). One rule for every reader, form and API, so that nothing stored can later break a
/// line-oriented export (an XYZ comment line, a CSV row) or make a label read differently from what it holds.
/// </summary>
public static class TextRules
{
    public const int MaxLabelLength = 200;

    /// <summary>
    /// The Unicode bidirectional formatting characters (Unicode Standard Annex #9: LRM, RLM, ALM, the embeddings and overrides
    /// U+202A–U+202E and the isolates U+2066–U+2069). An override makes "TS1‮2" display as another label than it holds.
    /// </summary>
    public static bool IsBidiControl(char c) =>
        c is '\u061C' or '\u200E' or '\u200F' or (>= '\u202A' and <= '\u202E') or (>= '\u2066' and <= '\u2069');

    /// <summary>What is wrong with a one-line label, or null: empty, longer than <see cref="MaxLabelLength"/>, a line break or other control character, a bidirectional control.</summary>
    public static string? LabelProblem(string? label, string what)
    {
        var t = label?.Trim() ?? "";
        if (t.Length == 0) return $"the {what} is empty";
        if (t.Length > MaxLabelLength) return $"the {what} has {t.Length} characters; at most {MaxLabelLength}";
        return CharacterProblem(t, what, allowLineBreaks: false);
    }

    /// <summary>What is wrong with free text (line breaks and tabs allowed), or null.</summary>
    public static string? FreeTextProblem(string? text, string what) =>
        string.IsNullOrEmpty(text) ? null : CharacterProblem(text, what, allowLineBreaks: true);

    private static string? CharacterProblem(string t, string what, bool allowLineBreaks)
    {
        for (var i = 0; i < t.Length; i++)
        {
            var c = t[i];
            if (allowLineBreaks && c is '\n' or '\r' or '\t') continue;
            if (char.IsControl(c))
                return c is '\n' or '\r'
                    ? $"the {what} contains a line break; it must be one line"
                    : $"the {what} contains the control character U+{(int)c:X4} at position {i + 1}";
            if (IsBidiControl(c))
                return $"the {what} contains the bidirectional control U+{(int)c:X4} at position {i + 1}, which makes text display other than it reads";
        }
        return null;
    }
}
