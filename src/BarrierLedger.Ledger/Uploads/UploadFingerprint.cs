using System.Security.Cryptography;
using System.Text;
using System.Text.Json;

namespace BarrierLedger.Ledger.Uploads;

/// <summary>
/// What an upload key stands for: SHA-256 (hex) over every file (name and SHA-256 of its bytes, in name order) and the
/// choices other than the key itself. Equal fingerprints mean a retry of the same upload; different ones a different upload.
/// </summary>
public static class UploadFingerprint
{
    public static string Of(IReadOnlyDictionary<string, byte[]> files, UploadChoices choices)
    {
        ArgumentNullException.ThrowIfNull(files);
        ArgumentNullException.ThrowIfNull(choices);
        var text = new StringBuilder();
        foreach (var (name, bytes) in files.OrderBy(f => f.Key, StringComparer.Ordinal))
            text.Append("file\t").Append(name).Append('\t').Append(Convert.ToHexStringLower(SHA256.HashData(bytes))).Append('\n');
        text.Append("choices\t").Append(JsonSerializer.Serialize(choices with { UploadKey = null }));
        return Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(text.ToString())));
    }
}
