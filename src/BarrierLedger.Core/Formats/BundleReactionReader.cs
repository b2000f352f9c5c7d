using System.Text.Json;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Kinetics;
using static BarrierLedger.Core.Formats.BundleManifestReader;
using static BarrierLedger.Core.Formats.BundleSchema;
using BarrierLedger.Core.Pathways;

namespace BarrierLedger.Core.Formats;

/// <summary>Reads one reaction of the manifest: its ordered states, their species terms, calculations and reaction-coordinate atom pairs.</summary>
internal static class BundleReactionReader
{
    internal static BundleReaction? ReadReaction(JsonElement r, string p, JsonInput j, Dictionary<string, SpeciesInfo> species,
        Dictionary<string, BundleCalculation> calcs)
    {
        if (!j.RequireObject(r, p)) return null;
        j.WarnUnknown(r, p, KnownKeys["reaction"]);
        var label = j.String(r, p, "label", required: true);
        var description = j.String(r, p, "description", required: false, allowEmpty: true) ?? "";
        var states = new List<BundleState>();
        var ok = true;
        if (j.Array(r, p, "states", required: true) is { } sArr)
        {
            if (sArr.GetArrayLength() < 2) { j.Issues.ErrorAt(JsonInput.Child(p, "states"), $"has {sArr.GetArrayLength()} state(s); a reaction needs at least 2 (reactants and products)"); ok = false; }
            var k = 0;
            foreach (var s in sArr.EnumerateArray())
            {
                var sp = JsonInput.Index(JsonInput.Child(p, "states"), k++);
                if (ReadState(s, sp, j, species, calcs) is { } st) states.Add(st);
                else ok = false;
            }
        }
        else ok = false;
        KineticsSetup? kinetics = null;
        if (JsonInput.Member(r, "kinetics") is not null)
        {
            kinetics = ReadKinetics(r, p, j, states);
            if (kinetics is null) ok = false;
        }
        return ok && label is not null ? new BundleReaction(label, description, [.. states], kinetics) : null;
    }

    // "kinetics": { "competing_channels": [saddle-point state labels], "enantiomeric": bool, "temperature_kelvin": K, "time_hours": h }
    private static KineticsSetup? ReadKinetics(JsonElement r, string p, JsonInput j, List<BundleState> states)
    {
        var kp = JsonInput.Child(p, "kinetics");
        var k = r.GetProperty("kinetics");
        if (!j.RequireObject(k, kp)) return null;
        j.WarnUnknown(k, kp, KnownKeys["kinetics"]);
        var ok = true;
        var channels = new List<string>();
        if (j.Array(k, kp, "competing_channels", required: false) is { } arr)
        {
            var i = 0;
            foreach (var c in arr.EnumerateArray())
            {
                var cp = JsonInput.Index(JsonInput.Child(kp, "competing_channels"), i++);
                if (c.ValueKind != JsonValueKind.String) { j.Issues.ErrorAt(cp, $"expected a saddle point's state label (a string), found {JsonInput.KindName(c.ValueKind)}"); ok = false; continue; }
                channels.Add(c.GetString()!);
            }
        }
        var setup = new KineticsSetup(channels, j.Bool(k, kp, "enantiomeric") ?? false,
            j.Number(k, kp, "temperature_kelvin", required: false), j.Number(k, kp, "time_hours", required: false));
        foreach (var (key, message) in setup.Problems([.. states.Select(s => (s.Label, s.Kind == StateKind.SaddlePoint))]))
        {
            j.Issues.ErrorAt(JsonInput.Child(kp, key), message);
            ok = false;
        }
        return ok ? setup : null;
    }

    private static BundleState? ReadState(JsonElement s, string p, JsonInput j, Dictionary<string, SpeciesInfo> species,
        Dictionary<string, BundleCalculation> calcs)
    {
        if (!j.RequireObject(s, p)) return null;
        j.WarnUnknown(s, p, KnownKeys["state"]);
        var issues = j.Issues;
        var ok = true;
        var label = j.String(s, p, "label", required: true);
        var kindText = j.String(s, p, "kind", required: true);
        StateKind kind = StateKind.Minimum;
        if (kindText == "minimum") kind = StateKind.Minimum;
        else if (kindText == "saddle_point") kind = StateKind.SaddlePoint;
        else if (kindText is not null) { issues.ErrorAt(JsonInput.Child(p, "kind"), $"is '{kindText}'; expected 'minimum' or 'saddle_point'"); ok = false; }
        var terms = new List<BundleTerm>();
        if (j.Array(s, p, "terms", required: true) is { } tArr)
        {
            if (tArr.GetArrayLength() == 0) { issues.ErrorAt(JsonInput.Child(p, "terms"), "is empty; expected at least one species"); ok = false; }
            var k = 0;
            foreach (var t in tArr.EnumerateArray())
            {
                var tp = JsonInput.Index(JsonInput.Child(p, "terms"), k++);
                if (!j.RequireObject(t, tp)) { ok = false; continue; }
                j.WarnUnknown(t, tp, KnownKeys["term"]);
                var sl = j.String(t, tp, "species", required: true);
                var coef = JsonInput.Member(t, "coefficient") is null ? 1 : j.Integer(t, tp, "coefficient", required: true, min: 1);
                if (sl is not null && !species.ContainsKey(sl))
                {
                    issues.ErrorAt(JsonInput.Child(tp, "species"), $"names species '{sl}', which is not in $.species; expected one of: {Known(species.Keys)}");
                    ok = false;
                }
                if (sl is null || coef is null) { ok = false; continue; }
                terms.Add(new BundleTerm(sl, coef.Value));
            }
        }
        else ok = false;
        var calcLabel = j.String(s, p, "calculation", required: false);
        BundleCalculation? calc = null;
        if (calcLabel is not null && !calcs.TryGetValue(calcLabel, out calc))
        {
            issues.ErrorAt(JsonInput.Child(p, "calculation"), $"names calculation '{calcLabel}', which is not in $.calculations");
            ok = false;
        }
        if (kind == StateKind.SaddlePoint && calcLabel is null)
        {
            issues.ErrorAt(p, "a saddle_point state must name its calculation (key 'calculation')");
            ok = false;
        }
        if (calc is not null && !terms.Any(t => t.Species == calc.Species))
        {
            issues.ErrorAt(JsonInput.Child(p, "calculation"), $"calculation '{calc.Label}' is of species '{calc.Species}', which is not among this state's terms");
            ok = false;
        }
        if (calc is not null && kind == StateKind.SaddlePoint && calc.Kind is not (CalculationKind.SaddlePoint or CalculationKind.Frequencies or CalculationKind.SinglePoint))
            issues.WarningAt(JsonInput.Child(p, "calculation"), $"calculation '{calc.Label}' is a {calc.Kind.Words()} calculation, not a saddle point");
        var pairs = new List<BundleAtomPair>();
        // "reacting_bonds" (the forming and breaking atom pairs); "reaction_coordinate" is the name format_version 1 bundles were
        // first written with: still read, never written, and not both at once.
        var bondsKey = s.TryGetProperty("reacting_bonds", out _) ? "reacting_bonds" : "reaction_coordinate";
        if (bondsKey == "reacting_bonds" && s.TryGetProperty("reaction_coordinate", out _))
        {
            issues.ErrorAt(JsonInput.Child(p, "reaction_coordinate"), "gives the reacting bonds a second time beside 'reacting_bonds' (its older name); keep one");
            ok = false;
        }
        if (j.Array(s, p, bondsKey, required: false) is { } rc)
        {
            var rcp = JsonInput.Child(p, bondsKey);
            if (kind != StateKind.SaddlePoint) { issues.ErrorAt(rcp, "only a saddle_point state has forming/breaking bonds"); ok = false; }
            var atoms = calc?.Geometry?.AtomCount;
            var k = 0;
            foreach (var pair in rc.EnumerateArray())
            {
                var pp = JsonInput.Index(rcp, k++);
                if (pair.ValueKind != JsonValueKind.Array || pair.GetArrayLength() != 2)
                {
                    issues.ErrorAt(pp, $"expected a pair of atom numbers [a, b] (1-based), found {(pair.ValueKind == JsonValueKind.Array ? $"{pair.GetArrayLength()} values" : JsonInput.KindName(pair.ValueKind))}");
                    ok = false;
                    continue;
                }
                var a = j.IntegerValue(pair[0], JsonInput.Index(pp, 0), min: 1);
                var b = j.IntegerValue(pair[1], JsonInput.Index(pp, 1), min: 1);
                if (a is null || b is null) { ok = false; continue; }
                if (a == b) { issues.ErrorAt(pp, $"names atom {a} twice; expected two different atoms"); ok = false; continue; }
                if (atoms is { } n && (a > n || b > n))
                {
                    issues.ErrorAt(pp, $"atom {Math.Max(a.Value, b.Value)} does not exist: the geometry of calculation '{calc!.Label}' has {n} atoms (numbers are 1-based)");
                    ok = false;
                    continue;
                }
                pairs.Add(new BundleAtomPair(a.Value, b.Value));
            }
        }
        return ok && label is not null ? new BundleState(label, kind, [.. terms], calcLabel, [.. pairs]) : null;
    }
}
