using System.IO.Compression;

namespace BarrierLedger.Core.Formats;

/// <summary>Opens the files a manifest names, from a zip or through a callback, with the shared byte budget.</summary>
internal sealed class BundleFiles(string bundleName, ReaderLimits limits, Func<string, Stream?>? open, Dictionary<string, ZipArchiveEntry>? entries)
{
    /// <summary>True when <paramref name="path"/> is a safe relative path: forward slashes, no "..", not absolute, no drive letter, no backslash.</summary>
    public static bool IsSafeRelativePath(string path) =>
        path.Length > 0 && path.Length <= 512 && !path.StartsWith('/') && !path.Contains('\\') && !path.Contains(':')
        && !path.Contains('\0') && path.Split('/').All(part => part.Length > 0 && part != ".." && part != ".");

    private long _budget = limits.MaxBytes;
    public Dictionary<string, byte[]> Read { get; } = new(StringComparer.Ordinal);

    public string DisplayName(string path) => entries is null ? path : $"{bundleName}!{path}";

    public byte[]? ReadEntry(ZipArchiveEntry entry, IssueCollector issues)
    {
        using var s = entry.Open();
        var sub = new IssueCollector($"{bundleName}!{entry.FullName}", limits.MaxIssues);
        var bytes = TextInput.ReadBytes(s, _budget, sub);
        if (bytes is null)
        {
            issues.Error(null, $"zip entry '{entry.FullName}' expands beyond the remaining budget of {TextInput.FormatBytes(_budget)} " +
                               $"(total uncompressed limit {TextInput.FormatBytes(limits.MaxBytes)}): refused as a possible zip bomb");
            return null;
        }
        _budget -= bytes.Length;
        return bytes;
    }

    /// <summary>The file's bytes, or null with an error at <paramref name="jsonPath"/>.</summary>
    public byte[]? Get(string path, string jsonPath, IssueCollector issues)
    {
        if (Read.TryGetValue(path, out var cached)) return cached;
        if (!IsSafeRelativePath(path))
        {
            issues.ErrorAt(jsonPath, $"file path {TextInput.Quote(path, 80)} is not allowed; expected a path relative to the bundle, with '/' and without '..'");
            return null;
        }
        byte[]? bytes = null;
        if (entries is not null)
        {
            if (!entries.TryGetValue(path, out var entry))
            {
                issues.ErrorAt(jsonPath, $"file '{path}' is not in the zip");
                return null;
            }
            bytes = ReadEntry(entry, issues);
        }
        else if (open is not null)
        {
            Stream? s;
            try { s = open(path); }
            catch (Exception ex) when (ex is IOException or UnauthorizedAccessException) { s = null; }
            if (s is null) { issues.ErrorAt(jsonPath, $"file '{path}' not found next to the bundle"); return null; }
            using (s)
            {
                var sub = new IssueCollector(path, limits.MaxIssues);
                bytes = TextInput.ReadBytes(s, _budget, sub);
                if (bytes is null) { issues.ErrorAt(jsonPath, $"file '{path}' is larger than the remaining budget of {TextInput.FormatBytes(_budget)}"); return null; }
                _budget -= bytes.Length;
            }
        }
        else
        {
            issues.ErrorAt(jsonPath, $"file '{path}' cannot be opened: a bare manifest was given; upload the bundle as a .zip with its files");
            return null;
        }
        if (bytes is not null) Read[path] = bytes;
        return bytes;
    }
}
