using System.Globalization;
using BarrierLedger.Ledger.Auditing;
using BarrierLedger.Ledger.Storage;
using Microsoft.Data.Sqlite;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Backups;

/// <summary>A backup file.</summary>
public sealed record BackupInfo(string Path, long SizeBytes, DateTimeOffset CreatedAt);

/// <summary>
/// Online backups of the whole ledger (records, accounts and every stored original file, which live in the database) while the
/// app keeps running: SQLite's <c>VACUUM INTO</c> writes a consistent, compacted copy of one snapshot to
/// <c>{DataDirectory}/backups/barrierledger-yyyyMMdd-HHmmss.db</c>.
/// Restore (documented in docs/ledger.md): stop the app, then <see cref="RestoreAsync"/> (or copy the file over
/// <c>{DataDirectory}/barrierledger.db</c> and delete any <c>-wal</c>/<c>-shm</c> beside it); it refuses a data folder that already
/// holds a ledger unless forced, and checks the backup's integrity first.
/// On PostgreSQL the backup is PostgreSQL's own <c>pg_dump --format=custom</c> to
/// <c>{DataDirectory}/backups/barrierledger-yyyyMMdd-HHmmss.dump</c> (see <see cref="PgDump"/>; restore with <c>pg_restore</c>).
/// </summary>
public sealed class BackupService(LedgerOptions options, IDbContextFactory<LedgerDbContext> factory, AuditService audit, TimeProvider time)
{
    public string BackupDirectory => Path.Combine(options.ResolvedDataDirectory, "backups");

    public async Task<BackupInfo> BackupAsync(string userId, CancellationToken ct = default)
    {
        Directory.CreateDirectory(BackupDirectory);
        var now = time.GetUtcNow();
        if (options.IsPostgreSql)
        {
            var dump = PgDump.TimestampedPath(BackupDirectory, now);
            await PgDump.RunAsync(options.Database.ConnectionString!, dump, ct);
            await RecordAsync(userId, dump, ct);
            return new BackupInfo(dump, new FileInfo(dump).Length, now);
        }
        var path = Path.Combine(BackupDirectory, $"barrierledger-{now.ToString("yyyyMMdd-HHmmss", CultureInfo.InvariantCulture)}.db");
        for (var n = 2; File.Exists(path); n++)
            path = Path.Combine(BackupDirectory, $"barrierledger-{now.ToString("yyyyMMdd-HHmmss", CultureInfo.InvariantCulture)}-{n}.db");
        await LedgerRetry.RunAsync(async token =>
        {
            await using var connection = new SqliteConnection(options.SqliteConnectionString);
            await connection.OpenAsync(token);
            await using var cmd = connection.CreateCommand();
            cmd.CommandText = "VACUUM INTO $path";
            cmd.Parameters.AddWithValue("$path", path);
            await cmd.ExecuteNonQueryAsync(token);
            return 0;
        }, ct);
        await RecordAsync(userId, path, ct);
        return new BackupInfo(path, new FileInfo(path).Length, now);
    }

    private async Task RecordAsync(string userId, string path, CancellationToken ct)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        audit.Record(db, userId, "backup.created", "Backup", Path.GetFileName(path), $"Backup written to {path}.");
        await db.SaveChangesAsync(ct);
    }

    /// <summary>Backups in the backup folder (SQLite copies, or pg_dump files on PostgreSQL), newest first.</summary>
    public IReadOnlyList<BackupInfo> ListBackups() => !Directory.Exists(BackupDirectory) ? [] :
        [.. new DirectoryInfo(BackupDirectory).GetFiles(options.IsPostgreSql ? "barrierledger-*.dump" : "barrierledger-*.db").OrderByDescending(f => f.Name)
            .Select(f => new BackupInfo(f.FullName, f.Length, new DateTimeOffset(f.LastWriteTimeUtc, TimeSpan.Zero)))];

    /// <summary>
    /// Puts a backup in place as the ledger of <paramref name="dataDirectory"/> (the app must not be running on it). Refuses when
    /// that folder already holds a ledger, unless <paramref name="force"/>; refuses a backup that fails <c>PRAGMA integrity_check</c>.
    /// </summary>
    public static async Task RestoreAsync(string backupPath, string dataDirectory, bool force = false, string databaseFileName = "barrierledger.db", CancellationToken ct = default)
    {
        if (!File.Exists(backupPath)) throw new FileNotFoundException($"No backup at {backupPath}.", backupPath);
        var check = await IntegrityCheckAsync(backupPath, ct);
        if (check != "ok") throw new InvalidDataException($"The backup {backupPath} is damaged (integrity check: {check}); it was not restored.");
        Directory.CreateDirectory(dataDirectory);
        var target = Path.Combine(dataDirectory, databaseFileName);
        if (File.Exists(target) && !force)
            throw new IOException($"{target} already holds a ledger; restoring would replace it. Restore into an empty folder, or force it.");
        SqliteConnection.ClearAllPools();
        foreach (var extra in new[] { target + "-wal", target + "-shm" }) File.Delete(extra);
        File.Copy(backupPath, target, overwrite: true);
    }

    /// <summary>The result of <c>PRAGMA integrity_check</c> on a database file ("ok" when sound).</summary>
    public static async Task<string> IntegrityCheckAsync(string databasePath, CancellationToken ct = default)
    {
        await using var connection = new SqliteConnection(new SqliteConnectionStringBuilder { DataSource = databasePath, Mode = SqliteOpenMode.ReadOnly, Pooling = false }.ToString());
        await connection.OpenAsync(ct);
        await using var cmd = connection.CreateCommand();
        cmd.CommandText = "PRAGMA integrity_check";
        var lines = new List<string>();
        await using var reader = await cmd.ExecuteReaderAsync(ct);
        while (await reader.ReadAsync(ct)) lines.Add(reader.GetString(0));
        return string.Join("; ", lines);
    }
}
