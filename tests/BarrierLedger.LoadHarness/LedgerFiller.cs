using System.Diagnostics;
using System.Text;
using BarrierLedger.Demo;
using BarrierLedger.Ledger;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Uploads;
using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.LoadHarness;

/// <summary>
/// Fills a running app's data directory with the large invented ledger (<c>barrierledger demo generate --reactions N</c>):
/// one upload per study folder through the Ledger's <see cref="UploadService"/>, the same workflow the upload page and the
/// demo loader use, as the demo member. SQLite in WAL mode lets the app keep serving while this process writes.
/// </summary>
internal static class LedgerFiller
{
    public static async Task<(int Studies, int Reactions, TimeSpan Took)> FillAsync(string dataDirectory, int reactions, string? bundleFolder, string uploaderUserName)
    {
        var clock = Stopwatch.StartNew();
        var config = new ConfigurationBuilder()
            .AddInMemoryCollection(new Dictionary<string, string?> { ["BarrierLedger:DataDirectory"] = dataDirectory })
            .Build();
        await using var services = new ServiceCollection().AddLedger(config).BuildServiceProvider();
        var factory = services.GetRequiredService<IDbContextFactory<LedgerDbContext>>();
        string uploader;
        await using (var db = await factory.CreateDbContextAsync())
            uploader = await db.Users.Where(u => u.UserName == uploaderUserName).Select(u => u.Id).SingleOrDefaultAsync()
                ?? throw new InvalidOperationException($"No account '{uploaderUserName}' in {dataDirectory}: was the demo loaded on first start?");

        var uploads = services.GetRequiredService<UploadService>();
        int studies = 0, stored = 0;
        foreach (var study in StudyFolders(reactions, bundleFolder))
        {
            var outcome = await uploads.StoreAsync(study.Files, new UploadChoices(), uploader);
            if (!outcome.Stored)
                throw new InvalidOperationException($"{study.Name} was not stored: " + string.Join("; ", outcome.Errors.Select(e => e.ToString())));
            studies++;
            stored += outcome.ReactionIds.Count;
        }
        return (studies, stored, clock.Elapsed);
    }

    /// <summary>The study folders of a bundle written by the command line, or the same files made here by the same generator.</summary>
    private static IEnumerable<(string Name, List<UploadFile> Files)> StudyFolders(int reactions, string? bundleFolder)
    {
        if (bundleFolder is not null)
        {
            foreach (var dir in Directory.EnumerateDirectories(bundleFolder).Order(StringComparer.Ordinal))
                yield return (Path.GetFileName(dir), Directory.EnumerateFiles(dir, "*", SearchOption.AllDirectories).Order(StringComparer.Ordinal)
                    .Select(f => new UploadFile(Path.GetRelativePath(dir, f).Replace('\\', '/'), File.ReadAllBytes(f))).ToList());
            yield break;
        }
        foreach (var group in DemoData.Scale(reactions).GroupBy(f => f.RelativePath.Split('/')[0]).OrderBy(g => g.Key, StringComparer.Ordinal))
            yield return (group.Key, group.Select(f => new UploadFile(f.RelativePath[(group.Key.Length + 1)..], Encoding.UTF8.GetBytes(f.Content))).ToList());
    }
}
