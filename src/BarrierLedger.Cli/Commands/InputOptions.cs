using System.CommandLine;

namespace BarrierLedger.Cli.Commands;

/// <summary>The FILE argument and --calculation option of the commands that work on one calculation.</summary>
internal sealed class CalculationArguments
{
    public Argument<string> File { get; } = new("file") { Description = "QCSchema result (hessian driver), bundle (.json or .zip) or XYZ" };
    public Option<string?> Calculation { get; } = new("--calculation") { Description = "Label of the calculation to use when FILE is a bundle" };

    public void AddTo(Command command)
    {
        CommonOptions.RejectUnknownOptions(File);
        command.Arguments.Add(File);
        command.Options.Add(Calculation);
    }

    /// <summary>Reads FILE and picks the calculation; prints the issues. Returns null (exit 2) when that fails.</summary>
    public CalculationData? Load(ParseResult pr, CliContext ctx)
    {
        var loaded = InputLoader.Load(pr.GetValue(File)!);
        ctx.WriteIssues(loaded.Issues);
        if (!loaded.Succeeded)
        {
            ctx.Err.WriteLine($"barrierledger: {pr.GetValue(File)} could not be read ({loaded.Issues.Count(i => i.IsError)} error(s) above)");
            return null;
        }
        var data = CalculationSource.Pick(loaded, pr.GetValue(Calculation), out var error);
        if (data is null) ctx.Err.WriteLine($"barrierledger: {error}");
        return data;
    }
}
