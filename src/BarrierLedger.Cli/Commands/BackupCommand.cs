using System.CommandLine;
using BarrierLedger.Ledger.Backups;
using BarrierLedger.Ledger.Storage;

namespace BarrierLedger.Cli.Commands;

/// <summary>
/// <c>barrierledger backup --out FILE.zip [--data-dir DIR]</c>: a consistent whole-ledger archive with a SHA-256 manifest (SQLite).
/// <c>barrierledger backup --postgresql CONNSTRING [--out FOLDER]</c>: pg_dump in custom format to a timestamped file (PostgreSQL).
/// </summary>
internal static class BackupCommand
{
    /// <summary>The same variables the web app reads for its store, for scripts that set them once.</summary>
    internal const string ProviderVariable = "BarrierLedger__Database__Provider";
    internal const string ConnectionVariable = "BarrierLedger__Database__ConnectionString";

    public static Command Create(CliContext ctx)
    {
        var dataDir = new Option<string?>("--data-dir") { Description = "Ledger data folder (holds barrierledger.db); default ./data" };
        var output = new Option<string?>("--out")
        {
            Description = "SQLite: the archive to write (.zip; refused if it exists). PostgreSQL: the folder for barrierledger-yyyyMMdd-HHmmss.dump (default: current folder)",
        };
        var postgres = new Option<string?>("--postgresql")
        {
            Description = $"Back up the PostgreSQL ledger with this Npgsql connection string, using pg_dump from PATH (default: {ConnectionVariable} when {ProviderVariable}=PostgreSQL)",
        };
        var cmd = new Command("backup", "Write the whole ledger to one file: for SQLite a zip (database copy taken safely while the app runs, every stored original file, SHA-256 manifest); for PostgreSQL a pg_dump custom-format file.")
            { dataDir, output, postgres };
        cmd.SetAction(pr =>
        {
            var connection = pr.GetValue(postgres) ?? PostgresFromEnvironment();
            if (connection is not null)
            {
                if (pr.GetValue(dataDir) is not null) throw new UsageException("give either --data-dir (SQLite) or --postgresql (PostgreSQL), not both");
                return BackupPostgres(ctx, connection, pr.GetValue(output));
            }
            var options = new LedgerOptions { DataDirectory = Path.GetFullPath(pr.GetValue(dataDir) ?? "data") };
            if (!File.Exists(options.DatabasePath))
            {
                ctx.Err.WriteLine($"barrierledger: there is no ledger at {options.DatabasePath}");
                return ExitCodes.Unreadable;
            }
            if (pr.GetValue(output) is not { } outArg) throw new UsageException("--out is required: the .zip archive to write");
            var path = Path.GetFullPath(outArg);
            if (File.Exists(path)) throw new UsageException($"--out: {path} exists; choose a new file name");
            if (Path.GetDirectoryName(path) is { } d) Directory.CreateDirectory(d);
            BackupManifest manifest;
            try
            {
                using var stream = new FileStream(path, FileMode.CreateNew, FileAccess.Write);
                manifest = new BackupService(options).CreateArchiveAsync(stream).GetAwaiter().GetResult();
            }
            catch
            {
                File.Delete(path);
                throw;
            }
            ctx.Out.WriteLine($"wrote {outArg}: database {manifest.Database.SizeBytes} bytes (SHA-256 {manifest.Database.Sha256}), {manifest.Files.Count} stored original file(s)");
            return ExitCodes.Ok;
        });
        return cmd;
    }

    private static string? PostgresFromEnvironment() =>
        string.Equals(Environment.GetEnvironmentVariable(ProviderVariable), nameof(StoreProvider.PostgreSQL), StringComparison.OrdinalIgnoreCase)
            ? Environment.GetEnvironmentVariable(ConnectionVariable) is { Length: > 0 } cs ? cs
                : throw new UsageException($"{ProviderVariable}=PostgreSQL but {ConnectionVariable} is empty; set it or pass --postgresql")
            : null;

    private static int BackupPostgres(CliContext ctx, string connectionString, string? outFolder)
    {
        var folder = Path.GetFullPath(outFolder ?? ".");
        if (File.Exists(folder)) throw new UsageException($"--out: {folder} is a file; with --postgresql give the folder for the timestamped dump");
        Directory.CreateDirectory(folder);
        var path = PgDump.TimestampedPath(folder, DateTimeOffset.UtcNow);
        try
        {
            PgDump.RunAsync(connectionString, path).GetAwaiter().GetResult();
        }
        catch (PgDumpNotFoundException ex)
        {
            ctx.Err.WriteLine($"barrierledger: {ex.Message}");
            return ExitCodes.Unreadable;
        }
        catch (InvalidOperationException ex)
        {
            ctx.Err.WriteLine($"barrierledger: {ex.Message}");
            return ExitCodes.Unreadable;
        }
        ctx.Out.WriteLine($"wrote {path}: pg_dump custom format, {new FileInfo(path).Length} bytes; restore with pg_restore (docs/ledger.md)");
        return ExitCodes.Ok;
    }
}
