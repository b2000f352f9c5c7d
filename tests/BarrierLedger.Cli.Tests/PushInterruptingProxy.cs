using System.Net;
using System.Net.Sockets;
using System.Text;

namespace BarrierLedger.Cli.Tests;

/// <summary>
/// A loopback TCP relay between <c>push</c> and the server. On the first connection that carries a POST it forwards the request
/// headers and only <see cref="BodyBytesBeforeHold"/> bytes of the body, then holds the rest and reports <see cref="Held"/>: the
/// server is then in the middle of reading the upload. The test stops the server at that moment; the relay then drops the
/// connection, as a network would. Later connections are relayed whole (and dropped when the server is not there).
/// </summary>
internal sealed class PushInterruptingProxy : IAsyncDisposable
{
    private readonly TcpListener _listener = new(IPAddress.Loopback, 0);
    private readonly int _serverPort;
    private readonly CancellationTokenSource _stop = new();
    private readonly TaskCompletionSource _held = new(TaskCreationOptions.RunContinuationsAsynchronously);
    private readonly TaskCompletionSource _release = new(TaskCreationOptions.RunContinuationsAsynchronously);
    private int _posts;

    public PushInterruptingProxy(int serverPort)
    {
        _serverPort = serverPort;
        _listener.Start();
        _ = AcceptLoopAsync();
    }

    public const int BodyBytesBeforeHold = 64;
    public string BaseUrl => $"http://127.0.0.1:{((IPEndPoint)_listener.LocalEndpoint).Port}";
    public int Connections;

    /// <summary>Completes when the first upload is held part-way through its body.</summary>
    public Task Held => _held.Task;

    /// <summary>Drops the held connection (call after the server was stopped).</summary>
    public void DropHeldConnection() => _release.TrySetResult();

    private async Task AcceptLoopAsync()
    {
        while (!_stop.IsCancellationRequested)
        {
            TcpClient client;
            try { client = await _listener.AcceptTcpClientAsync(_stop.Token); }
            catch (Exception) { return; }
            Interlocked.Increment(ref Connections);
            _ = RelayAsync(client);
        }
    }

    private async Task RelayAsync(TcpClient client)
    {
        using var _ = client;
        using var server = new TcpClient();
        try
        {
            await server.ConnectAsync(IPAddress.Loopback, _serverPort, _stop.Token);
        }
        catch (Exception)
        {
            return; // server down: the client sees its connection closed
        }
        var fromClient = client.GetStream();
        var toServer = server.GetStream();
        var serverToClient = toServer.CopyToAsync(fromClient, _stop.Token);
        try
        {
            var buffer = new byte[16 * 1024];
            var pending = new MemoryStream();
            var decided = _held.Task.IsCompleted;
            while (true)
            {
                var n = await fromClient.ReadAsync(buffer, _stop.Token);
                if (n == 0) break;
                if (decided)
                {
                    await toServer.WriteAsync(buffer.AsMemory(0, n), _stop.Token);
                    continue;
                }
                pending.Write(buffer, 0, n);
                var text = Encoding.ASCII.GetString(pending.GetBuffer(), 0, (int)pending.Length);
                var headerEnd = text.IndexOf("\r\n\r\n", StringComparison.Ordinal);
                if (headerEnd < 0) continue;
                decided = true;
                if (text.StartsWith("POST ", StringComparison.Ordinal) && Interlocked.CompareExchange(ref _posts, 1, 0) == 0)
                {
                    var upTo = (int)Math.Min(pending.Length, headerEnd + 4 + BodyBytesBeforeHold);
                    await toServer.WriteAsync(pending.GetBuffer().AsMemory(0, upTo), _stop.Token);
                    await toServer.FlushAsync(_stop.Token);
                    _held.TrySetResult();
                    await _release.Task.WaitAsync(_stop.Token);
                    return; // drop both sides: the upload never completes
                }
                await toServer.WriteAsync(pending.GetBuffer().AsMemory(0, (int)pending.Length), _stop.Token);
            }
            await serverToClient;
        }
        catch (Exception)
        {
            // either side went away: close both
        }
    }

    public ValueTask DisposeAsync()
    {
        _stop.Cancel();
        _listener.Stop();
        _release.TrySetResult();
        return ValueTask.CompletedTask;
    }
}
