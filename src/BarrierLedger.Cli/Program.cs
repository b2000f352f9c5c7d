using System.CommandLine;
using System.CommandLine.Parsing;
using BarrierLedger.Cli.Commands;

namespace BarrierLedger.Cli;

/// <summary>
/// The <c>barrierledger</c> command line. <see cref="Run"/> is the whole program with its output streams passed in,
/// so tests call it in-process. Exit codes: see <see cref="ExitCodes"/>.
/// </summary>
public static class Program
{
    public static int Main(string[] args) => Run(args, Console.Out, Console.Error);

    public static int Run(string[] args, TextWriter output, TextWriter error)
    {
        ArgumentNullException.ThrowIfNull(args);
        var context = new CliContext(output, error);
        var root = BuildRootCommand(context);
        var parse = root.Parse(args);
        if (parse.Errors.Count > 0)
        {
            foreach (var e in parse.Errors) error.WriteLine($"barrierledger: {e.Message}");
            error.WriteLine();
            PrintHelp(root, parse, error);
            return ExitCodes.UsageError;
        }
        try
        {
            return parse.Invoke(new InvocationConfiguration { Output = output, Error = error, EnableDefaultExceptionHandler = false });
        }
        catch (UsageException ex)
        {
            error.WriteLine($"barrierledger: {ex.Message}");
            error.WriteLine();
            PrintHelp(root, parse, error);
            return ExitCodes.UsageError;
        }
        catch (Exception ex)
        {
            // A bug, not bad input: say so in one line without a stack trace.
            error.WriteLine($"barrierledger: internal error ({ex.GetType().Name}): {ex.Message}");
            return ExitCodes.InternalError;
        }
    }

    /// <summary>
    /// The command tree. Each subcommand lives in its own file under Commands/ with a static <c>Create(CliContext)</c>;
    /// to add one, write the file and list it here.
    /// </summary>
    public static RootCommand BuildRootCommand(CliContext context)
    {
        var root = new RootCommand("barrierledger: read quantum-chemistry results, analyse frequencies, thermochemistry, rates and scans.");
        root.Subcommands.Add(VibrationsCommand.Create(context));
        root.Subcommands.Add(VibrationsCommand.CreateDeprecated(context));
        root.Subcommands.Add(ThermoCommand.Create(context));
        root.Subcommands.Add(KieCommand.Create(context));
        root.Subcommands.Add(RateCommand.Create(context));
        root.Subcommands.Add(KineticsCommand.Create(context));
        root.Subcommands.Add(ScanCommand.Create(context));
        root.Subcommands.Add(ValidateCommand.Create(context));
        root.Subcommands.Add(PushCommand.Create(context));
        root.Subcommands.Add(DemoCommand.Create(context));
        root.Subcommands.Add(ExportCommand.Create(context));
        root.Subcommands.Add(BackupCommand.Create(context));
        root.Subcommands.Add(RestoreCommand.Create(context));
        root.Subcommands.Add(MigrateStoreCommand.Create(context));
        return root;
    }

    private static void PrintHelp(RootCommand root, ParseResult parse, TextWriter writer)
    {
        var path = new List<string>();
        for (SymbolResult? r = parse.CommandResult; r is CommandResult cr && cr.Command is not RootCommand; r = cr.Parent)
            path.Insert(0, cr.Command.Name);
        path.Add("--help");
        root.Parse(path).Invoke(new InvocationConfiguration { Output = writer, Error = writer });
    }
}
