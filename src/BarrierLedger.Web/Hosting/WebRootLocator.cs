namespace BarrierLedger.Web.Hosting;

/// <summary>
/// Finds the repository's top-level <c>wwwroot/</c>: the one web root of the app. Looks upward from the current
/// directory and from the app's base directory (the build copies it beside the binaries).
/// </summary>
public static class WebRootLocator
{
    public static string Find()
    {
        foreach (var start in new[] { AppContext.BaseDirectory, Directory.GetCurrentDirectory() })
        {
            for (var dir = new DirectoryInfo(start); dir is not null; dir = dir.Parent)
            {
                var candidate = Path.Combine(dir.FullName, "wwwroot");
                if (File.Exists(Path.Combine(candidate, "app.css"))) return candidate;
            }
        }
        return Path.Combine(AppContext.BaseDirectory, "wwwroot");
    }
}
