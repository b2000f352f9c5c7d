using System.Diagnostics;
using System.Globalization;

namespace BarrierLedger.LoadHarness;

/// <summary>
/// The dashboard started by the harness as its own process (the same binary and configuration keys a person uses) on a free
/// loopback port and a fresh data directory, with the demo study and demo accounts loaded on first start.
/// </summary>
internal sealed class AppInstance : IAsyncDisposable
{
    private readonly Process _process;
    private readonly TaskCompletionSource<string> _listening = new(TaskCreationOptions.RunContinuationsAsynchronously);
    private readonly Queue<string> _tail = new();
    private int _failures;

    /// <summary>The address the app reported once listening (it picks a free loopback port itself).</summary>
    public string BaseUrl { get; private set; } = "";
    public string DataDirectory { get; }
    public int ProcessId => _process.Id;

    /// <summary>Lines the app logged at "fail" or "crit" level since it started.</summary>
    public int LoggedFailures => Volatile.Read(ref _failures);

    private AppInstance(string webDll, string dataDirectory)
    {
        DataDirectory = dataDirectory;
        var start = new ProcessStartInfo("dotnet")
        {
            WorkingDirectory = dataDirectory,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        foreach (var a in new[] { webDll, "--urls", "http://127.0.0.1:0", $"--BarrierLedger:DataDirectory={dataDirectory}",
                     // every simulated user signs in from 127.0.0.1; the per-address limits are for real clients
                     "--BarrierLedger:Limits:SignInPostsPerMinute=100000", "--BarrierLedger:Limits:DownloadsPerMinute=100000" }) start.ArgumentList.Add(a);
        start.Environment["ASPNETCORE_ENVIRONMENT"] = "Production";
        _process = new Process { StartInfo = start, EnableRaisingEvents = true };
        _process.OutputDataReceived += (_, e) => OnLine(e.Data);
        _process.ErrorDataReceived += (_, e) => OnLine(e.Data);
    }

    public static async Task<AppInstance> StartAsync(string webDll, string dataDirectory)
    {
        if (!File.Exists(webDll)) throw new FileNotFoundException("Build the web app first (dotnet build tests/BarrierLedger.LoadHarness builds it).", webDll);
        Directory.CreateDirectory(dataDirectory);
        var app = new AppInstance(webDll, dataDirectory);
        app._process.Start();
        app._process.BeginOutputReadLine();
        app._process.BeginErrorReadLine();
        var first = await Task.WhenAny(app._listening.Task, app._process.WaitForExitAsync(), Task.Delay(TimeSpan.FromMinutes(3)));
        if (first != app._listening.Task)
            throw new InvalidOperationException($"The app did not start listening. Last output:\n{app.Tail()}");
        app.BaseUrl = (await app._listening.Task).TrimEnd('/');
        return app;
    }

    /// <summary>The last lines the app printed (for error messages).</summary>
    public string Tail() { lock (_tail) return string.Join('\n', _tail); }

    private void OnLine(string? line)
    {
        if (line is null) return;
        lock (_tail)
        {
            _tail.Enqueue(line);
            while (_tail.Count > 60) _tail.Dequeue();
        }
        if (line.StartsWith("fail:", StringComparison.Ordinal) || line.StartsWith("crit:", StringComparison.Ordinal)) Interlocked.Increment(ref _failures);
        var at = line.IndexOf("Now listening on: ", StringComparison.Ordinal);
        if (at >= 0) _listening.TrySetResult(line[(at + "Now listening on: ".Length)..].Trim());
    }

    public async ValueTask DisposeAsync()
    {
        if (!_process.HasExited) _process.Kill(entireProcessTree: true);
        using var patience = new CancellationTokenSource(TimeSpan.FromSeconds(20));
        try { await _process.WaitForExitAsync(patience.Token); }
        catch (OperationCanceledException) { Console.Error.WriteLine($"The app (pid {_process.Id}) did not exit within 20 s."); }
        _process.Dispose();
    }
}

/// <summary>
/// The live managed heap of a .NET process, from <c>dotnet-gcdump report -p PID</c> (a .NET diagnostics tool, installed
/// apart: <c>dotnet tool install --tool-path DIR dotnet-gcdump</c>). Taking the dump runs a full garbage collection first, so
/// the figure holds what is reachable, not garbage awaiting collection as the RSS does.
/// </summary>
internal static partial class LiveHeap
{
    public static async Task<double?> ReadMiBAsync(string? gcdumpTool, int pid)
    {
        if (gcdumpTool is null) return null;
        var start = new ProcessStartInfo(gcdumpTool) { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        foreach (var a in new[] { "report", "-p", pid.ToString(CultureInfo.InvariantCulture) }) start.ArgumentList.Add(a);
        using var tool = Process.Start(start)!;
        var output = await tool.StandardOutput.ReadToEndAsync();
        await tool.WaitForExitAsync();
        var m = HeapBytes().Match(output);
        return m.Success ? double.Parse(m.Groups[1].Value.Replace(",", ""), CultureInfo.InvariantCulture) / 1048576 : null;
    }

    [System.Text.RegularExpressions.GeneratedRegex(@"^\s*([\d,]+)\s+GC Heap bytes", System.Text.RegularExpressions.RegexOptions.Multiline)]
    private static partial System.Text.RegularExpressions.Regex HeapBytes();
}

/// <summary>Resident memory of a process on this machine, from the kernel's /proc/PID/status (Linux), in MiB.</summary>
internal static class ProcessMemory
{
    /// <summary>VmRSS (all resident pages) and RssAnon (resident anonymous pages: the managed heap and native allocations).</summary>
    public static (double RssMiB, double AnonMiB)? Read(int pid)
    {
        var path = $"/proc/{pid}/status";
        if (!File.Exists(path)) return null;
        double? rss = null, anon = null;
        foreach (var line in File.ReadLines(path))
        {
            if (line.StartsWith("VmRSS:", StringComparison.Ordinal)) rss = Kib(line);
            else if (line.StartsWith("RssAnon:", StringComparison.Ordinal)) anon = Kib(line);
        }
        return rss is { } r && anon is { } a ? (r / 1024, a / 1024) : null;

        static double Kib(string line) =>
            double.Parse(line.Split(':', 2)[1].Trim().Split(' ')[0], CultureInfo.InvariantCulture);
    }
}
