using System.Text.Json;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Units;
using BarrierLedger.Core.Vibrations;

namespace BarrierLedger.Cli.Tests;

public class VibrationsCommandTests
{
    private static string WriteWater(TempDir dir)
    {
        var path = dir.Write("water.qcschema.json", WaterForceField.QcSchemaJson());
        // Set BL_DUMP_DIR to keep a copy of the hand-written file for inspection or demonstration.
        if (Environment.GetEnvironmentVariable("BL_DUMP_DIR") is { Length: > 0 } dump)
            File.Copy(path, Path.Combine(dump, "water.qcschema.json"), overwrite: true);
        return path;
    }

    [Fact]
    public void Vibrations_json_on_the_water_QCSchema_gives_the_frequencies_of_the_Core_API()
    {
        using var dir = new TempDir();
        var (code, output, err) = CliRunner.Run("vibrations", "--json", WriteWater(dir));
        Assert.True(code == 0, err);
        using var doc = JsonDocument.Parse(output);
        var cli = doc.RootElement.GetProperty("frequencies_cm1").EnumerateArray().Select(e => e.GetDouble()).ToArray();
        var api = FrequencyAnalysis.FromHessian(WaterForceField.Molecule(), WaterForceField.Hessian()).FrequenciesCm1;
        Assert.Equal(3, cli.Length);
        for (var i = 0; i < 3; i++)
            Assert.True(Math.Abs(cli[i] - api[i]) <= 1e-6 * api[i], $"mode {i + 1}: CLI {cli[i]} vs Core {api[i]}");
        Assert.Equal(0, doc.RootElement.GetProperty("imaginary_count").GetInt32());
        Assert.Equal("valence-force-field/none", doc.RootElement.GetProperty("level_of_theory").GetString());
        Assert.Equal("H2O", doc.RootElement.GetProperty("formula").GetString());
    }

    [Fact]
    public void Water_antisymmetric_stretch_matches_the_XY2_G_matrix_formula()
    {
        // Wilson, Decius and Cross (1955), XY2 bent molecule, B2 block: λ3 = f_r (1/m_H + (1 − cos θ)/m_O), no interaction constant.
        // Computed here in SI from the force constant, independent of the Core code; tolerance 0.01 cm⁻¹ covers the ~h² error of b_q.
        using var dir = new TempDir();
        var (_, output, _) = CliRunner.Run("vibrations", "--json", WriteWater(dir));
        using var doc = JsonDocument.Parse(output);
        var highest = doc.RootElement.GetProperty("frequencies_cm1").EnumerateArray().Max(e => e.GetDouble());
        var mu = PhysicalConstants.AtomicMassConstantKilogram;
        var theta = WaterForceField.ThetaDegrees * Math.PI / 180;
        var lambda = 845.0 * (1 / (Elements.H.MostAbundantIsotopeMassDa * mu) + (1 - Math.Cos(theta)) / (Elements.O.MostAbundantIsotopeMassDa * mu));
        var expected = Math.Sqrt(lambda) / (2 * Math.PI * PhysicalConstants.SpeedOfLightMetrePerSecond * 100);
        Assert.True(Math.Abs(highest - expected) < 0.01, $"antisymmetric stretch {highest} cm-1, G-matrix formula {expected} cm-1");
    }

    [Fact]
    public void Vibrations_table_lists_every_mode_in_SI_units()
    {
        using var dir = new TempDir();
        var (code, output, _) = CliRunner.Run("vibrations", WriteWater(dir));
        Assert.Equal(0, code);
        Assert.Contains("H2O, 3 atoms", output);
        Assert.Contains("Modes: 3, of them imaginary: 0", output);
        Assert.Contains("μ (Da)", output);
        Assert.Contains("k (N/m)", output);
        Assert.DoesNotContain("mdyn", output);
        Assert.DoesNotContain("amu", output);
        Assert.Equal(3, output.Split('\n').Count(l => l.TrimStart().StartsWith("1 |") || l.TrimStart().StartsWith("2 |") || l.TrimStart().StartsWith("3 |")));
    }

    [Fact]
    public void Vibrations_on_a_geometry_without_Hessian_is_unreadable_with_a_reason()
    {
        using var dir = new TempDir();
        var f = dir.Write("w.xyz", "3\n-76.4\nO 0 0 0\nH 0.757 0 0.586\nH -0.757 0 0.586\n");
        var (code, _, err) = CliRunner.Run("vibrations", f);
        Assert.Equal(2, code);
        Assert.Contains("has no Hessian, normal modes or frequencies", err);
    }

    [Fact]
    public void Vibrations_on_a_broken_file_prints_located_errors_and_exits_2()
    {
        using var dir = new TempDir();
        var f = dir.Write("w.json", WaterForceField.QcSchemaJson().Replace("\"H\", \"H\"]", "\"H\"]"));
        var (code, _, err) = CliRunner.Run("vibrations", f);
        Assert.Equal(2, code);
        Assert.Contains("w.json $.molecule.geometry: error: has 9 numbers, expected 3 × 2 atoms = 6", err);
    }

    [Fact]
    public void Vibrations_on_a_bundle_calculation_uses_its_frequencies()
    {
        using var dir = new TempDir();
        var f = dir.Write("b.json", """
            {"format":"barrierledger-bundle","format_version":1,"study":{"name":"t"},
             "species":[{"label":"W","charge":0,"multiplicity":1}],
             "calculations":[{"label":"w","species":"W","kind":"minimum","level_of_theory":"HF/STO-3G","energy_hartree":-74.96,
               "geometry":{"symbols":["O","H","H"],"positions_angstrom":[[0,0,0],[0.757,0,0.586],[-0.757,0,0.586]]},
               "frequencies_cm1":[2170.0, 4140.0, 4391.0]}]}
            """);
        var (code, output, _) = CliRunner.Run("vibrations", "--json", f);
        Assert.Equal(0, code);
        using var doc = JsonDocument.Parse(output);
        Assert.Equal([2170.0, 4140.0, 4391.0], doc.RootElement.GetProperty("frequencies_cm1").EnumerateArray().Select(e => e.GetDouble()));
    }

    [Fact]
    public void Vibrations_json_gives_reduced_mass_in_Da_and_force_constant_in_N_per_m_of_the_Core_API()
    {
        using var dir = new TempDir();
        var (code, output, err) = CliRunner.Run("vibrations", "--json", WriteWater(dir));
        Assert.True(code == 0, err);
        using var doc = JsonDocument.Parse(output);
        var modes = doc.RootElement.GetProperty("modes").EnumerateArray().ToArray();
        var api = FrequencyAnalysis.FromHessian(WaterForceField.Molecule(), WaterForceField.Hessian()).Modes;
        Assert.Equal(api.Length, modes.Length);
        for (var i = 0; i < api.Length; i++)
        {
            Assert.Equal(api[i].ReducedMassDalton, modes[i].GetProperty("reduced_mass_da").GetDouble(), 12);
            Assert.Equal(api[i].ForceConstantNewtonPerMetre, modes[i].GetProperty("force_constant_n_per_m").GetDouble(), 9);
            // k = (2πcν̃)² μ (harmonic oscillator; CODATA 2018 c and the dalton), computed here from the printed wavenumber and mass.
            var omega = 2 * Math.PI * PhysicalConstants.SpeedOfLightMetrePerSecond * 100 * api[i].FrequencyCm1;
            var k = omega * omega * api[i].ReducedMassDalton * PhysicalConstants.AtomicMassConstantKilogram;
            Assert.True(Math.Abs(k - modes[i].GetProperty("force_constant_n_per_m").GetDouble()) <= 1e-9 * k, $"mode {i + 1}: k = (2πcν̃)²μ gives {k} N/m");
        }
        Assert.False(modes[0].TryGetProperty("reduced_mass_amu", out _));
    }

    [Fact]
    public void Freq_still_works_for_one_release_and_says_it_is_deprecated()
    {
        using var dir = new TempDir();
        var file = WriteWater(dir);
        var (code, output, err) = CliRunner.Run("freq", "--json", file);
        var (_, current, currentErr) = CliRunner.Run("vibrations", "--json", file);
        Assert.Equal(0, code);
        Assert.Equal(current, output);
        Assert.Contains("'freq' is deprecated", err);
        Assert.Contains("use 'vibrations'", err);
        Assert.DoesNotContain("deprecated", currentErr);
        var (_, help, _) = CliRunner.Run("--help");
        Assert.Contains("vibrations", help);
        Assert.DoesNotContain(" freq ", help);
    }
}
