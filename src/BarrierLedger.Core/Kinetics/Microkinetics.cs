using System.Collections.Immutable;
using System.Globalization;
using MathNet.Numerics.RootFinding;

namespace BarrierLedger.Core.Kinetics;

/// <summary>
/// Microkinetic simulation of a mass-action <see cref="ReactionNetwork"/>: concentrations against time at a constant temperature
/// or on a linear ramp, integrated with the stiff, error-controlled Rosenbrock method <see cref="Rodas4"/> (Hairer and Wanner,
/// Solving ODEs II, §IV.7) on the network's analytic Jacobian, and the answers a chemist asks for: conversion and yields at chosen
/// times, the first time each conversion is reached (located inside the step that crosses it by Brent's method on re-computed
/// steps, so to the integrator's accuracy), and a sentence. <see cref="Sample"/> carries per-level energy uncertainties to those
/// answers by Monte Carlo.
/// </summary>
public static class Microkinetics
{
    /// <summary>Simulates <paramref name="network"/> under <paramref name="conditions"/>; answers <paramref name="question"/> when given.</summary>
    public static SimulationResult Simulate(
        ReactionNetwork network, SimulationConditions conditions, KineticsQuestion? question = null, SimulationOptions? options = null,
        CancellationToken cancel = default)
    {
        var compiled = new CompiledNetwork(network);
        var o = options ?? SimulationOptions.Default;
        var y0 = InitialVector(compiled, conditions, question, o);
        var run = Run(compiled, conditions, question, o, y0, shiftJoule: null, keepCurve: true, cancel);
        var notes = Notes(compiled, conditions, run);
        var start = conditions.Temperature.At(0);
        var answers = question is null ? null : BuildAnswers(compiled, conditions, question, y0, run);
        return new SimulationResult(
            [.. network.Species], Thin(run.Curve, o.MaxCurvePoints), [.. run.Reports], run.Final, compiled.Describe(start), answers, run.Outcome, notes);
    }

    /// <summary>k_f and k_r of every step of <paramref name="network"/> at <paramref name="temperatureKelvin"/>, as a simulation starting there uses them.</summary>
    public static IReadOnlyList<StepRateConstants> RateConstants(ReactionNetwork network, double temperatureKelvin) =>
        new CompiledNetwork(network).Describe(temperatureKelvin);

    /// <summary>
    /// Monte Carlo over the energy levels' uncertainties (see <see cref="EnergyLevel.UncertaintyKcalPerMol"/>): every sample
    /// shifts each level by an independent normal error N(0, σ²/2), recomputes every rate constant, simulates, and answers the
    /// question; the result gives median and central interval of each answer. Samples are drawn from their own random stream
    /// (fixed by <see cref="MonteCarloOptions.RandomKey"/> and the sample number), so the result does not depend on how many
    /// threads run them.
    /// </summary>
    public static MonteCarloResult Sample(
        ReactionNetwork network, SimulationConditions conditions, KineticsQuestion question, MonteCarloOptions? options = null,
        IProgress<int>? progress = null, CancellationToken cancel = default) =>
        MonteCarlo.Run(network, conditions, question, options ?? new MonteCarloOptions(), progress, cancel);

    internal sealed record RawRun(
        List<ConcentrationPoint> Curve, List<ConcentrationPoint> Reports, ConcentrationPoint Final, double?[] CrossingTimes,
        double?[] CrossingTemperatures, StiffOutcome Outcome, double MinimumValue, double AbsoluteTolerance);

    internal static double[] InitialVector(CompiledNetwork compiled, SimulationConditions conditions, KineticsQuestion? question, SimulationOptions options)
    {
        ArgumentNullException.ThrowIfNull(conditions);
        ArgumentNullException.ThrowIfNull(options);
        if (conditions.InitialMolPerL is null) throw new ArgumentException("Initial concentrations are missing.", nameof(conditions));
        if (conditions.Temperature is null) throw new ArgumentException("The temperature is missing.", nameof(conditions));
        conditions.Temperature.Validate();
        if (!(conditions.EndTimeSeconds > 0) || !double.IsFinite(conditions.EndTimeSeconds))
            throw new ArgumentException($"The time span must be positive and finite, got {conditions.EndTimeSeconds} s.", nameof(conditions));
        if (!(conditions.Temperature.MinimumUpTo(conditions.EndTimeSeconds) > 0))
            throw new ArgumentException($"The ramp falls to {conditions.Temperature.MinimumUpTo(conditions.EndTimeSeconds):0.#} K before the end of the run; temperatures must stay positive.", nameof(conditions));
        foreach (var r in conditions.ReportTimesSeconds ?? [])
            if (!(r > 0) || r > conditions.EndTimeSeconds || !double.IsFinite(r))
                throw new ArgumentException($"Report time {r} s lies outside the run (0, {conditions.EndTimeSeconds:G4} s].", nameof(conditions));
        if (!(options.RelativeTolerance > 0) || options.RelativeTolerance >= 1 || !(options.AbsoluteToleranceFraction > 0))
            throw new ArgumentException("Tolerances must be positive (relative below 1).", nameof(options));
        var y0 = new double[compiled.SpeciesCount];
        foreach (var (label, c) in conditions.InitialMolPerL)
        {
            if (!compiled.SpeciesIndex.TryGetValue(label, out var i))
                throw new ArgumentException($"Initial concentration given for '{label}', which is not a species of the network.", nameof(conditions));
            if (!(c >= 0) || !double.IsFinite(c))
                throw new ArgumentException($"Initial concentration of '{label}' must be zero or positive, got {c} mol/L.", nameof(conditions));
            y0[i] = c;
        }
        if (y0.All(c => c == 0)) throw new ArgumentException("Every initial concentration is zero: nothing can react.", nameof(conditions));
        if (question is not null)
        {
            if (!compiled.SpeciesIndex.TryGetValue(question.Substrate ?? "", out var s))
                throw new ArgumentException($"The substrate '{question.Substrate}' is not a species of the network.", nameof(question));
            if (!(y0[s] > 0)) throw new ArgumentException($"The substrate '{question.Substrate}' has no initial concentration.", nameof(question));
            foreach (var p in question.Products ?? [])
                if (!compiled.SpeciesIndex.ContainsKey(p)) throw new ArgumentException($"The product '{p}' is not a species of the network.", nameof(question));
            foreach (var x in question.TargetsOrDefault)
                if (!(x > 0 && x < 1)) throw new ArgumentException($"A conversion target must lie between 0 and 1, got {x}.", nameof(question));
        }
        return y0;
    }

    internal static RawRun Run(
        CompiledNetwork compiled, SimulationConditions conditions, KineticsQuestion? question, SimulationOptions options, double[] y0,
        double[]? shiftJoule, bool keepCurve, CancellationToken cancel)
    {
        var program = conditions.Temperature;
        var system = new MassActionSystem(compiled, program, shiftJoule);
        var atol = options.AbsoluteToleranceFraction * y0.Max();
        var integrator = new Rodas4(system, new StiffOptions(options.RelativeTolerance, atol, MaxSteps: options.MaxSteps, NonNegative: true));
        var reportTimes = (conditions.ReportTimesSeconds ?? []).Distinct().Order().ToArray();
        var stops = reportTimes.ToList();
        if (program.HoldTimeSeconds is { } hold && hold > 0 && hold < conditions.EndTimeSeconds) stops.Add(hold);

        var curve = new List<ConcentrationPoint>();
        var reports = new List<ConcentrationPoint>();
        if (keepCurve) curve.Add(new ConcentrationPoint(0, program.At(0), [.. y0]));
        var targets = question?.TargetsOrDefault.ToArray() ?? [];
        var crossing = new double?[targets.Length];
        var crossingT = new double?[targets.Length];
        var substrate = question is null ? -1 : compiled.SpeciesIndex[question.Substrate];
        var s0 = substrate >= 0 ? y0[substrate] : 1.0;
        var minimum = y0.Min();
        var probe = new double[compiled.SpeciesCount];
        var nextReport = 0;
        var lastY = (double[])y0.Clone();
        var lastT = 0.0;

        void OnAccepted(double tStart, double[] yStart, double tEnd, double[] yEnd)
        {
            for (var i = 0; i < yEnd.Length; i++) if (yEnd[i] < minimum) minimum = yEnd[i];
            Array.Copy(yEnd, lastY, yEnd.Length);
            lastT = tEnd;
            if (keepCurve) curve.Add(new ConcentrationPoint(tEnd, program.At(tEnd), [.. yEnd]));
            while (nextReport < reportTimes.Length && reportTimes[nextReport] <= tEnd)
            {
                // Report times are stops, so the integrator lands on them exactly.
                reports.Add(new ConcentrationPoint(reportTimes[nextReport], program.At(reportTimes[nextReport]), [.. yEnd]));
                nextReport++;
            }
            if (substrate < 0) return;
            var before = 1 - yStart[substrate] / s0;
            var after = 1 - yEnd[substrate] / s0;
            for (var k = 0; k < targets.Length; k++)
            {
                if (crossing[k] is not null || after < targets[k]) continue;
                var time = before >= targets[k] ? tStart : Locate(tStart, yStart, tEnd - tStart, targets[k]);
                crossing[k] = time;
                crossingT[k] = program.At(time);
            }
        }

        double Locate(double tStart, double[] yStart, double h, double target)
        {
            double G(double tau)
            {
                if (tau <= 0) return 1 - yStart[substrate] / s0 - target;
                integrator.TryStep(tStart, yStart, tau, probe, out _);
                return 1 - probe[substrate] / s0 - target;
            }
            return Brent.TryFindRoot(G, 0, h, Math.Max(h * 1e-12, 1e-300), 100, out var tau) ? tStart + tau : tStart + h;
        }

        var outcome = integrator.Integrate(0, y0, conditions.EndTimeSeconds, stops, OnAccepted, cancel);
        var final = new ConcentrationPoint(lastT, program.At(lastT), [.. lastY]);
        return new RawRun(curve, reports, final, crossing, crossingT, outcome, minimum, atol);
    }

    private static ImmutableArray<string> Notes(CompiledNetwork compiled, SimulationConditions conditions, RawRun run)
    {
        var notes = new List<string>();
        var program = conditions.Temperature;
        var start = program.At(0);
        var rates = compiled.Describe(start);
        foreach (var r in rates.Where(r => r.BarrierRaised))
            notes.Add($"Step {r.Label}: the saddle point lies below one of its minima, so the step is treated as barrierless (ΔG‡ = {r.GibbsBarrier!.Value.KcalPerMol:0.0} kcal/mol).");
        var otherTemperature = !program.IsIsothermal || Math.Abs(start - compiled.ReferenceTemperature) > 1e-9;
        if (otherTemperature)
        {
            var noEnthalpy = Enumerable.Range(0, compiled.StepCount).Where(s => !compiled.IsFixed(s) && !compiled.HasEnthalpies(s)).Select(s => compiled.Network.Steps[s].Label).ToList();
            if (noEnthalpy.Count > 0)
                notes.Add($"No enthalpies for {string.Join(", ", noEnthalpy)}: their ΔG‡ and ΔG_r are held at the {compiled.ReferenceTemperature:0.##} K values at other temperatures.");
            if (Enumerable.Range(0, compiled.StepCount).Any(compiled.IsFixed))
                notes.Add("Steps with given rate constants keep them at every temperature.");
            if (Enumerable.Range(0, compiled.StepCount).Any(s => !compiled.IsFixed(s) && compiled.HasEnthalpies(s)))
                notes.Add($"Away from {compiled.ReferenceTemperature:0.##} K, G(T) = H − T·S with H and S of {compiled.ReferenceTemperature:0.##} K (heat capacities neglected).");
        }
        if (!run.Outcome.Completed)
            notes.Add($"The simulation stopped at t = {Format.Duration(run.Outcome.TimeReached)}: {run.Outcome.FailureReason}.");
        if (run.MinimumValue < -100 * run.AbsoluteTolerance)
            notes.Add($"A concentration went negative ({run.MinimumValue:G3} mol/L), beyond the integrator's tolerance: tighten the tolerances.");
        return [.. notes];
    }

    private static KineticsAnswers BuildAnswers(CompiledNetwork compiled, SimulationConditions conditions, KineticsQuestion question, double[] y0, RawRun run)
    {
        var s = compiled.SpeciesIndex[question.Substrate];
        var s0 = y0[s];
        var products = question.Products.Select(p => compiled.SpeciesIndex[p]).ToArray();
        YieldPoint At(ConcentrationPoint p) =>
            new(p.TimeSeconds, p.TemperatureKelvin, 1 - p.MolPerL[s] / s0, [.. products.Select(i => p.MolPerL[i] / s0)]);
        var times = question.TargetsOrDefault.Select((x, k) => new ConversionTime(x, run.CrossingTimes[k], run.CrossingTemperatures[k])).ToImmutableArray();
        var end = At(run.Final);
        var reports = run.Reports.Select(At).ToImmutableArray();
        var sentence = Format.Sentence(question, conditions, times, end, run.Outcome.Completed);
        return new KineticsAnswers(question, s0, times, reports, end, sentence);
    }

    private static ImmutableArray<ConcentrationPoint> Thin(List<ConcentrationPoint> curve, int maxPoints)
    {
        if (curve.Count <= maxPoints || maxPoints < 3) return [.. curve];
        var positive = curve.Where(p => p.TimeSeconds > 0).ToList();
        var lo = Math.Log10(positive[0].TimeSeconds);
        var hi = Math.Log10(positive[^1].TimeSeconds);
        var width = (hi - lo) / (maxPoints - 2);
        var kept = new List<ConcentrationPoint> { curve[0] };
        var lastBin = long.MinValue;
        foreach (var p in positive)
        {
            var bin = width > 0 ? (long)Math.Floor((Math.Log10(p.TimeSeconds) - lo) / width) : 0;
            if (bin == lastBin) continue;
            kept.Add(p);
            lastBin = bin;
        }
        if (kept[^1] != curve[^1]) kept.Add(curve[^1]);
        return [.. kept];
    }

    /// <summary>Plain-language numbers for answers.</summary>
    public static class Format
    {
        /// <summary>A duration in the unit a chemist would say it in: "850 µs", "12 s", "41 min", "3.2 h", "12 d", "3.1 years".</summary>
        public static string Duration(double seconds)
        {
            if (double.IsPositiveInfinity(seconds)) return "never";
            if (!double.IsFinite(seconds)) return "—";
            var c = CultureInfo.InvariantCulture;
            var a = Math.Abs(seconds);
            if (a == 0) return "0 s";
            if (a < 1e-6) return (seconds * 1e9).ToString("0.##", c) + " ns";
            if (a < 1e-3) return Sig(seconds * 1e6) + " µs";
            if (a < 1) return Sig(seconds * 1e3) + " ms";
            // Units switch at 1 min, 1 h, 1 d and 1 year, as on the ledger and reaction tables (Web Display.Duration), so one time
            // never reads "107 min" in one table and "1.8 h" in the next.
            if (a < 60) return Sig(seconds) + " s";
            if (a < 3600) return Sig(seconds / 60) + " min";
            if (a < 86400) return Sig(seconds / 3600) + " h";
            if (a < 365.25 * 86400) return Sig(seconds / 86400) + " d";
            return Sig(seconds / (365.25 * 86400)) + " years";
        }

        /// <summary>A fraction as a percentage with two significant digits ("95 %", "4.2 %", "0.013 %").</summary>
        public static string Percent(double fraction) => Sig(fraction * 100) + " %";

        /// <summary>Two significant digits, no exponent below 10⁶.</summary>
        public static string Sig(double x)
        {
            var c = CultureInfo.InvariantCulture;
            if (x == 0 || !double.IsFinite(x)) return x.ToString(c);
            var a = Math.Abs(x);
            if (a >= 1e6 || a < 1e-3) return x.ToString("0.0e0", c);
            var digits = Math.Max(0, 1 - (int)Math.Floor(Math.Log10(a)));
            return Math.Round(x, digits).ToString("0." + new string('#', digits), c);
        }

        internal static string Temperature(double kelvin) => kelvin.ToString("0", CultureInfo.InvariantCulture) + " K";

        internal static string Sentence(KineticsQuestion q, SimulationConditions c, ImmutableArray<ConversionTime> times, YieldPoint end, bool completed)
        {
            var program = c.Temperature;
            var where = program.IsIsothermal
                ? $"at {Temperature(program.StartKelvin)}"
                : $"on a ramp from {Temperature(program.StartKelvin)} at {Sig(program.RampKelvinPerSecond * 60)} K/min";
            var reached = times.Where(t => t.TimeSeconds is not null).OrderByDescending(t => t.Conversion).ToList();
            var parts = new List<string>();
            if (reached.Count > 0)
            {
                var best = reached[0];
                var head = $"{Percent(best.Conversion)} conversion of {q.Substrate} after {Duration(best.TimeSeconds!.Value)} {where}";
                if (!program.IsIsothermal) head += $" (reached at {Temperature(best.TemperatureKelvin!.Value)})";
                var others = reached.Skip(1).OrderBy(t => t.Conversion).Select(t => $"{Percent(t.Conversion)} after {Duration(t.TimeSeconds!.Value)}").ToList();
                if (others.Count > 0) head += $" ({string.Join(", ", others)})";
                parts.Add(head);
                var missing = times.Where(t => t.TimeSeconds is null).Select(t => Percent(t.Conversion)).ToList();
                if (missing.Count > 0) parts.Add($"{string.Join(" and ", missing)} is not reached within {Duration(end.TimeSeconds)} ({Percent(end.Conversion)})");
            }
            else
            {
                parts.Add($"Only {Percent(Math.Max(0, end.Conversion))} conversion of {q.Substrate} after {Duration(end.TimeSeconds)} {where}; " +
                          $"{Percent(times.Min(t => t.Conversion))} is not reached");
            }
            if (q.Products.Count > 0)
            {
                var yields = q.Products.Select((p, i) => (p, y: end.Yields[i])).OrderByDescending(x => x.y).ToList();
                parts.Add($"after {Duration(end.TimeSeconds)}: " + string.Join(", ", yields.Select(x => $"{x.p} {Percent(Math.Max(0, x.y))} yield")));
            }
            var text = string.Join("; ", parts) + ".";
            if (!completed) text += " The simulation stopped before the end of the time span.";
            return char.ToUpperInvariant(text[0]) + text[1..];
        }
    }
}
