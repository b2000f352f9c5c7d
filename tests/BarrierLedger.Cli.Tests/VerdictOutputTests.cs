using System.Runtime.CompilerServices;
using System.Text.Json;

namespace BarrierLedger.Cli.Tests;

/// <summary>
/// vibrations and scan print the check verdicts with their reasons. The inputs are the check test cases of the Core tests
/// (tests/BarrierLedger.Core.Tests/Checks/Cases), whose expected verdicts are derived there.
/// </summary>
public class VerdictOutputTests
{
    private static string Case(string name, [CallerFilePath] string here = "") =>
        Path.GetFullPath(Path.Combine(Path.GetDirectoryName(here)!, "..", "BarrierLedger.Core.Tests", "Checks", "Cases", name));

    [Theory]
    [InlineData("clhcl-saddle.json", "Verdict: Passed", 0, "[saddle.reaction-mode]")]
    [InlineData("h-transfer-soft-rotor.json", "Verdict: Needs attention", 0, "[saddle.soft-imaginary-mode]")]
    [InlineData("h-transfer-two-imaginary.json", "Verdict: Failed", 1, "[saddle.several-significant-imaginary-modes]")]
    public void Freq_PrintsTheSaddlePointVerdictWithReasons(string file, string verdict, int exit, string code)
    {
        var (c, o, e) = CliRunner.Run("vibrations", Case(file));
        Assert.True(c == exit, $"exit {c}; stderr: {e}");
        Assert.Contains($"Saddle-point check: {verdict}", o);
        Assert.Contains(code, o);
    }

    [Fact]
    public void FreqJson_CarriesTheVerdict()
    {
        var (c, o, _) = CliRunner.Run("vibrations", Case("h-transfer-soft-rotor.json"), "--json");
        Assert.Equal(0, c);
        var check = JsonDocument.Parse(o).RootElement.GetProperty("saddle_check");
        Assert.Equal("needs_attention", check.GetProperty("verdict").GetString());
        Assert.Contains(check.GetProperty("reasons").EnumerateArray(), r => r.GetProperty("code").GetString() == "saddle.soft-imaginary-mode");
    }

    [Fact]
    public void Scan_PrintsTheScanVerdictWithJumpAndNonConvergedReasons()
    {
        var (c, o, e) = CliRunner.Run("scan", Case("step-scan.csv"));
        Assert.True(c == 1, $"exit {c} (a flagged jump exits 1); stderr: {e}");
        Assert.Contains("Scan check: Verdict: Needs attention", o);
        Assert.Contains("[scan.not-converged] Point 4", o);
        Assert.Contains("the energy jumps between points 8 and 9", o);
    }
}
