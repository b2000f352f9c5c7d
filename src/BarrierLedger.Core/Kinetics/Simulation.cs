using System.Collections.Immutable;

namespace BarrierLedger.Core.Kinetics;

/// <summary>What a simulation starts from and how long it runs.</summary>
/// <param name="InitialMolPerL">Initial concentration of each species that is present at t = 0 (mol/L); the others start at 0.</param>
/// <param name="Temperature">Constant temperature or linear ramp.</param>
/// <param name="EndTimeSeconds">Length of the run in s.</param>
/// <param name="ReportTimesSeconds">Times at which concentrations, conversion and yields are reported exactly (the integrator lands on them).</param>
public sealed record SimulationConditions(
    IReadOnlyDictionary<string, double> InitialMolPerL,
    TemperatureProgram Temperature,
    double EndTimeSeconds,
    IReadOnlyList<double>? ReportTimesSeconds = null);

/// <summary>The question a simulation answers: how fast is <see cref="Substrate"/> consumed, and how much of each product forms.</summary>
/// <param name="Substrate">The limiting reactant whose conversion X(t) = 1 − [S](t)/[S]₀ is reported (free S consumed).</param>
/// <param name="Products">Products whose yields [P](t)/[S]₀ are reported (one P per S assumed).</param>
/// <param name="ConversionTargets">Conversions whose first time is found, e.g. 0.5 and 0.95.</param>
public sealed record KineticsQuestion(string Substrate, IReadOnlyList<string> Products, IReadOnlyList<double>? ConversionTargets = null)
{
    /// <summary>The conversions asked for (0.5 and 0.95 unless given).</summary>
    public IReadOnlyList<double> TargetsOrDefault => ConversionTargets ?? [0.5, 0.95];
}

/// <summary>Accuracy and size limits of a simulation.</summary>
/// <param name="RelativeTolerance">rtol of the integrator.</param>
/// <param name="AbsoluteToleranceFraction">atol as a fraction of the largest initial concentration.</param>
/// <param name="MaxSteps">Most integrator steps.</param>
/// <param name="MaxCurvePoints">Most points kept for the concentration–time curve (accepted steps thinned evenly in log t).</param>
public sealed record SimulationOptions(double RelativeTolerance = 1e-6, double AbsoluteToleranceFraction = 1e-10, int MaxSteps = 200_000, int MaxCurvePoints = 600)
{
    public static SimulationOptions Default { get; } = new();
}

/// <summary>Concentrations at one time.</summary>
public sealed record ConcentrationPoint(double TimeSeconds, double TemperatureKelvin, ImmutableArray<double> MolPerL);

/// <summary>The first time a conversion is reached, with the temperature then; null time when it is not reached in the run.</summary>
public sealed record ConversionTime(double Conversion, double? TimeSeconds, double? TemperatureKelvin);

/// <summary>Conversion of the substrate and yield of each product (in <see cref="KineticsQuestion.Products"/> order) at one time.</summary>
public sealed record YieldPoint(double TimeSeconds, double TemperatureKelvin, double Conversion, ImmutableArray<double> Yields);

/// <summary>The answers of a simulation, with a one-sentence summary.</summary>
public sealed record KineticsAnswers(
    KineticsQuestion Question,
    double InitialSubstrateMolPerL,
    ImmutableArray<ConversionTime> ConversionTimes,
    ImmutableArray<YieldPoint> AtReportTimes,
    YieldPoint AtEnd,
    string Sentence);

/// <summary>Everything a simulation produced.</summary>
/// <param name="Species">Species in network order (the order of every concentration array).</param>
/// <param name="Curve">Concentration–time curve from the accepted steps (t = 0 first), thinned to the options' limit.</param>
/// <param name="Reports">Concentrations at the report times that were reached.</param>
/// <param name="Final">Concentrations at the end (or where the run stopped).</param>
/// <param name="RateConstantsAtStart">k_f and k_r of every step at the start temperature.</param>
/// <param name="Answers">Conversion, yields and sentence, when a question was asked.</param>
/// <param name="Outcome">Whether the integration reached the end, and its work.</param>
/// <param name="Notes">Plain-language warnings: raised barriers, enthalpies missing for a ramp, a run that stopped early.</param>
public sealed record SimulationResult(
    ImmutableArray<string> Species,
    ImmutableArray<ConcentrationPoint> Curve,
    ImmutableArray<ConcentrationPoint> Reports,
    ConcentrationPoint Final,
    IReadOnlyList<StepRateConstants> RateConstantsAtStart,
    KineticsAnswers? Answers,
    StiffOutcome Outcome,
    ImmutableArray<string> Notes)
{
    /// <summary>Index of a species in the concentration arrays.</summary>
    public int IndexOf(string species)
    {
        var i = Species.IndexOf(species);
        return i >= 0 ? i : throw new ArgumentException($"Species '{species}' is not in the network.", nameof(species));
    }
}
