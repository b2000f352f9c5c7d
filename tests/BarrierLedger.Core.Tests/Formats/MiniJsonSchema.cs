using System.Text.Json;

namespace BarrierLedger.Core.Tests.Formats;

/// <summary>
/// A structural JSON Schema (draft 2020-12) checker for the keywords docs/bundle.schema.json uses:
/// $ref to #/$defs, type, const, enum, required, properties, additionalProperties:false, items, anyOf,
/// minItems, maxItems, minLength, minimum, maximum, exclusiveMinimum. Any other keyword fails loudly, so the
/// schema cannot grow a rule this checker silently ignores.
/// </summary>
internal sealed class MiniJsonSchema(JsonElement root)
{
    private static readonly HashSet<string> s_keywords =
    [
        "$schema", "$id", "$ref", "$defs", "title", "description", "type", "const", "enum", "required", "properties",
        "additionalProperties", "items", "anyOf", "minItems", "maxItems", "minLength", "minimum", "maximum", "exclusiveMinimum",
    ];

    public List<string> Validate(JsonElement instance)
    {
        var errors = new List<string>();
        Check(root, instance, "$", errors);
        return errors;
    }

    private JsonElement Resolve(string reference)
    {
        const string prefix = "#/$defs/";
        if (!reference.StartsWith(prefix)) throw new NotSupportedException($"$ref {reference}");
        return root.GetProperty("$defs").GetProperty(reference[prefix.Length..]);
    }

    private void Check(JsonElement schema, JsonElement value, string path, List<string> errors)
    {
        foreach (var kw in schema.EnumerateObject())
            if (!s_keywords.Contains(kw.Name)) throw new NotSupportedException($"schema keyword '{kw.Name}' is not handled by the test checker");
        if (schema.TryGetProperty("$ref", out var r)) Check(Resolve(r.GetString()!), value, path, errors);
        if (schema.TryGetProperty("const", out var c) && c.GetRawText() != value.GetRawText()) errors.Add($"{path}: expected {c.GetRawText()}");
        if (schema.TryGetProperty("enum", out var en) && !en.EnumerateArray().Any(e => e.GetRawText() == value.GetRawText()))
            errors.Add($"{path}: {value.GetRawText()} not in enum");
        if (schema.TryGetProperty("anyOf", out var any))
        {
            if (!any.EnumerateArray().Any(s => { var e = new List<string>(); Check(s, value, path, e); return e.Count == 0; }))
                errors.Add($"{path}: matches no anyOf branch");
        }
        if (schema.TryGetProperty("type", out var t))
        {
            var ok = t.GetString() switch
            {
                "object" => value.ValueKind == JsonValueKind.Object,
                "array" => value.ValueKind == JsonValueKind.Array,
                "string" => value.ValueKind == JsonValueKind.String,
                "number" => value.ValueKind == JsonValueKind.Number,
                "integer" => value.ValueKind == JsonValueKind.Number && value.TryGetDouble(out var d) && d == Math.Floor(d),
                "boolean" => value.ValueKind is JsonValueKind.True or JsonValueKind.False,
                var other => throw new NotSupportedException($"type {other}"),
            };
            if (!ok) { errors.Add($"{path}: expected {t.GetString()}, found {value.ValueKind}"); return; }
        }
        if (value.ValueKind == JsonValueKind.Object)
        {
            if (schema.TryGetProperty("required", out var req))
                foreach (var k in req.EnumerateArray())
                    if (!value.TryGetProperty(k.GetString()!, out _)) errors.Add($"{path}: missing required '{k.GetString()}'");
            var props = schema.TryGetProperty("properties", out var pr) ? pr : default;
            foreach (var member in value.EnumerateObject())
            {
                if (props.ValueKind == JsonValueKind.Object && props.TryGetProperty(member.Name, out var sub)) Check(sub, member.Value, $"{path}.{member.Name}", errors);
                else if (schema.TryGetProperty("additionalProperties", out var ap) && ap.ValueKind == JsonValueKind.False)
                    errors.Add($"{path}: unexpected key '{member.Name}'");
            }
        }
        if (value.ValueKind == JsonValueKind.Array)
        {
            var n = value.GetArrayLength();
            if (schema.TryGetProperty("minItems", out var mi) && n < mi.GetInt32()) errors.Add($"{path}: fewer than {mi.GetInt32()} items");
            if (schema.TryGetProperty("maxItems", out var ma) && n > ma.GetInt32()) errors.Add($"{path}: more than {ma.GetInt32()} items");
            if (schema.TryGetProperty("items", out var items))
            {
                var i = 0;
                foreach (var item in value.EnumerateArray()) Check(items, item, $"{path}[{i++}]", errors);
            }
        }
        if (value.ValueKind == JsonValueKind.String && schema.TryGetProperty("minLength", out var ml) && value.GetString()!.Length < ml.GetInt32())
            errors.Add($"{path}: shorter than {ml.GetInt32()}");
        if (value.ValueKind == JsonValueKind.Number)
        {
            var v = value.GetDouble();
            if (schema.TryGetProperty("minimum", out var min) && v < min.GetDouble()) errors.Add($"{path}: below minimum {min.GetDouble()}");
            if (schema.TryGetProperty("maximum", out var max) && v > max.GetDouble()) errors.Add($"{path}: above maximum {max.GetDouble()}");
            if (schema.TryGetProperty("exclusiveMinimum", out var emin) && v <= emin.GetDouble()) errors.Add($"{path}: not above {emin.GetDouble()}");
        }
    }
}
