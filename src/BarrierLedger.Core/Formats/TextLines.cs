using System.Text;

namespace BarrierLedger.Core.Formats;

/// <summary>
/// The lines of a text taken one at a time, exactly as <c>text.Split('\n')</c> gives them with one trailing \r dropped from each
/// (so a text that ends with \n has a last, empty line), without holding the decoded text or all its lines at once: UTF-8 bytes
/// are decoded a line at a time into one reused buffer. A line taken is valid until the next call.
/// </summary>
internal sealed class TextLines
{
    private readonly byte[]? _bytes;
    private readonly string? _text;
    private readonly int _end;
    private int _next;
    private bool _done;
    private char[] _chars = new char[256];

    /// <summary>UTF-8 text (already checked by <see cref="TextInput.CheckText"/>) from <paramref name="start"/> on (after a BOM).</summary>
    public TextLines(byte[] bytes, int start)
    {
        _bytes = bytes;
        _next = start;
        _end = bytes.Length;
    }

    public TextLines(string text)
    {
        _text = text;
        _end = text.Length;
    }

    /// <summary>The 1-based number of the line last taken (0 before the first).</summary>
    public int Number { get; private set; }

    /// <summary>Whether another line can be taken.</summary>
    public bool HasMore => !_done;

    public bool TryTake(out ReadOnlySpan<char> line)
    {
        if (_done)
        {
            line = default;
            return false;
        }
        var newline = NewlineFrom(_next);
        var stop = newline < 0 ? _end : newline;
        line = Decode(_next, stop);
        if (newline < 0) _done = true;
        else _next = newline + 1;
        Number++;
        return true;
    }

    /// <summary>Whether the next line is the text's last and holds only white space (a blank tail, not another line).</summary>
    public bool NextIsLastAndBlank() => !_done && NewlineFrom(_next) < 0 && Decode(_next, _end).IsWhiteSpace();

    private int NewlineFrom(int from)
    {
        var at = _bytes is not null ? _bytes.AsSpan(from, _end - from).IndexOf((byte)'\n') : _text!.AsSpan(from, _end - from).IndexOf('\n');
        return at < 0 ? -1 : from + at;
    }

    private ReadOnlySpan<char> Decode(int from, int to)
    {
        ReadOnlySpan<char> s;
        if (_bytes is null)
        {
            s = _text.AsSpan(from, to - from);
        }
        else
        {
            // A \n byte never occurs inside a UTF-8 sequence, so decoding line by line gives the characters of decoding the whole.
            var raw = _bytes.AsSpan(from, to - from);
            var most = Encoding.UTF8.GetMaxCharCount(raw.Length);
            if (_chars.Length < most) _chars = new char[Math.Max(most, 2 * _chars.Length)];
            s = _chars.AsSpan(0, Encoding.UTF8.GetChars(raw, _chars));
        }
        return s.Length > 0 && s[^1] == '\r' ? s[..^1] : s;
    }
}
