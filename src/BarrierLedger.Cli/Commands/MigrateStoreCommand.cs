using System.CommandLine;
using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Cli.Commands;

/// <summary>
/// <c>barrierledger migrate-store --from sqlite:PATH --to postgresql:CONNSTRING [--force]</c>: copies a whole ledger into another
/// store (see <see cref="StoreTransfer"/>), prints a table of rows per table and the files verified. Exit 1 when refused (target
/// not empty) or when the verification fails; nothing is written to the target then.
/// </summary>
internal static class MigrateStoreCommand
{
    public static Command Create(CliContext ctx)
    {
        var from = new Option<string>("--from") { Description = "Ledger to copy: sqlite:PATH (the .db file or its data folder) or postgresql:CONNSTRING", Required = true };
        var to = new Option<string>("--to") { Description = "Store to copy into, migrated to the current schema first: postgresql:CONNSTRING or sqlite:PATH", Required = true };
        var force = new Option<bool>("--force") { Description = "Replace a ledger already in the target (the summary says what was replaced)" };
        var cmd = new Command("migrate-store", "Copy a whole ledger (accounts, tokens, records, stored files, uploads, audit, reviews, derivations, keys) into another store, verifying row counts and every file's SHA-256.")
        {
            from, to, force,
        };
        cmd.SetAction(pr =>
        {
            var source = StoreSpec.Parse("--from", pr.GetValue(from)!);
            var target = StoreSpec.Parse("--to", pr.GetValue(to)!);
            if (source.Provider == StoreProvider.Sqlite && !File.Exists(source.Options.DatabasePath))
            {
                ctx.Err.WriteLine($"barrierledger: there is no ledger at {source.Options.DatabasePath}");
                return ExitCodes.Unreadable;
            }
            return RunAsync(ctx, source, target, pr.GetValue(force)).GetAwaiter().GetResult();
        });
        return cmd;
    }

    private static async Task<int> RunAsync(CliContext ctx, StoreSpec source, StoreSpec target, bool force)
    {
        var sourceOptions = LedgerDatabase.CreateOptions(source.Options);
        var targetOptions = LedgerDatabase.CreateOptions(target.Options);
        await using (var probe = LedgerDatabase.CreateContext(sourceOptions))
        {
            var pending = (await probe.Database.GetPendingMigrationsAsync()).ToList();
            if (pending.Count > 0)
            {
                ctx.Err.WriteLine($"barrierledger: the source ledger ({LedgerDatabase.Describe(source.Options)}) is at an older schema ({pending.Count} migration(s) to apply, from {pending[0]}); "
                    + "start the app (or this version's 'barrierledger backup') on it once to upgrade it, then copy");
                return ExitCodes.ChecksFailed;
            }
        }
        ctx.Out.WriteLine($"migrate-store: {LedgerDatabase.Describe(source.Options)} -> {LedgerDatabase.Describe(target.Options)}");
        await LedgerDatabase.PrepareAsync(target.Options, new LedgerDbContextFactory(targetOptions));

        TransferReport report;
        try
        {
            await using var from = LedgerDatabase.CreateContext(sourceOptions);
            await using var to = LedgerDatabase.CreateContext(targetOptions);
            report = await StoreTransfer.CopyAsync(from, to, force, ctx.Out);
        }
        catch (StoreTransferException ex)
        {
            ctx.Err.WriteLine($"barrierledger: migrate-store refused: {ex.Message}");
            return ExitCodes.ChecksFailed;
        }

        var width = Math.Max(5, report.Tables.Max(t => t.Table.Length));
        ctx.Out.WriteLine();
        ctx.Out.WriteLine($"{"table".PadRight(width)}  {"source",8}  {"target",8}{(report.Replaced ? $"  {"replaced",8}" : "")}");
        foreach (var t in report.Tables)
            ctx.Out.WriteLine($"{t.Table.PadRight(width)}  {t.SourceRows,8}  {t.TargetRows,8}{(report.Replaced ? $"  {t.ReplacedRows,8}" : "")}");
        ctx.Out.WriteLine();
        ctx.Out.WriteLine($"copied {report.TotalRows} row(s) in {report.Tables.Count} tables, row counts equal; {report.FilesVerified} stored file(s) verified by SHA-256"
            + (report.Replaced ? $"; replaced the ledger that was in the target ({report.Tables.Sum(t => t.ReplacedRows)} row(s))" : ""));
        ctx.Out.WriteLine("not copied: the leases on background work (runtime state of the instances on the source)");
        return ExitCodes.Ok;
    }

    /// <summary>A store named on the command line as <c>sqlite:PATH</c> or <c>postgresql:CONNSTRING</c>.</summary>
    internal sealed record StoreSpec(StoreProvider Provider, LedgerOptions Options)
    {
        public static StoreSpec Parse(string option, string value)
        {
            var colon = value.IndexOf(':', StringComparison.Ordinal);
            var scheme = colon < 0 ? "" : value[..colon].ToLowerInvariant();
            var rest = colon < 0 ? "" : value[(colon + 1)..];
            if (rest.Length == 0 && scheme is "sqlite" or "postgresql" or "postgres")
                throw new UsageException($"{option}: '{value}' names no {(scheme == "sqlite" ? "path" : "connection string")} after '{scheme}:'");
            switch (scheme)
            {
                case "sqlite":
                    var path = Path.GetFullPath(rest);
                    var options = Directory.Exists(path)
                        ? new LedgerOptions { DataDirectory = path }
                        : new LedgerOptions { DataDirectory = Path.GetDirectoryName(path)!, DatabaseFileName = Path.GetFileName(path) };
                    return new StoreSpec(StoreProvider.Sqlite, options);
                case "postgresql" or "postgres":
                    return new StoreSpec(StoreProvider.PostgreSQL, new LedgerOptions
                    {
                        Database = new DatabaseOptions { Provider = StoreProvider.PostgreSQL, ConnectionString = rest },
                    });
                default:
                    throw new UsageException($"{option}: '{value}' is neither sqlite:PATH nor postgresql:CONNSTRING (for example postgresql:Host=127.0.0.1;Database=ledger;Username=ledger)");
            }
        }
    }
}
