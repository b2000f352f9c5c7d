namespace BarrierLedger.Core.Tests.Formats;

/// <summary>Finds files in the repository (samples beside these tests, docs/) from the test's output folder.</summary>
internal static class RepoFiles
{
    private static readonly Lazy<string> s_root = new(() =>
    {
        for (var d = new DirectoryInfo(AppContext.BaseDirectory); d is not null; d = d.Parent)
            if (File.Exists(System.IO.Path.Combine(d.FullName, "BarrierLedger.sln"))) return d.FullName;
        throw new InvalidOperationException("Repository root (BarrierLedger.sln) not found above " + AppContext.BaseDirectory);
    });

    public static string Root => s_root.Value;
    public static string Path(params string[] parts) => System.IO.Path.Combine([Root, .. parts]);
    public static string Sample(string relative) => Path("tests", "BarrierLedger.Core.Tests", "Formats", "Samples", relative);
    public static string SamplesDir => Path("tests", "BarrierLedger.Core.Tests", "Formats", "Samples");
}
