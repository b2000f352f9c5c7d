using System.Text.Json;

namespace BarrierLedger.Cli.Tests;

public class ValidateCommandTests
{
    [Fact]
    public void Good_xyz_is_readable_and_exits_0()
    {
        using var dir = new TempDir();
        var f = dir.Write("w.xyz", "3\n-76.4\nO 0 0 0\nH 0.757 0 0.586\nH -0.757 0 0.586\n");
        var (code, output, _) = CliRunner.Run("validate", f);
        Assert.Equal(0, code);
        Assert.Contains("readable, 0 error(s)", output);
    }

    [Fact]
    public void Broken_xyz_lists_located_errors_and_exits_2()
    {
        using var dir = new TempDir();
        var f = dir.Write("bad.xyz", "3\n-76.4\nO 0 0 0\nH 0.757 0\nH -0.757 0 0.586\n");
        var (code, output, _) = CliRunner.Run("validate", f);
        Assert.Equal(2, code);
        Assert.Contains("bad.xyz:4: error: expected an element and 3 coordinates", output);
    }

    [Fact]
    public void Missing_file_is_unreadable_input()
    {
        var (code, output, _) = CliRunner.Run("validate", "/nonexistent/nothing.xyz");
        Assert.Equal(2, code);
        Assert.Contains("file not found", output);
    }

    [Fact]
    public void Json_output_lists_files_with_issues()
    {
        using var dir = new TempDir();
        var f = dir.Write("bad.xyz", "1\n\nQq 0 0 0\n");
        var (code, output, _) = CliRunner.Run("validate", "--json", f);
        Assert.Equal(2, code);
        using var doc = JsonDocument.Parse(output);
        Assert.False(doc.RootElement.GetProperty("ok").GetBoolean());
        var issue = doc.RootElement.GetProperty("files")[0].GetProperty("issues")[0];
        Assert.Equal(3, issue.GetProperty("line").GetInt32());
        Assert.Equal("error", issue.GetProperty("severity").GetString());
        Assert.Contains("unknown element 'Qq'", issue.GetProperty("message").GetString());
    }
}
