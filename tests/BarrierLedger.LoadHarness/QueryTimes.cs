using System.Diagnostics;
using BarrierLedger.Ledger;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Reviews;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.LoadHarness;

/// <summary>
/// The Ledger queries behind the pages, timed in this process on the same data directory (the app keeps running): tells how
/// much of a page's render time is its query. Same rotation, warm-up and count as the page loads.
/// </summary>
internal static class QueryTimes
{
    public static async Task RunAsync(string dataDirectory, SitePages site, int loads)
    {
        var config = new ConfigurationBuilder()
            .AddInMemoryCollection(new Dictionary<string, string?> { ["BarrierLedger:DataDirectory"] = dataDirectory })
            .Build();
        await using var services = new ServiceCollection().AddLedger(config).BuildServiceProvider();
        var ledger = services.GetRequiredService<LedgerQueryService>();
        var reactions = services.GetRequiredService<ReactionQueryService>();
        var reviews = services.GetRequiredService<ReviewService>();

        Console.WriteLine();
        Console.WriteLine($"Ledger queries behind the pages, in the harness's process on the same store ({loads} calls each after 20 warm-up calls, so that the code is no longer cold); load average {Machine.LoadAverage()}");
        Console.WriteLine(Latencies.Row("studies list (every page's picker)", await TimeAsync(loads, _ => ledger.GetStudiesAsync())));
        Console.WriteLine(Latencies.Row("ledger rows of one study", await TimeAsync(loads, i => ledger.GetLedgerRowsAsync(site.StudyIds[i % site.StudyIds.Count]))));
        Console.WriteLine(Latencies.Row("one reaction's detail", await TimeAsync(loads, i => reactions.GetReactionAsync(site.ReactionIds[i % site.ReactionIds.Count]))));
        var queue = await reviews.QueuePageAsync(null, 20);
        var waiting = queue.MoreThanTotal ? $"more than {queue.Total}" : $"{queue.Total}";
        Console.WriteLine(Latencies.Row($"review queue, first page (20 of {waiting} waiting)", await TimeAsync(loads, _ => reviews.QueuePageAsync(null, 20))));
        if (queue.Next is { } second)
            Console.WriteLine(Latencies.Row("review queue, second page (keyset)", await TimeAsync(loads, _ => reviews.QueuePageAsync(second, 20))));
        var whole = (await reviews.QueueAsync()).Count; // the page's total stops at its count limit; the whole queue is counted here
        Console.WriteLine(Latencies.Row($"review queue, whole ({whole} items; no screen reads it)", await TimeAsync(Math.Min(loads, 10), _ => reviews.QueueAsync())));
    }

    private static async Task<IReadOnlyList<double>> TimeAsync<T>(int count, Func<int, Task<T>> query)
    {
        var ms = new List<double>();
        for (var i = -20; i < count; i++)
        {
            var clock = Stopwatch.StartNew();
            await query(i + 20);
            if (i >= 0) ms.Add(clock.Elapsed.TotalMilliseconds);
        }
        return ms;
    }
}
