using System.CommandLine;
using BarrierLedger.Ledger.Export;
using BarrierLedger.Ledger.Storage;

namespace BarrierLedger.Cli.Commands;

/// <summary><c>barrierledger backup --out FILE.zip [--data-dir DIR]</c>: a consistent whole-ledger archive with a SHA-256 manifest.</summary>
internal static class BackupCommand
{
    public static Command Create(CliContext ctx)
    {
        var dataDir = new Option<string?>("--data-dir") { Description = "Ledger data folder (holds barrierledger.db); default ./data" };
        var output = new Option<string>("--out") { Description = "Archive to write (.zip); refused if it exists", Required = true };
        var cmd = new Command("backup", "Write the whole ledger (database copy taken safely while the app runs, every stored original file, SHA-256 manifest) to one zip.") { dataDir, output };
        cmd.SetAction(pr =>
        {
            var options = new LedgerOptions { DataDirectory = Path.GetFullPath(pr.GetValue(dataDir) ?? "data") };
            if (!File.Exists(options.DatabasePath))
            {
                ctx.Err.WriteLine($"barrierledger: there is no ledger at {options.DatabasePath}");
                return ExitCodes.Unreadable;
            }
            var path = Path.GetFullPath(pr.GetValue(output)!);
            if (File.Exists(path)) throw new UsageException($"--out: {path} exists; choose a new file name");
            if (Path.GetDirectoryName(path) is { } d) Directory.CreateDirectory(d);
            BackupManifest manifest;
            try
            {
                using var stream = new FileStream(path, FileMode.CreateNew, FileAccess.Write);
                manifest = new LedgerBackupService(options).CreateAsync(stream).GetAwaiter().GetResult();
            }
            catch
            {
                File.Delete(path);
                throw;
            }
            ctx.Out.WriteLine($"wrote {pr.GetValue(output)}: database {manifest.Database.SizeBytes} bytes (SHA-256 {manifest.Database.Sha256}), {manifest.Files.Count} stored original file(s)");
            return ExitCodes.Ok;
        });
        return cmd;
    }
}
