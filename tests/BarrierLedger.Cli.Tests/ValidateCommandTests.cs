using System.Text.Json;

namespace BarrierLedger.Cli.Tests;

public class ValidateCommandTests
{
    [Fact]
    public void Good_xyz_is_readable_and_exits_0()
    {
        using var dir = new TempDir();
        var f = dir.Write("w.xyz", "3\n-76.4\nO 0 0 0\nH 0.757 0 0.586\nH -0.757 0 0.586\n");
        var (code, output, _) = CliRunner.Run("validate", f);
        Assert.Equal(0, code);
        Assert.Contains("readable, 0 error(s)", output);
    }

    [Fact]
    public void Broken_xyz_lists_located_errors_and_exits_2()
    {
        using var dir = new TempDir();
        var f = dir.Write("bad.xyz", "3\n-76.4\nO 0 0 0\nH 0.757 0\nH -0.757 0 0.586\n");
        var (code, output, _) = CliRunner.Run("validate", f);
        Assert.Equal(2, code);
        Assert.Contains("bad.xyz:4: error: expected an element and 3 coordinates", output);
    }

    [Fact]
    public void Missing_file_is_unreadable_input()
    {
        var (code, output, _) = CliRunner.Run("validate", "/nonexistent/nothing.xyz");
        Assert.Equal(2, code);
        Assert.Contains("file not found", output);
    }

    [Fact]
    public void Json_output_lists_files_with_issues()
    {
        using var dir = new TempDir();
        var f = dir.Write("bad.xyz", "1\n\nQq 0 0 0\n");
        var (code, output, _) = CliRunner.Run("validate", "--json", f);
        Assert.Equal(2, code);
        using var doc = JsonDocument.Parse(output);
        Assert.False(doc.RootElement.GetProperty("ok").GetBoolean());
        var issue = doc.RootElement.GetProperty("files")[0].GetProperty("issues")[0];
        Assert.Equal(3, issue.GetProperty("line").GetInt32());
        Assert.Equal("error", issue.GetProperty("severity").GetString());
        Assert.Contains("unknown element 'Qq'", issue.GetProperty("message").GetString());
    }
}

public class ValidateFormatsTests
{
    [Fact]
    public void Each_format_is_recognised_and_broken_files_are_located()
    {
        using var dir = new TempDir();
        var csv = dir.Write("scan.csv", "r,energy (kcal/mol)\n1.0,0.0\n1.1,abc\n");
        var qc = dir.Write("w.json", "{\"schema_name\":\"qcschema_output\",\"molecule\":{\"symbols\":[\"O\",\"H\"],\"geometry\":[0,0,0,0,0]},\"driver\":\"energy\",\"return_result\":-75.0}");
        var bundle = dir.Write("bundle.json", "{\"format\":\"barrierledger-bundle\",\"format_version\":1,\"study\":{\"name\":\"x\"},\"species\":[{\"label\":\"A\",\"charge\":\"0\",\"multiplicity\":1}]}");
        var (code, output, _) = CliRunner.Run("validate", csv, qc, bundle);
        Assert.Equal(2, code);
        Assert.Contains("scan.csv: csv-scan, NOT readable", output);
        Assert.Contains("scan.csv:3: error: energy 'abc' is not a number", output);
        Assert.Contains("w.json: qcschema, NOT readable", output);
        Assert.Contains("w.json $.molecule.geometry: error: has 5 numbers, expected 3 × 2 atoms = 6", output);
        Assert.Contains("bundle.json $.species[0].charge: error: expected a whole number, found a string", output);
    }

    [Fact]
    public void Bare_manifest_opens_named_files_beside_it_but_not_outside()
    {
        using var dir = new TempDir();
        dir.Write("h.xyz", "1\nenergy=-0.5 charge=0 multiplicity=2\nH 0 0 0\n");
        var ok = dir.Write("ok.json", Manifest("h.xyz"));
        Assert.Equal(0, CliRunner.Run("validate", ok).Code);
        var bad = dir.Write("bad.json", Manifest("../h.xyz"));
        var (code, output, _) = CliRunner.Run("validate", bad);
        Assert.Equal(2, code);
        Assert.Contains("$.calculations[0].file: error: file path '../h.xyz' is not allowed", output);
    }

    private static string Manifest(string file) =>
        "{\"format\":\"barrierledger-bundle\",\"format_version\":1,\"study\":{\"name\":\"x\"},\"species\":[{\"label\":\"H\",\"charge\":0,\"multiplicity\":2}]," +
        "\"calculations\":[{\"label\":\"h\",\"species\":\"H\",\"kind\":\"minimum\",\"level_of_theory\":\"HF/STO-3G\",\"file\":\"" + file + "\"}]}";
}
