using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Cli;

/// <summary>A file read from disk with whichever reader its format needs.</summary>
public sealed record LoadedInput(string Path, FileFormat Format, object? Value, IReadOnlyList<ReadIssue> Issues)
{
    public bool Succeeded => Value is not null;
}

/// <summary>Opens a path, detects its format and reads it. Missing files and unknown formats become issues, never exceptions.</summary>
public static class InputLoader
{
    public static LoadedInput Load(string path, ReaderLimits? limits = null, FileFormat? forced = null, EnergyUnit? scanUnit = null)
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
            FileFormat.CsvScan => From(path, format, ScanTableReader.Read(stream, name, scanUnit, limits)),
            FileFormat.QcSchema => From(path, format, QcSchemaReader.Read(stream, name, limits)),
            FileFormat.Bundle or FileFormat.BundleZip => From(path, format, BundleReader.Read(stream, name, limits, OpenBeside(path))),
            _ => Fail(path, format,
                $"cannot tell the format of '{name}': expected .xyz or .extxyz, .csv/.tsv/.txt scan table, QCSchema .json, bundle .json or .zip"),
        };
    }

    /// <summary>Opens files a bare manifest names, relative to the manifest's folder (paths already checked safe by the reader).</summary>
    private static Func<string, Stream?> OpenBeside(string manifestPath)
    {
        var dir = System.IO.Path.GetDirectoryName(System.IO.Path.GetFullPath(manifestPath))!;
        return relative =>
        {
            var full = System.IO.Path.GetFullPath(System.IO.Path.Combine(dir, relative));
            if (!full.StartsWith(dir + System.IO.Path.DirectorySeparatorChar, StringComparison.Ordinal)) return null;
            return File.Exists(full) ? File.OpenRead(full) : null;
        };
    }

    private static LoadedInput From<T>(string path, FileFormat format, ReadResult<T> r) where T : class =>
        new(path, format, r.Value, r.Issues);

    private static LoadedInput Fail(string path, FileFormat format, string message) =>
        new(path, format, null, [new ReadIssue(IssueSeverity.Error, System.IO.Path.GetFileName(path), null, null, message)]);
}
