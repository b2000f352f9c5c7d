using System.Globalization;
using System.Text;
using System.Text.RegularExpressions;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;

namespace BarrierLedger.Ledger.Tests.Uploads;

/// <summary>The upload page's per-file guesses: species from the file name, kind from the imaginary frequencies, level from the file.</summary>
public sealed class UploadSuggestionsTests
{
    /// <summary>
    /// A QCSchema Hessian result for HF along x: H = k·[[1,−1],[−1,1]] on the x components, zero elsewhere. Its one vibration has
    /// ν̃ = √(k/μ)/(2πc) (the two-mass spring, an analytic solution), imaginary for k &lt; 0.
    /// </summary>
    internal static byte[] DiatomicHessian(double kHartreePerBohr2, string method = "MODEL-B", string basis = "basis-2")
    {
        var h = new double[36];
        h[0] = h[21] = kHartreePerBohr2; // row-major 6 × 6: H[0,0] and H[3,3]
        h[3] = h[18] = -kHartreePerBohr2; // H[0,3] and H[3,0]
        var inv = CultureInfo.InvariantCulture;
        return Encoding.UTF8.GetBytes($$"""
            { "schema_name": "qcschema_output", "schema_version": 1, "success": true, "driver": "hessian",
              "model": { "method": "{{method}}", "basis": "{{basis}}" },
              "molecule": { "symbols": ["H", "F"], "geometry": [0, 0, 0, 1.7325, 0, 0], "molecular_charge": 0, "molecular_multiplicity": 1 },
              "properties": { "return_energy": -100.4 },
              "return_result": [{{string.Join(", ", h.Select(v => v.ToString("R", inv)))}}] }
            """);
    }

    /// <summary>ν̃ in cm⁻¹ of the two-mass spring with CODATA 2018 constants (E_h, a₀, u, c) and IUPAC atomic weights H 1.008, F 18.998.</summary>
    private static double SpringWavenumber(double k)
    {
        var kSi = Math.Abs(k) * 4.3597447222071e-18 / (5.29177210903e-11 * 5.29177210903e-11);
        var mu = 1.008 * 18.998403163 / (1.008 + 18.998403163) * 1.66053906660e-27;
        return Math.Sqrt(kSi / mu) / (2 * Math.PI * 299792458.0) / 100;
    }

    private static double FirstWavenumber(string reason) =>
        double.Parse(Regex.Match(reason, @"\((\d+)i").Groups[1].Value, CultureInfo.InvariantCulture);

    [Fact]
    public void For_LooseFiles_EachGetsSpeciesKindAndLevel_TheScanGoesWithTheSaddlePoint()
    {
        var files = new List<UploadFile>
        {
            new("ts1-freq.json", DiatomicHessian(-0.2)),
            new("reactant_opt.json", DiatomicHessian(0.4)),
            new("product.sp.xyz", Encoding.UTF8.GetBytes("2\nenergy=-100.41\nH 0 0 0\nF 0.92 0 0\n")),
            new("ts1-scan.csv", Encoding.UTF8.GetBytes("r,energy\n1.0,-100.40\n1.1,-100.39\n1.2,-100.40\n")),
        };

        var s = UploadSuggestions.For(files).ToDictionary(x => x.FileName);

        Assert.Equal(4, s.Count);
        var ts = s["ts1-freq.json"];
        Assert.Equal(("ts1", CalculationKind.SaddlePoint, 1), (ts.SpeciesLabel, ts.Kind, ts.ImaginaryCount));
        Assert.Equal("MODEL-B/basis-2", ts.LevelOfTheory);
        Assert.Equal("from the file", ts.LevelSource);
        // Analytic two-mass spring (see above); 0.1 % covers the atomic masses the project uses against IUPAC's.
        Assert.Equal(SpringWavenumber(-0.2), FirstWavenumber(ts.KindReason), SpringWavenumber(-0.2) * 1e-3 + 0.5);

        var reactant = s["reactant_opt.json"];
        Assert.Equal(("reactant", CalculationKind.Minimum, 0), (reactant.SpeciesLabel, reactant.Kind, reactant.ImaginaryCount));

        var product = s["product.sp.xyz"];
        Assert.Equal(("product", CalculationKind.Minimum), (product.SpeciesLabel, product.Kind));
        Assert.Equal("MODEL-B/basis-2", product.LevelOfTheory);
        Assert.Equal("as in ts1-freq.json", product.LevelSource);
        Assert.Equal(2, product.AtomCount);

        var scan = s["ts1-scan.csv"];
        Assert.True(scan.IsScan);
        Assert.Equal(("ts1", CalculationKind.RelaxedScan), (scan.SpeciesLabel, scan.Kind));
        Assert.Contains("saddle point's species", scan.SpeciesReason);
    }

    [Fact]
    public void For_TwoLevelsInTheFiles_LeavesAFileWithoutOneToBeTyped()
    {
        var s = UploadSuggestions.For([
            new("a.json", DiatomicHessian(0.4, "MODEL-A")),
            new("b.json", DiatomicHessian(0.4, "MODEL-C")),
            new("c.xyz", Encoding.UTF8.GetBytes("2\n\nH 0 0 0\nF 0.92 0 0\n")),
        ]).ToDictionary(x => x.FileName);

        Assert.Null(s["c.xyz"].LevelOfTheory);
        Assert.Equal("", s["c.xyz"].LevelSource);
    }

    [Fact]
    public void For_ABundleAndTheFilesItNames_GetNoRows()
    {
        var s = UploadSuggestions.For([new("h3.json", Encoding.UTF8.GetBytes(H3Bundle.Manifest())), new("loose.xyz", Encoding.UTF8.GetBytes("2\n\nH 0 0 0\nF 0.92 0 0\n"))]);

        Assert.Equal(["loose.xyz"], s.Select(x => x.FileName));
    }

    [Theory]
    [InlineData("TS1-freq.json", "TS1")]
    [InlineData("butadiene.sp.xyz", "butadiene")]
    [InlineData("int_2_opt_final.xyz", "int_2")]
    [InlineData("scan.csv", "scan")]
    [InlineData("methyl chloride.xyz", "methyl chloride")]
    public void SpeciesFromFileName_DropsExtensionsAndJobWords(string file, string expected) =>
        Assert.Equal(expected, UploadSuggestions.SpeciesFromFileName(file));

    [Fact]
    public void ChoicesFor_ARow_OverridesTheUploadWideFields_AndEmptyFieldsFallBack()
    {
        var choices = new UploadChoices
        {
            LevelOfTheory = "MODEL-A/basis-1", SpeciesLabel = "all",
            Files = new Dictionary<string, FileChoices> { ["x.xyz"] = new("X", CalculationKind.SaddlePoint, " ", 1, 2) },
        };

        var x = choices.For("x.xyz");
        var y = choices.For("y.xyz");

        Assert.Equal(("X", CalculationKind.SaddlePoint, "MODEL-A/basis-1", 1, 2), (x.SpeciesLabel, x.Kind, x.LevelOfTheory, x.Charge, x.Multiplicity));
        Assert.Equal(("all", null, "MODEL-A/basis-1"), (y.SpeciesLabel, y.Kind, y.LevelOfTheory));
    }
}
