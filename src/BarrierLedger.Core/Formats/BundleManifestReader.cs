using System.Collections.Immutable;
using System.Text.Json;
using BarrierLedger.Core.Conformers;
using static BarrierLedger.Core.Formats.BundleSchema;

namespace BarrierLedger.Core.Formats;

/// <summary>
/// Reads the manifest object by object: the root, the study and the species here, calculations, reactions, scans and IRCs through
/// their readers beside it. Every error names its JSON path and what was expected.
/// </summary>
internal static class BundleManifestReader
{
    internal sealed record SpeciesInfo(BundleSpecies Species, string Path, bool Complete = true);

    public static Bundle? Read(byte[] bytes, IssueCollector issues, ReaderLimits limits, BundleFiles files)
    {
        using var doc = JsonInput.Parse(bytes, issues);
        if (doc is null) return null;
        var j = new JsonInput(issues);
        var root = doc.RootElement;
        if (!j.RequireObject(root, "$")) return null;
        var format = j.String(root, "$", "format", required: true);
        if (format is not null && format != FormatName)
        {
            var hint = JsonInput.Member(root, "schema_name") is not null ? " (this looks like a QCSchema file, not a bundle)" : "";
            issues.ErrorAt("$.format", $"is '{format}'; expected '{FormatName}'{hint}");
            return null;
        }
        if (format is null) return null;
        var version = j.Integer(root, "$", "format_version", required: true, min: 1);
        if (version is > CurrentFormatVersion)
        {
            issues.ErrorAt("$.format_version", $"is {version}; this reader understands format_version {CurrentFormatVersion} (written by a newer BarrierLedger?)");
            return null;
        }
        j.WarnUnknown(root, "$", KnownKeys["bundle"]);

        BundleStudy? study = null;
        if (j.Object(root, "$", "study", required: true) is { } st)
        {
            j.WarnUnknown(st, "$.study", KnownKeys["study"]);
            var name = j.String(st, "$.study", "name", required: true);
            var description = j.String(st, "$.study", "description", required: false, allowEmpty: true) ?? "";
            if (name is not null) study = new BundleStudy(name, description, EnergyModel(j, st));
        }

        // Species.
        var species = new Dictionary<string, SpeciesInfo>(StringComparer.Ordinal);
        var conformerLists = new List<(string Species, string Path, JsonElement List)>();
        if (j.Array(root, "$", "species", required: true) is { } spArr)
        {
            var k = 0;
            foreach (var sp in spArr.EnumerateArray())
            {
                var p = JsonInput.Index("$.species", k++);
                if (!j.RequireObject(sp, p)) continue;
                j.WarnUnknown(sp, p, KnownKeys["species"]);
                var label = j.String(sp, p, "label", required: true);
                var charge = j.Integer(sp, p, "charge", required: true);
                var mult = j.Integer(sp, p, "multiplicity", required: true, min: 1);
                var sigma = j.Integer(sp, p, "symmetry_number", required: false, min: 1);
                if (label is null) continue;
                if (JsonInput.Member(sp, "conformers") is not null && j.Array(sp, p, "conformers", required: false) is { } conf)
                    conformerLists.Add((label, JsonInput.Child(p, "conformers"), conf));
                if (species.TryGetValue(label, out var prior)) { issues.ErrorAt(JsonInput.Child(p, "label"), $"species '{label}' is already defined at {prior.Path}; labels must be unique"); continue; }
                // A species whose charge or multiplicity is wrong keeps its label (the error is already listed), so that
                // references to it do not raise a second, misleading "not in $.species" error.
                species[label] = new SpeciesInfo(new BundleSpecies(label, charge ?? 0, mult ?? 1, sigma), p, charge is not null && mult is not null);
            }
            if (k == 0) issues.ErrorAt("$.species", "is empty; expected at least one species");
        }

        // Calculations.
        var calculations = new List<BundleCalculation>();
        var calcPaths = new Dictionary<string, string>(StringComparer.Ordinal);
        if (j.Array(root, "$", "calculations", required: false) is { } cArr)
        {
            var k = 0;
            foreach (var c in cArr.EnumerateArray())
            {
                var p = JsonInput.Index("$.calculations", k++);
                if (BundleCalculationReader.ReadCalculation(c, p, j, species, limits, files) is { } calc)
                {
                    if (calcPaths.TryGetValue(calc.Label, out var prior)) issues.ErrorAt(JsonInput.Child(p, "label"), $"calculation '{calc.Label}' is already defined at {prior}; labels must be unique");
                    else { calcPaths[calc.Label] = p; calculations.Add(calc); }
                }
            }
        }
        BundleConformerReader.Apply(conformerLists, j, calculations);
        var calcByLabel = calculations.ToDictionary(c => c.Label, StringComparer.Ordinal);

        // Reactions.
        var reactions = new List<BundleReaction>();
        var reactionLabels = new HashSet<string>(StringComparer.Ordinal);
        if (j.Array(root, "$", "reactions", required: false) is { } rArr)
        {
            var k = 0;
            foreach (var r in rArr.EnumerateArray())
            {
                var p = JsonInput.Index("$.reactions", k++);
                if (BundleReactionReader.ReadReaction(r, p, j, species, calcByLabel) is { } reaction)
                {
                    if (!reactionLabels.Add(reaction.Label)) issues.ErrorAt(JsonInput.Child(p, "label"), $"reaction '{reaction.Label}' is defined twice; labels must be unique");
                    else reactions.Add(reaction);
                }
            }
        }

        // Scans.
        var scans = new List<BundleScan>();
        var scanLabels = new HashSet<string>(StringComparer.Ordinal);
        if (j.Array(root, "$", "scans", required: false) is { } sArr)
        {
            var k = 0;
            foreach (var s in sArr.EnumerateArray())
            {
                var p = JsonInput.Index("$.scans", k++);
                if (BundleScanReader.ReadScan(s, p, j, species, limits, files) is { } scan)
                {
                    if (!scanLabels.Add(scan.Label)) issues.ErrorAt(JsonInput.Child(p, "label"), $"scan '{scan.Label}' is defined twice; labels must be unique");
                    else scans.Add(scan);
                }
            }
        }

        // IRCs.
        var ircs = new List<BundleIrc>();
        var ircLabels = new HashSet<string>(StringComparer.Ordinal);
        if (j.Array(root, "$", "ircs", required: false) is { } iArr)
        {
            var k = 0;
            foreach (var i in iArr.EnumerateArray())
            {
                var p = JsonInput.Index("$.ircs", k++);
                if (BundleIrcReader.ReadIrc(i, p, j, species, calcByLabel, limits, files) is { } irc)
                {
                    if (!ircLabels.Add(irc.Label)) issues.ErrorAt(JsonInput.Child(p, "label"), $"IRC '{irc.Label}' is defined twice; labels must be unique");
                    else ircs.Add(irc);
                }
            }
        }

        if (issues.HasErrors || study is null || version is null) return null;
        return new Bundle(version.Value, study, [.. species.Values.Select(v => v.Species)], [.. calculations], [.. reactions], [.. scans], [.. ircs],
            files.Read.ToImmutableDictionary(kv => kv.Key, kv => ImmutableArray.Create(kv.Value), StringComparer.Ordinal));
    }

    /// <summary>Reads <c>study.energy_model</c>; every key optional, each checked with its JSON path.</summary>
    private static BundleEnergyModel? EnergyModel(JsonInput j, JsonElement study)
    {
        const string p = "$.study.energy_model";
        if (JsonInput.Member(study, "energy_model") is null || j.Object(study, "$.study", "energy_model", required: false) is not { } em) return null;
        j.WarnUnknown(em, p, KnownKeys["energy_model"]);
        var energies = j.String(em, p, "energies_from", required: false, allowEmpty: true);
        var thermal = j.String(em, p, "thermal_from", required: false, allowEmpty: true);
        var t = j.Number(em, p, "temperature_kelvin", required: false);
        if (t is <= 0) { j.Issues.ErrorAt(JsonInput.Child(p, "temperature_kelvin"), $"is {t}; expected a temperature above 0 K"); t = null; }
        Thermochemistry.StandardState? state = null;
        if (j.String(em, p, "standard_state", required: false) is { } ss)
        {
            if (Thermochemistry.StandardStateNames.TryParse(ss, out var parsed)) state = parsed;
            else j.Issues.ErrorAt(JsonInput.Child(p, "standard_state"), $"is '{ss}'; expected '1 mol/L', '1 atm' or '1 bar'");
        }
        Thermochemistry.ThermoTreatment? lowModes = null;
        if (j.String(em, p, "low_modes", required: false) is { } lm)
        {
            if (Thermochemistry.LowModeNames.TryParse(lm, out var parsed)) lowModes = parsed;
            else j.Issues.ErrorAt(JsonInput.Child(p, "low_modes"), $"is '{lm}'; expected one of {string.Join(", ", Thermochemistry.LowModeNames.All.Select(n => $"'{n}'"))}");
        }
        var cutoff = j.Number(em, p, "low_mode_cutoff_cm1", required: false);
        if (cutoff is <= 0) { j.Issues.ErrorAt(JsonInput.Child(p, "low_mode_cutoff_cm1"), $"is {cutoff}; expected a positive cut-off in cm⁻¹"); cutoff = null; }
        bool? wigner = null;
        if (j.String(em, p, "tunnelling", required: false) is { } tu)
        {
            if (tu.Trim().ToLowerInvariant() is "none" or "wigner") wigner = tu.Trim().Equals("wigner", StringComparison.OrdinalIgnoreCase);
            else j.Issues.ErrorAt(JsonInput.Child(p, "tunnelling"), $"is '{tu}'; expected 'none' or 'wigner'");
        }
        ConformerChoice? conformers = null;
        if (j.String(em, p, "conformers", required: false) is { } co)
        {
            if (BundleEnergyModel.TryParseConformers(co, out var parsed)) conformers = parsed;
            else j.Issues.ErrorAt(JsonInput.Child(p, "conformers"), $"is '{co}'; expected 'lowest' or 'boltzmann-ensemble'");
        }
        return new BundleEnergyModel(energies?.Trim(), thermal?.Trim(), t, state, lowModes, cutoff, wigner, conformers);
    }

    internal static string Known(IEnumerable<string> keys)
    {
        var list = keys.Take(12).ToList();
        return list.Count == 0 ? "(none defined)" : string.Join(", ", list.Select(k => $"'{k}'"));
    }
}
