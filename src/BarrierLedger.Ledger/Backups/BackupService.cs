using System.IO.Compression;
using System.Security.Cryptography;
using System.Text.Json;
using System.Text.Json.Serialization;
using BarrierLedger.Ledger.Export;
using BarrierLedger.Ledger.Storage;
using Microsoft.Data.Sqlite;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Backups;

/// <summary>One entry of a backup archive with its SHA-256 (lower-case hex) and size.</summary>
public sealed record BackupEntry(
    [property: JsonPropertyName("path")] string Path,
    [property: JsonPropertyName("sha256")] string Sha256,
    [property: JsonPropertyName("size_bytes")] long SizeBytes,
    [property: JsonPropertyName("original_name")] string? OriginalName = null);

/// <summary>The manifest.json of a backup archive.</summary>
public sealed record BackupManifest(
    [property: JsonPropertyName("format")] string Format,
    [property: JsonPropertyName("format_version")] int FormatVersion,
    [property: JsonPropertyName("created_at")] DateTimeOffset CreatedAt,
    [property: JsonPropertyName("database")] BackupEntry Database,
    [property: JsonPropertyName("files")] IReadOnlyList<BackupEntry> Files);

/// <summary>What a restore wrote.</summary>
public sealed record RestoreReport(string DatabasePath, int StoredFiles, string DatabaseSha256);

/// <summary>A restore that was refused (non-empty target, damaged or foreign archive), with the reason in words.</summary>
public sealed class RestoreRefusedException(string message) : Exception(message);

/// <summary>
/// The ledger's one backup capability. A SQLite ledger is backed up as a zip with <c>manifest.json</c>, <c>ledger.db</c> (a
/// consistent copy taken with SQLite's <c>VACUUM INTO</c>, safe while the app runs) and every stored original file under
/// <c>files/&lt;sha256&gt;/&lt;name&gt;</c>; the manifest carries the SHA-256 of each (<see cref="CreateArchiveAsync"/>, used by
/// <c>barrierledger backup</c> and the admin's download). <see cref="RestoreArchiveAsync"/> checks every hash, then writes the
/// database into an empty data folder (refused into a non-empty one unless forced). A PostgreSQL ledger is backed up with
/// PostgreSQL's own <c>pg_dump</c> in custom format (<see cref="PgDump"/>; restore with <c>pg_restore</c>).
/// </summary>
public sealed class BackupService(LedgerOptions options)
{
    public const string FormatName = "barrierledger-backup";
    public const string ManifestPath = "manifest.json";
    public const string DatabaseEntry = "ledger.db";

    private static readonly JsonSerializerOptions s_json = new() { WriteIndented = true };

    /// <summary>Writes the archive to <paramref name="destination"/> and returns its manifest.</summary>
    public async Task<BackupManifest> CreateArchiveAsync(Stream destination, CancellationToken ct = default)
    {
        ArgumentNullException.ThrowIfNull(destination);
        if (options.IsPostgreSql)
            throw new NotSupportedException("The backup archive holds a SQLite copy of the ledger; a PostgreSQL ledger is backed up with pg_dump "
                + "(barrierledger backup --postgresql CONNSTRING, or pg_dump --format=custom; see docs/ledger.md).");
        if (!File.Exists(options.DatabasePath)) throw new FileNotFoundException($"There is no ledger database at {options.DatabasePath}.", options.DatabasePath);
        var temp = Directory.CreateTempSubdirectory("bl-backup-").FullName;
        try
        {
            var snapshot = Path.Combine(temp, DatabaseEntry);
            await using (var source = new SqliteConnection($"Data Source={options.DatabasePath};Mode=ReadOnly;Pooling=False"))
            {
                await source.OpenAsync(ct);
                await using var cmd = source.CreateCommand();
                cmd.CommandText = "VACUUM INTO $path";
                cmd.Parameters.AddWithValue("$path", snapshot);
                await cmd.ExecuteNonQueryAsync(ct);
            }

            var files = new List<(BackupEntry Entry, byte[] Content)>();
            await using (var db = Open(snapshot))
            {
                foreach (var f in await db.StoredFiles.AsNoTracking().OrderBy(f => f.Id).ToListAsync(ct))
                {
                    var hash = Sha256(f.Content);
                    if (!string.Equals(hash, f.Sha256, StringComparison.OrdinalIgnoreCase))
                        throw new InvalidDataException($"Stored file {f.Id} ('{f.FileName}') no longer matches its recorded SHA-256 ({f.Sha256}, now {hash}); the ledger is damaged, backup stopped.");
                    var name = SupportingInfoWriter.SafeFileName(Path.GetFileName(f.FileName));
                    files.Add((new BackupEntry($"files/{hash}/{name}", hash, f.Content.LongLength, f.FileName), f.Content));
                }
            }
            SqliteConnection.ClearAllPools();

            var dbBytes = await File.ReadAllBytesAsync(snapshot, ct);
            var manifest = new BackupManifest(FormatName, 1, DateTimeOffset.UtcNow,
                new BackupEntry(DatabaseEntry, Sha256(dbBytes), dbBytes.LongLength), [.. files.Select(f => f.Entry)]);
            using (var zip = new ZipArchive(destination, ZipArchiveMode.Create, leaveOpen: true))
            {
                await WriteEntryAsync(zip, ManifestPath, JsonSerializer.SerializeToUtf8Bytes(manifest, s_json), ct);
                await WriteEntryAsync(zip, DatabaseEntry, dbBytes, ct);
                foreach (var (entry, content) in files) await WriteEntryAsync(zip, entry.Path, content, ct);
            }
            return manifest;
        }
        finally
        {
            SqliteConnection.ClearAllPools();
            try { Directory.Delete(temp, true); } catch (IOException) { }
        }
    }

    /// <summary>
    /// Restores an archive into <paramref name="dataDirectory"/> as <see cref="LedgerOptions.DatabaseFileName"/>. Refused when the
    /// folder has any content unless <paramref name="force"/> (which replaces the database and its journal files only).
    /// Every entry's SHA-256 is checked against the manifest, and every stored file inside the restored database against its own.
    /// </summary>
    public static async Task<RestoreReport> RestoreArchiveAsync(Stream archive, string dataDirectory, string databaseFileName, bool force, CancellationToken ct = default)
    {
        ArgumentNullException.ThrowIfNull(archive);
        ArgumentException.ThrowIfNullOrWhiteSpace(dataDirectory);
        var dir = Path.GetFullPath(dataDirectory);
        if (Directory.Exists(dir) && Directory.EnumerateFileSystemEntries(dir).Any() && !force)
        {
            var sample = string.Join(", ", Directory.EnumerateFileSystemEntries(dir).Take(3).Select(Path.GetFileName));
            throw new RestoreRefusedException($"The data folder {dir} is not empty ({sample}…). Restore only into an empty folder, or force it to replace the database there.");
        }

        using var zip = OpenArchive(archive);
        var manifestEntry = zip.GetEntry(ManifestPath) ?? throw new RestoreRefusedException($"The archive has no {ManifestPath}; it is not a BarrierLedger backup.");
        BackupManifest manifest;
        try
        {
            await using var ms = manifestEntry.Open();
            manifest = await JsonSerializer.DeserializeAsync<BackupManifest>(ms, s_json, ct) ?? throw new JsonException("empty manifest");
        }
        catch (JsonException ex)
        {
            throw new RestoreRefusedException($"{ManifestPath} cannot be read: {ex.Message}");
        }
        if (manifest.Format != FormatName || manifest.FormatVersion != 1)
            throw new RestoreRefusedException($"{ManifestPath} says format '{manifest.Format}' version {manifest.FormatVersion}; this program restores '{FormatName}' version 1.");

        var dbBytes = await ReadCheckedAsync(zip, manifest.Database, ct);
        var fileHashes = new Dictionary<string, string>(StringComparer.OrdinalIgnoreCase);
        foreach (var f in manifest.Files)
        {
            await ReadCheckedAsync(zip, f, ct);
            fileHashes[f.Sha256] = f.Path;
        }

        Directory.CreateDirectory(dir);
        var target = Path.Combine(dir, databaseFileName);
        var staging = target + ".restoring";
        await File.WriteAllBytesAsync(staging, dbBytes, ct);
        int stored;
        try
        {
            await using (var db = Open(staging))
            {
                var rows = await db.StoredFiles.AsNoTracking().Select(f => new { f.Id, f.Sha256, f.Content }).ToListAsync(ct);
                foreach (var r in rows)
                {
                    if (!string.Equals(Sha256(r.Content), r.Sha256, StringComparison.OrdinalIgnoreCase))
                        throw new RestoreRefusedException($"Stored file {r.Id} in {DatabaseEntry} does not match its recorded SHA-256 {r.Sha256}.");
                    if (!fileHashes.ContainsKey(r.Sha256))
                        throw new RestoreRefusedException($"Stored file {r.Id} (SHA-256 {r.Sha256}) is in {DatabaseEntry} but not listed in {ManifestPath}.");
                }
                stored = rows.Count;
            }
            SqliteConnection.ClearAllPools();
            foreach (var suffix in new[] { "", "-wal", "-shm" }) File.Delete(target + suffix);
            File.Move(staging, target);
        }
        catch
        {
            SqliteConnection.ClearAllPools();
            File.Delete(staging);
            throw;
        }
        return new RestoreReport(target, stored, manifest.Database.Sha256);
    }

    /// <summary>SHA-256 as lower-case hex.</summary>
    public static string Sha256(byte[] content) => Convert.ToHexStringLower(SHA256.HashData(content));

    private static LedgerDbContext Open(string path) =>
        new(new DbContextOptionsBuilder<LedgerDbContext>().UseSqlite($"Data Source={path};Pooling=False").Options);

    private static ZipArchive OpenArchive(Stream archive)
    {
        try
        {
            return new ZipArchive(archive, ZipArchiveMode.Read, leaveOpen: true);
        }
        catch (InvalidDataException ex)
        {
            throw new RestoreRefusedException($"The backup is not a readable zip archive: {ex.Message}");
        }
    }

    private static async Task<byte[]> ReadCheckedAsync(ZipArchive zip, BackupEntry e, CancellationToken ct)
    {
        if (e.Path.Contains("..") || Path.IsPathRooted(e.Path) || e.Path.Contains('\\'))
            throw new RestoreRefusedException($"{ManifestPath} names an unsafe path '{e.Path}'.");
        var entry = zip.GetEntry(e.Path) ?? throw new RestoreRefusedException($"The archive lacks '{e.Path}', which {ManifestPath} lists.");
        if (entry.Length != e.SizeBytes) throw new RestoreRefusedException($"'{e.Path}' is {entry.Length} bytes; {ManifestPath} says {e.SizeBytes}.");
        using var ms = new MemoryStream();
        await using (var s = entry.Open()) await s.CopyToAsync(ms, ct);
        var bytes = ms.ToArray();
        var hash = Sha256(bytes);
        if (!string.Equals(hash, e.Sha256, StringComparison.OrdinalIgnoreCase))
            throw new RestoreRefusedException($"'{e.Path}' has SHA-256 {hash}; {ManifestPath} says {e.Sha256}. The archive is damaged.");
        return bytes;
    }

    private static async Task WriteEntryAsync(ZipArchive zip, string path, byte[] content, CancellationToken ct)
    {
        var entry = zip.CreateEntry(path, CompressionLevel.Optimal);
        await using var s = entry.Open();
        await s.WriteAsync(content, ct);
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
