using System.Globalization;
using BarrierLedger.Core.Kinetics;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Reviews;

namespace BarrierLedger.Ledger.Kinetics;

/// <summary>
/// What a run of a reaction's kinetics is asked for. Every member is optional: left out, it takes what the reaction's definition
/// proposes (its <c>kinetics</c> temperature and time span), else the energy model's temperature, 24 h and the proposed starting
/// mixture of <see cref="ReactionKinetics.Build(ReactionDetail, double)"/>.
/// </summary>
/// <param name="InitialMolPerL">Starting concentrations (mol/L) that replace the proposed ones species by species; a species not named keeps its proposed amount.</param>
/// <param name="TemperatureKelvin">Start temperature.</param>
/// <param name="Hours">Time span.</param>
/// <param name="RampKelvinPerMinute">Linear ramp (0 or null: isothermal).</param>
/// <param name="RampEndKelvin">Temperature at which a ramp stops and holds.</param>
/// <param name="Substrate">Limiting reactant whose conversion is reported (default: the proposed one).</param>
/// <param name="ReportHours">Times at which conversion and yields are reported (default: the end of the run).</param>
/// <param name="Samples">Monte Carlo samples over the energy uncertainty (0: none).</param>
/// <param name="RandomKey">Key of the Monte Carlo's random streams (the same key gives the same intervals).</param>
/// <param name="MaxParallelism">Threads of the Monte Carlo (null: all processors).</param>
public sealed record KineticsRequest(
    IReadOnlyDictionary<string, double>? InitialMolPerL = null,
    double? TemperatureKelvin = null,
    double? Hours = null,
    double? RampKelvinPerMinute = null,
    double? RampEndKelvin = null,
    string? Substrate = null,
    IReadOnlyList<double>? ReportHours = null,
    int Samples = 0,
    int RandomKey = 2026,
    int? MaxParallelism = null);

/// <summary>
/// One run of a pathway's kinetics with everything needed to state it honestly: what was simulated (reactions, energy model,
/// standard state, uncertainty), the conditions, the simulation, the Monte Carlo when asked for, and the cautions a reader must see
/// (unverified saddle points, broken consistency rules, the simulation's own notes).
/// </summary>
public sealed record KineticsReport(
    string Title,
    string EnergyModel,
    double ModelTemperatureKelvin,
    string StandardState,
    string UncertaintyText,
    ReactionKineticsModel Model,
    SimulationConditions Conditions,
    KineticsQuestion Question,
    SimulationResult Result,
    MonteCarloResult? MonteCarlo,
    IReadOnlyList<string> Cautions)
{
    /// <summary>[P₁]/[P₂] at the end, when two products are asked for and the second formed; else null.</summary>
    public double? ProductRatio =>
        Result.Answers is { AtEnd.Yields: { Length: >= 2 } y } && y[1] > 0 ? y[0] / y[1] : null;

    /// <summary>The conditions in words: temperature (or ramp), time span, starting mixture.</summary>
    public string ConditionsText
    {
        get
        {
            var c = CultureInfo.InvariantCulture;
            var t = Conditions.Temperature;
            var where = t.IsIsothermal ? $"{t.StartKelvin.ToString("0.##", c)} K"
                : $"from {t.StartKelvin.ToString("0.##", c)} K at {(t.RampKelvinPerSecond * 60).ToString("0.###", c)} K/min" + (t.FinalKelvin is { } f ? $" up to {f.ToString("0.##", c)} K" : "");
            var mixture = string.Join(", ", Conditions.InitialMolPerL.Where(kv => kv.Value > 0).Select(kv => $"{kv.Key} {kv.Value.ToString("G6", c)} mol/L"));
            return $"{where} for {Microkinetics.Format.Duration(Conditions.EndTimeSeconds)}; starting mixture {mixture}; the other species start at 0";
        }
    }

    /// <summary>The intervals' origin: "no uncertainty set", "no Monte Carlo run (…)" or the samples and key.</summary>
    public string IntervalText => MonteCarlo switch
    {
        _ when !(Model.SigmaKcalPerMol > 0) => $"{UncertainValue.NotSet}: every number is given without an interval",
        null => $"{UncertaintyText}; k intervals analytic (95 %); no Monte Carlo run, so times, yields and ratio carry no interval",
        { } m => $"{UncertaintyText}; k intervals analytic (95 %); times, yields and ratio: median and central {Microkinetics.Format.Percent(m.ConfidenceLevel)} " +
                 $"interval of a Monte Carlo of {m.Samples:N0} samples (random key {m.RandomKey}" + (m.Failed > 0 ? $"; {m.Failed} samples did not finish and are left out" : "") + ")",
    };

    /// <summary>Header lines every output of the run states (screen, CLI, CSV, XLSX, API).</summary>
    public IReadOnlyList<string> HeaderLines =>
    [
        EnergyModel,
        $"Simulated at {ConditionsText}",
        $"Rate constants from the stored ΔG‡ at the energy model's {ModelTemperatureKelvin.ToString("0.##", CultureInfo.InvariantCulture)} K" +
            (Math.Abs(Conditions.Temperature.StartKelvin - ModelTemperatureKelvin) > 1e-9 || !Conditions.Temperature.IsIsothermal ? " (taken to the run's temperature as the notes say)" : "") +
            $"; concentrations in mol/L at the standard state {StandardState}",
        $"Uncertainty: {IntervalText}",
    ];
}

/// <summary>
/// Runs the kinetics of a reaction from its stored derivation, the one route the reaction page's kinetics section, the
/// <c>barrierledger kinetics</c> command, the API and the downloads share: same network (<see cref="ReactionKinetics"/>), same
/// integrator and Monte Carlo (Core <see cref="Microkinetics"/>), same defaults.
/// </summary>
public static class KineticsRun
{
    /// <summary>Default time span when neither the request nor the reaction's definition gives one.</summary>
    public const double DefaultHours = 24;

    /// <summary>The reaction's model with the σ of its level of theory.</summary>
    public static ReactionKineticsModel ModelOf(ReactionDetail detail) =>
        ReactionKinetics.Build(detail, detail.Model.Settings.Uncertainty.SigmaFor(detail.LevelOfTheory));

    /// <summary>Runs <paramref name="detail"/>; throws <see cref="ArgumentException"/> naming what is wrong when it cannot be simulated or the request is bad.</summary>
    public static KineticsReport Run(ReactionDetail detail, KineticsRequest request, IProgress<int>? progress = null, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(detail);
        var model = ModelOf(detail);
        if (!model.CanSimulate) throw new ArgumentException($"Reaction {detail.Label} cannot be simulated: {string.Join(" ", model.Problems)}");
        return Run(model, [detail], $"Kinetics of {detail.Label} ({detail.StudyName})", request, progress, cancel);
    }

    /// <summary>Runs a built model of one or several reactions (<paramref name="reactions"/> give the energy model and the cautions).</summary>
    public static KineticsReport Run(
        ReactionKineticsModel model, IReadOnlyList<ReactionDetail> reactions, string title, KineticsRequest request, IProgress<int>? progress = null,
        CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(model);
        ArgumentNullException.ThrowIfNull(reactions);
        ArgumentNullException.ThrowIfNull(request);
        if (reactions.Count == 0) throw new ArgumentException("No reaction to simulate.", nameof(reactions));
        if (!model.CanSimulate) throw new ArgumentException(string.Join(" ", model.Problems));
        var first = reactions[0];
        var settings = first.Model.Settings;
        var declared = reactions.Count == 1 ? first.Kinetics : null;

        var initial = new Dictionary<string, double>(model.StartingMolPerL, StringComparer.Ordinal);
        foreach (var (species, c) in request.InitialMolPerL ?? new Dictionary<string, double>())
        {
            if (!model.Network.Species.Contains(species))
                throw new ArgumentException($"Starting concentration given for '{species}', which is not a species of the pathway; its species are {string.Join(", ", model.Network.Species)}.");
            initial[species] = c;
        }
        var kelvin = request.TemperatureKelvin ?? declared?.TemperatureKelvin ?? settings.TemperatureKelvin;
        var hours = request.Hours ?? declared?.TimeHours ?? DefaultHours;
        if (!(kelvin > 0) || !double.IsFinite(kelvin)) throw new ArgumentException($"The temperature must be above 0 K, got {kelvin} K.");
        if (!(hours > 0) || !double.IsFinite(hours)) throw new ArgumentException($"The time span must be above 0 h, got {hours} h.");
        if (request.Samples < 0) throw new ArgumentException($"The number of samples must be 0 (no Monte Carlo) or more, got {request.Samples}.");
        var ramp = (request.RampKelvinPerMinute ?? 0) / 60.0;
        var program = new TemperatureProgram(kelvin, ramp, ramp == 0 ? null : request.RampEndKelvin);
        var end = hours * 3600.0;
        var reports = (request.ReportHours ?? [hours]).Select(h => h * 3600.0).ToList();
        var conditions = new SimulationConditions(initial.Where(kv => kv.Value > 0).ToDictionary(StringComparer.Ordinal), program, end, reports);
        var substrate = request.Substrate ?? model.Substrate ?? model.Network.Species[0];
        var question = new KineticsQuestion(substrate, [.. model.Products.Where(p => p != substrate)]);

        var result = Microkinetics.Simulate(model.Network, conditions, question, cancel: cancel);
        MonteCarloResult? mc = request.Samples > 0 && model.SigmaKcalPerMol > 0
            ? Microkinetics.Sample(model.Network, conditions, question, new MonteCarloOptions(request.Samples, request.RandomKey, MaxParallelism: request.MaxParallelism), progress, cancel)
            : null;

        var cautions = new List<string>();
        foreach (var r in reactions)
        {
            var prefix = reactions.Count > 1 ? $"{r.Label}: " : "";
            foreach (var s in r.States.Where(s => s.Kind == Core.Pathways.StateKind.SaddlePoint && s.ReviewStatus != ReviewState.Verified))
                cautions.Add($"{prefix}saddle point {s.Label} is not verified by a reviewer ({ReviewStateText(s.ReviewStatus)}); its rate constant may rest on a wrong structure.");
            if (!r.Consistent)
                cautions.Add($"{prefix}the barriers break a consistency rule: {string.Join("; ", r.ConsistencyReasons.Select(x => x.Message.TrimEnd('.')))}.");
        }
        cautions.AddRange(result.Notes);
        if (mc is not null) cautions.AddRange(mc.Notes);
        if (result.Answers is { } a && a.Question.Products.Count > 0)
            cautions.Add($"Conversion is free {a.Question.Substrate} consumed and a yield is [product]/[{a.Question.Substrate}]₀ (one product per {a.Question.Substrate} assumed).");

        var uncertainty = first.Model.Settings.Uncertainty.Describe(first.LevelOfTheory);
        return new KineticsReport(title, settings.Describe(), settings.TemperatureKelvin, StandardStateNames.Text(settings.StandardState), uncertainty,
            model, conditions, question, result, mc, cautions);
    }

    private static string ReviewStateText(ReviewState? state) => state switch
    {
        ReviewState.Returned => "returned by the reviewer",
        ReviewState.Reopened => "reopened after a new upload",
        _ => "awaiting review",
    };
}
