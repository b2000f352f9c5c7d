using BarrierLedger.Core.Kinetics;

namespace BarrierLedger.Ledger.Kinetics;

/// <summary>An interval of a sampled answer (null members: no Monte Carlo run, or no uncertainty set).</summary>
/// <param name="Median">Median of the samples.</param>
/// <param name="Lower">Lower bound of the central interval (null when not reached).</param>
/// <param name="Upper">Upper bound (null when more than the upper tail of the samples never reach it).</param>
/// <param name="NotReachedSamples">Samples in which the answer was not reached within the run.</param>
public sealed record SummaryInterval(double? Median, double? Lower, double? Upper, int NotReachedSamples);

/// <summary>First time a conversion is reached (null: not within the run), with its interval.</summary>
public sealed record SummaryConversionTime(double Conversion, double? Seconds, double? Kelvin, SummaryInterval? Interval);

/// <summary>Conversion of the substrate at one report time, with its interval.</summary>
public sealed record SummaryConversion(double Seconds, double Conversion, SummaryInterval? Interval);

/// <summary>Yield of one product at the end of the run, with its interval.</summary>
public sealed record SummaryYield(string Product, double Yield, SummaryInterval? Interval);

/// <summary>[first]/[second] at the end of the run (null value: the second product does not form), with its interval.</summary>
public sealed record SummaryRatio(string First, string Second, double? Value, SummaryInterval? Interval);

/// <summary>Rate constants of one step at the start temperature; the forward k with its analytic 95 % interval (null: no uncertainty set).</summary>
public sealed record SummaryRateConstant(
    string Step, double Kelvin, double? GibbsBarrierKcalPerMol, double Forward, string ForwardUnit, double? ForwardLower95, double? ForwardUpper95,
    double Reverse, string ReverseUnit);

/// <summary>Concentrations (mol/L, in <see cref="KineticsSummary.Species"/> order) at one time of the curve.</summary>
public sealed record SummaryPoint(double Seconds, double Kelvin, IReadOnlyList<double> MolPerL);

/// <summary>Monte Carlo settings behind the intervals.</summary>
public sealed record SummaryMonteCarlo(int Samples, int Failed, int RandomKey, double ConfidenceLevel);

/// <summary>
/// A kinetics run as plain data: what <c>barrierledger kinetics --json</c> prints and the API returns (each in its own naming
/// convention). Times in s, concentrations in mol/L, conversion and yields as fractions; a time that is not reached is null.
/// </summary>
public sealed record KineticsSummary(
    string Title,
    string EnergyModel,
    double ModelTemperatureKelvin,
    string StandardState,
    string Uncertainty,
    double SigmaKcalPerMol,
    double StartKelvin,
    double RampKelvinPerMinute,
    double Hours,
    IReadOnlyDictionary<string, double> InitialMolPerL,
    string Substrate,
    IReadOnlyList<string> Products,
    string? Sentence,
    string? SentenceWithIntervals,
    IReadOnlyList<SummaryConversionTime> ConversionTimes,
    IReadOnlyList<SummaryConversion> Conversions,
    IReadOnlyList<SummaryYield> Yields,
    SummaryRatio? ProductRatio,
    IReadOnlyList<SummaryRateConstant> RateConstants,
    SummaryMonteCarlo? MonteCarlo,
    IReadOnlyList<string> Cautions,
    IReadOnlyList<string> Species,
    IReadOnlyList<SummaryPoint>? Curve)
{
    /// <summary>The summary of <paramref name="report"/>; <paramref name="withCurve"/> adds the concentration–time curve.</summary>
    public static KineticsSummary Of(KineticsReport report, bool withCurve)
    {
        ArgumentNullException.ThrowIfNull(report);
        var r = report.Result;
        var a = r.Answers;
        var mc = report.MonteCarlo is { UncertaintySet: true } m ? m : null;
        static double? Finite(double x) => double.IsFinite(x) ? x : null;
        static SummaryInterval? Interval(SampledInterval? s) => s is null ? null : new(Finite(s.Median), Finite(s.Lower), Finite(s.Upper), s.NotReached);
        var times = a is null ? [] : a.ConversionTimes.Select((t, k) => new SummaryConversionTime(t.Conversion, t.TimeSeconds, t.TemperatureKelvin,
            Interval(mc?.ConversionTimes.ElementAtOrDefault(k)))).ToList();
        var conversions = a is null ? [] : a.AtReportTimes.Select((p, k) => new SummaryConversion(p.TimeSeconds, p.Conversion,
            Interval(mc?.ConversionAtReportTimes.ElementAtOrDefault(k)))).ToList();
        var yields = a is null ? [] : a.Question.Products.Select((p, k) => new SummaryYield(p, a.AtEnd.Yields[k], Interval(mc?.FinalYields.ElementAtOrDefault(k)))).ToList();
        var ratio = a is { Question.Products.Count: >= 2 }
            ? new SummaryRatio(a.Question.Products[0], a.Question.Products[1], report.ProductRatio, Interval(mc?.ProductRatio))
            : null;
        var rates = r.RateConstantsAtStart.Select(k =>
        {
            var i = RateUncertainty.RateConstant(k.Forward, report.Model.SigmaKcalPerMol, k.TemperatureKelvin);
            return new SummaryRateConstant(k.Label, k.TemperatureKelvin, k.GibbsBarrier?.KcalPerMol, k.Forward, k.ForwardUnit,
                i.IsSet ? i.Lower : null, i.IsSet ? i.Upper : null, k.Reverse, k.ReverseUnit);
        }).ToList();
        var t = report.Conditions.Temperature;
        return new KineticsSummary(
            report.Title, report.EnergyModel, report.ModelTemperatureKelvin, report.StandardState, report.IntervalText, report.Model.SigmaKcalPerMol,
            t.StartKelvin, t.RampKelvinPerSecond * 60, report.Conditions.EndTimeSeconds / 3600.0,
            report.Conditions.InitialMolPerL, report.Question.Substrate, report.Question.Products,
            a?.Sentence, mc?.Sentence, times, conversions, yields, ratio, rates,
            report.MonteCarlo is { } run ? new SummaryMonteCarlo(run.Samples, run.Failed, run.RandomKey, run.ConfidenceLevel) : null,
            report.Cautions, r.Species, withCurve ? r.Curve.Select(p => new SummaryPoint(p.TimeSeconds, p.TemperatureKelvin, p.MolPerL)).ToList() : null);
    }
}
