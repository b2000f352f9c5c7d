using System.Text.Json;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Units;
using BarrierLedger.Core.Vibrations;

namespace BarrierLedger.Cli.Tests;

public class FreqCommandTests
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
    public void Freq_json_on_the_water_QCSchema_gives_the_frequencies_of_the_Core_API()
    {
        using var dir = new TempDir();
        var (code, output, err) = CliRunner.Run("freq", "--json", WriteWater(dir));
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
        var (_, output, _) = CliRunner.Run("freq", "--json", WriteWater(dir));
        using var doc = JsonDocument.Parse(output);
        var highest = doc.RootElement.GetProperty("frequencies_cm1").EnumerateArray().Max(e => e.GetDouble());
        var mu = PhysicalConstants.AtomicMassConstantKilogram;
        var theta = WaterForceField.ThetaDegrees * Math.PI / 180;
        var lambda = 845.0 * (1 / (Elements.H.MostAbundantIsotopeMassDa * mu) + (1 - Math.Cos(theta)) / (Elements.O.MostAbundantIsotopeMassDa * mu));
        var expected = Math.Sqrt(lambda) / (2 * Math.PI * PhysicalConstants.SpeedOfLightMetrePerSecond * 100);
        Assert.True(Math.Abs(highest - expected) < 0.01, $"antisymmetric stretch {highest} cm-1, G-matrix formula {expected} cm-1");
    }

    [Fact]
    public void Freq_table_lists_every_mode()
    {
        using var dir = new TempDir();
        var (code, output, _) = CliRunner.Run("freq", WriteWater(dir));
        Assert.Equal(0, code);
        Assert.Contains("H2O, 3 atoms", output);
        Assert.Contains("Imaginary modes: 0", output);
        Assert.Equal(3, output.Split('\n').Count(l => l.TrimStart().StartsWith("1 ") || l.TrimStart().StartsWith("2 ") || l.TrimStart().StartsWith("3 ")));
    }

    [Fact]
    public void Freq_on_a_geometry_without_Hessian_is_unreadable_with_a_reason()
    {
        using var dir = new TempDir();
        var f = dir.Write("w.xyz", "3\n-76.4\nO 0 0 0\nH 0.757 0 0.586\nH -0.757 0 0.586\n");
        var (code, _, err) = CliRunner.Run("freq", f);
        Assert.Equal(2, code);
        Assert.Contains("has no Hessian, normal modes or frequencies", err);
    }

    [Fact]
    public void Freq_on_a_broken_file_prints_located_errors_and_exits_2()
    {
        using var dir = new TempDir();
        var f = dir.Write("w.json", WaterForceField.QcSchemaJson().Replace("\"H\", \"H\"]", "\"H\"]"));
        var (code, _, err) = CliRunner.Run("freq", f);
        Assert.Equal(2, code);
        Assert.Contains("w.json $.molecule.geometry: error: has 9 numbers, expected 3 × 2 atoms = 6", err);
    }

    [Fact]
    public void Freq_on_a_bundle_calculation_uses_its_frequencies()
    {
        using var dir = new TempDir();
        var f = dir.Write("b.json", """
            {"format":"barrierledger-bundle","format_version":1,"study":{"name":"t"},
             "species":[{"label":"W","charge":0,"multiplicity":1}],
             "calculations":[{"label":"w","species":"W","kind":"minimum","level_of_theory":"HF/STO-3G","energy_hartree":-74.96,
               "geometry":{"symbols":["O","H","H"],"positions_angstrom":[[0,0,0],[0.757,0,0.586],[-0.757,0,0.586]]},
               "frequencies_cm1":[2170.0, 4140.0, 4391.0]}]}
            """);
        var (code, output, _) = CliRunner.Run("freq", "--json", f);
        Assert.Equal(0, code);
        using var doc = JsonDocument.Parse(output);
        Assert.Equal([2170.0, 4140.0, 4391.0], doc.RootElement.GetProperty("frequencies_cm1").EnumerateArray().Select(e => e.GetDouble()));
    }
}
