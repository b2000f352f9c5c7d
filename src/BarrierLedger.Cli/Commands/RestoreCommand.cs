using System.CommandLine;
using BarrierLedger.Ledger.Backups;
using BarrierLedger.Ledger.Storage;

namespace BarrierLedger.Cli.Commands;

/// <summary>
/// <c>barrierledger restore ARCHIVE --data-dir DIR [--force]</c>: checks every SHA-256 of a backup and writes its database into an
/// empty data folder. Exit 1 when refused (folder not empty, archive damaged or foreign); nothing is written then.
/// </summary>
internal static class RestoreCommand
{
    public static Command Create(CliContext ctx)
    {
        var archive = new Argument<string>("archive") { Description = "Backup archive written by 'barrierledger backup'" };
        CommonOptions.RejectUnknownOptions(archive);
        var dataDir = new Option<string>("--data-dir") { Description = "Data folder to restore into; must be empty or absent", Required = true };
        var force = new Option<bool>("--force") { Description = "Restore into a non-empty folder, replacing the ledger database there (other files are left alone)" };
        var cmd = new Command("restore", "Restore a backup into an empty data folder, after checking every file's SHA-256.") { archive, dataDir, force };
        cmd.SetAction(pr =>
        {
            var path = pr.GetValue(archive)!;
            if (!File.Exists(path))
            {
                ctx.Err.WriteLine($"barrierledger: {path} does not exist");
                return ExitCodes.Unreadable;
            }
            try
            {
                using var stream = File.OpenRead(path);
                var report = BackupService.RestoreArchiveAsync(stream, pr.GetValue(dataDir)!, new LedgerOptions().DatabaseFileName, pr.GetValue(force)).GetAwaiter().GetResult();
                ctx.Out.WriteLine($"restored {report.DatabasePath} (SHA-256 {report.DatabaseSha256}) with {report.StoredFiles} stored original file(s); every hash checked");
                return ExitCodes.Ok;
            }
            catch (RestoreRefusedException ex)
            {
                ctx.Err.WriteLine($"barrierledger: restore refused: {ex.Message}");
                return ExitCodes.ChecksFailed;
            }
        });
        return cmd;
    }
}
