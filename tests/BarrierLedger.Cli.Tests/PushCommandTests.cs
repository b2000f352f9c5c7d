using System.Text;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Tests.Conformers;

namespace BarrierLedger.Cli.Tests;

/// <summary><c>barrierledger push</c> against the real app on a loopback port (its own process, fresh data directory).</summary>
public sealed class PushCommandTests
{
    private const string Level = "MODEL-A/basis-1";

    /// <summary>Water, geometry close to the textbook 0.957 Å / 104.5° (from memory), invented energy.</summary>
    private static string WaterXyz(string energy = "-76.4189") =>
        $"3\nenergy={energy}\nO 0.000000 0.000000 0.117300\nH 0.000000 0.757200 -0.469200\nH 0.000000 -0.757200 -0.469200\n";

    private static string[] Args(string server, string tokenFile, params string[] files) =>
        ["push", "--server", server, "--token-file", tokenFile, "--study", "Push study", "--species", "H2O", "--kind", "Minimum",
         "--level", Level, "--charge", "0", "--multiplicity", "1", "--retries", "8", "--retry-delay", "0.5", .. files];

    [Fact]
    public async Task Push_SameFileTwice_IsStoredOnce_AndTheSecondPushSaysSo()
    {
        await using var server = new PushTestServer();
        await server.StartAsync();
        using var dir = new TempDir();
        var tokenFile = dir.Write("token", await server.CreateUploadTokenAsync("mira") + "\n");
        var water = dir.Write("water.xyz", WaterXyz());
        var other = dir.Write("water-b.xyz", WaterXyz("-76.4200"));

        var first = await Task.Run(() => CliRunner.Run(Args(server.BaseUrl, tokenFile, water, other)));
        Assert.True(first.Code == 0, first.Out + first.Err);
        Assert.Contains("[1/2] water.xyz", first.Out);
        Assert.Contains("[2/2] water-b.xyz", first.Out);
        Assert.Equal(2, first.Out.Split('\n').Count(l => l.Contains("stored: upload")));
        Assert.Equal((2, 2, 2), await server.CountsAsync());

        var second = await Task.Run(() => CliRunner.Run(Args(server.BaseUrl, tokenFile, water)));
        Assert.True(second.Code == 0, second.Out + second.Err);
        Assert.Contains("already stored", second.Out);
        Assert.Contains("nothing new was stored", second.Out);
        Assert.Equal((2, 2, 2), await server.CountsAsync());
    }

    [Fact]
    public async Task Push_ServerStoppedMidUpload_RetriesWithBackOff_AndStoresOnceAfterRestart()
    {
        await using var server = new PushTestServer();
        await server.StartAsync();
        using var dir = new TempDir();
        var tokenFile = dir.Write("token", await server.CreateUploadTokenAsync("mira"));
        var water = dir.Write("water.xyz", WaterXyz());
        await using var proxy = new PushInterruptingProxy(server.Port);

        var push = Task.Run(() => CliRunner.Run(Args(proxy.BaseUrl, tokenFile, water)));
        await proxy.Held.WaitAsync(TimeSpan.FromSeconds(60));
        // The server has the request headers and the first bytes of the body: stop it now, then lose the connection.
        await server.KillAsync();
        proxy.DropHeldConnection();
        Assert.Equal((0, 0, 0), await server.CountsAsync());

        await server.StartAsync(); // same port, same data directory
        var result = await push.WaitAsync(TimeSpan.FromSeconds(240));

        Assert.True(result.Code == 0, $"exit {result.Code}\n{result.Out}\n{result.Err}\nserver:\n{server.Output}");
        Assert.Contains("retry 1 of 8", result.Out);
        Assert.Contains("stored: upload", result.Out);
        Assert.True(proxy.Connections >= 2, "the upload was sent again on a new connection");
        Assert.Equal((1, 1, 1), await server.CountsAsync());

        var again = await Task.Run(() => CliRunner.Run(Args(server.BaseUrl, tokenFile, water)));
        Assert.Equal(0, again.Code);
        Assert.Contains("already stored", again.Out);
        Assert.Equal((1, 1, 1), await server.CountsAsync());
    }

    [Fact]
    public async Task Push_RejectedFile_ListsItsErrors_Exit2_RefusedToken_Exit4_NoToken_UsageError()
    {
        await using var server = new PushTestServer();
        await server.StartAsync();
        using var dir = new TempDir();
        var tokenFile = dir.Write("token", await server.CreateUploadTokenAsync("mira"));
        var broken = dir.Write("broken.xyz", "3\nenergy=-76.4\nO 0 0 0\nH 0 0.75 -0.47\n");

        var rejected = await Task.Run(() => CliRunner.Run(Args(server.BaseUrl, tokenFile, broken)));
        Assert.Equal(ExitCodes.Unreadable, rejected.Code);
        Assert.Contains("broken.xyz", rejected.Err);
        Assert.Contains("error", rejected.Err);

        var badToken = dir.Write("bad-token", "bltk_aaaaaaaaaa_" + new string('B', 40));
        var refused = await Task.Run(() => CliRunner.Run(Args(server.BaseUrl, badToken, dir.Write("w.xyz", WaterXyz()))));
        Assert.Equal(4, refused.Code);
        Assert.Contains("401", refused.Err);

        var saved = Environment.GetEnvironmentVariable("BARRIERLEDGER_TOKEN");
        Assert.True(string.IsNullOrEmpty(saved), "the test expects no token in the environment");
        var noToken = CliRunner.Run("push", "--server", server.BaseUrl, dir.Write("x.xyz", WaterXyz()));
        Assert.Equal(ExitCodes.UsageError, noToken.Code);
        Assert.Contains("BARRIERLEDGER_TOKEN", noToken.Err);
        Assert.Equal((0, 0, 0), await server.CountsAsync());
    }

    /// <summary>
    /// <c>--conformer-per-file</c> (issue 21, item 1): each file is stored as the conformer named after it, and push prints the
    /// server's conformer notes. Butane from internal coordinates (FlexibleMolecules; bond lengths and angles from memory); the
    /// second file is the first turned 90° about z and moved, so its heavy-atom RMSD to it is 0 (rigid motion, analytic) and it is
    /// a duplicate. Energies invented.
    /// </summary>
    [Fact]
    public async Task Push_ConformerPerFile_StoresEachFileAsItsOwnConformer_AndPrintsTheDuplicate()
    {
        await using var server = new PushTestServer();
        await server.StartAsync();
        using var dir = new TempDir();
        var tokenFile = dir.Write("token", await server.CreateUploadTokenAsync("mira"));
        var anti = FlexibleMolecules.Butane(180);
        var moved = new Molecule(anti.Elements,
            [.. anti.PositionsAngstrom.Select(p => new Vec3(-p.Y + 3.0, p.X - 1.0, p.Z + 2.0))], anti.Charge, anti.Multiplicity);
        var first = dir.Write("anti.xyz", XyzWriter.ToExtendedText(anti, -158.4000));
        var second = dir.Write("anti-again.xyz", XyzWriter.ToExtendedText(moved, -158.4000));

        var run = await Task.Run(() => CliRunner.Run(
            "push", "--server", server.BaseUrl, "--token-file", tokenFile, "--study", "Push conformers", "--species", "butane", "--kind", "Minimum",
            "--level", Level, "--charge", "0", "--multiplicity", "1", "--conformer-per-file", "--together", first, second));

        Assert.True(run.Code == 0, run.Out + run.Err);
        Assert.Contains("conformers: species butane: conformer anti-again duplicates anti (RMSD 0.000 Å", run.Out);
        Assert.Equal(["anti", "anti-again"], await server.ConformersAsync());
    }

    [Fact]
    public async Task Push_PastTheStorageQuota_Exit2_SayingQuotaUsageAndSize_AndStoresNothing()
    {
        await using var server = new PushTestServer();
        await server.StartAsync("--BarrierLedger:Uploads:UserQuotaMiB=1");
        using var dir = new TempDir();
        var tokenFile = dir.Write("token", await server.CreateUploadTokenAsync("mira") + "\n");
        // Padded with a blank tail to 600 KiB and 500 KiB: together past a 1 MiB quota (sizes counted by the test, not the store).
        var first = dir.Write("water.xyz", WaterXyz().PadRight(600 * 1024 - 1) + "\n");
        var second = dir.Write("water-b.xyz", WaterXyz("-76.4200").PadRight(500 * 1024 - 1) + "\n");

        var stored = await Task.Run(() => CliRunner.Run(Args(server.BaseUrl, tokenFile, first)));
        Assert.True(stored.Code == 0, stored.Out + stored.Err);
        var before = await server.CountsAsync();

        var refused = await Task.Run(() => CliRunner.Run(Args(server.BaseUrl, tokenFile, second)));

        Assert.Equal(ExitCodes.Unreadable, refused.Code);
        Assert.Contains("413", refused.Err);
        Assert.Contains("your quota is 1 MiB, you have stored 600 KiB, and this upload would add 500 KiB", refused.Err);
        Assert.DoesNotContain("retry", refused.Out);
        Assert.Equal(before, await server.CountsAsync());
    }
}
