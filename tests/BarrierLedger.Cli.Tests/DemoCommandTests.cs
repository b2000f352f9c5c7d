using System.Text;
using BarrierLedger.Demo;

namespace BarrierLedger.Cli.Tests;

public class DemoCommandTests
{
    [Fact]
    public void Generate_writes_exactly_the_demo_study_and_it_validates()
    {
        using var dir = new TempDir();
        var (code, output, error) = CliRunner.Run("demo", "generate", "--out", dir.Path);
        Assert.True(code == 0, error);
        Assert.Contains("demo study", output);
        var expected = DemoData.Showcase();
        var onDisk = Directory.EnumerateFiles(dir.Path, "*", SearchOption.AllDirectories).Count();
        Assert.Equal(expected.Count, onDisk);
        foreach (var f in expected)
            Assert.Equal(new UTF8Encoding(false).GetBytes(f.Content), File.ReadAllBytes(Path.Combine(dir.Path, f.RelativePath)));

        var (vcode, voutput, _) = CliRunner.Run("validate", Path.Combine(dir.Path, DemoWriter.ManifestName));
        Assert.Equal(0, vcode);
        Assert.Contains("readable, 0 error(s), 0 warning(s)", voutput);
    }

    [Fact]
    public void Generate_again_removes_stale_files_it_owns_and_keeps_others()
    {
        using var dir = new TempDir();
        Assert.Equal(0, CliRunner.Run("demo", "generate", "--out", dir.Path).Code);
        var stale = Path.Combine(dir.Path, "structures", "old-species.json");
        File.WriteAllText(stale, "{}");
        var mine = dir.Write("README.txt", "not the generator's");
        var (code, output, _) = CliRunner.Run("demo", "generate", "--out", dir.Path);
        Assert.Equal(0, code);
        Assert.False(File.Exists(stale));
        Assert.Contains("removed stale structures", output);
        Assert.True(File.Exists(mine));
    }

    [Fact]
    public void Reactions_option_writes_one_bundle_per_study_that_validates()
    {
        using var dir = new TempDir();
        var (code, output, error) = CliRunner.Run("demo", "generate", "--reactions", "30", "--out", dir.Path);
        Assert.True(code == 0, error);
        Assert.Contains("30 reactions in 2 studies", output);
        var manifests = Directory.GetFiles(dir.Path, DemoWriter.ManifestName, SearchOption.AllDirectories).Order(StringComparer.Ordinal).ToArray();
        Assert.Equal(2, manifests.Length);
        var (vcode, voutput, _) = CliRunner.Run(["validate", .. manifests]);
        Assert.Equal(0, vcode);
        Assert.Equal(2, voutput.Split('\n').Count(l => l.Contains("readable, 0 error(s), 0 warning(s)")));
    }

    [Theory]
    [InlineData("0")]
    [InlineData("-3")]
    [InlineData("many")]
    public void Bad_reaction_count_is_a_usage_error(string n)
    {
        using var dir = new TempDir();
        var (code, _, error) = CliRunner.Run("demo", "generate", "--reactions", n, "--out", dir.Path);
        Assert.Equal(ExitCodes.UsageError, code);
        Assert.Contains("--reactions", error);
        Assert.Empty(Directory.EnumerateFileSystemEntries(dir.Path));
    }
}
