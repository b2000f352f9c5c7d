using System.Diagnostics;

namespace BarrierLedger.LoadHarness;

/// <summary>The outcome of the concurrent run.</summary>
internal sealed record RunResult(double P50, double P95, int Steps, int Errors, double? MemoryPerCircuitMiB);

/// <summary>
/// Concurrent simulated users for a bounded time. Each user signs in through the form, loads a study's ledger over HTTP,
/// starts a real circuit from it and then, until the time is up, follows a link to a reaction, (reviewers) opens the review
/// queue, goes back to the ledger, and loads a reaction page over HTTP as a new tab would, pausing between steps.
/// </summary>
internal static class LoadRun
{
    private const string CircuitReady = "circuit-ready";
    private static readonly string[] s_reviewDone = ["Comment (required to return)", "Nothing awaits review"];
    private static readonly TimeSpan s_stepTimeout = TimeSpan.FromSeconds(30);

    /// <summary>
    /// One circuit per instance through every step, closed again, so that the memory read before the run already holds the
    /// code and caches a first circuit loads (not to be charged to the 30).
    /// </summary>
    private static async Task WarmUpAsync(IReadOnlyList<string> urls, SitePages site, HarnessOptions options)
    {
        foreach (var url in urls)
        {
            using var user = new SiteUser(url);
            await user.SignInAsync(options.Reviewer.Name, options.Reviewer.Password);
            var ledgerPath = $"/studies/{site.StudyIds[0]}";
            var (circuit, _) = await CircuitSession.StartAsync(user, await user.GetAsync(ledgerPath, RenderTimes.LedgerDone), [CircuitReady, RenderTimes.LedgerDone], s_stepTimeout);
            await using (circuit)
            {
                await circuit.NavigateAsync($"/reactions/{site.ReactionIds[0]}", [RenderTimes.ReactionDone], true, s_stepTimeout);
                await circuit.NavigateAsync("/review", s_reviewDone, true, s_stepTimeout);
                await circuit.NavigateAsync(ledgerPath, [RenderTimes.LedgerDone], false, s_stepTimeout);
            }
        }
        await Task.Delay(TimeSpan.FromSeconds(2));
    }

    public static async Task<RunResult> RunAsync(IReadOnlyList<string> urls, IReadOnlyList<int> pids, SitePages site, HarnessOptions options)
    {
        await WarmUpAsync(urls, site, options);
        var lat = new Latencies();
        var before = pids.ToDictionary(p => p, p => ProcessMemory.Read(p));
        var heapBefore = new Dictionary<int, double?>();
        foreach (var pid in pids) heapBefore[pid] = await LiveHeap.ReadMiBAsync(options.GcDump, pid);
        var open = 0;
        var started = 0;
        var browsing = 0;
        var allStarted = new TaskCompletionSource(TaskCreationOptions.RunContinuationsAsynchronously);
        var go = new TaskCompletionSource(TaskCreationOptions.RunContinuationsAsynchronously);
        var allBrowsed = new TaskCompletionSource(TaskCreationOptions.RunContinuationsAsynchronously);
        var closeCircuits = new TaskCompletionSource(TaskCreationOptions.RunContinuationsAsynchronously);
        var circuitsPerUrl = new int[urls.Count];
        var clock = new Stopwatch();
        var deadline = TimeSpan.FromSeconds(options.Seconds);

        async Task UserAsync(int i)
        {
            await Task.Delay(i * 100); // ramp up over a few seconds, as people arrive
            var (name, password) = i % 2 == 0 ? options.Reviewer : options.Member;
            var urlIndex = i % urls.Count; // round-robin, and sticky: every request of this user goes to this instance
            using var user = new SiteUser(urls[urlIndex]);
            var ledgerPath = $"/studies/{site.StudyIds[i % site.StudyIds.Count]}";
            CircuitSession? circuit = null;
            try
            {
                lat.Add("sign-in (form post)", await user.SignInAsync(name, password));
                var page = await user.GetAsync(ledgerPath, RenderTimes.LedgerDone);
                lat.Add("HTTP GET ledger", page.Elapsed);
                (circuit, var t) = await CircuitSession.StartAsync(user, page, [CircuitReady, RenderTimes.LedgerDone], s_stepTimeout);
                lat.Add("circuit start to interactive ledger", t);
                Interlocked.Increment(ref open);
                Interlocked.Increment(ref circuitsPerUrl[urlIndex]);
            }
            catch (Exception ex) when (ex is not OutOfMemoryException)
            {
                lat.Error("start", ex);
            }
            finally
            {
                if (Interlocked.Increment(ref started) == options.Users) allStarted.TrySetResult();
            }
            if (circuit is null) return;
            // Everyone waits with an idle circuit on the ledger until the memory with all circuits open is read.
            await go.Task;

            var random = new Random(i);
            Task Think() => Task.Delay((int)(options.ThinkMs * (0.5 + random.NextDouble())));
            // The time is checked before each round, so every user ends a round back on the ledger (a round lasts a few seconds).
            async Task<bool> Step(string kind, Func<Task<TimeSpan>> step)
            {
                try { lat.Add(kind, await step()); }
                catch (Exception ex) when (ex is not OutOfMemoryException)
                {
                    lat.Error(kind, ex);
                    if (!circuit.IsConnected) return false;
                }
                await Think();
                return true;
            }

            for (var n = 0; clock.Elapsed < deadline; n++)
            {
                var reaction = site.ReactionIds[(i * 7 + n) % site.ReactionIds.Count];
                if (!await Step("navigate to reaction", () => circuit.NavigateAsync($"/reactions/{reaction}", [RenderTimes.ReactionDone], true, s_stepTimeout))) break;
                if (i % 2 == 0 && !await Step("navigate to review queue", () => circuit.NavigateAsync("/review", s_reviewDone, true, s_stepTimeout))) break;
                if (!await Step("back to ledger", () => circuit.NavigateAsync(ledgerPath, [RenderTimes.LedgerDone], false, s_stepTimeout))) break;
                if (!await Step("HTTP GET reaction (new tab)", async () => (await user.GetAsync($"/reactions/{reaction}", RenderTimes.ReactionDone)).Elapsed)) break;
            }
            if (Interlocked.Decrement(ref browsing) == 0) allBrowsed.TrySetResult();
            await closeCircuits.Task;
            await circuit.DisposeAsync();
        }

        Console.WriteLine();
        Console.WriteLine($"Concurrent run: {options.Users} users sign in and open circuits, then browse for {options.Seconds} s against {string.Join(", ", urls)}, think time {options.ThinkMs} ms ±50 %; " +
                          $"load average at start {Machine.LoadAverage()}");
        var users = Enumerable.Range(0, options.Users).Select(UserAsync).ToList();
        await Task.WhenAny(allStarted.Task, Task.Delay(TimeSpan.FromMinutes(3)));
        await Task.Delay(TimeSpan.FromSeconds(5)); // idle, so that the figure holds the circuits, not requests in flight
        var idle = pids.ToDictionary(p => p, p => ProcessMemory.Read(p));
        var heapIdle = new Dictionary<int, double?>();
        foreach (var pid in pids) heapIdle[pid] = await LiveHeap.ReadMiBAsync(options.GcDump, pid);
        var openAtSample = Volatile.Read(ref open);
        browsing = openAtSample;
        clock.Start();
        go.TrySetResult();
        if (openAtSample > 0) await Task.WhenAny(allBrowsed.Task, Task.Delay(deadline + TimeSpan.FromMinutes(2)));
        var afterBrowsing = pids.ToDictionary(p => p, p => ProcessMemory.Read(p));
        var heapAfter = new Dictionary<int, double?>();
        foreach (var pid in pids) heapAfter[pid] = await LiveHeap.ReadMiBAsync(options.GcDump, pid);
        closeCircuits.TrySetResult();
        await Task.WhenAll(users);

        var pageSteps = lat.All(k => k != "sign-in (form post)");
        foreach (var kind in lat.Kinds) Console.WriteLine(Latencies.Row(kind, lat.Of(kind)));
        Console.WriteLine(Latencies.Row("all steps but sign-in", pageSteps));
        Console.WriteLine($"  circuits opened: {open} of {options.Users} ({string.Join(", ", urls.Select((u, k) => $"{circuitsPerUrl[k]} on {u}"))}); errors: {lat.ErrorCount}");
        foreach (var (message, count) in lat.Errors.Take(10)) Console.WriteLine($"    {count} × {message}");

        double? perCircuit = null;
        foreach (var pid in pids)
        {
            if (before[pid] is not { } b || idle[pid] is not { } w || afterBrowsing[pid] is not { } a) { Console.WriteLine($"  memory of pid {pid}: unreadable"); continue; }
            var circuitsHere = urls.Count == pids.Count ? circuitsPerUrl[pids.ToList().IndexOf(pid)] : openAtSample;
            Console.WriteLine($"  memory of pid {pid} (/proc VmRSS, anonymous part in brackets): {b.RssMiB:0.0} ({b.AnonMiB:0.0}) MiB before the run; " +
                              $"{w.RssMiB:0.0} ({w.AnonMiB:0.0}) MiB with {circuitsHere} idle circuits open on the ledger; " +
                              $"{a.RssMiB:0.0} ({a.AnonMiB:0.0}) MiB with them open after browsing");
            if (circuitsHere == 0) continue;
            Console.WriteLine($"    per circuit: {(w.RssMiB - b.RssMiB) / circuitsHere:0.00} MiB idle, {(a.RssMiB - b.RssMiB) / circuitsHere:0.00} MiB after browsing " +
                              "(RSS growth over the circuits; it also holds the garbage collector's headroom, so it is an upper bound)");
            if (heapBefore[pid] is { } hb && heapIdle[pid] is { } hi && heapAfter[pid] is { } ha)
            {
                Console.WriteLine($"    live managed heap (dotnet-gcdump, after a full collection): {hb:0.0} MiB before, {hi:0.0} MiB with the idle circuits, " +
                                  $"{ha:0.0} MiB after browsing: {(hi - hb) / circuitsHere * 1024:0} KiB per idle circuit, {(ha - hb) / circuitsHere * 1024:0} KiB after browsing");
                perCircuit = (perCircuit ?? 0) + (ha - hb) / circuitsHere / pids.Count;
            }
            else perCircuit = (perCircuit ?? 0) + (w.RssMiB - b.RssMiB) / circuitsHere / pids.Count;
        }
        Console.WriteLine($"  load average at the end: {Machine.LoadAverage()}");
        return pageSteps.Count == 0
            ? new RunResult(double.NaN, double.NaN, 0, lat.ErrorCount, perCircuit)
            : new RunResult(Percentile.NearestRank(pageSteps, 50), Percentile.NearestRank(pageSteps, 95), pageSteps.Count, lat.ErrorCount, perCircuit);
    }
}
