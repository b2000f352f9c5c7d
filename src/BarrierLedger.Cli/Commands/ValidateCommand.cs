using System.CommandLine;

namespace BarrierLedger.Cli.Commands;

/// <summary><c>barrierledger validate FILE...</c>: read every file, report every error and warning, compute nothing.</summary>
internal static class ValidateCommand
{
    public static Command Create(CliContext ctx)
    {
        var files = new Argument<string[]>("files") { Description = "Files to read (XYZ, extended XYZ, CSV scan table, QCSchema JSON, bundle .json or .zip)", Arity = ArgumentArity.OneOrMore };
        CommonOptions.RejectUnknownOptions(files);
        var json = CommonOptions.Json();
        var command = new Command("validate", "Read files and list every error and warning, with file and line or JSON path.") { files, json };
        command.SetAction(pr =>
        {
            var loaded = pr.GetValue(files)!.Select(f => InputLoader.Load(f)).ToList();
            var ok = loaded.All(l => l.Succeeded);
            if (pr.GetValue(json))
            {
                ctx.WriteJson(new
                {
                    ok,
                    files = loaded.Select(l => new
                    {
                        path = l.Path,
                        format = FormatNames.Of(l.Format),
                        readable = l.Succeeded,
                        issues = CliContext.IssuesToJson(l.Issues),
                    }),
                });
            }
            else
            {
                foreach (var l in loaded)
                {
                    var errors = l.Issues.Count(i => i.IsError);
                    var warnings = l.Issues.Count - errors;
                    ctx.Out.WriteLine($"{l.Path}: {FormatNames.Of(l.Format)}, {(l.Succeeded ? "readable" : "NOT readable")}, {errors} error(s), {warnings} warning(s)");
                    foreach (var i in l.Issues) ctx.Out.WriteLine("  " + i);
                }
            }
            return ok ? ExitCodes.Ok : ExitCodes.Unreadable;
        });
        return command;
    }
}
