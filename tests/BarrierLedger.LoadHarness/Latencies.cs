using System.Collections.Concurrent;
using System.Globalization;

namespace BarrierLedger.LoadHarness;

/// <summary>Timings by step kind, and errors by message, collected from many users at once.</summary>
internal sealed class Latencies
{
    private readonly ConcurrentDictionary<string, ConcurrentBag<double>> _byKind = new(StringComparer.Ordinal);
    private readonly ConcurrentDictionary<string, int> _errors = new(StringComparer.Ordinal);

    public void Add(string kind, TimeSpan elapsed) => _byKind.GetOrAdd(kind, _ => []).Add(elapsed.TotalMilliseconds);

    public void Error(string kind, Exception ex) => _errors.AddOrUpdate($"{kind}: {ex.Message}", 1, (_, n) => n + 1);

    public int ErrorCount => _errors.Values.Sum();
    public IEnumerable<KeyValuePair<string, int>> Errors => _errors.OrderByDescending(e => e.Value);
    public IReadOnlyList<double> Of(string kind) => _byKind.TryGetValue(kind, out var b) ? [.. b] : [];
    public IReadOnlyList<double> All(Func<string, bool> which) => [.. _byKind.Where(k => which(k.Key)).SelectMany(k => k.Value)];
    public IEnumerable<string> Kinds => _byKind.Keys.Order(StringComparer.Ordinal);

    public static string Row(string what, IReadOnlyList<double> ms) => ms.Count == 0
        ? $"  {what,-34} no samples"
        : string.Create(CultureInfo.InvariantCulture,
            $"  {what,-34} n={ms.Count,4}  p50={Percentile.NearestRank(ms, 50),8:0.0} ms  p95={Percentile.NearestRank(ms, 95),8:0.0} ms  max={ms.Max(),8:0.0} ms  mean={ms.Average(),8:0.0} ms");
}

/// <summary>Percentiles by the nearest-rank definition: the smallest sample with at least p % of the samples at or below it.</summary>
internal static class Percentile
{
    /// <summary>Sorted sample number ⌈p/100 · n⌉ (1-based); p in (0, 100].</summary>
    public static double NearestRank(IReadOnlyList<double> samples, double p)
    {
        if (samples.Count == 0) throw new ArgumentException("No samples.", nameof(samples));
        if (p is <= 0 or > 100) throw new ArgumentException($"The percentile must be in (0, 100], got {p}.", nameof(p));
        var sorted = samples.Order().ToArray();
        var rank = (int)Math.Ceiling(p / 100 * sorted.Length);
        return sorted[Math.Clamp(rank, 1, sorted.Length) - 1];
    }

    /// <summary>
    /// Checked at every start against the worked example of the nearest-rank method in Wikipedia's "Percentile" article
    /// (from memory): for 15, 20, 35, 40, 50 the 5th, 30th, 40th, 50th and 100th percentiles are 15, 20, 20, 35 and 50.
    /// </summary>
    public static void SelfCheck()
    {
        double[] list = [50, 15, 40, 20, 35];
        foreach (var (p, expected) in new[] { (5.0, 15.0), (30, 20), (40, 20), (50, 35), (100, 50) })
            if (NearestRank(list, p) != expected)
                throw new InvalidOperationException($"Nearest-rank percentile self-check failed: P{p} = {NearestRank(list, p)}, expected {expected}.");
    }
}
