using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Support;
using BarrierLedger.Ledger.Uploads;

namespace BarrierLedger.Ledger.Tests.Export;

/// <summary>A temporary ledger holding the committed demo study (seed-data/), stored through the real upload service.</summary>
internal static class DemoLedger
{
    /// <summary>Input formats only (a folder's README or notes are not part of the upload).</summary>
    private static bool IsDataFile(string path) => Path.GetExtension(path).ToLowerInvariant() is ".json" or ".xyz" or ".extxyz" or ".csv" or ".zip";

    public static string DemoFolder
    {
        get
        {
            for (var d = new DirectoryInfo(AppContext.BaseDirectory); d is not null; d = d.Parent)
                if (File.Exists(Path.Combine(d.FullName, "seed-data", "bundle.json"))) return Path.Combine(d.FullName, "seed-data");
            throw new DirectoryNotFoundException("seed-data/bundle.json not found above the test folder.");
        }
    }

    public static IReadOnlyList<UploadFile> Files(string folder) =>
        [.. Directory.EnumerateFiles(folder, "*", SearchOption.AllDirectories).Where(IsDataFile).Order(StringComparer.Ordinal)
            .Select(p => new UploadFile(Path.GetRelativePath(folder, p).Replace('\\', '/'), File.ReadAllBytes(p)))];

    public static Task<(TempLedger Ledger, int StudyId)> CreateAsync(string? dir = null) => CreateAsync(StoreProvider.Sqlite, dir);

    public static async Task<(TempLedger Ledger, int StudyId)> CreateAsync(StoreProvider store, string? dir = null)
    {
        var ledger = await TempLedger.CreateAsync(store, dir);
        var outcome = await ledger.Get<UploadService>().StoreAsync(Files(DemoFolder), new UploadChoices(), "demo-user");
        if (!outcome.Stored || outcome.StudyId is null)
            throw new InvalidOperationException("The demo study was not stored: " + string.Join("; ", outcome.Issues.Select(i => i.ToString())));
        return (ledger, outcome.StudyId.Value);
    }
}
