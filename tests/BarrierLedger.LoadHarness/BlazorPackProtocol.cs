using System.Buffers;
using System.Diagnostics.CodeAnalysis;
using Microsoft.AspNetCore.Connections;
using Microsoft.AspNetCore.SignalR;
using Microsoft.AspNetCore.SignalR.Protocol;

namespace BarrierLedger.LoadHarness;

/// <summary>
/// The hub protocol a browser's blazor.web.js speaks to /_blazor: SignalR's MessagePack framing under the name "blazorpack".
/// The server accepts only that name on the Blazor hub, so the standard MessagePack protocol is wrapped and renamed.
/// </summary>
internal sealed class BlazorPackProtocol : IHubProtocol
{
    private readonly MessagePackHubProtocol _inner = new();

    public string Name => "blazorpack";
    public int Version => _inner.Version;
    public TransferFormat TransferFormat => TransferFormat.Binary;
    public bool IsVersionSupported(int version) => _inner.IsVersionSupported(version);

    public bool TryParseMessage(ref ReadOnlySequence<byte> input, IInvocationBinder binder, [NotNullWhen(true)] out HubMessage? message) =>
        _inner.TryParseMessage(ref input, binder, out message);

    public void WriteMessage(HubMessage message, IBufferWriter<byte> output) => _inner.WriteMessage(message, output);
    public ReadOnlyMemory<byte> GetMessageBytes(HubMessage message) => _inner.GetMessageBytes(message);
}
