using System.Diagnostics;
using System.Globalization;
using Npgsql;

namespace BarrierLedger.Ledger.Backups;

/// <summary>pg_dump is not on PATH: the message says how to get it or how to back up by hand.</summary>
public sealed class PgDumpNotFoundException() : Exception(
    "pg_dump is not on PATH, so the PostgreSQL ledger cannot be backed up from here. Install the PostgreSQL client tools of the "
    + "server's major version or newer (Debian: sudo apt-get install -y postgresql-client), or run on the database server: "
    + "pg_dump --format=custom --file=barrierledger-YYYYMMDD-HHMMSS.dump DATABASE (restore with pg_restore, see docs/ledger.md).");

/// <summary>
/// The PostgreSQL counterpart of SQLite's VACUUM INTO backup: PostgreSQL's own <c>pg_dump</c> in custom format (one consistent
/// snapshot while the app keeps running; restore with <c>pg_restore</c>). The connection is passed through the PG* environment
/// variables, so the password never shows on a command line.
/// </summary>
public static class PgDump
{
    /// <summary>The full path of pg_dump on PATH, or null.</summary>
    public static string? Find() =>
        (Environment.GetEnvironmentVariable("PATH") ?? "").Split(Path.PathSeparator, StringSplitOptions.RemoveEmptyEntries)
            .Select(d => Path.Combine(d, OperatingSystem.IsWindows() ? "pg_dump.exe" : "pg_dump")).FirstOrDefault(File.Exists);

    /// <summary>barrierledger-yyyyMMdd-HHmmss.dump in <paramref name="folder"/>, with -2, -3 ... when that name is taken.</summary>
    public static string TimestampedPath(string folder, DateTimeOffset now)
    {
        var stamp = now.UtcDateTime.ToString("yyyyMMdd-HHmmss", CultureInfo.InvariantCulture);
        var path = Path.Combine(folder, $"barrierledger-{stamp}.dump");
        for (var n = 2; File.Exists(path); n++) path = Path.Combine(folder, $"barrierledger-{stamp}-{n}.dump");
        return path;
    }

    /// <summary>Runs <c>pg_dump --format=custom</c> of the database named by <paramref name="connectionString"/> into <paramref name="outputPath"/>.</summary>
    /// <exception cref="PgDumpNotFoundException">pg_dump is not on PATH.</exception>
    /// <exception cref="InvalidOperationException">pg_dump failed; the message carries its error output.</exception>
    public static async Task RunAsync(string connectionString, string outputPath, CancellationToken ct = default)
    {
        var exe = Find() ?? throw new PgDumpNotFoundException();
        var b = new NpgsqlConnectionStringBuilder(connectionString);
        var psi = new ProcessStartInfo(exe) { RedirectStandardError = true, RedirectStandardOutput = true, UseShellExecute = false };
        foreach (var a in new[] { "--format=custom", "--no-password", $"--file={outputPath}" }) psi.ArgumentList.Add(a);
        psi.Environment["PGHOST"] = b.Host ?? "localhost";
        psi.Environment["PGPORT"] = b.Port.ToString(CultureInfo.InvariantCulture);
        psi.Environment["PGDATABASE"] = b.Database ?? "";
        if (!string.IsNullOrEmpty(b.Username)) psi.Environment["PGUSER"] = b.Username;
        if (!string.IsNullOrEmpty(b.Password)) psi.Environment["PGPASSWORD"] = b.Password;
        psi.Environment["PGSSLMODE"] = b.SslMode switch
        {
            SslMode.Disable => "disable", SslMode.Allow => "allow", SslMode.Require => "require",
            SslMode.VerifyCA => "verify-ca", SslMode.VerifyFull => "verify-full", _ => "prefer",
        };
        using var process = Process.Start(psi) ?? throw new InvalidOperationException($"could not start {exe}");
        var stderr = process.StandardError.ReadToEndAsync(ct);
        var stdout = process.StandardOutput.ReadToEndAsync(ct);
        await process.WaitForExitAsync(ct);
        if (process.ExitCode != 0)
        {
            try { File.Delete(outputPath); } catch (IOException) { }
            throw new InvalidOperationException($"pg_dump of database '{b.Database}' on {b.Host}:{b.Port} failed (exit {process.ExitCode}): {(await stderr).Trim()}{(await stdout).Trim()}");
        }
    }
}
