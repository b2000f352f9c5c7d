namespace BarrierLedger.LoadHarness;

/// <summary>Ids of the site's pages found by reading its own ledger pages, and the render times measured on them.</summary>
internal sealed record SitePages(IReadOnlyList<int> StudyIds, IReadOnlyList<int> ReactionIds, double LedgerP95, double ReactionP95);

/// <summary>
/// Server render time of the ledger and reaction pages: one signed-in user, one request at a time, each page loaded
/// <c>--loads</c> times after five untimed warm-up loads, rotating over studies and reactions.
/// </summary>
internal static class RenderTimes
{
    public const string LedgerDone = "reactions shown";
    public const string ReactionDone = "Energy profile";

    public static async Task<SitePages> RunAsync(string url, HarnessOptions options)
    {
        using var user = new SiteUser(url);
        await user.SignInAsync(options.Reviewer.Name, options.Reviewer.Password);
        var home = await user.GetAsync("/", LedgerDone);
        var studies = SiteUser.Studies(home.Html).Where(s => s.Reactions > 0)
            .OrderByDescending(s => s.Reactions).ThenBy(s => s.Id).Select(s => s.Id).ToList();
        if (studies.Count == 0) throw new HarnessException($"{url} lists no study with reactions.");
        var reactions = new List<int>();
        foreach (var s in studies.Take(8))
            reactions.AddRange(SiteUser.ReactionLinks((await user.GetAsync($"/studies/{s}", LedgerDone)).Html));
        if (reactions.Count == 0) throw new HarnessException($"{url}: the ledger pages link no reaction.");

        var ledger = new List<double>();
        var reaction = new List<double>();
        long ledgerBytes = 0, reactionBytes = 0;
        // Alternating, so that both pages meet the same moments of a shared machine's load.
        for (var i = -5; i < options.Loads; i++)
        {
            var page = await user.GetAsync($"/studies/{studies[(i + 5) % studies.Count]}", LedgerDone);
            if (i >= 0) { ledger.Add(page.Elapsed.TotalMilliseconds); ledgerBytes += page.Html.Length; }
            page = await user.GetAsync($"/reactions/{reactions[(i + 5) % reactions.Count]}", ReactionDone);
            if (i >= 0) { reaction.Add(page.Elapsed.TotalMilliseconds); reactionBytes += page.Html.Length; }
        }

        Console.WriteLine();
        Console.WriteLine($"Server render time (signed-in GET over loopback, from request sent to last byte of the prerendered HTML; " +
                          $"{options.Loads} loads each after 5 warm-up loads, one at a time, the two pages alternating; {studies.Count} studies, {reactions.Count} reactions rotated); " +
                          $"load average {Machine.LoadAverage()}");
        Console.WriteLine(Latencies.Row("ledger page /studies/{id}", ledger) + $"  ~{ledgerBytes / ledger.Count / 1024} KiB");
        Console.WriteLine(Latencies.Row("reaction page /reactions/{id}", reaction) + $"  ~{reactionBytes / reaction.Count / 1024} KiB");
        return new SitePages(studies, reactions, Percentile.NearestRank(ledger, 95), Percentile.NearestRank(reaction, 95));
    }
}
