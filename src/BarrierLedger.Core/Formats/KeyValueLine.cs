using System.Text;

namespace BarrierLedger.Core.Formats;

/// <summary>
/// Parses an extended-XYZ comment line: whitespace-separated <c>key=value</c> pairs, values optionally in double
/// quotes (with \" and \\ escapes) or braces, and bare keys meaning a true flag. Keys keep their case; lookups
/// in the result are case-insensitive.
/// </summary>
internal static class KeyValueLine
{
    public static bool TryParse(string line, out List<KeyValuePair<string, string>> pairs, out string error)
    {
        pairs = [];
        error = "";
        var i = 0;
        while (true)
        {
            while (i < line.Length && char.IsWhiteSpace(line[i])) i++;
            if (i >= line.Length) break;
            var keyStart = i;
            while (i < line.Length && !char.IsWhiteSpace(line[i]) && line[i] != '=') i++;
            var key = line[keyStart..i];
            if (key.Length == 0) { error = $"'=' at column {i + 1} has no key before it"; return false; }
            if (key[0] == '"' || key.Contains('"')) { error = $"key {TextInput.Quote(key)} contains a quote; quotes are allowed only around values"; return false; }
            // Allow spaces around '=': "energy = -1.0".
            var j = i;
            while (j < line.Length && char.IsWhiteSpace(line[j])) j++;
            if (j >= line.Length || line[j] != '=')
            {
                pairs.Add(new(key, "T"));
                continue;
            }
            i = j + 1;
            while (i < line.Length && char.IsWhiteSpace(line[i])) i++;
            if (i >= line.Length) { error = $"key '{key}' has '=' but no value"; return false; }
            string value;
            if (line[i] == '"')
            {
                var sb = new StringBuilder();
                var start = i;
                i++;
                var closed = false;
                while (i < line.Length)
                {
                    var c = line[i];
                    if (c == '\\' && i + 1 < line.Length) { sb.Append(line[i + 1]); i += 2; continue; }
                    if (c == '"') { closed = true; i++; break; }
                    sb.Append(c);
                    i++;
                }
                if (!closed) { error = $"the quoted value of '{key}' opened at column {start + 1} is never closed"; return false; }
                value = sb.ToString();
            }
            else if (line[i] == '{')
            {
                var close = line.IndexOf('}', i);
                if (close < 0) { error = $"the value of '{key}' opened with '{{' at column {i + 1} is never closed"; return false; }
                value = line[(i + 1)..close];
                i = close + 1;
            }
            else
            {
                var start = i;
                while (i < line.Length && !char.IsWhiteSpace(line[i])) i++;
                value = line[start..i];
                if (value.Contains('"')) { error = $"the value of '{key}' has an unbalanced quote: {TextInput.Quote(value)}"; return false; }
            }
            pairs.Add(new(key, value));
        }
        return true;
    }

    /// <summary>Writes a value, quoting it when it contains whitespace, quotes, '=' or is empty.</summary>
    public static string FormatValue(string value)
    {
        if (value.Length > 0 && !value.Any(c => char.IsWhiteSpace(c) || c is '"' or '=' or '{' or '}' or '\\')) return value;
        return "\"" + value.Replace("\\", "\\\\").Replace("\"", "\\\"") + "\"";
    }
}
