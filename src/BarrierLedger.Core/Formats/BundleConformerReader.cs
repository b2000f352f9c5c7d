using System.Text.Json;
using static BarrierLedger.Core.Formats.BundleSchema;

namespace BarrierLedger.Core.Formats;

/// <summary>
/// Reads a species' <c>conformers</c> list: each conformer has a label (unique within the species) and the labels of the
/// calculations that belong to it (each of that species, each in one conformer only). The conformer's label is then set on each
/// of its calculations (<see cref="BundleCalculation.Conformer"/>).
/// </summary>
internal static class BundleConformerReader
{
    public static void Apply(IReadOnlyList<(string Species, string Path, JsonElement List)> lists, JsonInput j, List<BundleCalculation> calculations)
    {
        var issues = j.Issues;
        var index = new Dictionary<string, int>(StringComparer.Ordinal);
        for (var i = 0; i < calculations.Count; i++) index.TryAdd(calculations[i].Label, i);
        var assignedAt = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (var (species, path, list) in lists)
        {
            var labels = new HashSet<string>(StringComparer.Ordinal);
            var k = 0;
            foreach (var conformer in list.EnumerateArray())
            {
                var p = JsonInput.Index(path, k++);
                if (!j.RequireObject(conformer, p)) continue;
                j.WarnUnknown(conformer, p, KnownKeys["conformer"]);
                var label = j.String(conformer, p, "label", required: true);
                if (label is not null && !labels.Add(label))
                    issues.ErrorAt(JsonInput.Child(p, "label"), $"conformer '{label}' is listed twice for species '{species}'; labels must be unique within a species");
                if (j.Array(conformer, p, "calculations", required: true) is not { } calcs) continue;
                var m = 0;
                foreach (var c in calcs.EnumerateArray())
                {
                    var cp = JsonInput.Index(JsonInput.Child(p, "calculations"), m++);
                    if (c.ValueKind != JsonValueKind.String || string.IsNullOrWhiteSpace(c.GetString()))
                    {
                        issues.ErrorAt(cp, $"expected a calculation label (a non-empty string), found {JsonInput.KindName(c.ValueKind)}");
                        continue;
                    }
                    var calc = c.GetString()!;
                    if (!index.TryGetValue(calc, out var at))
                    {
                        issues.ErrorAt(cp, $"names calculation '{calc}', which is not in $.calculations");
                        continue;
                    }
                    if (calculations[at].Species != species)
                    {
                        issues.ErrorAt(cp, $"calculation '{calc}' is of species '{calculations[at].Species}', not '{species}'; a conformer lists calculations of its own species");
                        continue;
                    }
                    if (assignedAt.TryGetValue(calc, out var prior))
                    {
                        issues.ErrorAt(cp, $"calculation '{calc}' is already listed at {prior}; a calculation belongs to one conformer");
                        continue;
                    }
                    assignedAt[calc] = cp;
                    if (label is not null) calculations[at] = calculations[at] with { Conformer = label };
                }
                if (m == 0) issues.ErrorAt(JsonInput.Child(p, "calculations"), "is empty; expected the labels of the conformer's calculations");
            }
            if (k == 0) issues.ErrorAt(path, "is empty; leave 'conformers' out for a species given as one structure");
        }
    }
}
