using BarrierLedger.Ledger.Coordination;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Tests.Coordination;

/// <summary>
/// Two app instances on one database, modelled as two service providers (each with its own RecomputeService singleton)
/// over the same store (one SQLite file, or one PostgreSQL database): the recompute lease lets one of them run a pass at a
/// time, the other reads its progress.
/// </summary>
public sealed class RecomputeLeaseTests
{
    private static readonly TimeSpan Patience = TimeSpan.FromSeconds(60);

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Request_WhileAnotherInstanceHoldsTheLease_RunsNothing_ShowsItsProgress_AndEndsWhenItsPassCoversTheRequest(StoreProvider store)
    {
        await using var a = await TempLedger.CreateAsync(store);
        await using var b = a.SecondInstance();
        await a.Get<UploadService>().StoreDraftAsync(H3System.Draft(), new UploadChoices(), "member");
        var leases = a.Get<WorkLeaseStore>();
        const string other = "host-a/4242/holder01";
        Assert.True(await leases.TryAcquireAsync(RecomputeService.LeaseName, other));
        Assert.True(await leases.RenewAsync(RecomputeService.LeaseName, other, new LeaseProgress("deriving energies (study 1)", 3, 7, 1)));

        var recompute = b.Get<RecomputeService>();
        var pass = recompute.Request();
        var seen = await WaitForAsync(recompute, p => p.Elsewhere);
        Assert.True(seen.Running);
        Assert.Equal("recompute running on another instance: deriving energies (study 1)", seen.Phase);
        Assert.Equal((3, 7, 1), (seen.Done, seen.Total, seen.ChecksRun));
        Assert.Equal(seen, await recompute.GetProgressAsync());
        Assert.False(pass.IsCompleted);

        // The holder finishes a pass that began after b's request was recorded: that covers it, and b never runs one.
        var row = (await leases.ReadAsync(RecomputeService.LeaseName))!;
        Assert.True(await leases.TryReleaseAsync(RecomputeService.LeaseName, other, row.RequestSerial, new LeaseProgress("done", 7, 7, 1), null));
        await pass.WaitAsync(Patience);
        Assert.Equal(0, recompute.PassesRun);
        Assert.False(recompute.Current.Elsewhere);
        Assert.Equal(("done", 7, 7), (recompute.Current.Phase, recompute.Current.Done, recompute.Current.Total));
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Release_WhenRequestsArrivedDuringThePass_IsRefused_SoTheHolderRunsAgain(StoreProvider store)
    {
        await using var ledger = await TempLedger.CreateAsync(store);
        var leases = ledger.Get<WorkLeaseStore>();
        var first = await leases.RequestAsync("job");
        Assert.True(await leases.TryAcquireAsync("job", "one"));
        Assert.False(await leases.TryAcquireAsync("job", "two"));
        await leases.RequestAsync("job");
        Assert.False(await leases.TryReleaseAsync("job", "one", first, new LeaseProgress("done", 1, 1, 0), null));
        var row = (await leases.ReadAsync("job"))!;
        Assert.Equal("one", row.Holder);
        Assert.True(await leases.TryReleaseAsync("job", "one", row.RequestSerial, new LeaseProgress("done", 1, 1, 0), null));
        Assert.True(await leases.TryAcquireAsync("job", "two"));
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Request_WhenTheHolderDiedAndItsLeaseExpired_TakesItOver_AndRunsEveryStudy(StoreProvider store)
    {
        await using var a = await TempLedger.CreateAsync(store);
        await using var b = a.SecondInstance();
        var first = await a.Get<UploadService>().StoreDraftAsync(H3System.Draft(), new UploadChoices(), "member");
        var leases = a.Get<WorkLeaseStore>();
        // A holder that asked for a pass, took the lease and stopped renewing it a while ago (killed).
        await leases.RequestAsync(RecomputeService.LeaseName);
        Assert.True(await leases.TryAcquireAsync(RecomputeService.LeaseName, "gone/1/deadbeef"));
        await using (var db = await a.DbAsync())
        {
            var past = DateTimeOffset.UtcNow.AddMinutes(-5).ToUnixTimeMilliseconds();
            await db.WorkLeases.Where(l => l.Name == RecomputeService.LeaseName).ExecuteUpdateAsync(s => s.SetProperty(l => l.ExpiresAtUnixMs, past));
        }
        Assert.False(leases.HeldByOther((await leases.ReadAsync(RecomputeService.LeaseName))!, "anyone"));

        var recompute = b.Get<RecomputeService>();
        // b asks for a study that does not exist; the dead holder's request has no recorded scope, so b recomputes everything.
        await recompute.Request(first.StudyId!.Value + 1000).WaitAsync(Patience);
        Assert.Equal(1, recompute.PassesRun);
        Assert.Equal(("done", 1, 1), (recompute.Current.Phase, recompute.Current.Done, recompute.Current.Total));
        var row = (await leases.ReadAsync(RecomputeService.LeaseName))!;
        Assert.Null(row.Holder);
        Assert.Equal(row.RequestSerial, row.CompletedSerial);
        Assert.Equal(2, row.CompletedSerial);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task TwoInstances_RequestingAtOnce_NeverRunPassesAtTheSameTime_AndBothSeeTheResult(StoreProvider store)
    {
        await using var a = await TempLedger.CreateAsync(store);
        await using var b = a.SecondInstance();
        for (var i = 0; i < 3; i++)
            await a.Get<UploadService>().StoreDraftAsync(H3System.Draft(), new UploadChoices(), "member");
        var ra = a.Get<RecomputeService>();
        var rb = b.Get<RecomputeService>();
        Assert.NotEqual(ra.InstanceId, rb.InstanceId);

        var gate = new Lock();
        var ownRunning = new Dictionary<string, bool> { [ra.InstanceId] = false, [rb.InstanceId] = false };
        var overlaps = 0;
        void Track(RecomputeService r, RecomputeProgress p)
        {
            lock (gate)
            {
                ownRunning[r.InstanceId] = p.Running && !p.Elsewhere;
                if (ownRunning.Values.All(v => v)) overlaps++;
            }
        }
        ra.ProgressChanged += p => Track(ra, p);
        rb.ProgressChanged += p => Track(rb, p);

        for (var round = 0; round < 5; round++)
            await Task.WhenAll(ra.Request(), rb.Request()).WaitAsync(Patience);

        Assert.Equal(0, overlaps);
        Assert.InRange(ra.PassesRun + rb.PassesRun, 5, 20);
        var row = (await a.Get<WorkLeaseStore>().ReadAsync(RecomputeService.LeaseName))!;
        Assert.Null(row.Holder);
        Assert.Equal(10, row.RequestSerial);
        Assert.Equal(row.RequestSerial, row.CompletedSerial);
        int reactions;
        await using (var db = await a.DbAsync()) reactions = await db.Reactions.CountAsync(r => !r.Retired);
        foreach (var r in new[] { ra, rb })
        {
            var p = await r.GetProgressAsync();
            Assert.Equal(("done", reactions, false), (p.Phase, p.Done, p.Running));
        }
    }

    private static async Task<RecomputeProgress> WaitForAsync(RecomputeService service, Func<RecomputeProgress, bool> condition)
    {
        var until = DateTime.UtcNow + Patience;
        while (DateTime.UtcNow < until)
        {
            if (condition(service.Current)) return service.Current;
            await Task.Delay(50);
        }
        throw new TimeoutException("The recompute service never reached the awaited state; last: " + service.Current);
    }
}
