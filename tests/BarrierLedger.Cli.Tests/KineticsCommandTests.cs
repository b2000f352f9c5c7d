using System.IO.Compression;
using System.Text.Json;
using BarrierLedger.Cli.Commands;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Uploads;
using CsvHelper;
using Microsoft.Data.Sqlite;
using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.Cli.Tests;

public class KineticsCommandTests
{
    // An invented one-step isomerisation A → TS → B, B far below A (ΔE_r ≈ −31 kcal/mol), so the reverse step is negligible and the
    // kinetics is first order: [A](t) = [A]₀ e^{−kt}.
    private const string Bundle = """
        {
          "format": "barrierledger-bundle",
          "format_version": 1,
          "study": { "name": "First-order test", "description": "invented test data",
                     "energy_model": { "energies_from": "", "thermal_from": "", "temperature_kelvin": 298.15, "standard_state": "1 mol/L", "tunnelling": "none" } },
          "species": [
            { "label": "A", "charge": 0, "multiplicity": 1 },
            { "label": "TS", "charge": 0, "multiplicity": 1 },
            { "label": "B", "charge": 0, "multiplicity": 1 }
          ],
          "calculations": [
            { "label": "a", "species": "A", "kind": "minimum", "level_of_theory": "XDFT/basis-1", "energy_hartree": -1.17,
              "geometry": { "symbols": ["H", "H"], "positions_angstrom": [[0, 0, 0], [0.74, 0, 0]] }, "thermal_corrections": { "temperature_kelvin": 298.15, "zero_point_hartree": 0.01, "enthalpy_hartree": 0.012, "gibbs_hartree": 0.0 } },
            { "label": "ts", "species": "TS", "kind": "saddle_point", "level_of_theory": "XDFT/basis-1", "energy_hartree": -1.1246,
              "geometry": { "symbols": ["H", "H"], "positions_angstrom": [[0, 0, 0], [0.9, 0, 0]] }, "frequencies_cm1": [-1200.0], "thermal_corrections": { "temperature_kelvin": 298.15, "zero_point_hartree": 0.01, "enthalpy_hartree": 0.012, "gibbs_hartree": 0.0 } },
            { "label": "b", "species": "B", "kind": "minimum", "level_of_theory": "XDFT/basis-1", "energy_hartree": -1.22,
              "geometry": { "symbols": ["H", "H"], "positions_angstrom": [[0, 0, 0], [0.76, 0, 0]] }, "thermal_corrections": { "temperature_kelvin": 298.15, "zero_point_hartree": 0.01, "enthalpy_hartree": 0.012, "gibbs_hartree": 0.0 } }
          ],
          "reactions": [
            { "label": "AB", "description": "invented",
              "states": [
                { "label": "A", "kind": "minimum", "terms": [ { "species": "A" } ] },
                { "label": "TS", "kind": "saddle_point", "terms": [ { "species": "TS" } ], "calculation": "ts" },
                { "label": "B", "kind": "minimum", "terms": [ { "species": "B" } ] } ] }
          ]
        }
        """;

    // The bundle stored into a ledger through the real upload service, and the reaction as the reaction page reads it.
    private static async Task<(string DataDir, ReactionDetail Detail)> LedgerAsync(TempDir temp)
    {
        var dir = Path.Combine(temp.Path, "data");
        ReactionDetail detail;
        await using (var services = LedgerHost.Build(dir).BuildServiceProvider())
        {
            await SqliteSetup.PrepareAsync(services.GetRequiredService<LedgerOptions>(), services.GetRequiredService<IDbContextFactory<LedgerDbContext>>());
            var outcome = await services.GetRequiredService<UploadService>().StoreAsync([new UploadFile("bundle.json", System.Text.Encoding.UTF8.GetBytes(Bundle))], new UploadChoices(), "test");
            Assert.True(outcome.Stored, string.Join("; ", outcome.Issues));
            await services.GetRequiredService<BarrierLedger.Ledger.Derivation.RecomputeService>().WhenIdleAsync();
            await using var db = await services.GetRequiredService<IDbContextFactory<LedgerDbContext>>().CreateDbContextAsync();
            var id = await db.Reactions.Where(r => r.Label == "AB").Select(r => r.Id).SingleAsync();
            detail = (await services.GetRequiredService<ReactionQueryService>().GetReactionAsync(id))!;
        }
        SqliteConnection.ClearAllPools();
        return (dir, detail);
    }

    // First-order A → B against its analytic solution (Atkins & de Paula, Physical Chemistry, integrated rate laws):
    // [A] = [A]₀ e^{−kt}, t½ = ln 2 / k, t(95 %) = ln 20 / k, conversion X(t) = 1 − e^{−kt}; k is the reaction page's stored k.
    [Fact]
    public async Task FirstOrder_TimesAndConversionsAreTheIntegratedRateLaw_WithTheReactionPagesK()
    {
        using var temp = new TempDir();
        var (dir, detail) = await LedgerAsync(temp);
        var k = detail.Steps.Single().RateConstant!.Value;
        Assert.Equal(k, detail.RateConstantPerSecond!.Value, 12);
        var half = Math.Log(2) / k;
        var (code, output, err) = CliRunner.Run("kinetics", "--data-dir", dir, "--reaction", "AB", "--c0", "A=0.2", "--hours", (20 * half / 3600).ToString("R", System.Globalization.CultureInfo.InvariantCulture),
            "--at", string.Join(",", new[] { 0.5 * half, 3 * half }.Select(t => (t / 3600).ToString("R", System.Globalization.CultureInfo.InvariantCulture))), "--json");
        Assert.True(code == 0, err);
        var json = JsonDocument.Parse(output).RootElement;

        var rate = json.GetProperty("rate_constants")[0];
        Assert.Equal(1.0, rate.GetProperty("forward").GetDouble() / k, 12); // one route to k: the page's stored k, unchanged
        Assert.Equal(0.2, json.GetProperty("initial_mol_per_l").GetProperty("A").GetDouble());
        var times = json.GetProperty("conversion_times");
        Assert.Equal(0.5, times[0].GetProperty("conversion").GetDouble());
        Assert.True(Math.Abs(times[0].GetProperty("seconds").GetDouble() / half - 1) <= 1e-6, $"t½ {times[0].GetProperty("seconds").GetDouble()} vs ln2/k {half}");
        Assert.True(Math.Abs(times[1].GetProperty("seconds").GetDouble() / (Math.Log(20) / k) - 1) <= 1e-6);
        var conversions = json.GetProperty("conversions");
        foreach (var c in conversions.EnumerateArray())
        {
            var t = c.GetProperty("seconds").GetDouble();
            Assert.True(Math.Abs(c.GetProperty("conversion").GetDouble() / (1 - Math.Exp(-k * t)) - 1) <= 1e-6, $"X({t}) = {c.GetProperty("conversion").GetDouble()}");
        }
        Assert.Equal(2, conversions.GetArrayLength());
        // The curve: [A] = [A]₀ e^{−kt} at every accepted step, and [A] + [B] = [A]₀ (mass balance).
        var species = json.GetProperty("species").EnumerateArray().Select(s => s.GetString()).ToList();
        var (ia, ib) = (species.IndexOf("A"), species.IndexOf("B"));
        foreach (var p in json.GetProperty("curve").EnumerateArray())
        {
            var t = p.GetProperty("seconds").GetDouble();
            var c = p.GetProperty("mol_per_l");
            Assert.True(Math.Abs(c[ia].GetDouble() - 0.2 * Math.Exp(-k * t)) <= 1e-6 * 0.2, $"[A]({t}) = {c[ia].GetDouble()}");
            Assert.Equal(0.2, c[ia].GetDouble() + c[ib].GetDouble(), 9);
        }
        Assert.Contains("no Monte Carlo run", json.GetProperty("uncertainty").GetString());
        Assert.Contains(json.GetProperty("cautions").EnumerateArray(), c => c.GetString()!.Contains("saddle point TS is not verified", StringComparison.Ordinal));
    }

    // The text answer and the files: the sentence names t½ = ln 2 / k in the screen's wording (Atkins & de Paula, integrated rate laws),
    // the table prints k with its 95 % interval k·exp(±1.959964·σ/RT) (σ = 2 kcal/mol, the default; z from the NIST/SEMATECH e-Handbook
    // §1.3.6.7.1), and the curves CSV parses with [A] = [A]₀ e^{−kt} to the file's six significant digits.
    [Fact]
    public async Task Text_PrintsTheAnswerAndInterval_AndTheCurvesFileIsTheIntegratedRateLaw()
    {
        using var temp = new TempDir();
        var (dir, detail) = await LedgerAsync(temp);
        var k = detail.Steps.Single().RateConstant!.Value;
        var half = Math.Log(2) / k;
        var curves = Path.Combine(temp.Path, "out", "curves.csv");
        var answers = Path.Combine(temp.Path, "out", "answers.xlsx");
        var (code, output, err) = CliRunner.Run("kinetics", "--data-dir", dir, "--reaction", "AB", "--hours", "1", "--out", curves, "--answers", answers);
        Assert.True(code == 0, err);
        Assert.Contains($"95 % conversion of A after {BarrierLedger.Core.Kinetics.Microkinetics.Format.Duration(Math.Log(20) / k)} at 298 K (50 % after {BarrierLedger.Core.Kinetics.Microkinetics.Format.Duration(half)})", output);
        var rt = 8.314462618 * 298.15 / 4184.0; // R from CODATA 2018, thermochemical calorie
        var f = Math.Exp(1.959964 * 2.0 / rt);
        Assert.Contains($"{k:0.00E+00}", output);
        Assert.Contains($"{k / f:0.00E+00}", output);
        Assert.Contains($"{k * f:0.00E+00}", output);
        Assert.Contains("σ = 2.0 kcal/mol per barrier (the default for every level; common practice, no source)", output);
        Assert.Contains("Caution:", output);
        Assert.Contains("wrote", output);

        using (var reader = CsvReader.FromFile(curves, new CsvReaderOptions { CommentPrefix = '#' }))
        {
            Assert.Equal(["time (s)", "T (K)", "[A] (mol/L)", "[B] (mol/L)", "Note", "Note text"], reader.Headers);
            var rows = 0;
            while (reader.Read())
            {
                rows++;
                var t = double.Parse(reader.GetString("time (s)"), System.Globalization.CultureInfo.InvariantCulture);
                var a = double.Parse(reader.GetString("[A] (mol/L)"), System.Globalization.CultureInfo.InvariantCulture);
                var exact = 0.1 * Math.Exp(-k * t);
                // Six significant digits of t and [A] (relative rounding ≤ 5e-6 each; t's carries into [A] as k·t·5e-6), the integrator's rtol 1e-6 and atol 1e-11.
                Assert.True(Math.Abs(a - exact) <= exact * (1e-6 + 5e-6 * (1 + k * t)) + 1e-11, $"[A]({t}) = {a}, expected {exact}");
            }
            Assert.True(rows > 10);
        }
        var text = File.ReadAllText(curves);
        Assert.Contains("# Uncertainty: σ = 2.0 kcal/mol", text);
        Assert.Contains("standard state 1 mol/L", text);
        Assert.Contains("# Caution:", text);
        using var zip = ZipFile.OpenRead(answers);
        var workbook = new StreamReader(zip.GetEntry("xl/workbook.xml")!.Open()).ReadToEnd();
        Assert.Contains("Kinetics answers", workbook);
    }

    // The demo's catalysed pathway IX from the demo bundle: the command runs at the conditions its definition proposes (353.15 K, 24 h),
    // and its forward k at the model temperature are the reaction page's (checked per demo step in Ledger ReactionKineticsTests); a
    // Monte Carlo with the same random key gives the same intervals.
    [Fact]
    public void DemoPathway_FromTheBundle_UsesTheDeclaredConditions_AndRepeatsWithTheSameKey()
    {
        string[] args = ["kinetics", "--bundle", ExportCommandTests.DemoFolder, "--reaction", "IX", "--samples", "40", "--random-key", "7", "--json"];
        var (code, first, err) = CliRunner.Run(args);
        Assert.True(code == 0, err);
        var json = JsonDocument.Parse(first).RootElement;
        Assert.Equal(353.15, json.GetProperty("start_kelvin").GetDouble());
        Assert.Equal(24.0, json.GetProperty("hours").GetDouble());
        Assert.Equal(40, json.GetProperty("monte_carlo").GetProperty("samples").GetInt32());
        Assert.Contains("only 40 samples", string.Join(" ", json.GetProperty("cautions").EnumerateArray().Select(c => c.GetString())), StringComparison.OrdinalIgnoreCase);
        var (_, second, _) = CliRunner.Run(args);
        Assert.Equal(json.GetProperty("yields").ToString(), JsonDocument.Parse(second).RootElement.GetProperty("yields").ToString());
    }

    [Fact]
    public async Task BadInput_IsRefusedWithWhatAndWhy()
    {
        using var temp = new TempDir();
        var (dir, _) = await LedgerAsync(temp);
        var (code, _, err) = CliRunner.Run("kinetics", "--data-dir", dir, "--reaction", "AB", "--c0", "C=0.1");
        Assert.Equal(ExitCodes.Unreadable, code);
        Assert.Contains("'C', which is not a species of the pathway; its species are A, B", err);
        (code, _, err) = CliRunner.Run("kinetics", "--data-dir", dir, "--reaction", "AB", "--c0", "A:0.1");
        Assert.Equal(ExitCodes.UsageError, code);
        Assert.Contains("expected SPECIES=MOL_PER_L", err);
        (code, _, err) = CliRunner.Run("kinetics", "--data-dir", dir, "--reaction", "AB", "--out", Path.Combine(temp.Path, "x.txt"));
        Assert.Equal(ExitCodes.UsageError, code);
        Assert.Contains("must end in .csv or .xlsx", err);
        (code, _, err) = CliRunner.Run("kinetics", "--data-dir", dir, "--reaction", "ZZ");
        Assert.Equal(ExitCodes.UsageError, code);
        Assert.Contains("no reaction 'ZZ'", err);
    }
}
