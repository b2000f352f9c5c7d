using System.IO.Compression;
using System.Text.Json;
using BarrierLedger.Ledger.Backups;
using BarrierLedger.Ledger.Export;
using BarrierLedger.Ledger.Tests.Export;
using BarrierLedger.Ledger.Tests.Support;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Tests.Backups;

public class BackupServiceTests
{
    private static async Task<string> TableCsvAsync(TempLedger ledger, int studyId)
    {
        var source = await new ExportQueryService(ledger.Factory).GetTableSourceAsync(studyId);
        return System.Text.Encoding.UTF8.GetString(CsvTableWriter.ToBytes(BarrierTable.Build(source, new TableOptions(Enum.GetValues<ExportColumn>(), Decimals: 6))));
    }

    private static async Task<List<(string Sha, string Hash)>> FileHashesAsync(TempLedger ledger)
    {
        await using var db = await ledger.DbAsync();
        return [.. (await db.StoredFiles.AsNoTracking().OrderBy(f => f.Sha256).ToListAsync()).Select(f => (f.Sha256, BackupService.Sha256(f.Content)))];
    }

    [Fact]
    public async Task BackupThenRestore_GivesTheSameLedgerAnswers_AndFileHashes()
    {
        var (ledger, studyId) = await DemoLedger.CreateAsync();
        await using var _ = ledger;
        var before = await TableCsvAsync(ledger, studyId);
        var hashesBefore = await FileHashesAsync(ledger);
        Assert.NotEmpty(hashesBefore);
        Assert.All(hashesBefore, h => Assert.Equal(h.Sha, h.Hash));

        using var archive = new MemoryStream();
        var manifest = await new BackupService(ledger.Options).CreateArchiveAsync(archive);
        Assert.Equal(hashesBefore.Count, manifest.Files.Count);

        // The archive holds each original file with the hash the manifest gives.
        archive.Position = 0;
        using (var zip = new ZipArchive(archive, ZipArchiveMode.Read, leaveOpen: true))
        {
            foreach (var f in manifest.Files)
            {
                using var ms = new MemoryStream();
                zip.GetEntry(f.Path)!.Open().CopyTo(ms);
                Assert.Equal(f.Sha256, BackupService.Sha256(ms.ToArray()));
            }
            var parsed = JsonSerializer.Deserialize<BackupManifest>(zip.GetEntry(BackupService.ManifestPath)!.Open());
            Assert.Equal(manifest.Database.Sha256, parsed!.Database.Sha256);
        }

        var target = Path.Combine(Path.GetTempPath(), "bl-restore-" + Guid.NewGuid().ToString("N")[..8]);
        archive.Position = 0;
        var report = await BackupService.RestoreArchiveAsync(archive, target, "barrierledger.db", force: false);
        Assert.Equal(hashesBefore.Count, report.StoredFiles);

        await using var restored = await TempLedger.CreateAsync(target);
        Assert.Equal(before, await TableCsvAsync(restored, studyId));
        Assert.Equal(hashesBefore, await FileHashesAsync(restored));
    }

    [Fact]
    public async Task Restore_IntoANonEmptyFolder_IsRefusedUnlessForced()
    {
        await using var ledger = await TempLedger.CreateAsync();
        using var archive = new MemoryStream();
        await new BackupService(ledger.Options).CreateArchiveAsync(archive);

        var target = Directory.CreateTempSubdirectory("bl-restore-").FullName;
        try
        {
            File.WriteAllText(Path.Combine(target, "notes.txt"), "keep me");
            archive.Position = 0;
            var e = await Assert.ThrowsAsync<RestoreRefusedException>(() => BackupService.RestoreArchiveAsync(archive, target, "barrierledger.db", force: false));
            Assert.Contains("is not empty", e.Message);
            Assert.Contains("notes.txt", e.Message);
            Assert.False(File.Exists(Path.Combine(target, "barrierledger.db")));

            archive.Position = 0;
            await BackupService.RestoreArchiveAsync(archive, target, "barrierledger.db", force: true);
            Assert.True(File.Exists(Path.Combine(target, "barrierledger.db")));
            Assert.Equal("keep me", File.ReadAllText(Path.Combine(target, "notes.txt")));
        }
        finally
        {
            Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
            Directory.Delete(target, true);
        }
    }

    [Fact]
    public async Task Restore_OfADamagedArchive_SaysWhichEntryIsWrong()
    {
        await using var ledger = await TempLedger.CreateAsync();
        using var archive = new MemoryStream();
        var manifest = await new BackupService(ledger.Options).CreateArchiveAsync(archive);

        // Rebuild the archive with one byte of the database changed.
        using var damaged = new MemoryStream();
        archive.Position = 0;
        using (var src = new ZipArchive(archive, ZipArchiveMode.Read, leaveOpen: true))
        using (var dst = new ZipArchive(damaged, ZipArchiveMode.Create, leaveOpen: true))
        {
            foreach (var e in src.Entries)
            {
                using var ms = new MemoryStream();
                e.Open().CopyTo(ms);
                var bytes = ms.ToArray();
                if (e.FullName == BackupService.DatabaseEntry) bytes[^1] ^= 0xff;
                using var w = dst.CreateEntry(e.FullName).Open();
                w.Write(bytes);
            }
        }
        damaged.Position = 0;
        var target = Path.Combine(Path.GetTempPath(), "bl-restore-" + Guid.NewGuid().ToString("N")[..8]);
        var ex = await Assert.ThrowsAsync<RestoreRefusedException>(() => BackupService.RestoreArchiveAsync(damaged, target, "barrierledger.db", force: false));
        Assert.Contains("'ledger.db' has SHA-256", ex.Message);
        Assert.Contains(manifest.Database.Sha256, ex.Message);
        Assert.False(File.Exists(Path.Combine(target, "barrierledger.db")));

        var notZip = await Assert.ThrowsAsync<RestoreRefusedException>(() => BackupService.RestoreArchiveAsync(new MemoryStream([1, 2, 3]), target, "barrierledger.db", false));
        Assert.Contains("not a readable zip", notZip.Message);
    }
}
