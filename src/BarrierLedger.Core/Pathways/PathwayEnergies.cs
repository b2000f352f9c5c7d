using System.Globalization;
using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Conformers;
using BarrierLedger.Core.Kinetics;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Pathways;

/// <summary>Where thermal corrections come from under an energy model.</summary>
public enum ThermalSource
{
    /// <summary>Each species' reported corrections (<see cref="SpeciesRecord.Thermal"/>), moved to the model's standard state.</summary>
    Reported,
    /// <summary>
    /// Computed by Core thermochemistry from each species' geometry and frequencies at the model's temperature, standard state,
    /// treatment and the species' σ; a species without geometry and frequencies falls back to its reported corrections.
    /// </summary>
    Computed,
    /// <summary>Electronic energies only: no ΔH, ΔG, rate constants or energetic span.</summary>
    ElectronicOnly,
}

/// <summary>The tunnelling correction applied to each step's Eyring rate constant.</summary>
public enum StepTunnelling
{
    /// <summary>κ = 1 (times <see cref="EnergyModel.TransmissionCoefficient"/>).</summary>
    None,
    /// <summary>Wigner's κ from the saddle point's imaginary frequency (<see cref="Tunnelling.Wigner"/>).</summary>
    Wigner,
}

/// <summary>
/// An energy model: which thermal corrections are used, at which temperature, standard state and treatment (all in
/// <see cref="Thermo"/>), a constant transmission coefficient for Eyring rate constants, and the tunnelling correction that
/// multiplies it per step.
/// </summary>
public sealed record EnergyModel(ThermalSource Thermal = ThermalSource.Reported, ThermoOptions? Thermo = null, double TransmissionCoefficient = 1.0,
    StepTunnelling Tunnelling = StepTunnelling.None, ConformerChoice Conformers = ConformerChoice.Lowest)
{
    public ThermoOptions ThermoOrDefault => Thermo ?? ThermoOptions.Default;
}

/// <summary>
/// One species of a state as the derivation used it: the record with the thermal correction actually applied (null if none); for a
/// species with several conformers, the record of the conformer used (its lowest) or of the ensemble, and <see cref="Conformer"/>.
/// </summary>
public sealed record TermEnergies(SpeciesRecord Species, int Coefficient)
{
    /// <summary>Which conformer(s) made its energies; null for a species with one conformer.</summary>
    public ConformerUse? Conformer { get; init; }
}

/// <summary>
/// The conformers a species' energies came from: <see cref="Lowest"/> is the label of its lowest conformer that takes part (the one
/// used under <see cref="ConformerChoice.Lowest"/>), <see cref="Description"/> the words ("conformer c2 (lowest of 3)", "ensemble of 3
/// conformers (c1 61 %, …)"), <see cref="Energies"/> and <see cref="Selection"/> every conformer's energies and what was made of them.
/// </summary>
public sealed record ConformerUse(string Lowest, string Description, IReadOnlyList<ConformerEnergies> Energies, ConformerSelectionResult Selection);

/// <summary>
/// Energies of one state: absolute sums and values relative to the first state (null where a correction is missing), and its
/// terms in the order given, each with the thermal correction used.
/// </summary>
public sealed record StateEnergies(string Label, StateKind Kind, Energy Electronic, Energy? Enthalpy, Energy? Gibbs, Energy RelativeElectronic, Energy? RelativeEnthalpy,
    Energy? RelativeGibbs)
{
    public IReadOnlyList<TermEnergies> Terms { get; init; } = [];
}

/// <summary>
/// One step minimum → saddle point → minimum.
/// </summary>
/// <param name="From">Label of the minimum before the saddle point.</param>
/// <param name="SaddlePoint">Label of the saddle point.</param>
/// <param name="To">Label of the minimum after it.</param>
/// <param name="ElectronicBarrier">ΔE‡ = E(saddle) − E(from).</param>
/// <param name="GibbsBarrier">ΔG‡ = G(saddle) − G(from), null without thermal corrections.</param>
/// <param name="ElectronicReactionEnergy">ΔE_r = E(to) − E(from).</param>
/// <param name="GibbsReactionEnergy">ΔG_r = G(to) − G(from), or null.</param>
/// <param name="Molecularity">Molecules in "from" minus molecules in the saddle point, plus one.</param>
/// <param name="RateConstant">Eyring k from ΔG‡ with κ (s⁻¹ for unimolecular, M⁻¹ s⁻¹ for bimolecular, referred to the model's standard state), or null.</param>
/// <param name="RateConstantUnit">"s⁻¹", "M⁻¹ s⁻¹" or "M⁻² s⁻¹".</param>
/// <param name="HalfLifeSeconds">t½ = ln 2 / k for a unimolecular step; null otherwise (it depends on concentrations).</param>
/// <param name="EnthalpyBarrier">ΔH‡ = H(saddle) − H(from), or null.</param>
/// <param name="ImaginaryFrequencyCm1">The saddle point's imaginary frequency as given (negative), or null.</param>
/// <param name="TransmissionCoefficient">κ used in <paramref name="RateConstant"/>.</param>
public sealed record StepEnergies(
    string From, string SaddlePoint, string To,
    Energy ElectronicBarrier, Energy? GibbsBarrier, Energy ElectronicReactionEnergy, Energy? GibbsReactionEnergy,
    int Molecularity, double? RateConstant, string RateConstantUnit, double? HalfLifeSeconds,
    Energy? EnthalpyBarrier = null, double? ImaginaryFrequencyCm1 = null, double TransmissionCoefficient = 1.0);

/// <summary>
/// The pathway's headline numbers: the Gibbs barrier is the energetic span δE when it can be formed (Kozuch and Shaik,
/// Acc. Chem. Res. 2011, 44, 101), else the highest step ΔG‡; <see cref="DeterminingSaddlePoint"/> is the TDTS or that step's
/// saddle point; k_eff = κ (k_B T/h) exp(−ΔG‡/RT) with that saddle point's κ (first order, <see cref="Eyring"/>), t½ = ln 2 / k_eff.
/// <see cref="ElectronicBarrier"/> is the highest step ΔE‡; <see cref="ReactionGibbs"/> is G(last) − G(first).
/// </summary>
public sealed record OverallEnergies(Energy? GibbsBarrier, Energy? ElectronicBarrier, Energy? ReactionGibbs, string? DeterminingSaddlePoint,
    double TransmissionCoefficient, double? RateConstantPerSecond, double? HalfLifeSeconds);

/// <summary>Everything derived for a pathway under an energy model, with the consistency verdict and reasons it carries.</summary>
public sealed record PathwayEnergyResult(
    EnergyModel Model,
    IReadOnlyList<StateEnergies> States,
    IReadOnlyList<StepEnergies> Steps,
    EnergeticSpanResult? OverallSpan,
    Verdict Verdict,
    IReadOnlyList<CheckReason> Reasons)
{
    /// <summary>The headline barrier, rate constant and half-life (see <see cref="OverallEnergies"/>).</summary>
    public OverallEnergies Overall { get; init; } = new(null, null, null, null, 1.0, null, null);

    public string Report() => CheckReport.Format(Verdict, Reasons);
}

/// <summary>Stable codes of reasons added when deriving energies (besides those of <see cref="BarrierConsistency"/>).</summary>
public static class PathwayEnergyCodes
{
    public const string ThermalTemperatureNotModel = "energies.thermal-temperature-not-model";
    public const string MissingFrequencies = "energies.missing-frequencies";
    public const string NoRateConstant = "energies.no-rate-constant";
    public const string StandardStateConverted = "energies.standard-state-converted";
    public const string ThermochemistryFailed = "energies.thermochemistry-failed";
    public const string NegativeBarrier = "energies.negative-barrier";
    public const string RateAboveLimit = "energies.rate-above-limit";
}

/// <summary>
/// The one derivation of every number of a pathway (the ledger, its exports, the API and the command line all read its result).
/// Derived energies of a pathway: E, H and G of every state (Σ coefficient × species value; H = E + enthalpy correction,
/// G = E + Gibbs correction in the model's standard state) relative to the first state; for every saddle point with minima on
/// both sides, ΔE‡, ΔG‡, ΔE_r, ΔG_r, the Eyring rate constant k = κ (k_B T/h)(c°)^{1−m} exp(−ΔG‡/RT) (<see cref="Eyring"/>)
/// with κ from the model's tunnelling correction and the saddle point's imaginary frequency (Wigner 1932, <see cref="Tunnelling.Wigner"/>),
/// and for unimolecular steps t½ = ln 2 / k; the headline numbers (<see cref="OverallEnergies"/>); and the overall barrier by the energetic-span model (<see cref="EnergeticSpan"/>,
/// Kozuch and Shaik, Acc. Chem. Res. 2011, 44, 101) over the states before the last, with ΔG_r = G(last) − G(first).
/// The consistency check (<see cref="BarrierConsistency"/>) runs on the thermal corrections actually used; its reasons are
/// part of the result and set its verdict, so a barrier from mixed levels of theory is never shown without saying so.
/// </summary>
public static class PathwayEnergies
{
    public static PathwayEnergyResult Derive(Pathway pathway, EnergyModel? model = null)
    {
        ArgumentNullException.ThrowIfNull(pathway);
        pathway.Validate();
        var m = model ?? new EnergyModel();
        var thermo = m.ThermoOrDefault;
        var t = thermo.TemperatureKelvin;
        var extra = new List<CheckReason>();

        // Keyed by record equality, the same equality Distinct uses: equal records built separately resolve to one entry.
        var resolved = new Dictionary<SpeciesRecord, SpeciesRecord>();
        var conformers = new Dictionary<SpeciesRecord, ConformerUse>();
        foreach (var sp in pathway.States.SelectMany(s => s.Terms).Select(x => x.Species).Distinct())
        {
            if (sp.Conformers is { Count: > 1 } list)
            {
                var (record, use) = Ensemble(sp, list, m, thermo, extra);
                resolved[sp] = record;
                conformers[sp] = use;
            }
            else resolved[sp] = sp with { Thermal = Resolve(sp, m, thermo, extra) };
        }
        // The conformer checks a reviewer sees, once per state that holds the species (a saddle point is judged as one).
        foreach (var s in pathway.States)
            foreach (var sp in s.Terms.Select(x => x.Species).Distinct())
                if (conformers.TryGetValue(sp, out var use))
                    extra.AddRange(ConformerSelection.Check(s.Label, sp.Label, s.Kind == StateKind.SaddlePoint, use.Energies, use.Selection, t));
        var used = pathway with
        {
            States = [.. pathway.States.Select(s => s with { Terms = [.. s.Terms.Select(x => x with { Species = resolved[x.Species] })] })],
        };
        var consistency = BarrierConsistency.Check(used, requireThermal: m.Thermal != ThermalSource.ElectronicOnly);

        var first = used.States[0];
        Energy? Sum(PathwayState s, Func<ThermalCorrection, Energy> part) =>
            m.Thermal == ThermalSource.ElectronicOnly || s.Terms.Any(x => x.Species.Thermal is null)
                ? null
                : s.Terms.Aggregate(Energy.Zero, (acc, x) => acc + x.Coefficient * (x.Species.ElectronicEnergy + part(x.Species.Thermal!)));
        var e0 = first.ElectronicEnergy;
        var h0 = Sum(first, c => c.Enthalpy);
        var g0 = Sum(first, c => c.Gibbs);
        var states = used.States.Select((s, si) =>
        {
            var e = s.ElectronicEnergy;
            var h = Sum(s, c => c.Enthalpy);
            var g = Sum(s, c => c.Gibbs);
            return new StateEnergies(s.Label, s.Kind, e, h, g, e - e0, h - h0, g - g0)
            {
                Terms = [.. s.Terms.Select((x, j) => new TermEnergies(x.Species, x.Coefficient)
                {
                    Conformer = conformers.GetValueOrDefault(pathway.States[si].Terms[j].Species),
                })],
            };
        }).ToList();

        var steps = new List<StepEnergies>();
        for (var i = 0; i < used.States.Count; i++)
        {
            if (used.States[i].Kind != StateKind.SaddlePoint) continue;
            if (i == 0 || i == used.States.Count - 1 || used.States[i - 1].Kind != StateKind.Minimum || used.States[i + 1].Kind != StateKind.Minimum)
                throw new ArgumentException($"Pathway '{pathway.Name}': saddle point '{used.States[i].Label}' must have a minimum directly before and after it.", nameof(pathway));
            var (a, ts, b) = (states[i - 1], states[i], states[i + 1]);
            var molecularity = used.States[i - 1].MoleculeCount - used.States[i].MoleculeCount + 1;
            var dg = ts.Gibbs - a.Gibbs;
            var imaginary = used.States[i].ImaginaryFrequencyCm1;
            var kappa = Kappa(m, imaginary, t);
            double? k = null, half = null;
            var unit = molecularity switch { 1 => "s⁻¹", 2 => "M⁻¹ s⁻¹", 3 => "M⁻² s⁻¹", _ => "" };
            if (dg is { } negative && negative.Hartree < 0)
            {
                extra.Add(new(PathwayEnergyCodes.NegativeBarrier, CheckSeverity.Failure,
                    $"Step {a.Label} → {ts.Label}: the saddle point lies {Kcal(-negative.KcalPerMol)} kcal/mol below the minimum before it under this energy model " +
                    $"(ΔG‡ = −{Kcal(-negative.KcalPerMol)} kcal/mol). A saddle point cannot lie below the minimum it is reached from, so that minimum, the saddle point " +
                    "or the levels of theory need another look; no rate constant is given for this step."));
            }
            else if (dg is { } high && AboveLimit(high, t, kappa))
            {
                extra.Add(RateLimitReason($"Step {a.Label} → {ts.Label}", high, t, kappa));
            }
            else if (dg is { } barrier)
            {
                if (molecularity is >= 1 and <= 3)
                {
                    k = Eyring.RateConstant(barrier, t, kappa, molecularity, StandardConcentration(thermo));
                    if (molecularity == 1) half = Eyring.HalfLifeSeconds(k.Value);
                }
                else
                {
                    extra.Add(new(PathwayEnergyCodes.NoRateConstant, CheckSeverity.Attention,
                        $"Step {a.Label} → {ts.Label}: {used.States[i - 1].MoleculeCount} molecules become {used.States[i].MoleculeCount}, a molecularity of {molecularity}; " +
                        "no Eyring rate constant is given for it."));
                }
            }
            steps.Add(new StepEnergies(a.Label, ts.Label, b.Label, ts.Electronic - a.Electronic, dg, b.Electronic - a.Electronic, b.Gibbs - a.Gibbs,
                molecularity, k, unit, half, ts.Enthalpy - a.Enthalpy, imaginary, kappa));
        }

        EnergeticSpanResult? span = null;
        if (states.All(s => s.Gibbs is not null) && states.Count >= 3 && states[0].Kind == StateKind.Minimum
            && states[^1].Kind == StateKind.Minimum && states.Any(s => s.Kind == StateKind.SaddlePoint))
        {
            var cycle = states.Take(states.Count - 1)
                .Select(s => new CycleState(s.Label, s.RelativeGibbs!.Value, s.Kind))
                .ToList();
            span = EnergeticSpan.Analyze(cycle, states[^1].RelativeGibbs!.Value, t);
        }

        var overall = Overall(steps, span, states[^1].RelativeGibbs, t);
        if (overall.GibbsBarrier is { } head && overall.RateConstantPerSecond is null && !extra.Any(x => x.Code is PathwayEnergyCodes.NegativeBarrier or PathwayEnergyCodes.RateAboveLimit))
            extra.Add(head.Hartree < 0
                ? new(PathwayEnergyCodes.NegativeBarrier, CheckSeverity.Failure,
                    $"The pathway's overall barrier is −{Kcal(-head.KcalPerMol)} kcal/mol; no effective rate constant or half-life is given for it.")
                : RateLimitReason("The pathway's overall barrier", head, t, overall.TransmissionCoefficient));
        var reasons = consistency.Reasons.Concat(extra).OrderByDescending(r => r.Severity).ToList();
        return new PathwayEnergyResult(m, states, steps, span, CheckReason.VerdictOf(reasons), reasons)
        {
            Overall = overall,
        };
    }

    private static OverallEnergies Overall(List<StepEnergies> steps, EnergeticSpanResult? span, Energy? reactionGibbs, double t)
    {
        var highest = steps.Where(s => s.GibbsBarrier is not null).MaxBy(s => s.GibbsBarrier!.Value.Hartree);
        var determining = span is not null ? steps.FirstOrDefault(s => s.SaddlePoint == span.Tdts.Label) : highest;
        var barrier = span?.EnergeticSpanEnergy ?? highest?.GibbsBarrier;
        var kappa = determining?.TransmissionCoefficient ?? 1.0;
        double? k = barrier is { } bg && bg.Hartree >= 0 && !AboveLimit(bg, t, kappa) ? Eyring.RateConstant(bg, t, kappa) : null;
        var electronic = steps.Count == 0 ? (Energy?)null : steps.MaxBy(s => s.ElectronicBarrier.Hartree)!.ElectronicBarrier;
        return new OverallEnergies(barrier, electronic, reactionGibbs, span?.Tdts.Label ?? highest?.SaddlePoint, kappa, k,
            k is > 0 ? Eyring.HalfLifeSeconds(k.Value) : null);
    }

    /// <summary>
    /// Whether Eyring would give more than the universal frequency k_B T/h: κ exp(−ΔG‡/RT) > 1. Transition-state theory assumes a
    /// barrier well above RT (Eyring, J. Chem. Phys. 3, 107 (1935)); such a value is never presented as a rate constant.
    /// </summary>
    private static bool AboveLimit(Energy barrier, double t, double kappa) =>
        Math.Log(kappa) - barrier.KJPerMol * 1000.0 / (PhysicalConstants.GasConstantJoulePerMoleKelvin * t) > 0;

    private static CheckReason RateLimitReason(string what, Energy barrier, double t, double kappa) =>
        new(PathwayEnergyCodes.RateAboveLimit, CheckSeverity.Failure,
            $"{what} ({Kcal(barrier.KcalPerMol)} kcal/mol{(kappa > 1 ? $", κ = {kappa.ToString("0.###", CultureInfo.InvariantCulture)}" : "")}) would give a rate constant " +
            $"above k_BT/h = {Eyring.FrequencyFactorPerSecond(t).ToString("0.00E+0", CultureInfo.InvariantCulture)} s⁻¹ at {F(t)} K, where transition-state theory does not hold; " +
            "no rate constant or half-life is given for it.");

    private static string Kcal(double x) => x.ToString("0.0", CultureInfo.InvariantCulture);

    /// <summary>κ of a step: the model's constant times Wigner's correction when asked for and the saddle point has an imaginary mode.</summary>
    private static double Kappa(EnergyModel m, double? imaginaryCm1, double t) =>
        m.TransmissionCoefficient * (m.Tunnelling == StepTunnelling.Wigner && imaginaryCm1 is { } v && v < 0 ? Tunnelling.Wigner(Math.Abs(v), t) : 1.0);

    /// <summary>
    /// The thermal correction one species gets under <paramref name="model"/>: exactly the one a pathway containing it would use
    /// (computed from its geometry and frequencies, else reported and moved to the model's standard state), with the reasons
    /// found; null when there is none. For listing a species on its own (a structure in no pathway).
    /// </summary>
    public static ThermalCorrection? ThermalCorrectionOf(SpeciesRecord species, EnergyModel? model, out IReadOnlyList<CheckReason> reasons) =>
        SpeciesEnergies(species, model, out reasons).Species.Thermal;

    /// <summary>
    /// One species as a pathway containing it would use it under <paramref name="model"/>: its thermal correction, and for a
    /// species with several conformers the model's conformer choice with every conformer's energies (<see cref="TermEnergies.Conformer"/>).
    /// For listing a species on its own (its page, a structure in no pathway).
    /// </summary>
    public static TermEnergies SpeciesEnergies(SpeciesRecord species, EnergyModel? model, out IReadOnlyList<CheckReason> reasons)
    {
        ArgumentNullException.ThrowIfNull(species);
        var m = model ?? new EnergyModel();
        var list = new List<CheckReason>();
        reasons = list;
        if (species.Conformers is { Count: > 1 } conformers)
        {
            var (record, use) = Ensemble(species, conformers, m, m.ThermoOrDefault, list);
            return new TermEnergies(record, 1) { Conformer = use };
        }
        return new TermEnergies(species with { Thermal = Resolve(species, m, m.ThermoOrDefault, list) }, 1);
    }

    /// <summary>c° in mol/L of the model's standard state: c for a solution, p/(RT) for a gas.</summary>
    private static double StandardConcentration(ThermoOptions o) => o.StandardState switch
    {
        StandardState.Solution1Molar => o.ConcentrationMolPerL ?? 1.0,
        _ => Thermochemistry.IdealGasThermo.ReferencePressurePascal(o.TemperatureKelvin, o.StandardState, o.PressurePascal)
             / (PhysicalConstants.GasConstantJoulePerMoleKelvin * o.TemperatureKelvin) / 1000.0,
    };

    /// <summary>
    /// A species with several conformers: every conformer's thermal correction as for a species of its own, then the model's
    /// choice (<see cref="ConformerSelection.Select"/>). Under the lowest-conformer choice the species is that conformer's record;
    /// under the ensemble its electronic energy, enthalpy and Gibbs energy are the ensemble's (G = −RT ln Σ exp(−G_i/RT), E and H
    /// population-weighted, the zero-point energy too) on the lowest conformer's record. Reasons found for a conformer are kept
    /// only when it takes part.
    /// </summary>
    private static (SpeciesRecord Record, ConformerUse Use) Ensemble(SpeciesRecord sp, IReadOnlyList<ConformerRecord> list, EnergyModel m, ThermoOptions thermo,
        List<CheckReason> extra)
    {
        var t = thermo.TemperatureKelvin;
        var thermal = new ThermalCorrection?[list.Count];
        var found = new List<CheckReason>[list.Count];
        var energies = new List<ConformerEnergies>(list.Count);
        for (var i = 0; i < list.Count; i++)
        {
            var c = list[i];
            found[i] = [];
            thermal[i] = Resolve(c.Record with { Label = $"{sp.Label} ({c.Label})" }, m, thermo, found[i]);
            var e = c.Record.ElectronicEnergy;
            energies.Add(new ConformerEnergies(c.Label, e, thermal[i] is { } th ? e + th.Enthalpy : null, thermal[i] is { } tg ? e + tg.Gibbs : null,
                c.CheckPassed, c.DuplicateOf, c.DuplicateNote));
        }
        var selection = ConformerSelection.Select(energies, m.Conformers, t);
        var lowest = selection.Lowest;
        var taking = m.Conformers == ConformerChoice.Lowest ? [lowest] : selection.Included.ToArray();
        foreach (var i in taking) extra.AddRange(found[i]);
        var use = new ConformerUse(list[lowest].Label, selection.Describe(energies), energies, selection);
        var baseRecord = list[lowest].Record with { Label = sp.Label, Conformers = sp.Conformers };
        if (m.Conformers == ConformerChoice.Lowest || selection.Included.Length == 1)
            return (baseRecord with { Thermal = thermal[lowest] }, use);
        if (selection.Gibbs is not { } g || thermal[lowest] is not { } th0)
            return (baseRecord with { ElectronicEnergy = selection.Electronic, Thermal = null }, use);
        var e0 = selection.Electronic;
        var zpe = Energy.FromHartree(selection.Included.Sum(i => selection.Populations[i] * thermal[i]!.ZeroPoint.Hartree));
        var h = selection.Enthalpy ?? e0 + th0.Enthalpy;
        return (baseRecord with
        {
            ElectronicEnergy = e0,
            Thermal = th0 with { ZeroPoint = zpe, Enthalpy = h - e0, Gibbs = g - e0, Source = $"{th0.Source}, Boltzmann ensemble of {selection.Included.Length} conformers" },
        }, use);
    }

    private static ThermalCorrection? Resolve(SpeciesRecord sp, EnergyModel m, ThermoOptions thermo, List<CheckReason> extra)
    {
        var t = thermo.TemperatureKelvin;
        switch (m.Thermal)
        {
            case ThermalSource.ElectronicOnly:
                return null;
            case ThermalSource.Reported:
                if (sp.Thermal is not { } r) return null;
                if (Math.Abs(r.TemperatureKelvin - t) > 0.01)
                    extra.Add(new(PathwayEnergyCodes.ThermalTemperatureNotModel, CheckSeverity.Failure,
                        $"{sp.Label}: its thermal corrections are for {F(r.TemperatureKelvin)} K but the energy model is at {F(t)} K; recompute them at {F(t)} K or compute them here."));
                if (r.StandardState == thermo.StandardState) return r;
                var shift = Thermochemistry.IdealGasThermo.StandardStateCorrection(r.TemperatureKelvin, r.StandardState, thermo.StandardState, thermo.ConcentrationMolPerL ?? 1.0);
                extra.Add(new(PathwayEnergyCodes.StandardStateConverted, CheckSeverity.Info,
                    $"{sp.Label}: Gibbs correction moved from {r.StandardState} to {thermo.StandardState} ({Signed(shift.KcalPerMol)} kcal/mol)."));
                return r with { Gibbs = r.Gibbs + shift, StandardState = thermo.StandardState };
            default:
                if (sp.Geometry is null || sp.FrequenciesCm1 is null)
                {
                    if (sp.Thermal is not null) return Resolve(sp, m with { Thermal = ThermalSource.Reported }, thermo, extra);
                    extra.Add(new(PathwayEnergyCodes.MissingFrequencies, CheckSeverity.Attention,
                        $"{sp.Label}: no geometry and frequencies, so its thermal corrections cannot be computed."));
                    return null;
                }
                ThermoResult result;
                try
                {
                    result = Thermochemistry.IdealGasThermo.Compute(sp.Geometry, sp.FrequenciesCm1, thermo with { SymmetryNumber = Math.Max(1, sp.SymmetryNumber) });
                }
                catch (ArgumentException ex)
                {
                    if (sp.Thermal is not null) return Resolve(sp, m with { Thermal = ThermalSource.Reported }, thermo, extra);
                    extra.Add(new(PathwayEnergyCodes.ThermochemistryFailed, CheckSeverity.Attention,
                        $"{sp.Label}: its thermal corrections cannot be computed from its geometry and frequencies ({ex.Message})."));
                    return null;
                }
                var level = sp.FrequencyLevel ?? sp.ElectronicLevel.GeometryLevel ?? sp.ElectronicLevel;
                return new ThermalCorrection(result.ZeroPointEnergy, result.EnthalpyCorrection, result.GibbsCorrection, level, t, thermo.StandardState,
                    $"computed ({thermo.Treatment})");
        }
    }

    private static string F(double x) => x.ToString("0.##", CultureInfo.InvariantCulture);

    private static string Signed(double x) => x.ToString("+0.00;−0.00", CultureInfo.InvariantCulture);
}
