using System.Globalization;
using System.Text;
using System.Text.Json;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Tests.Scans;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Tests.Checks;

/// <summary>
/// The check test cases as input files (bundles and CSV scans in Checks/Cases/) for the command line. The files are
/// generated from the same systems the Core tests use; this test fails when a file on disk no longer matches what the
/// generator produces. Set BARRIERLEDGER_WRITE_CASES=1 to rewrite them.
/// </summary>
public class CheckCaseFiles
{
    private static string CasesDirectory([System.Runtime.CompilerServices.CallerFilePath] string here = "") =>
        Path.Combine(Path.GetDirectoryName(here)!, "Cases");

    public static IReadOnlyDictionary<string, string> Generate() => new Dictionary<string, string>
    {
        ["clhcl-saddle.json"] = SaddleBundle("Linear [Cl-H-Cl]- saddle point (invented)", "ClHCl", -1, 1, TestSystems.ClHCl(),
            SaddleCheckFromHessianTests.ClHClHessian(0.10, -0.05, 0.05), [(1, 2), (2, 3)], "Cl- + HCl", "HCl + Cl-"),
        ["h-transfer-soft-rotor.json"] = SaddleBundle("Hydrogen transfer ethane + Cl with a soft methyl rotor (invented)", "TS-H", 0, 2,
            TestSystems.HydrogenTransfer(), SaddleCheckFromHessianTests.HydrogenTransferHessian(-0.001), [(2, 8), (8, 9)], "C2H6 + Cl", "C2H5 + HCl"),
        ["h-transfer-two-imaginary.json"] = SaddleBundle("Hydrogen transfer with a second large imaginary torsion (invented)", "TS-H", 0, 2,
            TestSystems.HydrogenTransfer(), SaddleCheckFromHessianTests.HydrogenTransferHessian(-0.03), [(2, 8), (8, 9)], "C2H6 + Cl", "C2H5 + HCl"),
        ["muller-brown-relaxed-scan.csv"] = MullerBrownScan(),
        ["step-scan.csv"] = StepScan(),
    };

    [Fact]
    public void CaseFilesOnDisk_MatchTheGenerator()
    {
        var dir = CasesDirectory();
        var write = Environment.GetEnvironmentVariable("BARRIERLEDGER_WRITE_CASES") == "1";
        foreach (var (name, text) in Generate())
        {
            var path = Path.Combine(dir, name);
            if (write) { Directory.CreateDirectory(dir); File.WriteAllText(path, text); continue; }
            Assert.True(File.Exists(path), $"{path} is missing; run the tests once with BARRIERLEDGER_WRITE_CASES=1.");
            Assert.True(File.ReadAllText(path) == text, $"{path} differs from the generator; rerun with BARRIERLEDGER_WRITE_CASES=1 and review the change.");
        }
    }

    private static string SaddleBundle(string study, string species, int charge, int multiplicity, Molecule m, double[] hessian,
        (int, int)[] reactionCoordinate, string reactantLabel, string productLabel)
    {
        using var stream = new MemoryStream();
        using (var w = new Utf8JsonWriter(stream, new JsonWriterOptions { Indented = true }))
        {
            w.WriteStartObject();
            w.WriteString("format", "barrierledger-bundle");
            w.WriteNumber("format_version", 1);
            w.WriteStartObject("study");
            w.WriteString("name", study);
            w.WriteString("description", "A check test case: Cartesian Hessian from a hand-made valence force field (see the Core tests).");
            w.WriteEndObject();
            w.WriteStartArray("species");
            w.WriteStartObject(); w.WriteString("label", species); w.WriteNumber("charge", charge); w.WriteNumber("multiplicity", multiplicity); w.WriteEndObject();
            w.WriteEndArray();
            w.WriteStartArray("calculations");
            w.WriteStartObject();
            w.WriteString("label", species + "-freq");
            w.WriteString("species", species);
            w.WriteString("kind", "saddle_point");
            w.WriteString("level_of_theory", "model/force-field");
            w.WriteStartObject("geometry");
            w.WriteStartArray("symbols");
            foreach (var e in m.Elements) w.WriteStringValue(e.Symbol);
            w.WriteEndArray();
            w.WriteStartArray("positions_angstrom");
            foreach (var p in m.PositionsAngstrom)
            {
                w.WriteStartArray();
                w.WriteNumberValue(Math.Round(p.X, 10)); w.WriteNumberValue(Math.Round(p.Y, 10)); w.WriteNumberValue(Math.Round(p.Z, 10));
                w.WriteEndArray();
            }
            w.WriteEndArray();
            w.WriteEndObject();
            w.WriteStartArray("hessian_hartree_per_bohr2");
            foreach (var h in hessian) w.WriteNumberValue(Math.Round(h, 12));
            w.WriteEndArray();
            w.WriteEndObject();
            w.WriteEndArray();
            w.WriteStartArray("reactions");
            w.WriteStartObject();
            w.WriteString("label", "R1");
            w.WriteStartArray("states");
            w.WriteStartObject(); w.WriteString("label", reactantLabel); w.WriteString("kind", "minimum");
            w.WriteStartArray("terms"); w.WriteStartObject(); w.WriteString("species", species); w.WriteEndObject(); w.WriteEndArray(); w.WriteEndObject();
            w.WriteStartObject(); w.WriteString("label", "TS"); w.WriteString("kind", "saddle_point");
            w.WriteStartArray("terms"); w.WriteStartObject(); w.WriteString("species", species); w.WriteEndObject(); w.WriteEndArray();
            w.WriteString("calculation", species + "-freq");
            w.WriteStartArray("reaction_coordinate");
            foreach (var (a, b) in reactionCoordinate) { w.WriteStartArray(); w.WriteNumberValue(a); w.WriteNumberValue(b); w.WriteEndArray(); }
            w.WriteEndArray();
            w.WriteEndObject();
            w.WriteStartObject(); w.WriteString("label", productLabel); w.WriteString("kind", "minimum");
            w.WriteStartArray("terms"); w.WriteStartObject(); w.WriteString("species", species); w.WriteEndObject(); w.WriteEndArray(); w.WriteEndObject();
            w.WriteEndArray();
            w.WriteEndObject();
            w.WriteEndArray();
            w.WriteEndObject();
        }
        return Encoding.UTF8.GetString(stream.ToArray()) + "\n";
    }

    private static string MullerBrownScan()
    {
        var sb = new StringBuilder("# Relaxed scan along x of the Mueller-Brown surface (Theor. Chim. Acta 1979, 53, 75), energies read as kcal/mol\n");
        sb.Append("x,energy (kcal/mol),converged\n");
        var y = MullerBrown.Minima[2].Y;
        for (var i = 0; i <= 14; i++)
        {
            var x = -0.05 + 0.05 * i;
            y = MullerBrown.RelaxY(x, y);
            sb.Append(CultureInfo.InvariantCulture, $"{x:F2},{MullerBrown.Evaluate(x, y).V:F6},yes\n");
        }
        return sb.ToString();
    }

    private static string StepScan()
    {
        var sb = new StringBuilder("# Invented C-H distance scan: a +6 kcal/mol step after point 8 and a non-converged point 4\n");
        sb.Append("r(C1-H2) (angstrom),energy (kcal/mol),converged\n");
        foreach (var (x, kcal, converged) in ScanAnalysisTests.StepProfile())
            sb.Append(CultureInfo.InvariantCulture, $"{x:F2},{kcal:F6},{(converged ? "yes" : "no")}\n");
        return sb.ToString();
    }
}
