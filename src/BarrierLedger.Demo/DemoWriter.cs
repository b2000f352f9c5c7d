using System.Globalization;
using System.Text;
using System.Text.Encodings.Web;
using System.Text.Json;
using System.Text.Json.Nodes;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Conformers;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Scans;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Demo;

/// <summary>
/// Writes a <see cref="DemoStudy"/> in the tool's own input formats: the bundle manifest (<c>bundle.json</c>, docs/formats.md),
/// one QCSchema AtomicResult per structure (hessian driver; energy driver for a lone atom), one extended XYZ per single point
/// and one multi-frame extended XYZ per scan (energy= on every frame). Output is deterministic: fixed order, invariant
/// culture, '\n' line ends, Hessians rounded to 1e-10 hartree/bohr².
/// </summary>
public static class DemoWriter
{
    /// <summary>Name of the manifest in the output folder.</summary>
    public const string ManifestName = "bundle.json";

    private static readonly JsonSerializerOptions JsonOptions = new()
    {
        WriteIndented = true,
        IndentSize = 2,
        NewLine = "\n",
        Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping,
    };

    /// <summary>The files of <paramref name="study"/>, the manifest first, each under <paramref name="prefix"/> ("" or "folder/").</summary>
    public static IReadOnlyList<DemoFile> Write(DemoStudy study, string prefix = "") => Write(study, prefix, null);

    /// <summary>
    /// As <see cref="Write(DemoStudy, string)"/>; <paramref name="structureFiles"/> may supply the text of structure files already
    /// made for identical species (the scale generator reuses them across studies).
    /// </summary>
    internal static IReadOnlyList<DemoFile> Write(DemoStudy study, string prefix, Func<DemoSpecies, string>? structureFiles)
    {
        ArgumentNullException.ThrowIfNull(study);
        var files = new List<DemoFile>();
        var species = new JsonArray();
        var calculations = new JsonArray();
        var speciesByLabel = new Dictionary<string, JsonObject>(StringComparer.Ordinal);
        foreach (var s in study.Species)
        {
            if (!speciesByLabel.TryGetValue(s.Label, out var entry))
            {
                entry = new JsonObject { ["label"] = s.Label, ["charge"] = s.Geometry.Charge, ["multiplicity"] = s.Geometry.Multiplicity };
                speciesByLabel[s.Label] = entry;
                species.Add(entry);
            }
            var conformerCalcs = new JsonArray();
            if (s.Conformer is not null)
            {
                if (entry["conformers"] is not JsonArray list) entry["conformers"] = list = [];
                list.Add(new JsonObject { ["label"] = s.Conformer, ["calculations"] = conformerCalcs });
            }
            var structurePath = s.Frequencies ? $"structures/{s.Slug}.json" : $"structures/{s.Slug}.xyz";
            var isAtom = s.ForceField is null;
            var calc = new JsonObject
            {
                ["label"] = OptLabel(s),
                ["species"] = s.Label,
                ["kind"] = s.Kind switch
                {
                    CalculationKind.Minimum => "minimum",
                    CalculationKind.SaddlePoint => "saddle_point",
                    _ => "single_point",
                },
                ["level_of_theory"] = s.GeometryLevel ?? study.GeometryLevel,
                ["file"] = structurePath,
            };
            if (s.Note.Length > 0) calc["note"] = s.Note;
            calculations.Add(calc);
            conformerCalcs.Add(OptLabel(s));
            files.Add(new DemoFile(prefix + structurePath, !s.Frequencies ? XyzWriter.ToExtendedText(s.Geometry, s.OptEnergyHartree)
                : structureFiles?.Invoke(s) ?? QcSchema(s, s.GeometryLevel ?? study.GeometryLevel, isAtom)));
            if (s.SinglePointEnergyHartree is { } sp)
            {
                var spPath = $"structures/{s.Slug}.sp.xyz";
                calculations.Add(new JsonObject
                {
                    ["label"] = SinglePointLabel(s),
                    ["species"] = s.Label,
                    ["kind"] = "single_point",
                    ["level_of_theory"] = s.SinglePointLevel,
                    ["file"] = spPath,
                });
                conformerCalcs.Add(SinglePointLabel(s));
                files.Add(new DemoFile(prefix + spPath, XyzWriter.ToExtendedText(s.Geometry, sp)));
            }
        }

        var reactions = new JsonArray();
        foreach (var r in study.Reactions)
        {
            var states = new JsonArray();
            foreach (var st in r.States)
            {
                var terms = new JsonArray();
                foreach (var (sp, c) in st.Terms)
                {
                    var t = new JsonObject { ["species"] = sp };
                    if (c != 1) t["coefficient"] = c;
                    terms.Add(t);
                }
                var state = new JsonObject { ["label"] = st.Label, ["kind"] = st.IsSaddlePoint ? "saddle_point" : "minimum", ["terms"] = terms };
                if (st.IsSaddlePoint)
                {
                    var saddle = study.Species.First(x => x.Label == st.Terms[0].Species);
                    state["calculation"] = OptLabel(saddle);
                    state["reacting_bonds"] = new JsonArray([.. st.ReactionCoordinate.Select(p => (JsonNode)new JsonArray(p.First, p.Second))]);
                }
                states.Add(state);
            }
            var reaction = new JsonObject { ["label"] = r.Label, ["description"] = r.Description, ["states"] = states };
            if (r.RunKelvin is not null || r.RunHours is not null)
            {
                var kinetics = new JsonObject();
                if (r.RunKelvin is { } t) kinetics["temperature_kelvin"] = t;
                if (r.RunHours is { } h) kinetics["time_hours"] = h;
                reaction["kinetics"] = kinetics;
            }
            reactions.Add(reaction);
        }

        var scans = new JsonArray();
        foreach (var sc in study.Scans)
        {
            var path = $"scans/{sc.Slug}.xyz";
            scans.Add(new JsonObject
            {
                ["label"] = sc.Label,
                ["species"] = sc.Species,
                ["level_of_theory"] = sc.Level,
                ["coordinate"] = new JsonObject
                {
                    ["kind"] = sc.Kind switch { ScanCoordinateKind.Distance => "distance", ScanCoordinateKind.Angle => "angle", _ => "dihedral" },
                    ["atoms"] = new JsonArray([.. sc.Atoms1Based.Select(a => (JsonNode)a)]),
                },
                ["points"] = new JsonArray([.. sc.Points.Select(p => (JsonNode)new JsonObject { ["coordinate"] = p.Coordinate, ["energy_hartree"] = p.EnergyHartree })]),
                ["geometries_file"] = path,
            });
            var text = new StringBuilder();
            foreach (var p in sc.Points)
                text.Append(XyzWriter.ToExtendedText(p.Geometry ?? throw new ArgumentException($"Scan '{sc.Label}' has a point without a geometry.", nameof(study)), p.EnergyHartree));
            files.Add(new DemoFile(prefix + path, text.ToString()));
        }

        var ircs = new JsonArray();
        foreach (var irc in study.Ircs ?? [])
        {
            var path = $"irc/{irc.Slug}.xyz";
            var saddle = study.Species.First(x => x.Label == irc.Saddle);
            ircs.Add(new JsonObject { ["label"] = irc.Label, ["saddle_point"] = OptLabel(saddle), ["level_of_theory"] = irc.Level, ["path_file"] = path });
            var text = new StringBuilder();
            foreach (var (g, e) in irc.Frames) text.Append(XyzWriter.ToExtendedText(g, e));
            files.Add(new DemoFile(prefix + path, text.ToString()));
        }

        var manifest = new JsonObject
        {
            ["format"] = "barrierledger-bundle",
            ["format_version"] = 1,
            ["study"] = new JsonObject
            {
                ["name"] = study.Name,
                ["description"] = study.Description,
                // The study's stated protocol: single-point energies on the optimised geometries, thermal corrections from the
                // frequency calculations, 1 mol/L, conformers as Boltzmann ensembles. Without it each state would use its own
                // calculations and mix levels. BU keeps its reactant and saddle point as conformer ensembles; under the ensemble
                // every conformer check applies (duplicates only matter in a Boltzmann sum). Species with one conformer get the
                // same energies either way.
                ["energy_model"] = new JsonObject
                {
                    ["energies_from"] = DemoScenario.SinglePointLevel,
                    ["thermal_from"] = DemoScenario.GeometryLevel,
                    ["standard_state"] = "1 mol/L",
                    ["conformers"] = BundleEnergyModel.ConformerName(ConformerChoice.BoltzmannEnsemble),
                },
            },
            ["species"] = species,
            ["calculations"] = calculations,
            ["reactions"] = reactions,
            ["scans"] = scans,
        };
        if (ircs.Count > 0) manifest["ircs"] = ircs;
        files.Insert(0, new DemoFile(prefix + ManifestName, manifest.ToJsonString(JsonOptions) + "\n"));
        return files;
    }

    /// <summary>
    /// Label of a species' structure calculation (optimisation with Hessian, an optimisation still without one, or the energy of
    /// a lone atom), with the conformer's label after the species'.
    /// </summary>
    public static string OptLabel(DemoSpecies s) =>
        s.ForceField is null ? $"{Name(s)} energy" : s.Frequencies ? $"{Name(s)} opt+freq" : $"{Name(s)} opt";

    /// <summary>Label of a species' single point.</summary>
    public static string SinglePointLabel(DemoSpecies s) => $"{Name(s)} single point";

    private static string Name(DemoSpecies s) => s.Conformer is null ? s.Label : $"{s.Label} {s.Conformer}";

    /// <summary>
    /// A QCSchema AtomicResult: molecule in bohr, model from the level of theory, properties.return_energy, and the Hessian
    /// (flat, one row per line) as return_result; for a lone atom the energy driver.
    /// </summary>
    internal static string QcSchema(DemoSpecies s, string level, bool energyOnly)
    {
        var lot = LevelOfTheory.Parse(level);
        var m = s.Geometry;
        var sb = new StringBuilder();
        sb.Append("{\n");
        sb.Append("  \"schema_name\": \"qcschema_output\",\n");
        sb.Append("  \"schema_version\": 1,\n");
        sb.Append("  \"molecule\": {\n");
        sb.Append("    \"schema_name\": \"qcschema_molecule\",\n");
        sb.Append("    \"schema_version\": 2,\n");
        sb.Append("    \"symbols\": [").Append(string.Join(", ", m.Elements.Select(e => Str(e.Symbol)))).Append("],\n");
        sb.Append("    \"geometry\": [\n");
        for (var i = 0; i < m.AtomCount; i++)
        {
            var p = m.PositionsAngstrom[i];
            sb.Append("      ").Append(Num(Bohr(p.X))).Append(", ").Append(Num(Bohr(p.Y))).Append(", ").Append(Num(Bohr(p.Z)));
            sb.Append(i < m.AtomCount - 1 ? ",\n" : "\n");
        }
        sb.Append("    ],\n");
        sb.Append("    \"molecular_charge\": ").Append(m.Charge.ToString(CultureInfo.InvariantCulture)).Append(",\n");
        sb.Append("    \"molecular_multiplicity\": ").Append(m.Multiplicity.ToString(CultureInfo.InvariantCulture)).Append('\n');
        sb.Append("  },\n");
        sb.Append("  \"driver\": ").Append(Str(energyOnly ? "energy" : "hessian")).Append(",\n");
        sb.Append("  \"model\": { \"method\": ").Append(Str(lot.Method)).Append(", \"basis\": ").Append(Str(lot.Basis)).Append(" },\n");
        sb.Append("  \"keywords\": {},\n");
        sb.Append("  \"provenance\": { \"creator\": \"BarrierLedger demo generator (invented data)\", \"version\": \"1\", \"routine\": \"BarrierLedger.Demo\" },\n");
        sb.Append("  \"properties\": { \"return_energy\": ").Append(Num(s.OptEnergyHartree)).Append(" },\n");
        if (energyOnly)
        {
            sb.Append("  \"return_result\": ").Append(Num(s.OptEnergyHartree)).Append(",\n");
        }
        else
        {
            var h = ValenceForceField.CartesianHessian(m, s.ForceField);
            var n3 = 3 * m.AtomCount;
            sb.Append("  \"return_result\": [\n");
            for (var i = 0; i < n3; i++)
            {
                sb.Append("    ");
                for (var j = 0; j < n3; j++)
                {
                    sb.Append(Num(RoundHessian(h[i * n3 + j])));
                    if (j < n3 - 1) sb.Append(", ");
                }
                sb.Append(i < n3 - 1 ? ",\n" : "\n");
            }
            sb.Append("  ],\n");
        }
        sb.Append("  \"success\": true\n");
        sb.Append("}\n");
        return sb.ToString();
    }

    private static double Bohr(double angstrom) => Clean(Math.Round(angstrom / PhysicalConstants.BohrAngstrom, 10));

    private static double RoundHessian(double v) => Clean(Math.Round(v, 10));

    private static double Clean(double v) => v == 0 ? 0.0 : v;

    private static string Num(double v) => v.ToString("R", CultureInfo.InvariantCulture);

    private static string Str(string s) => JsonSerializer.Serialize(s, JsonOptions);
}
