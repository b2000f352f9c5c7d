using BarrierLedger.Core.Pathways;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Core.Conformers;
using System.IO.Compression;
using System.Text;
using System.Text.Json;
using System.Text.Json.Nodes;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Scans;
using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Units;
using static BarrierLedger.Core.Tests.Formats.FormatTestHelpers;

namespace BarrierLedger.Core.Tests.Formats;

public class BundleReaderTests
{
    private static readonly string[] s_sampleFiles = ["h2.xyz", "ts1.xyz", "scans/c1h5.csv", "scans/c1h5.xyz", "irc/ts1-irc.xyz"];

    internal static string SampleText() => File.ReadAllText(RepoFiles.Sample("sample-bundle.json"));

    private static Stream? OpenSample(string relative)
    {
        var p = Path.Combine(RepoFiles.SamplesDir, relative);
        return File.Exists(p) ? File.OpenRead(p) : null;
    }

    internal static ReadResult<Bundle> ReadJson(string json, ReaderLimits? limits = null) =>
        BundleReader.Read(Utf8(json), "bundle.json", limits, OpenSample);

    internal static byte[] Zip(IEnumerable<(string Name, byte[] Content)> entries)
    {
        var ms = new MemoryStream();
        using (var zip = new ZipArchive(ms, ZipArchiveMode.Create, leaveOpen: true))
        {
            foreach (var (name, content) in entries)
            {
                var e = zip.CreateEntry(name, CompressionLevel.Optimal);
                using var s = e.Open();
                s.Write(content);
            }
        }
        return ms.ToArray();
    }

    internal static byte[] SampleZip() =>
        Zip(s_sampleFiles.Select(f => (f, File.ReadAllBytes(RepoFiles.Sample(f))))
            .Prepend(("bundle.json", File.ReadAllBytes(RepoFiles.Sample("sample-bundle.json")))));

    [Fact]
    public void Sample_bundle_passes_the_schema_and_the_reader()
    {
        using var schemaDoc = JsonDocument.Parse(File.ReadAllText(RepoFiles.Path("docs", "bundle.schema.json")));
        using var sample = JsonDocument.Parse(SampleText());
        var schemaErrors = new MiniJsonSchema(schemaDoc.RootElement).Validate(sample.RootElement);
        Assert.True(schemaErrors.Count == 0, string.Join("\n", schemaErrors));
        var r = ReadJson(SampleText());
        Assert.True(r.Succeeded, string.Join("\n", r.Issues));
        Assert.Empty(r.Warnings);
    }

    [Fact]
    public void Species_symmetry_number_is_read_when_given_passes_the_schema_and_is_null_when_absent()
    {
        var n = JsonNode.Parse(SampleText())!;
        n["species"]![1]!["symmetry_number"] = 3;
        using var schemaDoc = JsonDocument.Parse(File.ReadAllText(RepoFiles.Path("docs", "bundle.schema.json")));
        using var doc = JsonDocument.Parse(n.ToJsonString());
        Assert.Empty(new MiniJsonSchema(schemaDoc.RootElement).Validate(doc.RootElement));

        var b = ReadJson(n.ToJsonString()).GetValueOrThrow();

        Assert.Equal(3, b.Species[1].SymmetryNumber);
        Assert.Null(b.Species[0].SymmetryNumber);
    }

    [Fact]
    public void Study_energy_model_is_read_when_given_passes_the_schema_round_trips_and_is_null_when_absent()
    {
        var n = JsonNode.Parse(SampleText())!;
        n["study"]!["energy_model"] = new JsonObject
        {
            ["energies_from"] = "CCSD(T)/cc-pVTZ//B3LYP/def2-SVP", ["thermal_from"] = "B3LYP/def2-SVP", ["temperature_kelvin"] = 350.0,
            ["standard_state"] = "1 atm", ["low_modes"] = "entropy-enthalpy", ["low_mode_cutoff_cm1"] = 50.0, ["tunnelling"] = "wigner",
            ["conformers"] = "boltzmann-ensemble",
        };
        using var schemaDoc = JsonDocument.Parse(File.ReadAllText(RepoFiles.Path("docs", "bundle.schema.json")));
        using var doc = JsonDocument.Parse(n.ToJsonString());
        Assert.Empty(new MiniJsonSchema(schemaDoc.RootElement).Validate(doc.RootElement));

        var b = ReadJson(n.ToJsonString()).GetValueOrThrow();
        var expected = new BundleEnergyModel("CCSD(T)/cc-pVTZ//B3LYP/def2-SVP", "B3LYP/def2-SVP", 350.0, StandardState.Gas1Atm,
            ThermoTreatment.QuasiRrhoEntropyAndEnthalpy, 50.0, true, ConformerChoice.BoltzmannEnsemble);
        Assert.Equal(expected, b.Study.EnergyModel);
        Assert.Equal(expected, BundleReader.Read(new MemoryStream(BundleWriter.ToZip(b)), "again.zip").GetValueOrThrow().Study.EnergyModel);
        Assert.Null(ReadJson(SampleText()).GetValueOrThrow().Study.EnergyModel);
    }

    [Fact]
    public void Sample_bundle_is_read_into_the_records_the_store_imports()
    {
        var b = ReadJson(SampleText()).GetValueOrThrow();
        Assert.Equal(1, b.FormatVersion);
        Assert.Equal(5, b.Species.Length);
        Assert.Equal(2, b.Species.Single(s => s.Label == "CH3").Multiplicity);

        var ch3 = b.Calculations.Single(c => c.Label == "CH3-opt");
        Assert.Equal(CalculationKind.Minimum, ch3.Kind);
        Assert.Equal("B3LYP", ch3.LevelOfTheory.Method);
        Assert.Equal(4, ch3.Geometry!.AtomCount);
        Assert.Equal(2, ch3.Geometry.Multiplicity);
        Assert.Equal(6, ch3.FrequenciesCm1.Length);
        Assert.Equal(0.0095, ch3.ThermalCorrections!.GibbsHartree);

        var h2 = b.Calculations.Single(c => c.Label == "H2-opt");
        Assert.Equal(-1.17, h2.EnergyHartree);
        Assert.Equal("h2.xyz", h2.File);

        var ts = b.Calculations.Single(c => c.Label == "TS1-opt");
        Assert.Equal(CalculationKind.SaddlePoint, ts.Kind);
        Assert.Equal(-40.95, ts.EnergyHartree);
        Assert.Equal([-1650.0], ts.FrequenciesCm1.ToArray());
        var mode = Assert.Single(ts.Modes);
        Close.Absolute(1.0, Math.Sqrt(mode.DisplacementCartesian.Sum(v => v.LengthSquared)), 1e-12, "mode displacement norm", "normalised on reading (definition)");

        var sp = b.Calculations.Single(c => c.Label == "TS1-sp");
        Assert.Equal("B3LYP", sp.LevelOfTheory.GeometryLevel!.Method);

        var reaction = Assert.Single(b.Reactions);
        Assert.Equal(["CH3 + H2", "TS1", "CH4 + H"], reaction.States.Select(s => s.Label));
        var tsState = reaction.States[1];
        Assert.Equal(StateKind.SaddlePoint, tsState.Kind);
        Assert.Equal("TS1-opt", tsState.Calculation);
        Assert.Equal([new BundleAtomPair(1, 5), new BundleAtomPair(5, 6)], tsState.ReactionCoordinate.ToArray());
        Assert.Equal(1, reaction.States[0].Terms[1].Coefficient);

        var inline = b.Scans.Single(s => s.Label == "C1-H5 inline");
        Assert.Equal(ScanCoordinateKind.Distance, inline.Coordinate.Kind);
        Assert.Equal([0, 4], inline.Coordinate.Atoms.ToArray());
        Assert.False(inline.Points[2].Converged);

        var fromFiles = b.Scans.Single(s => s.Label == "C1-H5 from files");
        Assert.Equal(2, fromFiles.Points.Length);
        // 3.1 kcal/mol in hartree with 627.5094740631 kcal/mol per Eh (CODATA 2018, via Energy).
        Close.Absolute(3.1 / Energy.KcalPerMolPerHartree, fromFiles.Points[1].EnergyHartree, 1e-15, "scan energy from kcal/mol", "CODATA 2018 hartree");
        Assert.Equal(1.5, fromFiles.Points[1].Geometry!.PositionsAngstrom[4].X);
        Assert.Equal(2, fromFiles.Points[1].Geometry!.Multiplicity);

        var irc = Assert.Single(b.Ircs);
        Assert.Equal(("TS1 IRC", "TS1-opt", IrcForm.Path, 5), (irc.Label, irc.SaddlePoint, irc.Structures.Form, irc.Structures.Structures.Length));
        Assert.Equal([-40.965, -40.957, -40.950, -40.960, -40.975], irc.Structures.Structures.Select(f => f.EnergyHartree!.Value));
        Assert.All(irc.Structures.Structures, f => Assert.Equal(2, f.Geometry.Multiplicity)); // the saddle point's species (TS1, doublet)
        Assert.Equal(1.09, irc.Structures.Structures[^1].Geometry.PositionsAngstrom[4].X);

        Assert.Equal(s_sampleFiles.Order(), b.Files.Keys.Order());
        Assert.Equal(File.ReadAllBytes(RepoFiles.Sample("ts1.xyz")), b.Files["ts1.xyz"].ToArray());
    }

    [Fact]
    public void Zip_bundle_reads_the_same_as_manifest_with_files()
    {
        var fromZip = BundleReader.Read(new MemoryStream(SampleZip()), "demo.zip").GetValueOrThrow();
        var fromJson = ReadJson(SampleText()).GetValueOrThrow();
        Assert.Equal(fromJson.Calculations.Select(c => (c.Label, c.EnergyHartree, c.Geometry?.AtomCount)), fromZip.Calculations.Select(c => (c.Label, c.EnergyHartree, c.Geometry?.AtomCount)));
        Assert.Equal(fromJson.Scans.SelectMany(s => s.Points).Select(p => p.EnergyHartree), fromZip.Scans.SelectMany(s => s.Points).Select(p => p.EnergyHartree));
        Assert.Equal(fromJson.Files.Keys.Order(), fromZip.Files.Keys.Order());
    }

    [Fact]
    public void Unknown_key_is_a_warning_naming_the_known_keys()
    {
        var node = JsonNode.Parse(SampleText())!;
        node["species"]![0]!["multiplicty"] = 2;
        var r = ReadJson(node.ToJsonString());
        Assert.True(r.Succeeded);
        var w = Assert.Single(r.Warnings);
        Assert.Equal("$.species[0].multiplicty", w.JsonPath);
        Assert.Contains("expected one of: label, charge, multiplicity", w.Message);
    }

    // Table of manifest errors: a change to the sample, the expected JSON path and wording.
    public static TheoryData<string, Action<JsonNode>, string, string[]> ManifestErrors => new()
    {
        { "wrong format", n => n["format"] = "other", "$.format", ["expected 'barrierledger-bundle'"] },
        { "newer version", n => n["format_version"] = 7, "$.format_version", ["understands format_version 1"] },
        { "charge as text", n => n["species"]![1]!["charge"] = "0", "$.species[1].charge", ["expected a whole number, found a string"] },
        { "multiplicity 0", n => n["species"]![1]!["multiplicity"] = 0, "$.species[1].multiplicity", ["is 0; expected 1 or more"] },
        { "symmetry number 0", n => n["species"]![1]!["symmetry_number"] = 0, "$.species[1].symmetry_number", ["is 0; expected 1 or more"] },
        { "energy model standard state", n => n["study"]!["energy_model"] = new JsonObject { ["standard_state"] = "1 M" }, "$.study.energy_model.standard_state", ["'1 M'", "'1 mol/L'"] },
        { "energy model low modes", n => n["study"]!["energy_model"] = new JsonObject { ["low_modes"] = "grimme" }, "$.study.energy_model.low_modes", ["'grimme'", "'entropy'"] },
        { "energy model temperature", n => n["study"]!["energy_model"] = new JsonObject { ["temperature_kelvin"] = -5 }, "$.study.energy_model.temperature_kelvin", ["above 0 K"] },
        { "energy model tunnelling", n => n["study"]!["energy_model"] = new JsonObject { ["tunnelling"] = "bell" }, "$.study.energy_model.tunnelling", ["'none' or 'wigner'"] },
        { "energy model cut-off", n => n["study"]!["energy_model"] = new JsonObject { ["low_mode_cutoff_cm1"] = 0 }, "$.study.energy_model.low_mode_cutoff_cm1", ["is 0", "positive cut-off"] },
        { "energy model conformers", n => n["study"]!["energy_model"] = new JsonObject { ["conformers"] = "all" }, "$.study.energy_model.conformers", ["'all'", "'lowest' or 'boltzmann-ensemble'"] },
        { "energy model temperature as text", n => n["study"]!["energy_model"] = new JsonObject { ["temperature_kelvin"] = "298" }, "$.study.energy_model.temperature_kelvin", ["expected a number, found a string"] },
        { "energy model level as number", n => n["study"]!["energy_model"] = new JsonObject { ["energies_from"] = 5 }, "$.study.energy_model.energies_from", ["expected a string"] },
        { "energy model not an object", n => n["study"]!["energy_model"] = "1 mol/L", "$.study.energy_model", ["expected an object"] },
        { "duplicate species", n => n["species"]![1]!["label"] = "CH3", "$.species[1].label", ["already defined at $.species[0]"] },
        { "unknown species", n => n["calculations"]![0]!["species"] = "CH5", "$.calculations[0].species", ["'CH5'", "not in $.species"] },
        { "unknown kind", n => n["calculations"]![0]!["kind"] = "transition_state", "$.calculations[0].kind", ["'transition_state'", "saddle_point"] },
        { "positive energy", n => n["calculations"]![0]!["energy_hartree"] = 12.5, "$.calculations[0].energy_hartree", ["not negative"] },
        { "energy in kcal/mol", n => n["calculations"]![0]!["energy_hartree"] = -24975.0, "$.calculations[0].energy_hartree", ["lowest plausible", "CH3"] },
        { "geometry count", n => n["calculations"]![0]!["geometry"]!["positions_angstrom"]!.AsArray().RemoveAt(3), "$.calculations[0].geometry.positions_angstrom", ["3 positions for 4 symbols"] },
        { "geometry triple", n => n["calculations"]![0]!["geometry"]!["positions_angstrom"]![1]!.AsArray().RemoveAt(2), "$.calculations[0].geometry.positions_angstrom[1]", ["[x, y, z]", "2 numbers"] },
        { "duplicate atom", n => n["calculations"]![0]!["geometry"]!["positions_angstrom"]![1] = new JsonArray(0, 0, 0), "$.calculations[0].geometry.positions_angstrom", ["C1 and H2 are at the same position"] },
        { "bad symbol", n => n["calculations"]![0]!["geometry"]!["symbols"]![2] = "Hq", "$.calculations[0].geometry.symbols[2]", ["'Hq' is not an element"] },
        { "parity", n => n["species"]![0]!["multiplicity"] = 1, "$.species[0].multiplicity", ["9 electrons", "multiplicity 1"] },
        { "thermal temperature", n => n["calculations"]![0]!["thermal_corrections"]!["temperature_kelvin"] = -5, "$.calculations[0].thermal_corrections.temperature_kelvin", ["above 0 K"] },
        { "thermal in kcal", n => n["calculations"]![0]!["thermal_corrections"]!["gibbs_hartree"] = 5.96, "$.calculations[0].thermal_corrections.gibbs_hartree", ["fraction of a hartree"] },
        { "hessian size", n => n["calculations"]![0]!["hessian_hartree_per_bohr2"] = new JsonArray(1.0, 0.0, 0.0, 1.0), "$.calculations[0].hessian_hartree_per_bohr2", ["4 entries", "expected (3 × 4)² = 144"] },
        { "mode size", n => n["calculations"]![2]!["modes"]![0]!["displacements"]!.AsArray().RemoveAt(5), "$.calculations[2].modes[0].displacements", ["15 numbers", "6 atoms"] },
        { "file traversal", n => n["calculations"]![1]!["file"] = "../secret.xyz", "$.calculations[1].file", ["not allowed", "'..'"] },
        { "file missing", n => n["calculations"]![1]!["file"] = "nothere.xyz", "$.calculations[1].file", ["'nothere.xyz' not found"] },
        { "saddle without calculation", n => n["reactions"]![0]!["states"]![1]!.AsObject().Remove("calculation"), "$.reactions[0].states[1]", ["must name its calculation"] },
        { "state kind", n => n["reactions"]![0]!["states"]![0]!["kind"] = "intermediate", "$.reactions[0].states[0].kind", ["'minimum' or 'saddle_point'"] },
        { "term species", n => n["reactions"]![0]!["states"]![2]!["terms"]![0]!["species"] = "CH4x", "$.reactions[0].states[2].terms[0].species", ["'CH4x'"] },
        { "coefficient 0", n => n["reactions"]![0]!["states"]![0]!["terms"]![0]!["coefficient"] = 0, "$.reactions[0].states[0].terms[0].coefficient", ["expected 1 or more"] },
        { "coordinate atom beyond geometry", n => n["reactions"]![0]!["states"]![1]!["reaction_coordinate"]![1]![1] = 9, "$.reactions[0].states[1].reaction_coordinate[1]", ["atom 9 does not exist", "6 atoms"] },
        { "coordinate pair same atom", n => n["reactions"]![0]!["states"]![1]!["reaction_coordinate"]![0] = new JsonArray(5, 5), "$.reactions[0].states[1].reaction_coordinate[0]", ["atom 5 twice"] },
        { "coordinate on minimum", n => n["reactions"]![0]!["states"]![0]!["reaction_coordinate"] = new JsonArray(new JsonArray(1, 2)), "$.reactions[0].states[0].reaction_coordinate", ["only a saddle_point state"] },
        { "calculation of other species", n => n["reactions"]![0]!["states"]![1]!["calculation"] = "CH3-opt", "$.reactions[0].states[1].calculation", ["species 'CH3'", "not among this state's terms"] },
        { "one state", n => { n["reactions"]![0]!["states"]!.AsArray().RemoveAt(2); n["reactions"]![0]!["states"]!.AsArray().RemoveAt(1); }, "$.reactions[0].states", ["1 state(s)"] },
        { "scan atoms count", n => n["scans"]![0]!["coordinate"]!["atoms"]!.AsArray().Add(3), "$.scans[0].coordinate.atoms", ["a distance needs 2"] },
        { "scan coordinate kind", n => n["scans"]![0]!["coordinate"]!["kind"] = "bond", "$.scans[0].coordinate.kind", ["'distance', 'angle' or 'dihedral'"] },
        { "scan points and file", n => n["scans"]![0]!["points_file"] = "scans/c1h5.csv", "$.scans[0]", ["both 'points' and 'points_file'"] },
        { "scan energy text", n => n["scans"]![0]!["points"]![1]!["energy_hartree"] = "x", "$.scans[0].points[1].energy_hartree", ["expected a number, found a string"] },
        { "scan geometries mismatch", n => n["scans"]![1]!["geometries_file"] = "ts1.xyz", "$.scans[1].geometries_file", ["1 frames for 2 points"] },
        { "level of theory empty", n => n["calculations"]![0]!["level_of_theory"] = "", "$.calculations[0].level_of_theory", ["is empty"] },
        { "study missing", n => n.AsObject().Remove("study"), "$.study", ["missing; expected an object"] },
        { "duplicate calculation", n => n["calculations"]![3]!["label"] = "CH3-opt", "$.calculations[3].label", ["already defined at $.calculations[0]"] },
        { "irc of a minimum", n => n["ircs"]![0]!["saddle_point"] = "CH3-opt", "$.ircs[0].saddle_point", ["'CH3-opt'", "minimum", "saddle_point calculation"] },
        { "irc in two forms", n => n["ircs"]![0]!["forward_file"] = "ts1.xyz", "$.ircs[0]", ["both 'path_file' and endpoint files"] },
        { "irc half a pair", n => { n["ircs"]![0]!.AsObject().Remove("path_file"); n["ircs"]![0]!["forward_file"] = "ts1.xyz"; }, "$.ircs[0]", ["'forward_file' without 'backward_file'"] },
        { "irc of other atoms", n => { n["ircs"]![0]!.AsObject().Remove("path_file"); n["ircs"]![0]!["forward_file"] = "h2.xyz"; n["ircs"]![0]!["backward_file"] = "h2.xyz"; },
            "$.ircs[0].forward_file", ["has 2 atoms, not 6", "saddle point 'TS1-opt'"] },
        { "duplicate irc", n => n["ircs"]!.AsArray().Add(n["ircs"]![0]!.DeepClone()), "$.ircs[1].label", ["IRC 'TS1 IRC' is defined twice"] },
    };

    [Theory]
    [MemberData(nameof(ManifestErrors))]
    public void Manifest_errors_name_the_json_path_and_what_was_expected(string what, Action<JsonNode> change, string path, string[] fragments)
    {
        var node = JsonNode.Parse(SampleText())!;
        change(node);
        var r = ReadJson(node.ToJsonString());
        Assert.False(r.Succeeded, what);
        Assert.True(r.Errors.Any(e => e.JsonPath == path && fragments.All(f => e.Message.Contains(f))),
            $"{what}: expected an error at {path} containing [{string.Join(" | ", fragments)}], got:\n{string.Join("\n", r.Issues)}");
    }

    [Fact]
    public void Invalid_json_gives_the_line()
    {
        var r = ReadJson("{\n  \"format\": \"barrierledger-bundle\",\n  \"format_version\": 1,\n  oops\n}");
        SingleError(r, 4, null, "not valid JSON");
    }

    [Fact]
    public void Errors_inside_a_named_file_carry_that_file_and_line()
    {
        var zip = Zip([("bundle.json", Encoding.UTF8.GetBytes(SampleText())), ("h2.xyz", "2\n\nH 0 0 0\nH 0 0\n"u8.ToArray()),
            ("ts1.xyz", File.ReadAllBytes(RepoFiles.Sample("ts1.xyz"))), ("scans/c1h5.csv", File.ReadAllBytes(RepoFiles.Sample("scans/c1h5.csv"))),
            ("scans/c1h5.xyz", File.ReadAllBytes(RepoFiles.Sample("scans/c1h5.xyz"))), ("irc/ts1-irc.xyz", File.ReadAllBytes(RepoFiles.Sample("irc/ts1-irc.xyz")))]);
        var r = BundleReader.Read(new MemoryStream(zip), "up.zip");
        var e = Assert.Single(r.Errors);
        Assert.Equal("up.zip!h2.xyz", e.FileName);
        Assert.Equal(4, e.Line);
    }

    [Fact]
    public void Bare_manifest_without_a_file_opener_says_to_upload_a_zip()
    {
        var r = BundleReader.Read(Utf8(SampleText()), "bundle.json");
        Assert.Contains(r.Errors, e => e.JsonPath == "$.calculations[1].file" && e.Message.Contains("upload the bundle as a .zip"));
    }

    [Fact]
    public void A_species_with_a_bad_charge_is_still_known_to_references()
    {
        var json = """
            {"format":"barrierledger-bundle","format_version":1,"study":{"name":"x"},
             "species":[{"label":"A","charge":"0","multiplicity":1},{"label":"B","charge":0,"multiplicity":1}],
             "reactions":[{"label":"R","states":[{"label":"A","kind":"minimum","terms":[{"species":"A"}]},{"label":"B","kind":"minimum","terms":[{"species":"B"}]}]}]}
            """;
        var r = BundleReader.Read(FormatTestHelpers.Utf8(json), "b.json");
        var e = Assert.Single(r.Errors);
        Assert.Equal("$.species[0].charge", e.JsonPath);
    }

    private static string OneModeBundle(string modeKeys) => $$"""
        {"format":"barrierledger-bundle","format_version":1,"study":{"name":"x"},
         "species":[{"label":"HH","charge":0,"multiplicity":1}],
         "calculations":[{"label":"h2","species":"HH","kind":"minimum","level_of_theory":"HF/STO-3G","energy_hartree":-1.1,
           "geometry":{"symbols":["H","H"],"positions_angstrom":[[0,0,0],[0,0,0.74]]},
           "modes":[{"frequency_cm1":4400.0,"displacements":[[0,0,-1],[0,0,1]]{{modeKeys}}}]}]}
        """;

    [Fact]
    public void Mode_keys_in_SI_are_read_as_given()
    {
        var r = BundleReader.Read(Utf8(OneModeBundle(""","reduced_mass_da":0.504,"force_constant_n_per_m":575.0""")), "b.json");
        Assert.Empty(r.Errors);
        var mode = r.Value!.Calculations.Single().Modes.Single();
        Assert.Equal(0.504, mode.ReducedMassDalton);
        Assert.Equal(575.0, mode.ForceConstantNewtonPerMetre);
    }

    [Fact]
    public void Older_mode_keys_are_still_read_and_mdyn_per_angstrom_becomes_N_per_m()
    {
        // 1 mdyn/Å = 1e-8 N / 1e-10 m = 100 N/m exactly (definitions of the dyne and the ångström).
        var r = BundleReader.Read(Utf8(OneModeBundle(""","reduced_mass_amu":0.504,"force_constant_mdyn_per_angstrom":5.75""")), "b.json");
        Assert.Empty(r.Errors);
        Assert.DoesNotContain(r.Issues, i => i.Message.Contains("unknown", StringComparison.OrdinalIgnoreCase));
        var mode = r.Value!.Calculations.Single().Modes.Single();
        Assert.Equal(0.504, mode.ReducedMassDalton);
        Assert.Equal(575.0, mode.ForceConstantNewtonPerMetre, 10);
    }

    [Fact]
    public void A_mode_with_both_the_new_and_the_older_key_is_an_error_at_the_older_key()
    {
        var r = BundleReader.Read(Utf8(OneModeBundle(""","force_constant_n_per_m":575.0,"force_constant_mdyn_per_angstrom":5.75""")), "b.json");
        var e = Assert.Single(r.Errors);
        Assert.Equal("$.calculations[0].modes[0].force_constant_mdyn_per_angstrom", e.JsonPath);
        Assert.Contains("give only 'force_constant_n_per_m'", e.Message);
    }

    // The forming/breaking bonds are written as "reacting_bonds"; the sample keeps their first name "reaction_coordinate",
    // which format_version 1 bundles still use (docs/formats.md).
    [Fact]
    public void Reacting_bonds_read_the_same_pairs_as_their_older_name()
    {
        var node = JsonNode.Parse(SampleText())!;
        var ts = node["reactions"]![0]!["states"]![1]!.AsObject();
        var pairs = ts["reaction_coordinate"]!.DeepClone();
        ts.Remove("reaction_coordinate");
        ts["reacting_bonds"] = pairs;
        var b = ReadJson(node.ToJsonString()).GetValueOrThrow();
        var state = b.Reactions[0].States[1];
        Assert.Equal([new BundleAtomPair(1, 5), new BundleAtomPair(5, 6)], state.ReactionCoordinate.ToArray());
    }

    [Fact]
    public void Reacting_bonds_given_under_both_names_is_an_error_at_the_older_name()
    {
        var node = JsonNode.Parse(SampleText())!;
        var ts = node["reactions"]![0]!["states"]![1]!.AsObject();
        ts["reacting_bonds"] = ts["reaction_coordinate"]!.DeepClone();
        var r = ReadJson(node.ToJsonString());
        Assert.False(r.Succeeded);
        Assert.Contains(r.Errors, e => e.JsonPath == "$.reactions[0].states[1].reaction_coordinate" && e.Message.Contains("keep one"));
    }
}
