using System.Text.Json;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.IsotopeEffects;

namespace BarrierLedger.Cli.Tests;

public class KieCommandTests
{
    private static string Structures
    {
        get
        {
            for (var d = new DirectoryInfo(AppContext.BaseDirectory); d is not null; d = d.Parent)
                if (File.Exists(Path.Combine(d.FullName, "seed-data", "bundle.json"))) return Path.Combine(d.FullName, "seed-data", "structures");
            throw new DirectoryNotFoundException("seed-data/bundle.json not found above the test folder.");
        }
    }

    // The command reads the two QCSchema files, finds H4 in acetaldehyde by atom order and prints what Core's one entry point gives.
    [Fact]
    public void Kie_OnTheDemoHydrogenShift_PrintsCoresKieAndFactors()
    {
        var ts = Path.Combine(Structures, "ts-ke.json");
        var reactant = Path.Combine(Structures, "acetaldehyde.json");
        var (code, output, err) = CliRunner.Run("kie", ts, reactant, "--substitute", "H4=D", "--tunnelling", "wigner", "--json");
        Assert.True(code == 0, err);
        var json = JsonDocument.Parse(output).RootElement;
        QcSchemaResult Read(string path) { using var f = File.OpenRead(path); return QcSchemaReader.Read(f, path).Value!; }
        var t = Read(ts);
        var r = Read(reactant);
        var subs = IsotopeSubstitution.ParseList("4=D");
        var direct = KineticIsotopeEffect.Compute(new KieStructure("TS", t.Molecule, [.. t.HessianHartreePerBohr2], subs),
            [new KieStructure("R", r.Molecule, [.. r.HessianHartreePerBohr2], subs)], new KieOptions(Tunnelling: KieTunnelling.Wigner));
        Assert.Equal(direct.Kie, json.GetProperty("kie").GetDouble(), 12);
        Assert.Equal(direct.ZeroPointFactor, json.GetProperty("factors").GetProperty("zpe").GetDouble(), 12);

        (code, output, err) = CliRunner.Run("kie", ts, reactant, "--substitute", "4=D");
        Assert.True(code == 0, err);
        Assert.Contains("KIE", output);
        Assert.Contains("ZPE", output);
    }

    [Fact]
    public void Kie_WithAReactantAtomOfAnotherElement_RefusesAndNamesIt()
    {
        var (code, _, err) = CliRunner.Run("kie", Path.Combine(Structures, "ts-ke.json"), Path.Combine(Structures, "acetaldehyde.json"),
            "--substitute", "4=D", "--reactant-substitute", "3=D");
        Assert.Equal(2, code);
        Assert.Contains("O3", err);
    }
}
