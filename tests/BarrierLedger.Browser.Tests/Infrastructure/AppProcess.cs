using System.Diagnostics;
using System.Net;
using System.Net.Sockets;
using System.Text;
using System.Text.RegularExpressions;

namespace BarrierLedger.Browser.Tests.Infrastructure;

/// <summary>
/// The real dashboard, started as its own process on a free loopback port with a fresh data directory,
/// exactly as a user starts it (same binary, same configuration keys).
/// </summary>
public sealed partial class AppProcess : IAsyncDisposable
{
    private readonly Process _process;
    private readonly StringBuilder _output = new();
    private readonly TaskCompletionSource<string> _password = new(TaskCreationOptions.RunContinuationsAsynchronously);
    private readonly TaskCompletionSource _listening = new(TaskCreationOptions.RunContinuationsAsynchronously);

    public string BaseUrl { get; }
    public string DataDirectory { get; }

    private AppProcess(IReadOnlyList<string> extraArgs)
    {
        var port = FreePort();
        BaseUrl = $"http://127.0.0.1:{port}";
        DataDirectory = Path.Combine(Path.GetTempPath(), "bl-browser-" + Guid.NewGuid().ToString("N")[..10]);
        Directory.CreateDirectory(DataDirectory);

        var start = new ProcessStartInfo("dotnet")
        {
            WorkingDirectory = DataDirectory,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        start.ArgumentList.Add(RepoPaths.WebDll);
        start.ArgumentList.Add("--urls");
        start.ArgumentList.Add(BaseUrl);
        start.ArgumentList.Add($"--BarrierLedger:DataDirectory={DataDirectory}");
        // Every simulated browser signs in from 127.0.0.1; the per-address sign-in limit is for real clients (RequestLimitTests check it).
        start.ArgumentList.Add("--BarrierLedger:Limits:SignInPostsPerMinute=100000");
        foreach (var a in extraArgs) start.ArgumentList.Add(a);
        start.Environment["ASPNETCORE_ENVIRONMENT"] = "Production";
        _process = new Process { StartInfo = start, EnableRaisingEvents = true };
        _process.OutputDataReceived += (_, e) => OnLine(e.Data);
        _process.ErrorDataReceived += (_, e) => OnLine(e.Data);
    }

    /// <summary>Everything the app printed so far (for failure messages).</summary>
    public string Output { get { lock (_output) return _output.ToString(); } }

    /// <summary>The first admin's one-time password, as printed once on the console.</summary>
    public Task<string> FirstAdminPassword => _password.Task;

    public static async Task<AppProcess> StartAsync(params string[] extraArgs)
    {
        var app = new AppProcess(extraArgs);
        app._process.Start();
        app._process.BeginOutputReadLine();
        app._process.BeginErrorReadLine();
        var ready = await Task.WhenAny(app._listening.Task, Task.Delay(TimeSpan.FromSeconds(90)));
        if (ready != app._listening.Task || app._process.HasExited)
            throw new InvalidOperationException($"The app did not start listening on {app.BaseUrl}. Output:\n{app.Output}");
        return app;
    }

    private void OnLine(string? line)
    {
        if (line is null) return;
        lock (_output) _output.AppendLine(line);
        var m = PasswordLine().Match(line);
        if (m.Success) _password.TrySetResult(m.Groups[1].Value);
        if (line.Contains("Now listening on", StringComparison.Ordinal)) _listening.TrySetResult();
    }

    [GeneratedRegex(@"one-time password: (\S+)")]
    private static partial Regex PasswordLine();

    private static int FreePort()
    {
        using var l = new TcpListener(IPAddress.Loopback, 0);
        l.Start();
        return ((IPEndPoint)l.LocalEndpoint).Port;
    }

    public async ValueTask DisposeAsync()
    {
        try
        {
            if (!_process.HasExited)
            {
                _process.Kill(entireProcessTree: true);
                await _process.WaitForExitAsync().WaitAsync(TimeSpan.FromSeconds(15));
            }
        }
        catch (Exception) { /* already gone */ }
        _process.Dispose();
        try { Directory.Delete(DataDirectory, recursive: true); } catch (IOException) { } catch (UnauthorizedAccessException) { }
    }
}
