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

    public static async Task<RunResult> RunAsync(IReadOnlyList<string> urls, IReadOnlyList<int> pids, SitePages site, HarnessOptions options)
    {
        var lat = new Latencies();
        var before = pids.ToDictionary(p => p, p => ProcessMemory.Read(p));
        var open = 0;
        var started = 0;
        var allStarted = new TaskCompletionSource(TaskCreationOptions.RunContinuationsAsynchronously);
        var circuitsPerUrl = new int[urls.Count];
        var clock = Stopwatch.StartNew();
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

            var random = new Random(i);
            Task Think() => Task.Delay((int)(options.ThinkMs * (0.5 + random.NextDouble())));
            async Task<bool> Step(string kind, Func<Task<TimeSpan>> step)
            {
                if (clock.Elapsed >= deadline) return false;
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
            await circuit.DisposeAsync();
        }

        Console.WriteLine();
        Console.WriteLine($"Concurrent run: {options.Users} users for {options.Seconds} s against {string.Join(", ", urls)}, think time {options.ThinkMs} ms ±50 %; " +
                          $"load average at start {Machine.LoadAverage()}");
        var users = Enumerable.Range(0, options.Users).Select(UserAsync).ToList();
        await Task.WhenAny(allStarted.Task, Task.Delay(TimeSpan.FromMinutes(3)));
        await Task.Delay(TimeSpan.FromSeconds(3)); // let the last circuits settle
        var withCircuits = pids.ToDictionary(p => p, p => ProcessMemory.Read(p));
        var openAtSample = Volatile.Read(ref open);
        await Task.WhenAll(users);

        var pageSteps = lat.All(k => k != "sign-in (form post)");
        foreach (var kind in lat.Kinds) Console.WriteLine(Latencies.Row(kind, lat.Of(kind)));
        Console.WriteLine(Latencies.Row("all steps but sign-in", pageSteps));
        Console.WriteLine($"  circuits opened: {open} of {options.Users} ({string.Join(", ", urls.Select((u, k) => $"{circuitsPerUrl[k]} on {u}"))}); errors: {lat.ErrorCount}");
        foreach (var (message, count) in lat.Errors.Take(10)) Console.WriteLine($"    {count} × {message}");

        double? perCircuit = null;
        foreach (var pid in pids)
        {
            if (before[pid] is not { } b || withCircuits[pid] is not { } w) { Console.WriteLine($"  memory of pid {pid}: unreadable"); continue; }
            var circuitsHere = urls.Count == pids.Count ? circuitsPerUrl[pids.ToList().IndexOf(pid)] : openAtSample;
            Console.WriteLine($"  memory of pid {pid}: RSS {b.RssMiB:0.0} MiB before the run (anonymous {b.AnonMiB:0.0}), {w.RssMiB:0.0} MiB " +
                              $"with {circuitsHere} circuits open (anonymous {w.AnonMiB:0.0}); " +
                              (circuitsHere > 0 ? $"{(w.RssMiB - b.RssMiB) / circuitsHere:0.00} MiB per circuit" : "no circuit"));
            if (circuitsHere > 0) perCircuit = (perCircuit ?? 0) + (w.RssMiB - b.RssMiB) / circuitsHere / pids.Count;
        }
        Console.WriteLine($"  load average at the end: {Machine.LoadAverage()}");
        return pageSteps.Count == 0
            ? new RunResult(double.NaN, double.NaN, 0, lat.ErrorCount, perCircuit)
            : new RunResult(Percentile.NearestRank(pageSteps, 50), Percentile.NearestRank(pageSteps, 95), pageSteps.Count, lat.ErrorCount, perCircuit);
    }
}
