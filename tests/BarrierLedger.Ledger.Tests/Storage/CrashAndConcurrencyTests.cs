using BarrierLedger.Ledger.Storage;
using System.Diagnostics;
using System.Text;
using BarrierLedger.Ledger.Backups;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;
using Microsoft.Data.Sqlite;
using Microsoft.EntityFrameworkCore;
using Xunit.Abstractions;

namespace BarrierLedger.Ledger.Tests.Storage;

public sealed class CrashAndConcurrencyTests(ITestOutputHelper output)
{
    private const int Frames = 300;
    private const int Atoms = 60;

    [Fact]
    public async Task Upload_KilledAtRandomMoments20Times_LeavesASoundFileWithEachUploadWhollyPresentOrAbsent()
    {
        await using var ledger = await TempLedger.CreateAsync();
        var random = new Random(20261202);
        var dll = typeof(ChildProcess).Assembly.Location;
        var midUpload = 0;
        for (var round = 0; round < 20; round++)
        {
            var psi = new ProcessStartInfo("dotnet", [dll, ChildProcess.Mode, ledger.Directory, Frames.ToString(), Atoms.ToString()])
            {
                RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false,
            };
            using var child = Process.Start(psi)!;
            string? lastBegun = null, lastStored = null;
            var ready = new TaskCompletionSource();
            child.OutputDataReceived += (_, e) =>
            {
                if (e.Data == "ready") ready.TrySetResult();
                else if (e.Data?.StartsWith("begin ", StringComparison.Ordinal) == true) Volatile.Write(ref lastBegun, e.Data[6..]);
                else if (e.Data?.StartsWith("stored ", StringComparison.Ordinal) == true) Volatile.Write(ref lastStored, e.Data[7..]);
            };
            var errors = new StringBuilder();
            child.ErrorDataReceived += (_, e) => { lock (errors) errors.AppendLine(e.Data); };
            child.BeginOutputReadLine();
            child.BeginErrorReadLine();
            var started = await Task.WhenAny(ready.Task, child.WaitForExitAsync(), Task.Delay(TimeSpan.FromSeconds(60)));
            Assert.True(started == ready.Task, $"the child did not get ready: {errors}");
            await Task.Delay(random.Next(0, 700));
            child.Kill(); // SIGKILL on Unix: no chance to finish or clean up
            await child.WaitForExitAsync();
            Assert.Equal(137, child.ExitCode); // 128 + SIGKILL(9): it was killed, not done
            var inFlight = Volatile.Read(ref lastBegun);
            if (inFlight is not null && inFlight != Volatile.Read(ref lastStored)) midUpload++;

            Assert.Equal("ok", await BackupService.IntegrityCheckAsync(ledger.Options.DatabasePath));
            await using var db = await ledger.DbAsync();
            var uploads = await db.Uploads.Select(u => new { u.Id, u.Key }).ToListAsync();
            var perUpload = await db.Scans.GroupBy(s => s.UploadId)
                .Select(g => new { g.Key, Scans = g.Count(), Points = g.Sum(s => db.ScanPoints.Count(p => p.ScanId == s.Id)) }).ToListAsync();
            var big = uploads.Where(u => u.Key.StartsWith("child-", StringComparison.Ordinal)).Select(u => u.Id).ToHashSet();
            Assert.Equal(uploads.Select(u => u.Id).Order(), perUpload.Select(p => p.Key).Order());
            Assert.All(perUpload, p => Assert.Equal((1, big.Contains(p.Key) ? Frames : 3), (p.Scans, p.Points)));
            Assert.Equal(big.Count * Frames + (uploads.Count - big.Count) * 3, await db.ScanPoints.CountAsync());
            Assert.Equal(uploads.Count, await db.AuditEvents.CountAsync(a => a.Action == "upload.stored"));
            // The upload being written when the kill came is either all there or not there at all.
            if (inFlight is not null && uploads.Any(u => u.Key == inFlight))
                Assert.Equal(Frames, perUpload.Single(p => p.Key == uploads.Single(u => u.Key == inFlight).Id).Points);
            output.WriteLine($"round {round + 1}: in flight {inFlight ?? "-"}, last stored {lastStored ?? "-"}; the file holds {big.Count} complete large uploads");
        }
        output.WriteLine($"{midUpload} of 20 kills came while an upload was being written");
        Assert.True(midUpload >= 1, "no kill came during an upload: the test did not test anything");
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task EightParallelUploads_IntoOneFile_AreEachStoredExactlyOnce_WithoutLockErrors(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var bytes = Encoding.UTF8.GetBytes(H3System.ScanXyz(200, 40));
        var uploads = ledger.Get<UploadService>();
        var tasks = Enumerable.Range(0, 8).Select(i => Task.Run(() => uploads.StoreAsync(
            [new UploadFile($"scan-{i}.xyz", bytes)], H3System.ScanChoices("Shared study", $"chain-{i}", $"parallel-{i}"), $"user-{i}"))).ToList();
        var outcomes = await Task.WhenAll(tasks);

        Assert.All(outcomes, o => Assert.True(o.Stored, string.Join("\n", o.Errors)));
        await using var db = await ledger.DbAsync();
        Assert.Equal(1, await db.Studies.CountAsync()); // all eight found or created the same study, once
        Assert.Equal(8, await db.Uploads.CountAsync());
        Assert.Equal(Enumerable.Range(0, 8).Select(i => $"chain-{i}"), (await db.Species.Select(s => s.Label).ToListAsync()).Order());
        Assert.Equal(8, await db.Scans.CountAsync());
        Assert.Equal(8 * 200, await db.ScanPoints.CountAsync());
        Assert.Equal(1, await db.StoredFiles.CountAsync()); // the same bytes eight times are stored once

        // The same upload key again is not stored a second time.
        var again = await uploads.StoreAsync([new UploadFile("scan-0.xyz", bytes)], H3System.ScanChoices("Shared study", "chain-0", "parallel-0"), "user-0");
        Assert.True(again.Stored);
        Assert.Equal(8, await db.Uploads.CountAsync());
    }

    [Fact]
    public async Task Backup_ThenRestoreIntoANewFolder_AnswersTheSameLedgerQuery()
    {
        await using var ledger = await TempLedger.CreateAsync();
        var stored = await ledger.Get<UploadService>().StoreDraftAsync(H3System.Draft(), new UploadChoices(), "member");
        using var archive = new MemoryStream();
        await ledger.Get<BackupService>().CreateArchiveAsync(archive);

        var target = Path.Combine(ledger.Directory, "restored");
        archive.Position = 0;
        var report = await BackupService.RestoreArchiveAsync(archive, target, ledger.Options.DatabaseFileName, force: false);
        Assert.Equal("ok", await BackupService.IntegrityCheckAsync(report.DatabasePath));
        archive.Position = 0;
        await Assert.ThrowsAsync<RestoreRefusedException>(() => BackupService.RestoreArchiveAsync(archive, target, ledger.Options.DatabaseFileName, force: false));
        await using var restored = await TempLedger.CreateAsync(target);
        var a = await ledger.Get<LedgerQueryService>().GetLedgerRowsAsync(stored.StudyId!.Value);
        var b = await restored.Get<LedgerQueryService>().GetLedgerRowsAsync(stored.StudyId!.Value);
        Assert.Equal(a.Rows.Select(r => (r.Label, r.BarrierGibbs, r.RateConstantPerSecond, r.Verdict, r.ReviewStatus)),
                     b.Rows.Select(r => (r.Label, r.BarrierGibbs, r.RateConstantPerSecond, r.Verdict, r.ReviewStatus)));
        await using var db1 = await ledger.DbAsync();
        await using var db2 = await restored.DbAsync();
        Assert.Equal(await db1.StoredFiles.Select(f => f.Sha256).ToListAsync(), await db2.StoredFiles.Select(f => f.Sha256).ToListAsync());
    }
}
