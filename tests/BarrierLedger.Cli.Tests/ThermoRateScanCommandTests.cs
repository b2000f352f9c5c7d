using System.Globalization;
using System.Text;
using System.Text.Json;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Core.Vibrations;

namespace BarrierLedger.Cli.Tests;

public class ThermoCommandTests
{
    private static JsonElement RunJson(params string[] args)
    {
        var (code, output, err) = CliRunner.Run(args);
        Assert.True(code == 0, err);
        return JsonDocument.Parse(output).RootElement.Clone();
    }

    // Water is C2v, so σ = 2 when the option is absent (McQuarrie, Statistical Mechanics, ch. 8, from memory).
    [Theory]
    [InlineData(new string[0], 298.15, 2, StandardState.Gas1Atm, ThermoTreatment.Rrho)]
    [InlineData(new[] { "--temperature", "350", "--symmetry-number", "1", "--standard-state", "1M", "--low-modes", "entropy-enthalpy" }, 350.0, 1, StandardState.Solution1Molar, ThermoTreatment.QuasiRrhoEntropyAndEnthalpy)]
    [InlineData(new[] { "--low-modes", "entropy", "--low-mode-cutoff", "50" }, 298.15, 2, StandardState.Gas1Atm, ThermoTreatment.QuasiRrhoEntropy)]
    [InlineData(new[] { "--standard-state", "1bar" }, 298.15, 2, StandardState.Gas1Bar, ThermoTreatment.Rrho)]
    public void Thermo_json_equals_the_Core_API_for_the_same_options(string[] options, double t, int sigma, StandardState state, ThermoTreatment treatment)
    {
        using var dir = new TempDir();
        var file = dir.Write("water.json", WaterForceField.QcSchemaJson());
        var j = RunJson(["thermo", "--json", file, .. options]);
        var cutoff = options.Contains("--low-mode-cutoff") ? 50.0 : 100.0;
        var api = IdealGasThermo.Compute(FrequencyAnalysis.FromHessian(WaterForceField.Molecule(), WaterForceField.Hessian()),
            new ThermoOptions(t, SymmetryNumber: sigma, Treatment: treatment, StandardState: state, QuasiRrhoCutoffCm1: cutoff));
        Assert.Equal(sigma, j.GetProperty("symmetry_number").GetInt32());
        Assert.Equal("C2v", j.GetProperty("point_group").GetString());
        Assert.Equal(LowModeNames.Name(treatment), j.GetProperty("low_modes").GetString());
        Assert.Equal(api.ZeroPointEnergy.Hartree, j.GetProperty("zpe_hartree").GetDouble(), 12);
        Assert.Equal(api.EnthalpyCorrection.Hartree, j.GetProperty("enthalpy_hartree").GetDouble(), 12);
        Assert.Equal(api.GibbsCorrection.Hartree, j.GetProperty("gibbs_hartree").GetDouble(), 12);
        Assert.Equal(api.EntropyJoulePerMoleKelvin, j.GetProperty("entropy_j_per_mol_k").GetDouble(), 9);
        Assert.Equal(-76.4 + api.GibbsCorrection.Hartree, j.GetProperty("total_gibbs_hartree").GetDouble(), 12);
        Assert.Equal(t, j.GetProperty("temperature_k").GetDouble());
    }

    [Fact]
    public void Thermo_on_a_water_Hessian_prints_C2v_and_sigma_2_without_being_told()
    {
        // Water's point group C2v and σ = 2 (Cotton, Chemical Applications of Group Theory, ch. 3; McQuarrie, ch. 8; from memory).
        using var dir = new TempDir();
        var file = dir.Write("water.json", WaterForceField.QcSchemaJson());
        var (code, output, err) = CliRunner.Run("thermo", file);
        Assert.True(code == 0, err);
        Assert.Contains("point group C2v, so σ = 2", output);
        // The standard state in words, as screens and exports write it (p = 1 atm = 101325 Pa, exact by definition), not the enum name.
        Assert.Contains("standard state 1 atm (p = 101325 Pa)", output);
        Assert.DoesNotContain("Gas1Atm", output);
        Assert.Contains("standard state 1 mol/L", CliRunner.Run("thermo", "--standard-state", "1M", file).Out);
        var given = CliRunner.Run("thermo", "--symmetry-number", "1", file);
        Assert.Contains("σ = 1 as given (the point group alone gives 2)", given.Out);
        // R ln 2 = 5.763 J/(mol K) between the two entropies (CODATA 2018 R).
        var s2 = RunJson("thermo", "--json", file).GetProperty("entropy_j_per_mol_k").GetDouble();
        var s1 = RunJson("thermo", "--json", "--symmetry-number", "1", file).GetProperty("entropy_j_per_mol_k").GetDouble();
        Assert.Equal(8.314462618 * Math.Log(2), s1 - s2, 6);
    }

    [Fact]
    public void Pressure_option_with_units_changes_the_reference_pressure()
    {
        using var dir = new TempDir();
        var file = dir.Write("water.json", WaterForceField.QcSchemaJson());
        Assert.Equal(2e5, RunJson("thermo", "--json", "--pressure", "2bar", file).GetProperty("reference_pressure_pa").GetDouble(), 6);
        Assert.Equal(101325.0, RunJson("thermo", "--json", "--pressure", "1", file).GetProperty("reference_pressure_pa").GetDouble(), 6);
    }

    [Theory]
    [InlineData("--temperature", "-5", "above 0 K")]
    [InlineData("--pressure", "lots", "not a pressure")]
    [InlineData("--standard-state", "2M", "2M")]
    [InlineData("--symmetry-number", "0", "1 or more")]
    [InlineData("--low-modes", "quasi", "harmonic")]
    [InlineData("--low-mode-cutoff", "0", "above 0")]
    [InlineData("--symmetry-tolerance", "-1", "above 0")]
    public void Bad_options_print_usage_and_exit_2(string option, string value, string fragment)
    {
        using var dir = new TempDir();
        var file = dir.Write("water.json", WaterForceField.QcSchemaJson());
        var (code, _, err) = CliRunner.Run("thermo", option, value, file);
        Assert.Equal(2, code);
        Assert.Contains(fragment, err);
        Assert.Contains("Usage:", err);
    }
}

public class RateCommandTests
{
    [Fact]
    public void Eyring_rate_and_half_life_match_an_independent_evaluation()
    {
        // k = (k_B T/h) exp(−ΔG‡/RT) for 20 kcal/mol at 298.15 K with the exact SI constants (CODATA 2018), evaluated
        // independently in Python: 0.013588150047874660 s⁻¹, t½ = ln 2 / k = 51.011151489923485 s.
        var (code, output, _) = CliRunner.Run("rate", "--json", "--barrier", "20", "--unit", "kcal/mol", "--temperature", "298.15");
        Assert.Equal(0, code);
        using var doc = JsonDocument.Parse(output);
        Assert.Equal(0.01358815004787466, doc.RootElement.GetProperty("rate_constant_per_s").GetDouble(), 1e-15);
        Assert.Equal(51.011151489923485, doc.RootElement.GetProperty("half_life_s").GetDouble(), 1e-9);
    }

    [Fact]
    public void Same_barrier_in_kJ_per_mol_gives_the_same_rate()
    {
        var kcal = JsonDocument.Parse(CliRunner.Run("rate", "--json", "--barrier", "20", "--unit", "kcal/mol").Out).RootElement.GetProperty("rate_constant_per_s").GetDouble();
        var kj = JsonDocument.Parse(CliRunner.Run("rate", "--json", "--barrier", "83.68", "--unit", "kJ/mol").Out).RootElement.GetProperty("rate_constant_per_s").GetDouble();
        Assert.Equal(kcal, kj, kcal * 1e-12);
    }

    [Fact]
    public void Wigner_tunnelling_multiplies_the_rate_by_kappa()
    {
        // κ(1000i cm⁻¹, 298.15 K) = 1 + (h c ν̃ / k_B T)²/24 = 1.9702999975616726 (independent Python evaluation, exact SI constants).
        var j = JsonDocument.Parse(CliRunner.Run("rate", "--json", "--barrier", "20", "--unit", "kcal/mol", "--tunnelling", "wigner", "--imaginary-frequency", "-1000").Out).RootElement;
        Assert.Equal(1.9702999975616726, j.GetProperty("kappa").GetDouble(), 1e-9);
        Assert.Equal(0.01358815004787466 * 1.9702999975616726, j.GetProperty("rate_constant_per_s").GetDouble(), 1e-14);
    }

    [Fact]
    public void Human_output_gives_rate_and_half_life()
    {
        var (code, output, _) = CliRunner.Run("rate", "--barrier", "20", "--unit", "kcal/mol");
        Assert.Equal(0, code);
        Assert.Contains("k = 1.3588E-002 s^-1", output);
        Assert.Contains("(51 s)", output);
    }

    [Theory]
    [InlineData(new[] { "rate", "--unit", "kcal/mol" }, "--barrier")]
    [InlineData(new[] { "rate", "--barrier", "20", "--unit", "furlongs" }, "furlongs")]
    [InlineData(new[] { "rate", "--barrier", "20", "--tunnelling", "wigner" }, "--imaginary-frequency")]
    [InlineData(new[] { "rate", "--barrier", "20", "--tunnelling", "skodje-truhlar", "--imaginary-frequency", "1000" }, "--reverse-barrier")]
    [InlineData(new[] { "rate", "--barrier", "twenty" }, "twenty")]
    public void Usage_errors_print_the_usage_and_exit_2(string[] args, string fragment)
    {
        var (code, _, err) = CliRunner.Run(args);
        Assert.Equal(2, code);
        Assert.Contains(fragment, err);
        Assert.Contains("Usage:", err);
        Assert.DoesNotContain("   at ", err);
    }
}

public class ScanCommandTests
{
    private static string Profile(Func<double, double> kcal, int n = 11) =>
        "r (Å),energy (kcal/mol)\n" + string.Concat(Enumerable.Range(0, n).Select(i =>
        {
            var x = 1.5 + 0.1 * i;
            return string.Create(CultureInfo.InvariantCulture, $"{x},{kcal(x)}\n");
        }));

    [Fact]
    public void Smooth_profile_has_one_maximum_near_the_analytic_one_and_exits_0()
    {
        using var dir = new TempDir();
        // E(x) = 10 − 40 (x − 2.0)² kcal/mol: maximum 10 kcal/mol at x = 2.0 Å.
        var f = dir.Write("scan.csv", Profile(x => 10 - 40 * (x - 2.0) * (x - 2.0)));
        var (code, output, err) = CliRunner.Run("scan", "--json", f);
        Assert.True(code == 0, err);
        using var doc = JsonDocument.Parse(output);
        var max = Assert.Single(doc.RootElement.GetProperty("maxima").EnumerateArray());
        Assert.Equal(2.0, max.GetProperty("coordinate").GetDouble(), 1e-3);
        Assert.Equal(11, doc.RootElement.GetProperty("points").GetArrayLength());
        Assert.Empty(doc.RootElement.GetProperty("flags").EnumerateArray());
    }

    [Fact]
    public void Jump_is_flagged_and_exits_1()
    {
        using var dir = new TempDir();
        var f = dir.Write("scan.csv", Profile(x => x > 2.05 && x < 2.15 ? 10 - 40 * (x - 2.0) * (x - 2.0) + 8 : 10 - 40 * (x - 2.0) * (x - 2.0)));
        var (code, output, _) = CliRunner.Run("scan", f);
        // A flagged jump means the profile is not continuous: the scan command exits 1 (checks failed) and prints the verdict.
        Assert.Equal(1, code);
        Assert.Contains("scan.jump", output);
        Assert.Contains("Needs attention", output);
    }

    [Fact]
    public void Scan_of_a_broken_table_prints_located_errors_and_exits_2()
    {
        using var dir = new TempDir();
        var f = dir.Write("scan.csv", "r,energy\n1.0,-1.0\n1.1,oops\n");
        var (code, _, err) = CliRunner.Run("scan", f);
        Assert.Equal(2, code);
        Assert.Contains("scan.csv:3: error: energy 'oops' is not a number", err);
    }

    [Fact]
    public void Scan_that_turns_back_is_refused_with_the_analysis_reason()
    {
        using var dir = new TempDir();
        var f = dir.Write("scan.csv", "r,energy\n1.0,-1.0\n1.2,-1.1\n1.1,-1.05\n");
        var (code, _, err) = CliRunner.Run("scan", f);
        Assert.Equal(2, code);
        Assert.Contains("cannot be analysed", err);
    }
}

public class RateTunnellingTests
{
    [Fact]
    public void Skodje_Truhlar_kappa_is_the_Core_value_for_the_same_barriers()
    {
        var j = JsonDocument.Parse(CliRunner.Run("rate", "--json", "--barrier", "15", "--unit", "kcal/mol", "--tunnelling", "skodje-truhlar",
            "--imaginary-frequency", "1500", "--reverse-barrier", "25").Out).RootElement;
        var kappa = BarrierLedger.Core.Kinetics.Tunnelling.SkodjeTruhlar(1500, BarrierLedger.Core.Units.Energy.FromKcalPerMol(15),
            BarrierLedger.Core.Units.Energy.FromKcalPerMol(25), 298.15);
        Assert.Equal(kappa, j.GetProperty("kappa").GetDouble(), 12);
        Assert.True(kappa > 1, "tunnelling must speed the reaction up");
    }
}

public class ScanFromXyzTests
{
    [Fact]
    public void Multi_frame_xyz_with_atoms_finds_the_analytic_maximum_and_prints_each_flag_once()
    {
        using var dir = new TempDir();
        // E(r) = −1 + 0.016 (1 − 40 (r − 1.0)²) hartree over r = 0.8 … 1.2 Å: maximum at r = 1.0 Å (calculus).
        var sb = new StringBuilder();
        for (var i = 0; i <= 10; i++)
        {
            var r = 0.8 + 0.04 * i;
            var e = -1 + 0.016 * (1 - 40 * (r - 1.0) * (r - 1.0));
            sb.Append(string.Create(CultureInfo.InvariantCulture, $"2\nenergy={e:R}{(i == 9 ? " converged=no" : "")}\nH 0 0 0\nH 0 0 {r:R}\n"));
        }
        var f = dir.Write("stretch.xyz", sb.ToString());
        var (code, output, err) = CliRunner.Run("scan", "--atoms", "1,2", "--json", f);
        Assert.True(code == 0, err);
        using var doc = JsonDocument.Parse(output);
        var max = Assert.Single(doc.RootElement.GetProperty("maxima").EnumerateArray());
        Assert.Equal(1.0, max.GetProperty("coordinate").GetDouble(), 1e-3);
        Assert.Equal("distance", doc.RootElement.GetProperty("coordinate_kind").GetString());
        Assert.False(doc.RootElement.GetProperty("points")[9].GetProperty("converged").GetBoolean());

        var (_, table, _) = CliRunner.Run("scan", "--atoms", "1,2", f);
        // The non-converged point's message appears once (as a reason of the scan check), not also under the table.
        var message = "Point 10 (1.160 Å) did not converge";
        Assert.Equal(1, CountOf(table, message));
    }

    [Fact]
    public void Multi_frame_xyz_without_atoms_is_a_usage_error_that_says_what_to_add()
    {
        using var dir = new TempDir();
        var f = dir.Write("stretch.xyz", "2\nenergy=-1.0\nH 0 0 0\nH 0 0 0.8\n2\nenergy=-0.9\nH 0 0 0\nH 0 0 0.9\n");
        var (code, _, err) = CliRunner.Run("scan", f);
        Assert.Equal(2, code);
        Assert.Contains("--atoms", err);
    }

    private static int CountOf(string text, string part)
    {
        var n = 0;
        for (var i = text.IndexOf(part, StringComparison.Ordinal); i >= 0; i = text.IndexOf(part, i + 1, StringComparison.Ordinal)) n++;
        return n;
    }
}
