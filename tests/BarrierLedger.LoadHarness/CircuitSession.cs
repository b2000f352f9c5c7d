using System.Diagnostics;
using System.Globalization;
using System.Net;
using System.Text;
using System.Text.Json.Nodes;
using Microsoft.AspNetCore.Http.Connections;
using Microsoft.AspNetCore.SignalR.Client;
using Microsoft.AspNetCore.SignalR.Protocol;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.LoadHarness;

/// <summary>
/// A real Blazor Server circuit driven the way blazor.web.js drives it: WebSocket to /_blazor with the user's cookies, the
/// "blazorpack" protocol, StartCircuit and then UpdateRootComponents with the component markers of the prerendered page;
/// every render batch is acknowledged (OnRenderCompleted) and every JavaScript call answered (EndInvokeJSFromDotNet) as a
/// browser without a DOM would; navigation is OnLocationChanged, as when a link is followed inside the interactive router.
/// A step is done when a render batch carries the text the finished page shows.
/// </summary>
internal sealed class CircuitSession : IAsyncDisposable
{
    // JSCallResultType as the server sends it: 0 JSON value, 1 JS object reference, 2 stream reference, 3 no result.
    private const int JSObjectReferenceResult = 1;

    private readonly HubConnection _hub;
    private readonly string _baseUrl;
    private readonly object _gate = new();
    private readonly List<(byte[][] Texts, TaskCompletionSource Done)> _waiting = [];
    private long _nextJsObject;
    private string? _serverError;

    private CircuitSession(SiteUser user)
    {
        _baseUrl = user.BaseUrl;
        var builder = new HubConnectionBuilder().WithUrl(_baseUrl + "/_blazor", o =>
        {
            o.Cookies = user.Cookies;
            o.Transports = HttpTransportType.WebSockets;
        });
        builder.Services.AddSingleton<IHubProtocol, BlazorPackProtocol>();
        _hub = builder.Build();
        _hub.ServerTimeout = TimeSpan.FromSeconds(60);

        _hub.On<long, byte[]>("JS.RenderBatch", async (batchId, data) =>
        {
            Interlocked.Increment(ref _renderBatches);
            Seen(data);
            await _hub.SendAsync("OnRenderCompleted", batchId, null);
        });
        // (async handle, function identifier, arguments JSON, result type, target object id, call type)
        _hub.On("JS.BeginInvokeJS", [typeof(long), typeof(string), typeof(string), typeof(int), typeof(long), typeof(int)], async args =>
        {
            Interlocked.Increment(ref _jsCalls);
            var handle = (long)args[0]!;
            if (handle == 0) return; // the server awaits no answer
            var result = (int)args[3]! == JSObjectReferenceResult
                ? $"{{\"__jsObjectId\":{Interlocked.Increment(ref _nextJsObject)}}}"
                : "null";
            await _hub.SendAsync("EndInvokeJSFromDotNet", handle, true, string.Create(CultureInfo.InvariantCulture, $"[{handle},true,{result}]"));
        });
        _hub.On<string>("JS.Error", message => Fail("the server reported: " + message));
        _hub.Closed += ex =>
        {
            if (!_closing) Fail("the circuit's connection closed" + (ex is null ? "" : ": " + ex.Message));
            return Task.CompletedTask;
        };
    }

    private int _renderBatches, _jsCalls;
    private volatile bool _closing;

    public int RenderBatches => Volatile.Read(ref _renderBatches);
    public int JsCalls => Volatile.Read(ref _jsCalls);

    public bool IsConnected => _hub.State == HubConnectionState.Connected && _serverError is null;

    /// <summary>
    /// Connects and starts the circuit for a page the user has just loaded; timed until render batches have shown every one
    /// of <paramref name="allTexts"/> (the page interactive with its data).
    /// </summary>
    public static async Task<(CircuitSession Session, TimeSpan Elapsed)> StartAsync(SiteUser user, RenderedPage page, string[] allTexts, TimeSpan timeout)
    {
        var markers = page.ComponentMarkers;
        if (markers.Count == 0) throw new HarnessException($"{page.Url} has no interactive component markers");
        var session = new CircuitSession(user);
        var clock = Stopwatch.StartNew();
        var done = allTexts.Select(t => session.Expect([t])).ToList();
        await session._hub.StartAsync();
        var secret = await session._hub.InvokeAsync<string?>("StartCircuit", session._baseUrl + "/", page.Url, "[]", page.ApplicationState);
        if (string.IsNullOrEmpty(secret)) throw new HarnessException("the server refused to start a circuit: " + session._serverError);
        var operations = new JsonArray([.. markers.Select((m, i) => (JsonNode)new JsonObject
        {
            ["type"] = "add",
            ["ssrComponentId"] = i + 1,
            ["marker"] = m.DeepClone(),
        })]);
        var batch = new JsonObject { ["batchId"] = 1, ["operations"] = operations };
        await session._hub.SendAsync("UpdateRootComponents", batch.ToJsonString(), page.ApplicationState);
        foreach (var d in done) await session.WaitAsync(d, timeout, "start of the circuit on " + page.Url);
        return (session, clock.Elapsed);
    }

    /// <summary>Follows a link inside the interactive router (or goes back, <paramref name="intercepted"/> false); timed until the new page shows <paramref name="doneTexts"/>.</summary>
    public async Task<TimeSpan> NavigateAsync(string path, string[] doneTexts, bool intercepted, TimeSpan timeout)
    {
        var clock = Stopwatch.StartNew();
        var done = Expect(doneTexts);
        await _hub.SendAsync("OnLocationChanged", _baseUrl + path, null, intercepted);
        await WaitAsync(done, timeout, "navigation to " + path);
        return clock.Elapsed;
    }

    private TaskCompletionSource Expect(string[] texts)
    {
        var done = new TaskCompletionSource(TaskCreationOptions.RunContinuationsAsynchronously);
        lock (_gate) _waiting.Add(([.. texts.Select(Encoding.UTF8.GetBytes)], done));
        return done;
    }

    private async Task WaitAsync(TaskCompletionSource done, TimeSpan timeout, string what)
    {
        var first = await Task.WhenAny(done.Task, Task.Delay(timeout));
        if (first == done.Task) { await done.Task; return; }
        lock (_gate) _waiting.RemoveAll(w => w.Done == done);
        throw new HarnessException($"{what}: not rendered within {timeout.TotalSeconds:0} s" + (_serverError is null ? "" : $" ({_serverError})"));
    }

    /// <summary>Render batches carry every new text of the page in their string table (UTF-8): a step is done when its text arrives.</summary>
    private void Seen(byte[] batch)
    {
        lock (_gate)
            for (var i = _waiting.Count - 1; i >= 0; i--)
                if (_waiting[i].Texts.Any(t => batch.AsSpan().IndexOf(t) >= 0))
                {
                    _waiting[i].Done.TrySetResult();
                    _waiting.RemoveAt(i);
                }
    }

    private void Fail(string why)
    {
        _serverError ??= why;
        lock (_gate)
        {
            foreach (var w in _waiting) w.Done.TrySetException(new HarnessException(why));
            _waiting.Clear();
        }
    }

    public async ValueTask DisposeAsync()
    {
        _closing = true;
        try { await _hub.StopAsync(); } catch (Exception ex) when (ex is WebException or HttpRequestException or OperationCanceledException) { }
        await _hub.DisposeAsync();
    }
}
