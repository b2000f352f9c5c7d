using System.Text.Json.Nodes;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Units;
using static BarrierLedger.Core.Tests.Formats.FormatTestHelpers;

namespace BarrierLedger.Core.Tests.Formats;

public class QcSchemaReaderTests
{
    // Water at r = 0.9572 Å, θ = 104.52° in bohr; energy -76.0266 Eh (an invented but plausible HF value).
    internal const string Energy = """
        {
          "schema_name": "qcschema_output",
          "schema_version": 1,
          "molecule": {
            "symbols": ["O", "H", "H"],
            "geometry": [0.0, 0.0, 0.0, 1.43042, 0.0, 1.10756, -1.43042, 0.0, 1.10756],
            "molecular_charge": 0,
            "molecular_multiplicity": 1
          },
          "driver": "energy",
          "model": { "method": "HF", "basis": "cc-pVDZ" },
          "properties": { "return_energy": -76.0266 },
          "return_result": -76.0266,
          "success": true,
          "provenance": { "creator": "hand-written" }
        }
        """;

    private static ReadResult<QcSchemaResult> Read(string json) => QcSchemaReader.Read(Utf8(json), "w.json");

    private static string Hessian(double[] h, string extra = "") =>
        Energy.Replace("\"driver\": \"energy\"", "\"driver\": \"hessian\"" + extra)
              .Replace("\"return_result\": -76.0266", "\"return_result\": [" + string.Join(",", h.Select(Numbers.Format)) + "]");

    private static double[] DiagonalHessian(int n, double value = 0.5)
    {
        var h = new double[n * n];
        for (var i = 0; i < n; i++) h[i * n + i] = value;
        return h;
    }

    [Fact]
    public void Energy_result_gives_molecule_in_angstrom_energy_level_and_program()
    {
        var r = Read(Energy);
        Assert.True(r.Succeeded, string.Join("\n", r.Issues));
        var q = r.Value!;
        Assert.Equal(QcDriver.Energy, q.Driver);
        Assert.Equal(-76.0266, q.EnergyHartree);
        Assert.Equal("HF/cc-pVDZ", q.LevelOfTheory!.ToString());
        Assert.Equal("hand-written", q.Program);
        // 1.43042 bohr × 0.529177210903 Å/bohr (CODATA 2018).
        Close.Absolute(1.43042 * 0.529177210903, q.Molecule.PositionsAngstrom[1].X, 1e-12, "x of H2 in Å", "CODATA 2018 Bohr radius");
        Assert.Empty(r.Issues);
    }

    [Fact]
    public void Hessian_result_keeps_the_row_major_matrix_flat_or_nested()
    {
        var h = DiagonalHessian(9);
        h[1] = h[9] = 0.01;
        var r = Read(Hessian(h));
        Assert.True(r.Succeeded, string.Join("\n", r.Issues));
        Assert.Equal(h, r.Value!.HessianHartreePerBohr2.ToArray());
        Assert.Equal(-76.0266, r.Value.EnergyHartree);
        var nested = "[" + string.Join(",", Enumerable.Range(0, 9).Select(i => "[" + string.Join(",", h.Skip(9 * i).Take(9).Select(Numbers.Format)) + "]")) + "]";
        var r2 = Read(Hessian(h).Replace("\"return_result\": [" + string.Join(",", h.Select(Numbers.Format)) + "]", "\"return_result\": " + nested));
        Assert.Equal(h, r2.GetValueOrThrow().HessianHartreePerBohr2.ToArray());
    }

    [Fact]
    public void Slightly_asymmetric_hessian_is_a_warning()
    {
        var h = DiagonalHessian(9);
        h[1] = 0.01;
        h[9] = 0.01 + 1e-5;
        var r = Read(Hessian(h));
        Assert.True(r.Succeeded);
        Assert.Contains(r.Warnings, w => w.JsonPath == "$.return_result" && w.Message.Contains("symmetrised"));
    }

    public static TheoryData<string, Action<JsonNode>, string, string[]> Errors => new()
    {
        { "input not output", n => n["schema_name"] = "qcschema_input", "$.schema_name", ["'qcschema_input'", "calculation input"] },
        { "no schema name", n => n.AsObject().Remove("schema_name"), "$.schema_name", ["missing; expected a string"] },
        { "failed", n => { n["success"] = false; n["error"] = new JsonObject { ["error_message"] = "SCF did not converge" }; }, "$.success", ["SCF did not converge"] },
        { "no molecule", n => n.AsObject().Remove("molecule"), "$.molecule", ["missing; expected an object"] },
        { "symbol", n => n["molecule"]!["symbols"]![1] = "Hx", "$.molecule.symbols[1]", ["unknown element 'Hx'"] },
        { "symbol number", n => n["molecule"]!["symbols"]![1] = 1, "$.molecule.symbols[1]", ["expected an element symbol, found a number"] },
        { "geometry length", n => n["molecule"]!["geometry"]!.AsArray().RemoveAt(8), "$.molecule.geometry", ["8 numbers, expected 3 × 3 atoms = 9"] },
        { "geometry text", n => n["molecule"]!["geometry"]![4] = "0.0", "$.molecule.geometry[4]", ["expected a number, found a string"] },
        { "charge half", n => n["molecule"]!["molecular_charge"] = 0.5, "$.molecule.molecular_charge", ["expected a whole number, found 0.5"] },
        { "parity", n => n["molecule"]!["molecular_multiplicity"] = 2, "$.molecule.molecular_multiplicity", ["10 electrons cannot have spin multiplicity 2"] },
        { "driver", n => n["driver"] = "properties", "$.driver", ["'properties'", "'energy', 'gradient' or 'hessian'"] },
        { "no result", n => n.AsObject().Remove("return_result"), "$.return_result", ["missing; expected the energy result"] },
        { "positive energy", n => { n["return_result"] = 76.0; n["properties"]!["return_energy"] = 76.0; }, "$.properties.return_energy", ["not negative"] },
        { "energy in eV", n => { n["return_result"] = -2068.8; n["properties"]!["return_energy"] = -2068.8; }, "$.properties.return_energy", ["lowest plausible", "H2O"] },
        { "duplicate atoms", n => { n["molecule"]!["geometry"]![3] = 0.0; n["molecule"]!["geometry"]![5] = 0.0; }, "$.molecule.geometry", ["O1 and H2 are at the same position"] },
        { "model method", n => n["model"]!.AsObject().Remove("method"), "$.model.method", ["missing; expected a string"] },
        { "gradient size", n => { n["driver"] = "gradient"; n["return_result"] = new JsonArray(0.0, 0.0, 0.0); }, "$.return_result", ["3 numbers, expected 3 × 3 atoms = 9"] },
    };

    [Theory]
    [MemberData(nameof(Errors))]
    public void Errors_name_the_json_path_and_what_was_expected(string what, Action<JsonNode> change, string path, string[] fragments)
    {
        var node = JsonNode.Parse(Energy)!;
        change(node);
        var r = Read(node.ToJsonString());
        Assert.False(r.Succeeded, what);
        Assert.True(r.Errors.Any(e => e.JsonPath == path && fragments.All(f => e.Message.Contains(f))),
            $"{what}: expected an error at {path} containing [{string.Join(" | ", fragments)}], got:\n{string.Join("\n", r.Issues)}");
    }

    [Fact]
    public void Hessian_of_the_wrong_size_names_the_atom_count_it_would_fit()
    {
        var r = Read(Hessian(DiagonalHessian(6)));
        SingleError(r, null, "$.return_result", "36 entries", "expected (3 × 3)² = 81", "a Hessian for 2 atoms");
    }

    [Fact]
    public void Strongly_asymmetric_hessian_is_an_error()
    {
        var h = DiagonalHessian(9);
        h[1] = 0.2;
        SingleError(Read(Hessian(h)), null, "$.return_result", "not symmetric", "[0,1] and [1,0]");
    }

    [Fact]
    public void Malformed_json_gives_a_line()
    {
        var r = Read(Energy.Replace("\"driver\": \"energy\",", "\"driver\": \"energy\""));
        var e = Assert.Single(r.Errors);
        Assert.Equal(11, e.Line); // the parser notices the missing comma where "model" begins
        Assert.Contains("not valid JSON", e.Message);
    }
}
