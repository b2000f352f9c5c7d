using System.Collections.Immutable;
using MathNet.Numerics.Distributions;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Kinetics;

/// <summary>Settings of <see cref="Microkinetics.Sample"/>.</summary>
/// <param name="Samples">Number of samples (at least 1,000 for a stated interval; fewer only for quick looks).</param>
/// <param name="RandomKey">Fixes the random streams, so a run can be repeated exactly.</param>
/// <param name="ConfidenceLevel">Central interval reported, e.g. 0.95.</param>
/// <param name="MaxParallelism">Threads to use; null for all processors.</param>
/// <param name="Simulation">Integrator tolerances per sample (looser than a single run by default).</param>
public sealed record MonteCarloOptions(
    int Samples = 1000, int RandomKey = 2026, double ConfidenceLevel = 0.95, int? MaxParallelism = null, SimulationOptions? Simulation = null)
{
    /// <summary>Integrator settings of each sample: rtol 1e-5, and no curve kept.</summary>
    public SimulationOptions SimulationOrDefault => Simulation ?? new SimulationOptions(RelativeTolerance: 1e-5, AbsoluteToleranceFraction: 1e-9);
}

/// <summary>
/// Median and central interval of one sampled quantity; <see cref="Upper"/> (or both bounds) is +∞ when more than the upper
/// tail of the samples never reach a conversion within the run.
/// </summary>
/// <param name="Quantity">What it is, e.g. "time to 95 % conversion".</param>
/// <param name="Nominal">The value without errors.</param>
/// <param name="Median">Median of the samples.</param>
/// <param name="Lower">Lower bound of the central interval.</param>
/// <param name="Upper">Upper bound.</param>
/// <param name="NotReached">Samples in which the quantity was not reached (counted as +∞).</param>
public sealed record SampledInterval(string Quantity, double Nominal, double Median, double Lower, double Upper, int NotReached);

/// <summary>What a Monte Carlo over the energy uncertainties gives.</summary>
/// <param name="Samples">Samples run.</param>
/// <param name="Failed">Samples whose integration did not reach the end (left out of the statistics).</param>
/// <param name="ConfidenceLevel">Level of the intervals.</param>
/// <param name="RandomKey">Key of the random streams.</param>
/// <param name="UncertaintySet">False when every level has σ = 0: then no sampling was done.</param>
/// <param name="ConversionTimes">Time to each conversion target, in the question's order.</param>
/// <param name="ConversionAtReportTimes">Conversion at each report time.</param>
/// <param name="FinalYields">Yield of each product at the end.</param>
/// <param name="ProductRatio">[P₁]/[P₂] at the end for the first two products, if two were asked for.</param>
/// <param name="ForwardRateConstants">k_f of every step at the start temperature.</param>
/// <param name="Sentence">The answer sentence with its intervals.</param>
/// <param name="Notes">Plain-language cautions.</param>
public sealed record MonteCarloResult(
    int Samples, int Failed, double ConfidenceLevel, int RandomKey, bool UncertaintySet,
    ImmutableArray<SampledInterval> ConversionTimes,
    ImmutableArray<SampledInterval> ConversionAtReportTimes,
    ImmutableArray<SampledInterval> FinalYields,
    SampledInterval? ProductRatio,
    ImmutableArray<SampledInterval> ForwardRateConstants,
    string Sentence,
    ImmutableArray<string> Notes);

/// <summary>The Monte Carlo behind <see cref="Microkinetics.Sample"/>.</summary>
internal static class MonteCarlo
{
    public static MonteCarloResult Run(
        ReactionNetwork network, SimulationConditions conditions, KineticsQuestion question, MonteCarloOptions options,
        IProgress<int>? progress, CancellationToken cancel)
    {
        ArgumentNullException.ThrowIfNull(question);
        if (options.Samples < 1) throw new ArgumentException($"At least one sample is needed, got {options.Samples}.", nameof(options));
        RateUncertainty.Z(options.ConfidenceLevel);
        var compiled = new CompiledNetwork(network);
        var sim = options.SimulationOrDefault;
        var y0 = Microkinetics.InitialVector(compiled, conditions, question, sim);
        var nominal = Microkinetics.Run(compiled, conditions, question, sim, y0, null, keepCurve: false, cancel);
        var t0 = conditions.Temperature.At(0);
        var levels = compiled.LevelSigmaKcal.Length;
        var set = compiled.LevelSigmaKcal.Any(s => s > 0);
        var targets = question.TargetsOrDefault;
        var reportCount = nominal.Reports.Count;
        var s = compiled.SpeciesIndex[question.Substrate];
        var products = question.Products.Select(p => compiled.SpeciesIndex[p]).ToArray();
        var nominalK = new double[compiled.StepCount];
        compiled.RateConstants(t0, default, nominalK, new double[compiled.StepCount]);

        var n = set ? options.Samples : 0;
        var times = new double[n, targets.Count];
        var atReports = new double[n, reportCount];
        var yields = new double[n, products.Length];
        var ratios = new double[n];
        var rates = new double[n, compiled.StepCount];
        var failed = new bool[n];
        var done = 0;
        var parallel = new ParallelOptions { CancellationToken = cancel, MaxDegreeOfParallelism = options.MaxParallelism ?? Environment.ProcessorCount };
        Parallel.For(0, n, parallel, i =>
        {
            var random = new Random(StreamKey(options.RandomKey, i));
            var shift = new double[levels];
            for (var l = 0; l < levels; l++)
                if (compiled.LevelSigmaKcal[l] > 0)
                    shift[l] = Normal.Sample(random, 0.0, compiled.LevelSigmaKcal[l] / Math.Sqrt(2.0)) * PhysicalConstants.ThermochemicalCalorieJoule * 1000.0;
            var kf = new double[compiled.StepCount];
            compiled.RateConstants(t0, shift, kf, new double[compiled.StepCount]);
            for (var k = 0; k < kf.Length; k++) rates[i, k] = kf[k];
            var run = Microkinetics.Run(compiled, conditions, question, sim, y0, shift, keepCurve: false, cancel);
            failed[i] = !run.Outcome.Completed;
            for (var k = 0; k < targets.Count; k++) times[i, k] = run.CrossingTimes[k] ?? double.PositiveInfinity;
            for (var k = 0; k < reportCount; k++) atReports[i, k] = k < run.Reports.Count ? 1 - run.Reports[k].MolPerL[s] / y0[s] : double.NaN;
            for (var k = 0; k < products.Length; k++) yields[i, k] = run.Final.MolPerL[products[k]] / y0[s];
            ratios[i] = products.Length >= 2 ? run.Final.MolPerL[products[0]] / run.Final.MolPerL[products[1]] : double.NaN;
            var count = Interlocked.Increment(ref done);
            if (progress is not null && (count % Math.Max(1, n / 100) == 0 || count == n)) progress.Report(count);
        });

        var ok = Enumerable.Range(0, n).Where(i => !failed[i]).ToArray();
        var level = options.ConfidenceLevel;
        SampledInterval Summary(string name, double nominalValue, Func<int, double> value)
        {
            if (!set) return new SampledInterval(name, nominalValue, nominalValue, nominalValue, nominalValue, double.IsPositiveInfinity(nominalValue) ? 1 : 0);
            var values = ok.Select(value).Where(v => !double.IsNaN(v)).Order().ToArray();
            if (values.Length == 0) return new SampledInterval(name, nominalValue, double.NaN, double.NaN, double.NaN, 0);
            return new SampledInterval(name, nominalValue, Quantile(values, 0.5), Quantile(values, (1 - level) / 2), Quantile(values, (1 + level) / 2),
                values.Count(double.IsPositiveInfinity));
        }

        var conversionTimes = targets.Select((x, k) => Summary($"time to {Microkinetics.Format.Percent(x)} conversion",
            nominal.CrossingTimes[k] ?? double.PositiveInfinity, i => times[i, k])).ToImmutableArray();
        var reportIntervals = Enumerable.Range(0, reportCount).Select(k => Summary(
            $"conversion at {Microkinetics.Format.Duration(nominal.Reports[k].TimeSeconds)}", 1 - nominal.Reports[k].MolPerL[s] / y0[s], i => atReports[i, k])).ToImmutableArray();
        var yieldIntervals = products.Select((p, k) => Summary($"yield of {question.Products[k]}", nominal.Final.MolPerL[p] / y0[s], i => yields[i, k])).ToImmutableArray();
        SampledInterval? ratio = products.Length >= 2
            ? Summary($"[{question.Products[0]}]/[{question.Products[1]}]", nominal.Final.MolPerL[products[0]] / nominal.Final.MolPerL[products[1]], i => ratios[i])
            : null;
        var rateIntervals = Enumerable.Range(0, compiled.StepCount)
            .Select(k => Summary($"k_f of {network.Steps[k].Label}", nominalK[k], i => rates[i, k])).ToImmutableArray();

        var notes = new List<string>();
        if (!set) notes.Add("No uncertainty set: every energy level has σ = 0, so no sampling was done.");
        else if (options.Samples < 1000) notes.Add($"Only {options.Samples} samples: the interval bounds are rough (use at least 1,000).");
        if (ok.Length < n) notes.Add($"{n - ok.Length} of {n} samples did not reach the end of the run and are left out.");
        notes.Add("Each energy level's error is independent and normal; errors that cancel between similar states (common practice, no source) would make the true interval narrower.");
        var sentence = Sentence(question, conditions, conversionTimes, yieldIntervals, set, level, n);
        return new MonteCarloResult(n, n - ok.Length, level, options.RandomKey, set, conversionTimes, reportIntervals, yieldIntervals, ratio, rateIntervals,
            sentence, [.. notes]);
    }

    /// <summary>Quantile of sorted values by linear interpolation between order statistics (Hyndman and Fan's type 7).</summary>
    internal static double Quantile(double[] sorted, double p)
    {
        if (sorted.Length == 1) return sorted[0];
        var h = (sorted.Length - 1) * p;
        var lo = (int)Math.Floor(h);
        var hi = Math.Min(lo + 1, sorted.Length - 1);
        if (double.IsPositiveInfinity(sorted[hi]) || double.IsPositiveInfinity(sorted[lo])) return h - lo == 0 ? sorted[lo] : double.PositiveInfinity;
        return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
    }

    /// <summary>A random-stream number for sample <paramref name="sample"/> under <paramref name="key"/> (SplitMix64 finaliser).</summary>
    internal static int StreamKey(int key, int sample)
    {
        unchecked
        {
            var z = ((ulong)(uint)key << 32 | (uint)sample) + 0x9E3779B97F4A7C15UL;
            z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9UL;
            z = (z ^ (z >> 27)) * 0x94D049BB133111EBUL;
            z ^= z >> 31;
            return (int)(z & 0x7FFFFFFF);
        }
    }

    private static string Sentence(
        KineticsQuestion q, SimulationConditions c, ImmutableArray<SampledInterval> times, ImmutableArray<SampledInterval> yields, bool set, double level, int n)
    {
        if (!set) return "No uncertainty set: the answer carries no interval.";
        var parts = new List<string>();
        var where = c.Temperature.IsIsothermal ? $"at {Microkinetics.Format.Temperature(c.Temperature.StartKelvin)}" : "on the ramp";
        for (var k = times.Length - 1; k >= 0; k--)
        {
            var t = times[k];
            var target = q.TargetsOrDefault[k];
            parts.Add($"{Microkinetics.Format.Percent(target)} conversion of {q.Substrate} {where}: " +
                      $"{Range(t.Median)} ({Microkinetics.Format.Percent(level)} interval {Microkinetics.Format.Duration(t.Lower)} to {Range(t.Upper)})");
        }
        foreach (var y in yields)
            parts.Add($"{y.Quantity} {Microkinetics.Format.Percent(y.Median)} ({Microkinetics.Format.Percent(y.Lower)} to {Microkinetics.Format.Percent(y.Upper)})");
        return string.Join("; ", parts) + $" — from {n:N0} samples.";
    }

    private static string Range(double upper) => double.IsPositiveInfinity(upper) ? "not reached within the run" : Microkinetics.Format.Duration(upper);
}
