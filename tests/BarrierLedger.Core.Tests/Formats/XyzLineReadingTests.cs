using System.Globalization;
using System.Text;
using BarrierLedger.Core.Formats;
using static BarrierLedger.Core.Tests.Formats.FormatTestHelpers;

namespace BarrierLedger.Core.Tests.Formats;

/// <summary>
/// The XYZ reader takes its lines one at a time from the file's bytes (issue 19, finding 7) instead of decoding the whole file and
/// splitting it. Its lines must be exactly those of splitting the decoded text on \n with one trailing \r dropped (the rule in
/// docs/formats.md), so line numbers and messages stay what they were; the bytes path and the in-memory text path must agree.
/// Invalid UTF-8 becomes U+FFFD as .NET's UTF-8 decoder replaces it (the Unicode Standard's substitution of maximal subparts, §3.9).
/// </summary>
public sealed class XyzLineReadingTests
{
    public static TheoryData<string, int, string[]> LineEdges => new()
    {
        // CRLF line ends, with a byte-order mark: the mark is no character of the count line, and \r belongs to no field.
        { "\uFEFF1\r\n\r\nXx 0 0 0\r\n", 3, ["unknown element 'Xx'"] },
        // Blank lines before a frame are skipped but counted.
        { "\n \n\t\n1\n\nH 0 abc 0\n", 6, ["coordinate y of atom 1", "'abc'"] },
        // A last line of white space only is the end of the file, not an atom line.
        { "2\n\nH 0 0 0\n   ", 1, ["declares 2 atoms", "ends after 1 atom line(s)"] },
        // ...but an empty line followed by the final newline is a line of its own: a blank atom line.
        { "2\r\n\r\nH 0 0 0\r\n\r\n", 4, ["blank line inside frame 1", "atom 2 of 2"] },
        // No newline at the end: the count is the last line.
        { "3", 2, ["file ends after the atom count"] },
        // A line of no-break spaces inside a frame is blank (white space as char.IsWhiteSpace has it).
        { "2\n\nH 0 0 0\n\u00A0\u00A0\n", 4, ["blank line inside frame 1", "atom 2 of 2"] },
        // A stray line after a complete frame, as the next frame's count.
        { "1\r\n\r\nH 0 0 0\r\nH 0 0 1\r\n", 4, ["expected the number of atoms", "'H 0 0 1'", "declared 1 atoms"] },
    };

    [Theory, MemberData(nameof(LineEdges))]
    public void LinesAreThoseOfSplittingOnNewline_WithTheSameLineNumbersAndMessages(string text, int line, string[] fragments)
    {
        SingleError(XyzReader.Read(Utf8(text), "t.xyz"), line, null, fragments);
        SingleError(XyzReader.ReadText(text.TrimStart('\uFEFF'), "t.xyz"), line, null, fragments);
    }

    [Fact]
    public void InvalidUtf8InAnElement_IsQuotedAsTheReplacementCharacter_OnItsLine()
    {
        var bytes = Encoding.ASCII.GetBytes("2\n\nH 0 0 0\n? 0 0 1\n");
        bytes[Array.LastIndexOf(bytes, (byte)'?')] = 0xC3; // a lead byte with no continuation byte
        SingleError(XyzReader.Read(new MemoryStream(bytes), "t.xyz"), 4, null, "unknown element '\uFFFD'");
    }

    [Fact]
    public void ManyFramesAcrossLongAndShortLines_ReadTheSameFromBytesAndFromText()
    {
        // Frames of varied shape: comment lines of 0 to 5,000 characters, CRLF and LF, extra columns, non-ASCII in comments.
        var text = new StringBuilder();
        var random = new Random(7);
        for (var f = 0; f < 300; f++)
        {
            var newline = f % 3 == 0 ? "\r\n" : "\n";
            text.Append("2").Append(newline)
                .Append(CultureInfo.InvariantCulture, $"energy=-1.1{f % 100:00} note=\"{new string('é', random.Next(0, 5000))}\"").Append(newline)
                .Append(CultureInfo.InvariantCulture, $"H 0 0 {f * 0.001:0.000}").Append(newline)
                .Append(CultureInfo.InvariantCulture, $"H 0 0 {0.74 + f * 0.001:0.000} 1.5 2.5").Append(newline);
        }
        var fromBytes = XyzReader.Read(Utf8(text.ToString()), "t.xyz");
        var fromText = XyzReader.ReadText(text.ToString(), "t.xyz");

        Assert.True(fromBytes.Succeeded, string.Join("\n", fromBytes.Issues));
        Assert.Equal(300, fromBytes.Value!.Frames.Length);
        Assert.Equal(fromText.Issues.Select(i => i.ToString()), fromBytes.Issues.Select(i => i.ToString()));
        Assert.Equal(fromText.Value!.Frames.Select(x => (x.FirstLine, x.EnergyHartree, x.Comment, x.Molecule.PositionsAngstrom[1])),
            fromBytes.Value.Frames.Select(x => (x.FirstLine, x.EnergyHartree, x.Comment, x.Molecule.PositionsAngstrom[1])));
        Assert.Equal(1 + 4 * 299, fromBytes.Value.Frames[^1].FirstLine);
        Assert.Contains(fromBytes.Warnings, w => w.Line == 4 && w.Message.Contains("2 column(s) after x y z are ignored"));
    }
}
