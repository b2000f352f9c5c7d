namespace BarrierLedger.Cli.Tests;

public class ProgramTests
{
    [Fact]
    public void No_arguments_prints_usage_and_exits_2()
    {
        var (code, _, err) = CliRunner.Run();
        Assert.Equal(2, code);
        Assert.Contains("Usage:", err);
        Assert.DoesNotContain("   at ", err);
    }

    [Fact]
    public void Unknown_option_prints_the_subcommand_usage_not_a_stack_trace()
    {
        var (code, _, err) = CliRunner.Run("validate", "--bogus", "x.xyz");
        Assert.Equal(2, code);
        Assert.Contains("--bogus", err);
        Assert.Contains("validate", err);
        Assert.Contains("Usage:", err);
        Assert.DoesNotContain("   at ", err);
    }

    [Fact]
    public void Help_exits_0()
    {
        var (code, output, _) = CliRunner.Run("--help");
        Assert.Equal(0, code);
        Assert.Contains("validate", output);
    }
}
