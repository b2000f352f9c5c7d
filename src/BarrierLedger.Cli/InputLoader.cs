using BarrierLedger.Core.Formats;

namespace BarrierLedger.Cli;

/// <summary>A file read from disk with whichever reader its format needs.</summary>
public sealed record LoadedInput(string Path, FileFormat Format, object? Value, IReadOnlyList<ReadIssue> Issues)
{
    public bool Succeeded => Value is not null;
}

/// <summary>Opens a path, detects its format and reads it. Missing files and unknown formats become issues, never exceptions.</summary>
public static class InputLoader
{
    public static LoadedInput Load(string path, ReaderLimits? limits = null, FileFormat? forced = null)
    {
        var name = System.IO.Path.GetFileName(path);
        if (!File.Exists(path))
            return Fail(path, FileFormat.Unknown, $"file not found: {path}");
        byte[] head;
        try
        {
            using var probe = File.OpenRead(path);
            head = new byte[Math.Min(4096, probe.Length)];
            probe.ReadExactly(head);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            return Fail(path, FileFormat.Unknown, $"cannot open: {ex.Message}");
        }
        var format = forced ?? FileFormats.Detect(name, head);
        using var stream = File.OpenRead(path);
        return format switch
        {
            FileFormat.Xyz => From(path, format, XyzReader.Read(stream, name, limits)),
            _ => Fail(path, format,
                $"cannot tell the format of '{name}': expected .xyz or .extxyz, .csv/.tsv/.txt scan table, QCSchema .json, bundle .json or .zip"),
        };
    }

    private static LoadedInput From<T>(string path, FileFormat format, ReadResult<T> r) where T : class =>
        new(path, format, r.Value, r.Issues);

    private static LoadedInput Fail(string path, FileFormat format, string message) =>
        new(path, format, null, [new ReadIssue(IssueSeverity.Error, System.IO.Path.GetFileName(path), null, null, message)]);
}
