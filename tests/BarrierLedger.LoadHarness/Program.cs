using System.Globalization;
using BarrierLedger.LoadHarness;

if (args.Contains("--help") || args.Contains("-h"))
{
    Console.WriteLine(HarnessOptions.Usage);
    return 0;
}
HarnessOptions options;
try { options = HarnessOptions.Parse(args); }
catch (ArgumentException ex)
{
    Console.Error.WriteLine(ex.Message);
    Console.Error.WriteLine(HarnessOptions.Usage);
    return 2;
}
Percentile.SelfCheck();
CultureInfo.CurrentCulture = CultureInfo.InvariantCulture;

Console.WriteLine($"BarrierLedger load harness, {DateTime.UtcNow:yyyy-MM-dd HH:mm:ss} UTC, {Environment.ProcessorCount} cores, load average {Machine.LoadAverage()}");
if (options.UploadMemory)
{
    try { return await UploadMemory.RunAsync(options); }
    catch (Exception ex) when (ex is InvalidOperationException or HarnessException or HttpRequestException or FileNotFoundException)
    {
        Console.Error.WriteLine("harness stopped: " + ex.Message);
        return 1;
    }
}
AppInstance? app = null;
string? dataDirectory = null;
try
{
    if (options.Start)
    {
        dataDirectory = Path.Combine(Path.GetTempPath(), "bl-load-" + Guid.NewGuid().ToString("N")[..10]);
        if (options.FromCopy is { } source)
        {
            Directory.CreateDirectory(dataDirectory);
            foreach (var file in Directory.EnumerateFiles(source)) File.Copy(file, Path.Combine(dataDirectory, Path.GetFileName(file)));
        }
        app = await AppInstance.StartAsync(options.WebDllPath(), dataDirectory);
        Console.WriteLine($"app: {options.WebDllPath()} at {app.BaseUrl}, pid {app.ProcessId}, fresh data directory {dataDirectory}" +
                          (options.FromCopy is null ? "" : $" (a copy of {options.FromCopy})"));
        if (options.FromCopy is null)
        {
            var (studies, reactions, took) = await LedgerFiller.FillAsync(dataDirectory, options.Reactions, options.Bundle, options.Member.Name);
            Console.WriteLine($"stored {reactions} reactions in {studies} studies through the upload workflow in {took.TotalSeconds:0.0} s" +
                              (options.Bundle is null ? " (generated as by `barrierledger demo generate`)" : $" (from {options.Bundle})"));
        }
    }
    List<string> urls = app is null ? options.Urls : [app.BaseUrl];
    List<int> pids = app is null ? options.Pids : [app.ProcessId];

    var site = await RenderTimes.RunAsync(urls[0], options);
    if (dataDirectory is not null) await QueryTimes.RunAsync(dataDirectory, site, options.Loads);
    var failures = app?.LoggedFailures ?? 0;
    var run = await LoadRun.RunAsync(urls, pids, site, options);

    Console.WriteLine();
    Console.WriteLine("Summary (goals from issue 7)");
    Console.WriteLine(Verdict("ledger page render p95", site.LedgerP95, 150));
    Console.WriteLine(Verdict("reaction page render p95", site.ReactionP95, 200));
    Console.WriteLine($"  {options.Users} users, {options.Seconds} s: p50 {run.P50:0.0} ms, p95 {run.P95:0.0} ms over {run.Steps} steps; errors {run.Errors} (goal 0)" +
                      (app is null ? "" : $"; the app logged {app.LoggedFailures - failures} fail/crit lines during the run"));
    Console.WriteLine(run.MemoryPerCircuitMiB is not { } m ? "  server memory per circuit: not measured (give --pid)"
        : options.GcDump is null ? $"  server memory per circuit: {m:0.00} MiB (RSS growth / open circuits, idle; an upper bound, see above)"
        : $"  server memory per circuit: {m * 1024:0} KiB (live managed heap growth / open circuits, after browsing)");
    Console.WriteLine($"  load average at the end: {Machine.LoadAverage()}");
    return run.Errors == 0 ? 0 : 1;
}
catch (Exception ex) when (ex is InvalidOperationException or HarnessException or HttpRequestException or FileNotFoundException)
{
    Console.Error.WriteLine("harness stopped: " + ex.Message);
    if (app is not null) Console.Error.WriteLine("last app output:\n" + app.Tail());
    return 1;
}
finally
{
    if (app is not null) await app.DisposeAsync();
    if (dataDirectory is not null && !options.Keep)
        try { Directory.Delete(dataDirectory, recursive: true); } catch (IOException) { }
}

static string Verdict(string what, double p95, double goal) =>
    $"  {what}: {p95:0.0} ms, goal ≤ {goal:0} ms: {(p95 <= goal ? "met" : "NOT met")}";

/// <summary>Facts about this machine printed beside every figure (it is shared with other builds).</summary>
internal static class Machine
{
    public static string LoadAverage() =>
        File.Exists("/proc/loadavg") ? string.Join(' ', File.ReadAllText("/proc/loadavg").Split(' ').Take(3)) : "unknown";
}
