namespace BarrierLedger.Browser.Tests.Infrastructure;

/// <summary>Locations in the repository, found from the test binaries' folder.</summary>
public static class RepoPaths
{
    public static string Root { get; } = FindRoot();

    /// <summary>The web app built by the same configuration as these tests.</summary>
    public static string WebDll
    {
        get
        {
            var configuration = AppContext.BaseDirectory.Contains($"{Path.DirectorySeparatorChar}Release{Path.DirectorySeparatorChar}") ? "Release" : "Debug";
            var path = Path.Combine(Root, "src", "BarrierLedger.Web", "bin", configuration, "net10.0", "BarrierLedger.Web.dll");
            if (!File.Exists(path)) throw new FileNotFoundException("Build the web app first (dotnet build BarrierLedger.sln).", path);
            return path;
        }
    }

    /// <summary>Screenshots land here so a person can look at them after a run.</summary>
    public static string ScreenshotDirectory
    {
        get
        {
            var dir = Path.Combine(Root, "artifacts", "screenshots");
            Directory.CreateDirectory(dir);
            return dir;
        }
    }

    private static string FindRoot()
    {
        for (var dir = new DirectoryInfo(AppContext.BaseDirectory); dir is not null; dir = dir.Parent)
            if (File.Exists(Path.Combine(dir.FullName, "BarrierLedger.sln"))) return dir.FullName;
        throw new DirectoryNotFoundException("BarrierLedger.sln not found above " + AppContext.BaseDirectory);
    }
}
