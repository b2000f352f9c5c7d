using System.IO.Compression;

namespace BarrierLedger.Core.Formats;

/// <summary>
/// Zip safety for a bundle archive: a bounded number of entries, no entry name that climbs out of the archive, the manifest
/// at the root, and every entry read within the shared uncompressed budget (the sizes a zip declares are not trusted).
/// </summary>
internal static class BundleZip
{
    public static ReadResult<Bundle> Read(byte[] bytes, string fileName, ReaderLimits limits, IssueCollector issues)
    {
        try
        {
            using var zip = new ZipArchive(new MemoryStream(bytes, writable: false), ZipArchiveMode.Read);
            if (zip.Entries.Count > limits.MaxZipEntries)
            {
                issues.Error(null, $"zip has {zip.Entries.Count} entries, more than the limit of {limits.MaxZipEntries} (ReaderLimits.MaxZipEntries)");
                return issues.Result<Bundle>(null);
            }
            var entries = new Dictionary<string, ZipArchiveEntry>(StringComparer.Ordinal);
            foreach (var e in zip.Entries)
            {
                if (e.FullName.EndsWith('/')) continue;
                if (!BundleFiles.IsSafeRelativePath(e.FullName))
                {
                    issues.Error(null, $"zip entry {TextInput.Quote(e.FullName, 80)} has an unsafe path (absolute, '..', '\\' or ':'); expected paths relative to the bundle root");
                    continue;
                }
                entries[e.FullName] = e;
            }
            if (issues.HasErrors) return issues.Result<Bundle>(null);
            if (!entries.TryGetValue(BundleSchema.ManifestEntryName, out var manifestEntry))
            {
                var roots = entries.Keys.Where(k => !k.Contains('/')).Take(10);
                issues.Error(null, $"zip has no '{BundleSchema.ManifestEntryName}' at its root; found: {string.Join(", ", roots.DefaultIfEmpty("(no files)"))}");
                return issues.Result<Bundle>(null);
            }
            var files = new BundleFiles(fileName, limits, null, entries);
            var manifestBytes = files.ReadEntry(manifestEntry, issues);
            if (manifestBytes is null) return issues.Result<Bundle>(null);
            var manifestIssues = new IssueCollector($"{fileName}!{BundleSchema.ManifestEntryName}", limits.MaxIssues);
            var bundle = BundleManifestReader.Read(manifestBytes, manifestIssues, limits, files);
            issues.AddRange(manifestIssues.ToList());
            return issues.Result(bundle);
        }
        catch (InvalidDataException ex)
        {
            issues.Error(null, $"not a readable zip archive: {ex.Message}");
            return issues.Result<Bundle>(null);
        }
    }
}
