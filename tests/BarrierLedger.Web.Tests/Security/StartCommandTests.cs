using System.Text.Json;

namespace BarrierLedger.Web.Tests.Security;

/// <summary>
/// Issue 19, finding 4: the README's start command (<c>dotnet run --project src/BarrierLedger.Web</c>, which applies the
/// project's launch profile) runs in the Production environment, so API errors carry no stack traces and no developer page.
/// </summary>
public sealed class StartCommandTests
{
    private static string Repo()
    {
        for (var d = new DirectoryInfo(AppContext.BaseDirectory); d is not null; d = d.Parent)
            if (File.Exists(Path.Combine(d.FullName, "BarrierLedger.sln"))) return d.FullName;
        throw new InvalidOperationException("BarrierLedger.sln not found above the test binaries.");
    }

    [Fact]
    public void ReadmeStartCommand_UsesALaunchProfileInTheProductionEnvironment()
    {
        var repo = Repo();
        Assert.Contains("dotnet run --project src/BarrierLedger.Web\n", File.ReadAllText(Path.Combine(repo, "README.md")).Replace("\r", ""));

        var launch = JsonDocument.Parse(File.ReadAllText(Path.Combine(repo, "src/BarrierLedger.Web/Properties/launchSettings.json"))).RootElement;
        // dotnet run picks the first profile whose commandName is "Project".
        var profile = launch.GetProperty("profiles").EnumerateObject().First(p => p.Value.GetProperty("commandName").GetString() == "Project").Value;
        var environment = profile.TryGetProperty("environmentVariables", out var vars) && vars.TryGetProperty("ASPNETCORE_ENVIRONMENT", out var e)
            ? e.GetString() : "Production"; // unset means Production
        Assert.Equal("Production", environment);
        Assert.False(profile.TryGetProperty("environmentVariables", out var v2) && v2.TryGetProperty("DOTNET_ENVIRONMENT", out _));
    }
}
