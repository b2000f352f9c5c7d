namespace BarrierLedger.Core.Formats;

/// <summary>
/// Bounds every reader enforces before it allocates, so a mistaken or hostile upload cannot exhaust memory or time.
/// The defaults and the reasons for them are in docs/formats.md.
/// </summary>
/// <param name="MaxBytes">Largest input (and, for a zip, largest total uncompressed size) accepted. Default 128 MiB.</param>
/// <param name="MaxAtoms">Most atoms in one structure. Default 20,000.</param>
/// <param name="MaxFrames">Most frames in a multi-frame XYZ file, or rows in a scan table. Default 100,000.</param>
/// <param name="MaxZipEntries">Most entries in a bundle zip. Default 10,000.</param>
/// <param name="MaxIssues">Issues kept per file before the rest are summarised in one line. Default 200.</param>
public sealed record ReaderLimits(
    long MaxBytes = 128L * 1024 * 1024,
    int MaxAtoms = 20_000,
    int MaxFrames = 100_000,
    int MaxZipEntries = 10_000,
    int MaxIssues = 200)
{
    public static ReaderLimits Default { get; } = new();
}
