namespace BarrierLedger.Core.Formats;

/// <summary>
/// Reads a BarrierLedger bundle: the JSON manifest alone, or a .zip holding <c>bundle.json</c> at its root plus the
/// files it names. For a bare manifest, <c>openFile</c> (if given) opens the named files, e.g. beside the manifest
/// on disk; without it, file references are reported as not found. Zip entries are read from the stream with every
/// size bounded by <see cref="ReaderLimits"/> (the declared sizes in a zip are not trusted), and only the entries the
/// manifest names are read; names that climb out of the archive ("..", absolute paths) are refused.
/// </summary>
public static class BundleReader
{
    /// <summary>
    /// Reads a manifest, or a zip holding one, into a <see cref="Bundle"/> with every problem found (file, line or JSON path,
    /// and what was expected); the value is null when there is any error.
    /// </summary>
    public static ReadResult<Bundle> Read(Stream stream, string fileName, ReaderLimits? limits = null, Func<string, Stream?>? openFile = null)
    {
        limits ??= ReaderLimits.Default;
        var issues = new IssueCollector(fileName, limits.MaxIssues);
        var bytes = TextInput.ReadBytes(stream, limits.MaxBytes, issues);
        if (bytes is null) return issues.Result<Bundle>(null);
        if (FileFormats.HasZipSignature(bytes))
            return BundleZip.Read(bytes, fileName, limits, issues);
        if (fileName.EndsWith(".zip", StringComparison.OrdinalIgnoreCase))
        {
            issues.Error(null, bytes.Length == 0
                ? "the file is empty; expected a zip archive holding bundle.json"
                : "not a zip archive (it does not begin with a zip signature); expected a zip holding bundle.json. Was the copy cut short, or is it another kind of file named .zip?");
            return issues.Result<Bundle>(null);
        }
        var files = new BundleFiles(fileName, limits, openFile, null);
        return issues.Result(BundleManifestReader.Read(bytes, issues, limits, files));
    }
}
