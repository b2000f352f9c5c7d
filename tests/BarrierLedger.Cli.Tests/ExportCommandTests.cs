using System.IO.Compression;
using BarrierLedger.Cli.Commands;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Uploads;
using CsvHelper;
using Microsoft.Data.Sqlite;
using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.Cli.Tests;

public class ExportCommandTests
{
    /// <summary>Input formats only (a folder's README or notes are not part of the upload).</summary>
    private static bool IsDataFile(string path) => Path.GetExtension(path).ToLowerInvariant() is ".json" or ".xyz" or ".extxyz" or ".csv" or ".zip";

    internal static string DemoFolder
    {
        get
        {
            for (var d = new DirectoryInfo(AppContext.BaseDirectory); d is not null; d = d.Parent)
                if (File.Exists(Path.Combine(d.FullName, "seed-data", "bundle.json"))) return Path.Combine(d.FullName, "seed-data");
            throw new DirectoryNotFoundException("seed-data/bundle.json not found above the test folder.");
        }
    }

    /// <summary>A ledger data folder holding the demo study, stored through the real upload service.</summary>
    internal static async Task<string> DemoDataDirAsync(TempDir temp)
    {
        var dir = Path.Combine(temp.Path, "data");
        await using var services = LedgerHost.Build(dir).BuildServiceProvider();
        await SqliteSetup.PrepareAsync(services.GetRequiredService<LedgerOptions>(), services.GetRequiredService<IDbContextFactory<LedgerDbContext>>());
        var root = DemoFolder;
        var files = Directory.EnumerateFiles(root, "*", SearchOption.AllDirectories).Where(IsDataFile).Order(StringComparer.Ordinal)
            .Select(p => new UploadFile(Path.GetRelativePath(root, p).Replace('\\', '/'), File.ReadAllBytes(p))).ToList();
        var outcome = await services.GetRequiredService<UploadService>().StoreAsync(files, new UploadChoices(), "test");
        Assert.True(outcome.Stored, string.Join("; ", outcome.Issues));
        SqliteConnection.ClearAllPools();
        return dir;
    }

    [Fact]
    public void ExportTable_FromABundle_WritesCsvThatParses()
    {
        using var temp = new TempDir();
        var path = Path.Combine(temp.Path, "t.csv");
        var (code, output, err) = CliRunner.Run("export", "table", "--bundle", DemoFolder, "--format", "csv", "--columns", "reaction,step,barrier-dG,review", "--out", path);
        Assert.True(code == 0, err);
        Assert.Contains("wrote", output);
        using var reader = CsvReader.FromFile(path, new CsvReaderOptions { CommentPrefix = '#' });
        Assert.Equal(["Reaction", "Step", "ΔG‡ (kcal/mol)", "Review", "Note", "Note text"], reader.Headers);
        var rows = 0;
        while (reader.Read())
        {
            rows++;
            Assert.NotEqual("", reader.GetString("Note"));
        }
        Assert.True(rows >= 5);
        Assert.Contains("# Caution:", File.ReadAllText(path));
    }

    [Fact]
    public void ExportExamples_WritesEveryFormat()
    {
        using var temp = new TempDir();
        var (code, _, err) = CliRunner.Run("export", "examples", "--bundle", DemoFolder, "--out", temp.Path);
        Assert.True(code == 0, err);
        foreach (var f in new[] { "barriers.csv", "barriers.xlsx", "barriers.tex", "barriers.md", "diagram.svg", "diagram.png", "coordinates.txt" })
            Assert.True(new FileInfo(Path.Combine(temp.Path, f)).Length > 500, f);
        System.Xml.Linq.XDocument.Load(Path.Combine(temp.Path, "diagram.svg"));
    }

    // "dG" (a barrier) beside "dGr" (a reaction energy) read alike; the first names still work for one release.
    [Fact]
    public void ExportTable_DeprecatedColumnName_StillWorks_WithADeprecationLine()
    {
        using var temp = new TempDir();
        var path = Path.Combine(temp.Path, "t.csv");
        var (code, _, err) = CliRunner.Run("export", "table", "--bundle", DemoFolder, "--format", "csv", "--columns", "reaction,dGr", "--out", path);
        Assert.True(code == 0, err);
        Assert.Contains("--columns 'dGr' is deprecated", err);
        Assert.Contains("use 'reaction-dG'", err);
        using var reader = CsvReader.FromFile(path, new CsvReaderOptions { CommentPrefix = '#' });
        Assert.Equal(["Reaction", "ΔG_r (kcal/mol)", "Note", "Note text"], reader.Headers);
    }

    [Fact]
    public void ExportTable_UnknownColumn_IsAUsageError()
    {
        using var temp = new TempDir();
        var (code, _, err) = CliRunner.Run("export", "table", "--bundle", DemoFolder, "--columns", "reaction,speed", "--out", Path.Combine(temp.Path, "x.csv"));
        Assert.Equal(ExitCodes.UsageError, code);
        Assert.Contains("unknown column 'speed'", err);
    }

    // The same parser and sentence as the two HTTP surfaces (Web.Tests ExportUnitsTests).
    [Theory]
    [InlineData("cm-1")]
    [InlineData("furlongs")]
    public void ExportTable_UnitNotForBarriers_IsAUsageErrorWithCoresSentence(string text)
    {
        using var temp = new TempDir();
        var (code, _, err) = CliRunner.Run("export", "table", "--bundle", DemoFolder, "--unit", text, "--out", Path.Combine(temp.Path, "x.csv"));
        Assert.Equal(ExitCodes.UsageError, code);
        Assert.False(BarrierLedger.Core.Units.BarrierUnits.TryParse(text, out _, out var why));
        Assert.Contains($"--unit: {why}", err);
    }

    [Fact]
    public void ExportTable_UnitInElectronVolt_HeadsTheColumnsInEv()
    {
        using var temp = new TempDir();
        var path = Path.Combine(temp.Path, "t.csv");
        var (code, _, err) = CliRunner.Run("export", "table", "--bundle", DemoFolder, "--format", "csv", "--columns", "reaction,barrier-dG", "--unit", "ElectronVolt", "--out", path);
        Assert.True(code == 0, err);
        Assert.Contains("ΔG‡ (eV)", File.ReadAllText(path));
    }

    [Fact]
    public void Export_WithoutALedger_SaysWhereItLooked()
    {
        using var temp = new TempDir();
        var (code, _, err) = CliRunner.Run("export", "table", "--data-dir", Path.Combine(temp.Path, "none"), "--out", Path.Combine(temp.Path, "x.csv"));
        Assert.Equal(ExitCodes.Unreadable, code);
        Assert.Contains("there is no ledger at", err);
    }

    [Fact]
    public async Task BackupThenRestore_RoundTrips_AndRefusesANonEmptyFolder()
    {
        using var temp = new TempDir();
        var data = await DemoDataDirAsync(temp);
        var archive = Path.Combine(temp.Path, "backup.zip");
        var (code, output, err) = CliRunner.Run("backup", "--data-dir", data, "--out", archive);
        Assert.True(code == 0, err);
        Assert.Contains("stored original file(s)", output);
        using (var zip = ZipFile.OpenRead(archive)) Assert.NotNull(zip.GetEntry("manifest.json"));

        var restored = Path.Combine(temp.Path, "restored");
        (code, output, err) = CliRunner.Run("restore", archive, "--data-dir", restored);
        Assert.True(code == 0, err);
        Assert.Contains("every hash checked", output);

        var before = CliRunner.Run("export", "table", "--data-dir", data, "--format", "markdown", "--decimals", "4", "--out", Path.Combine(temp.Path, "a.md"));
        var after = CliRunner.Run("export", "table", "--data-dir", restored, "--format", "markdown", "--decimals", "4", "--out", Path.Combine(temp.Path, "b.md"));
        Assert.Equal(0, before.Code);
        Assert.Equal(0, after.Code);
        Assert.Equal(File.ReadAllText(Path.Combine(temp.Path, "a.md")), File.ReadAllText(Path.Combine(temp.Path, "b.md")));

        (code, _, err) = CliRunner.Run("restore", archive, "--data-dir", restored);
        Assert.Equal(ExitCodes.ChecksFailed, code);
        Assert.Contains("restore refused", err);
        Assert.Contains("is not empty", err);
        (code, _, err) = CliRunner.Run("restore", archive, "--data-dir", restored, "--force");
        Assert.True(code == 0, err);
        SqliteConnection.ClearAllPools();
    }
}
