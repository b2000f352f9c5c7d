using System.Text;

namespace BarrierLedger.Core.Formats;

/// <summary>Bounded reading of a stream into bytes or text, shared by every reader.</summary>
internal static class TextInput
{
    /// <summary>Reads at most <paramref name="maxBytes"/> bytes; null (with an error) when the stream holds more or cannot be read.</summary>
    public static byte[]? ReadBytes(Stream stream, long maxBytes, IssueCollector issues)
    {
        ArgumentNullException.ThrowIfNull(stream);
        try
        {
            // A whole in-memory file whose buffer the caller exposed: read it where it is instead of copying it.
            if (stream is MemoryStream { Position: 0 } whole && whole.TryGetBuffer(out var all) && all.Offset == 0 && all.Count == all.Array!.Length)
            {
                if (all.Count > maxBytes)
                {
                    return TooLarge(issues, maxBytes);
                }
                return all.Array;
            }
            if (stream.CanSeek)
            {
                // Known length: check it before reading and read into an array of exactly that size.
                var remaining = stream.Length - stream.Position;
                if (remaining > maxBytes)
                {
                    return TooLarge(issues, maxBytes);
                }
                var exact = new byte[remaining];
                stream.ReadExactly(exact);
                return exact;
            }
            using var buffer = new MemoryStream();
            var chunk = new byte[16384];
            long total = 0;
            int n;
            while ((n = stream.Read(chunk, 0, chunk.Length)) > 0)
            {
                total += n;
                if (total > maxBytes)
                {
                    return TooLarge(issues, maxBytes);
                }
                buffer.Write(chunk, 0, n);
            }
            return buffer.ToArray();
        }
        catch (IOException ex)
        {
            issues.Error(null, $"could not read the file: {ex.Message}");
            return null;
        }
        catch (InvalidDataException ex)
        {
            issues.Error(null, $"could not read the file (corrupt compressed data): {ex.Message}");
            return null;
        }
    }

    private static byte[]? TooLarge(IssueCollector issues, long maxBytes)
    {
        issues.Error(null, $"file is larger than the limit of {FormatBytes(maxBytes)}; raise ReaderLimits.MaxBytes if it really is this large");
        return null;
    }

    /// <summary>
    /// Refuses binary content (a NUL byte) with an error naming its line; otherwise true, with <paramref name="start"/> past a
    /// UTF-8 byte-order mark.
    /// </summary>
    public static bool CheckText(byte[] bytes, IssueCollector issues, out int start)
    {
        var span = bytes.AsSpan();
        start = 0;
        var nul = span.IndexOf((byte)0);
        if (nul >= 0)
        {
            var line = 1 + span[..nul].Count((byte)'\n');
            issues.Error(line, "found a NUL byte: this is a binary file, expected plain text (UTF-8)");
            return false;
        }
        if (span.StartsWith(Encoding.UTF8.Preamble)) start = Encoding.UTF8.Preamble.Length;
        return true;
    }

    /// <summary>Decodes UTF-8 (BOM allowed); refuses binary content (NUL bytes) with an error.</summary>
    public static string? Decode(byte[] bytes, IssueCollector issues) =>
        CheckText(bytes, issues, out var start) ? Encoding.UTF8.GetString(bytes, start, bytes.Length - start) : null;

    public static string? ReadText(Stream stream, ReaderLimits limits, IssueCollector issues)
    {
        var bytes = ReadBytes(stream, limits.MaxBytes, issues);
        return bytes is null ? null : Decode(bytes, issues);
    }

    /// <summary>Splits into lines on \n, dropping a trailing \r from each.</summary>
    public static string[] SplitLines(string text)
    {
        var lines = text.Split('\n');
        for (var i = 0; i < lines.Length; i++)
            if (lines[i].EndsWith('\r')) lines[i] = lines[i][..^1];
        return lines;
    }

    public static string FormatBytes(long bytes) =>
        bytes >= 1024 * 1024 ? $"{bytes / (1024.0 * 1024.0):0.#} MiB" : bytes >= 1024 ? $"{bytes / 1024.0:0.#} KiB" : $"{bytes} bytes";

    /// <summary>Shortens text for quoting in a message.</summary>
    public static string Quote(string text, int max = 40)
    {
        var t = text.Length > max ? text[..max] + "…" : text;
        return "'" + t.Replace("\t", "\\t") + "'";
    }
}
