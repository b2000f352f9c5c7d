using System.Text.Json;

namespace BarrierLedger.Core.Formats;

/// <summary>
/// Parsing JSON with the shared bounds, and typed access to members that reports a JSON path and what was expected
/// for every problem. Paths are written "$.molecule.geometry[4]".
/// </summary>
internal sealed class JsonInput(IssueCollector issues)
{
    public IssueCollector Issues { get; } = issues;

    private static readonly JsonDocumentOptions s_options = new()
    {
        MaxDepth = 64,
        AllowTrailingCommas = false,
        CommentHandling = JsonCommentHandling.Disallow,
    };

    /// <summary>Parses the bytes; null with a located error (line from the parser) when they are not JSON.</summary>
    public static JsonDocument? Parse(byte[] bytes, IssueCollector issues)
    {
        try
        {
            var span = bytes.AsSpan();
            if (span.StartsWith("\xEF\xBB\xBF"u8)) span = span[3..];
            // The parser checks UTF-8 only when a string is read, long after parsing; check it first, with its place.
            if (!System.Text.Unicode.Utf8.IsValid(span))
            {
                var (line, column) = FirstInvalidUtf8(span);
                issues.Error(line, $"not UTF-8 text (byte {column} of the line is not valid UTF-8): save the file as UTF-8 and upload it again");
                return null;
            }
            return JsonDocument.Parse(span.ToArray(), s_options);
        }
        catch (JsonException ex)
        {
            var message = ex.Message;
            var cut = message.IndexOf(" Path:", StringComparison.Ordinal);
            if (cut < 0) cut = message.IndexOf(" LineNumber:", StringComparison.Ordinal);
            if (cut > 0) message = message[..cut].TrimEnd('.', ' ');
            var line = ex.LineNumber is { } l ? (int)l + 1 : (int?)null;
            var col = ex.BytePositionInLine is { } c ? $" (byte {c + 1} of the line)" : "";
            issues.Error(line, $"not valid JSON{col}: {message}");
            return null;
        }
    }

    /// <summary>Line (1-based) and byte in that line (1-based) of the first byte that is not valid UTF-8.</summary>
    internal static (int Line, int Byte) FirstInvalidUtf8(ReadOnlySpan<byte> text)
    {
        var at = 0;
        while (at < text.Length)
        {
            var status = System.Text.Rune.DecodeFromUtf8(text[at..], out _, out var used);
            if (status != System.Buffers.OperationStatus.Done) break;
            at += used;
        }
        var before = text[..at];
        var line = before.Count((byte)'\n') + 1;
        var lineStart = before.LastIndexOf((byte)'\n') + 1;
        return (line, at - lineStart + 1);
    }

    public static string Child(string path, string name) => $"{path}.{name}";
    public static string Index(string path, int i) => $"{path}[{i}]";

    public static string KindName(JsonValueKind k) => k switch
    {
        JsonValueKind.Object => "an object",
        JsonValueKind.Array => "an array",
        JsonValueKind.String => "a string",
        JsonValueKind.Number => "a number",
        JsonValueKind.True or JsonValueKind.False => "true/false",
        JsonValueKind.Null => "null",
        _ => "nothing",
    };

    /// <summary>The member, or null; a member that is JSON null counts as absent.</summary>
    public static JsonElement? Member(JsonElement obj, string name) =>
        obj.ValueKind == JsonValueKind.Object && obj.TryGetProperty(name, out var v) && v.ValueKind != JsonValueKind.Null ? v : null;

    public bool RequireObject(JsonElement e, string path)
    {
        if (e.ValueKind == JsonValueKind.Object) return true;
        Issues.ErrorAt(path, $"expected an object, found {KindName(e.ValueKind)}");
        return false;
    }

    public JsonElement? Object(JsonElement obj, string path, string name, bool required)
    {
        var p = Child(path, name);
        var v = Member(obj, name);
        if (v is null) { if (required) Issues.ErrorAt(p, "missing; expected an object"); return null; }
        return RequireObject(v.Value, p) ? v : null;
    }

    public JsonElement? Array(JsonElement obj, string path, string name, bool required)
    {
        var p = Child(path, name);
        var v = Member(obj, name);
        if (v is null) { if (required) Issues.ErrorAt(p, "missing; expected an array"); return null; }
        if (v.Value.ValueKind != JsonValueKind.Array) { Issues.ErrorAt(p, $"expected an array, found {KindName(v.Value.ValueKind)}"); return null; }
        return v;
    }

    public string? String(JsonElement obj, string path, string name, bool required, bool allowEmpty = false)
    {
        var p = Child(path, name);
        var v = Member(obj, name);
        if (v is null) { if (required) Issues.ErrorAt(p, "missing; expected a string"); return null; }
        if (v.Value.ValueKind != JsonValueKind.String) { Issues.ErrorAt(p, $"expected a string, found {KindName(v.Value.ValueKind)}"); return null; }
        var s = v.Value.GetString()!;
        if (!allowEmpty && string.IsNullOrWhiteSpace(s)) { Issues.ErrorAt(p, "is empty; expected a non-empty string"); return null; }
        // Text that is free prose (descriptions, notes) may span lines; everything else is a one-line name, label or path.
        var problem = allowEmpty ? Text.TextRules.FreeTextProblem(s, "text") : Text.TextRules.LabelProblem(s, "value");
        if (problem is not null) { Issues.ErrorAt(p, problem); return null; }
        return s;
    }

    public double? Number(JsonElement obj, string path, string name, bool required)
    {
        var v = Member(obj, name);
        if (v is null) { if (required) Issues.ErrorAt(Child(path, name), "missing; expected a number"); return null; }
        return NumberValue(v.Value, Child(path, name));
    }

    public double? NumberValue(JsonElement v, string path)
    {
        if (v.ValueKind != JsonValueKind.Number) { Issues.ErrorAt(path, $"expected a number, found {KindName(v.ValueKind)}"); return null; }
        if (!v.TryGetDouble(out var d) || !double.IsFinite(d)) { Issues.ErrorAt(path, $"number {v.GetRawText()} is out of range; expected a finite number"); return null; }
        return d;
    }

    /// <summary>A whole number; accepts 1.0 (some writers emit charges as floats) but not 1.5.</summary>
    public int? Integer(JsonElement obj, string path, string name, bool required, int? min = null)
    {
        var v = Member(obj, name);
        var p = Child(path, name);
        if (v is null) { if (required) Issues.ErrorAt(p, "missing; expected a whole number"); return null; }
        return IntegerValue(v.Value, p, min);
    }

    public int? IntegerValue(JsonElement v, string path, int? min = null)
    {
        if (v.ValueKind != JsonValueKind.Number) { Issues.ErrorAt(path, $"expected a whole number, found {KindName(v.ValueKind)}"); return null; }
        if (!v.TryGetDouble(out var d) || d != Math.Floor(d) || Math.Abs(d) > int.MaxValue)
        {
            Issues.ErrorAt(path, $"expected a whole number, found {v.GetRawText()}");
            return null;
        }
        var i = (int)d;
        if (min is { } m && i < m) { Issues.ErrorAt(path, $"is {i}; expected {m} or more"); return null; }
        return i;
    }

    public bool? Bool(JsonElement obj, string path, string name)
    {
        var v = Member(obj, name);
        if (v is null) return null;
        if (v.Value.ValueKind is JsonValueKind.True or JsonValueKind.False) return v.Value.GetBoolean();
        Issues.ErrorAt(Child(path, name), $"expected true or false, found {KindName(v.Value.ValueKind)}");
        return null;
    }

    /// <summary>
    /// A flat array of numbers, or (when <paramref name="allowNested"/>) an array of arrays of numbers read row by row.
    /// Refuses more than <paramref name="maxCount"/> numbers before allocating them.
    /// </summary>
    public double[]? Numbers(JsonElement array, string path, bool allowNested, long maxCount)
    {
        if (array.ValueKind != JsonValueKind.Array) { Issues.ErrorAt(path, $"expected an array of numbers, found {KindName(array.ValueKind)}"); return null; }
        var n = array.GetArrayLength();
        var nested = n > 0 && array[0].ValueKind == JsonValueKind.Array;
        if (nested && !allowNested) { Issues.ErrorAt(Index(path, 0), "expected a number, found an array (this array must be flat)"); return null; }
        long total = 0;
        if (nested)
        {
            var k = 0;
            foreach (var row in array.EnumerateArray())
            {
                if (row.ValueKind != JsonValueKind.Array) { Issues.ErrorAt(Index(path, k), $"expected an array (row {k}), found {KindName(row.ValueKind)}"); return null; }
                total += row.GetArrayLength();
                k++;
            }
        }
        else total = n;
        if (total > maxCount) { Issues.ErrorAt(path, $"has {total} numbers, more than the {maxCount} the limits allow"); return null; }
        var result = new double[total];
        var ok = true;
        var idx = 0;
        if (nested)
        {
            var r = 0;
            foreach (var row in array.EnumerateArray())
            {
                var c = 0;
                foreach (var x in row.EnumerateArray())
                {
                    var d = NumberValue(x, $"{Index(path, r)}[{c}]");
                    if (d is null) ok = false; else result[idx] = d.Value;
                    idx++; c++;
                    if (!ok && Issues.Count > 20) return null;
                }
                r++;
            }
        }
        else
        {
            foreach (var x in array.EnumerateArray())
            {
                var d = NumberValue(x, Index(path, idx));
                if (d is null) ok = false; else result[idx] = d.Value;
                idx++;
                if (!ok && Issues.Count > 20) return null;
            }
        }
        return ok ? result : null;
    }

    /// <summary>Warns once per unknown member, so misspelt keys are noticed.</summary>
    public void WarnUnknown(JsonElement obj, string path, IReadOnlyCollection<string> known)
    {
        if (obj.ValueKind != JsonValueKind.Object) return;
        foreach (var p in obj.EnumerateObject())
            if (!known.Contains(p.Name))
                Issues.WarningAt(Child(path, p.Name), $"unknown key '{p.Name}' is ignored; expected one of: {string.Join(", ", known)}");
    }
}
