namespace BarrierLedger.Core.Chemistry;

/// <summary>
/// A level of theory as the trade writes it: "method/basis", optionally with a solvation model in
/// parentheses or after a comma-free suffix "(model, solvent)", and optionally "A//B" meaning a single point
/// at level A on a geometry optimised at level B.
/// </summary>
/// <param name="Method">Electronic-structure method, e.g. "wB97X-D".</param>
/// <param name="Basis">Basis set, e.g. "def2-TZVP"; empty when the method implies it.</param>
/// <param name="Solvation">Solvation model and solvent, e.g. "SMD, water"; empty for gas phase.</param>
/// <param name="GeometryLevel">The level the geometry came from, for "A//B"; null when the same.</param>
public sealed record LevelOfTheory(string Method, string Basis, string Solvation = "", LevelOfTheory? GeometryLevel = null)
{
    /// <summary>The level that produced the energy, without the geometry part.</summary>
    public string EnergyPart =>
        (string.IsNullOrEmpty(Basis) ? Method : $"{Method}/{Basis}") + (string.IsNullOrEmpty(Solvation) ? "" : $" ({Solvation})");

    public override string ToString() => GeometryLevel is null ? EnergyPart : $"{EnergyPart}//{GeometryLevel.EnergyPart}";

    /// <summary>Case-insensitive comparison of the normalised text.</summary>
    public bool SameAs(LevelOfTheory? other) =>
        other is not null && string.Equals(Normalise(ToString()), Normalise(other.ToString()), StringComparison.OrdinalIgnoreCase);

    private static string Normalise(string s) => string.Concat(s.Where(c => !char.IsWhiteSpace(c)));

    /// <summary>
    /// Parses "method/basis (solvation)//method/basis (solvation)". Returns false with a reason for empty text.
    /// </summary>
    public static bool TryParse(string? text, out LevelOfTheory level, out string error)
    {
        level = null!;
        error = "";
        if (string.IsNullOrWhiteSpace(text)) { error = "level of theory is empty"; return false; }
        var parts = text.Split("//", 2, StringSplitOptions.TrimEntries);
        if (!TryParseSingle(parts[0], out var energy, out error)) return false;
        if (parts.Length == 2)
        {
            if (!TryParseSingle(parts[1], out var geom, out error)) { error = $"geometry level after '//': {error}"; return false; }
            energy = energy with { GeometryLevel = geom };
        }
        level = energy;
        return true;
    }

    public static LevelOfTheory Parse(string text) =>
        TryParse(text, out var l, out var e) ? l : throw new FormatException($"Cannot read level of theory '{text}': {e}.");

    private static bool TryParseSingle(string text, out LevelOfTheory level, out string error)
    {
        level = null!;
        error = "";
        var t = text.Trim();
        if (t.Length == 0) { error = "empty method"; return false; }
        // Solvation is a trailing "(...)" group set off by a space: "method/basis (PCM, water)". Parentheses inside
        // the method or basis ("CCSD(T)", "6-31G(d)") are not set off by a space and stay where they are.
        var solvation = "";
        if (t.EndsWith(')'))
        {
            var open = OpeningParenthesis(t);
            if (open > 0 && char.IsWhiteSpace(t[open - 1]))
            {
                solvation = t[(open + 1)..^1].Trim();
                t = t[..open].Trim();
            }
        }
        var slash = t.IndexOf('/');
        var method = slash >= 0 ? t[..slash].Trim() : t;
        var basis = slash >= 0 ? t[(slash + 1)..].Trim() : "";
        if (method.Length == 0) { error = $"no method before '/' in '{text}'"; return false; }
        level = new LevelOfTheory(method, basis, solvation);
        return true;
    }

    /// <summary>Index of the "(" that matches the final ")", or −1.</summary>
    private static int OpeningParenthesis(string t)
    {
        var depth = 0;
        for (var i = t.Length - 1; i >= 0; i--)
        {
            if (t[i] == ')') depth++;
            else if (t[i] == '(' && --depth == 0) return i;
        }
        return -1;
    }
}
