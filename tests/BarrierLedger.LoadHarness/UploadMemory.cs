using System.Diagnostics;
using System.Globalization;
using System.Net.Http.Headers;
using System.Text;
using BarrierLedger.Core.Formats;
using BarrierLedger.Ledger;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.LoadHarness;

/// <summary>
/// Issue 19, finding 7: the server's resident memory while large XYZ files are previewed through POST /api/v1/uploads/preview
/// (one, then several at once), and the time to read such a file. Peak resident memory is the kernel's VmHWM for the app
/// process, reset before each step (<c>/proc/PID/clear_refs</c>), and also sampled as VmRSS every 20 ms.
/// Goals from the issue: three concurrent 60 MiB previews keep the server at or below 1 GB resident; a 60 MiB XYZ reads in ≤ 3 s.
/// </summary>
internal static class UploadMemory
{
    public static async Task<int> RunAsync(HarnessOptions options)
    {
        var xyz = Path.Combine(Path.GetTempPath(), $"bl-scan-{options.UploadMiB}mib.xyz");
        var frames = WriteScan(xyz, options.UploadMiB);
        Console.WriteLine($"file: {xyz}, {new FileInfo(xyz).Length / 1048576.0:0.0} MiB, a relaxed scan of {frames} frames of 30 atoms");

        var reads = new List<double>();
        for (var r = 0; r < 3; r++)
        {
            var clock = Stopwatch.StartNew();
            using (var stream = File.OpenRead(xyz))
            {
                var result = XyzReader.Read(stream, "scan.xyz");
                if (result.Value is null) throw new HarnessException("the generated scan did not read: " + string.Join("; ", result.Issues.Take(3)));
            }
            reads.Add(clock.Elapsed.TotalSeconds);
            GC.Collect();
        }
        reads.Sort();
        Console.WriteLine($"Core XyzReader.Read of the file in this process: median {reads[1]:0.00} s of 3 (min {reads[0]:0.00}, max {reads[2]:0.00}); load average {Machine.LoadAverage()}");

        var dataDirectory = Path.Combine(Path.GetTempPath(), "bl-upmem-" + Guid.NewGuid().ToString("N")[..10]);
        var app = await AppInstance.StartAsync(options.WebDllPath(), dataDirectory);
        try
        {
            Console.WriteLine($"app: {options.WebDllPath()} at {app.BaseUrl}, pid {app.ProcessId}");
            var token = await CreateTokenAsync(dataDirectory, options.Member.Name);
            using var http = new HttpClient { BaseAddress = new Uri(app.BaseUrl), Timeout = TimeSpan.FromMinutes(10) };
            http.DefaultRequestHeaders.Authorization = new AuthenticationHeaderValue("Bearer", token);
            var bytes = await File.ReadAllBytesAsync(xyz);

            await Task.Delay(TimeSpan.FromSeconds(3));
            Console.WriteLine($"idle: VmRSS {Rss(app.ProcessId):0} MiB; load average {Machine.LoadAverage()}");
            var one = await StepAsync(http, app.ProcessId, bytes, 1);
            var three = await StepAsync(http, app.ProcessId, bytes, options.UploadConcurrency);

            Console.WriteLine();
            Console.WriteLine("Summary (goals from issue 19, finding 7)");
            Console.WriteLine($"  read a {options.UploadMiB} MiB XYZ (Core): {reads[1]:0.00} s, goal ≤ 3 s: {(reads[1] <= 3 ? "met" : "NOT met")}");
            Console.WriteLine($"  one preview over HTTP: {one.Seconds.Max():0.00} s, peak VmHWM {one.PeakMiB:0} MiB");
            Console.WriteLine($"  {options.UploadConcurrency} previews at once: peak VmHWM {three.PeakMiB:0} MiB, goal ≤ 1024 MiB: {(three.PeakMiB <= 1024 ? "met" : "NOT met")}; "
                + $"answers {string.Join(", ", three.Statuses)}; times {string.Join(", ", three.Seconds.Select(s => s.ToString("0.00", CultureInfo.InvariantCulture)))} s");
            Console.WriteLine($"  load average at the end: {Machine.LoadAverage()}");
            return 0;
        }
        finally
        {
            await app.DisposeAsync();
            try { Directory.Delete(dataDirectory, recursive: true); } catch (IOException) { }
        }
    }

    private sealed record Step(double PeakMiB, double SampledPeakMiB, List<int> Statuses, List<double> Seconds);

    private static async Task<Step> StepAsync(HttpClient http, int pid, byte[] file, int concurrent)
    {
        GC.Collect();
        await File.WriteAllTextAsync($"/proc/{pid}/clear_refs", "5"); // resets VmHWM to the current VmRSS
        var before = Rss(pid);
        using var stop = new CancellationTokenSource();
        var sampled = before;
        var sampler = Task.Run(async () =>
        {
            while (!stop.IsCancellationRequested)
            {
                sampled = Math.Max(sampled, Rss(pid));
                try { await Task.Delay(20, stop.Token); } catch (OperationCanceledException) { }
            }
        });
        var requests = Enumerable.Range(0, concurrent).Select(async i =>
        {
            var clock = Stopwatch.StartNew();
            using var form = new MultipartFormDataContent
            {
                { new ByteArrayContent(file), "file", $"scan{i}.xyz" },
                { new StringContent("relaxed-scan"), "kind" },
                { new StringContent("big scan"), "species" },
                { new StringContent("wB97X-D/def2-TZVP"), "level" },
                { new StringContent("1,2"), "scanAtoms" },
            };
            using var response = await http.PostAsync("/api/v1/uploads/preview", form);
            var body = await response.Content.ReadAsStringAsync();
            if ((int)response.StatusCode is not (200 or 503))
                Console.WriteLine($"  preview {i}: {(int)response.StatusCode} {body[..Math.Min(body.Length, 300)]}");
            return ((int)response.StatusCode, clock.Elapsed.TotalSeconds);
        }).ToList();
        var results = await Task.WhenAll(requests);
        await stop.CancelAsync();
        await sampler;
        var hwm = Status(pid, "VmHWM:");
        var step = new Step(hwm, sampled, [.. results.Select(r => r.Item1)], [.. results.Select(r => r.Item2)]);
        Console.WriteLine($"{concurrent} preview(s) at once: VmRSS before {before:0} MiB, peak VmHWM {hwm:0} MiB (sampled peak {sampled:0} MiB), after {Rss(pid):0} MiB; "
            + $"answers {string.Join(", ", step.Statuses)}; times {string.Join(", ", step.Seconds.Select(s => s.ToString("0.00", CultureInfo.InvariantCulture)))} s; load average {Machine.LoadAverage()}");
        await Task.Delay(TimeSpan.FromSeconds(3));
        return step;
    }

    private static double Rss(int pid) => Status(pid, "VmRSS:");

    private static double Status(int pid, string field)
    {
        foreach (var line in File.ReadLines($"/proc/{pid}/status"))
            if (line.StartsWith(field, StringComparison.Ordinal))
                return double.Parse(line[field.Length..].Trim().Split(' ')[0], CultureInfo.InvariantCulture) / 1024;
        throw new HarnessException($"/proc/{pid}/status has no {field}");
    }

    private static async Task<string> CreateTokenAsync(string dataDirectory, string userName)
    {
        var config = new ConfigurationBuilder().AddInMemoryCollection(new Dictionary<string, string?> { ["BarrierLedger:DataDirectory"] = dataDirectory }).Build();
        await using var services = new ServiceCollection().AddLedger(config).AddSingleton<AccessTokenService>().BuildServiceProvider();
        string userId;
        await using (var db = await services.GetRequiredService<IDbContextFactory<LedgerDbContext>>().CreateDbContextAsync())
            userId = await db.Users.Where(u => u.UserName == userName).Select(u => u.Id).SingleOrDefaultAsync()
                ?? throw new HarnessException($"No account '{userName}': was the demo loaded on first start?");
        return (await services.GetRequiredService<AccessTokenService>().CreateAsync(userId, "upload memory harness", TokenScopes.Upload, TimeSpan.FromDays(1))).Text;
    }

    /// <summary>An invented relaxed scan: a 30-atom chain stretched frame by frame, each frame with energy= on its comment line.</summary>
    private static int WriteScan(string path, int mib)
    {
        var target = (long)mib * 1048576;
        using var writer = new StreamWriter(path, false, new UTF8Encoding(false));
        var line = new StringBuilder();
        var frames = 0;
        while (writer.BaseStream.Position < target - 4096)
        {
            writer.Write("30\n");
            writer.Write(string.Create(CultureInfo.InvariantCulture, $"energy={-420.123456 + frames * 1e-7:0.000000000} frame={frames}\n"));
            for (var a = 0; a < 30; a++)
            {
                line.Clear();
                var stretch = a == 1 ? 1.5 + frames * 1e-5 : 1.5 * a;
                line.Append(a % 3 == 0 ? "C " : a % 3 == 1 ? "H " : "O ");
                line.Append(string.Create(CultureInfo.InvariantCulture, $"{stretch,16:0.0000000000} {0.37 * Math.Sin(a + frames * 1e-3),16:0.0000000000} {0.41 * Math.Cos(a),16:0.0000000000}\n"));
                writer.Write(line);
            }
            frames++;
            writer.Flush();
        }
        return frames;
    }
}
