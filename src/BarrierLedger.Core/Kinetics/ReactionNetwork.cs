using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Kinetics;

/// <summary>A species of a network with its stoichiometric coefficient (a positive integer) on one side of an elementary step.</summary>
public sealed record StepTerm(string Species, int Coefficient = 1);

/// <summary>
/// One energy level of a network: a state of a pathway (a sum of species such as "cat + S", an intermediate, or a saddle point)
/// with its Gibbs energy relative to its pathway's zero at the network's reference temperature and standard state.
/// </summary>
/// <param name="Key">Name the steps refer to, unique in the network (e.g. "R1/TS2").</param>
/// <param name="Gibbs">G at <see cref="ReactionNetwork.ReferenceTemperatureKelvin"/>, relative to any zero shared with the levels it is compared with.</param>
/// <param name="Enthalpy">H on the same zero, or null; with it G(T) = H − T (H − G)/T_ref at other temperatures (ΔH and ΔS held constant).</param>
/// <param name="UncertaintyKcalPerMol">
/// Standard uncertainty (one standard deviation, kcal/mol) of an energy difference between two levels computed at this level's
/// level of theory, e.g. a barrier. The Monte Carlo shifts each level by an independent normal error of variance σ²/2, so a
/// barrier or reaction energy between two levels of equal σ has standard deviation σ. 0 means no uncertainty set.
/// </param>
public sealed record EnergyLevel(string Key, Energy Gibbs, Energy? Enthalpy = null, double UncertaintyKcalPerMol = 0.0);

/// <summary>How the rate constants of an elementary step are obtained.</summary>
public abstract record StepRate;

/// <summary>
/// Rate constants given directly, independent of temperature: forward k in (mol/L)^{1−m} s⁻¹ with m the sum of reactant
/// coefficients, reverse k likewise with the products (0 for an irreversible step).
/// </summary>
public sealed record FixedRates(double Forward, double Reverse = 0.0) : StepRate;

/// <summary>
/// Rate constants from the network's energy levels (transition-state theory): ΔG‡ = G(saddle point) − G(from) and
/// ΔG_r = G(to) − G(from); forward k_f = κ (k_B T/h) (c°)^{1−m} exp(−ΔG‡/RT) (<see cref="Eyring"/>), reverse k_r = k_f / K_c by
/// detailed balance with K_c = exp(−ΔG_r/RT) (c°)^{Δn}, Δn = Σ product coefficients − Σ reactant coefficients (IUPAC Green Book,
/// 3rd ed. 2007, §2.11: K_c = K° (c°)^{Σν}). A saddle point that lies below either of its minima is treated as barrierless
/// (ΔG‡ raised to max(0, ΔG_r), common practice, no source) and said so in the notes.
/// </summary>
/// <param name="From">Level of the minimum the reactants form (e.g. "cat + S").</param>
/// <param name="SaddlePoint">Level of the saddle point.</param>
/// <param name="To">Level of the minimum the products form.</param>
/// <param name="Tunnelling">κ of the step, evaluated at every temperature; null for κ = 1.</param>
public sealed record EyringRates(string From, string SaddlePoint, string To, TunnellingModel? Tunnelling = null) : StepRate;

/// <summary>An elementary step of a mass-action network: reactants → products, with its rate constants.</summary>
public sealed record ElementaryStep(string Label, IReadOnlyList<StepTerm> Reactants, IReadOnlyList<StepTerm> Products, StepRate Rate)
{
    /// <summary>Molecularity of the forward step m = Σ reactant coefficients.</summary>
    public int ForwardOrder => Reactants.Sum(r => r.Coefficient);

    /// <summary>Molecularity of the reverse step = Σ product coefficients.</summary>
    public int ReverseOrder => Products.Sum(p => p.Coefficient);
}

/// <summary>
/// The standard state the energy levels refer to, as a concentration c° in mol/L at temperature T: the solution's c° (1 mol/L
/// unless given) or, for a gas standard state, p°/(RT).
/// </summary>
public sealed record StandardConcentration(
    StandardState State = StandardState.Solution1Molar, double PressurePascal = PhysicalConstants.StandardAtmospherePascal, double? SolutionMolPerL = null)
{
    /// <summary>c° in mol/L at <paramref name="temperatureKelvin"/>.</summary>
    public double MolPerL(double temperatureKelvin) =>
        Thermochemistry.IdealGasThermo.ReferencePressurePascal(temperatureKelvin, State, PressurePascal, SolutionMolPerL)
        / (PhysicalConstants.GasConstantJoulePerMoleKelvin * temperatureKelvin) / 1000.0;

    /// <summary>"1 mol/L", "1 atm" or "1 bar".</summary>
    public string Describe() => State switch
    {
        StandardState.Solution1Molar => $"{SolutionMolPerL ?? 1.0:0.###} mol/L",
        StandardState.Gas1Bar => "1 bar",
        _ => Math.Abs(PressurePascal - PhysicalConstants.StandardAtmospherePascal) < 1e-6 ? "1 atm" : $"{PressurePascal:0.###} Pa",
    };
}

/// <summary>
/// A mass-action network: species (concentrations in mol/L), elementary steps and the energy levels their rate constants come
/// from. Rate of a step r = k_f Π [Rᵢ]^{νᵢ} − k_r Π [Pⱼ]^{νⱼ}; d[X]/dt = Σ_steps (ν_X,products − ν_X,reactants) r.
/// </summary>
/// <param name="Species">Species labels, unique.</param>
/// <param name="Steps">Elementary steps over those species.</param>
/// <param name="Levels">Energy levels that <see cref="EyringRates"/> steps refer to.</param>
/// <param name="ReferenceTemperatureKelvin">Temperature the levels' G were derived at.</param>
/// <param name="StandardState">Standard state of the levels' G (defines c° for steps whose molecularity is not 1).</param>
public sealed record ReactionNetwork(
    IReadOnlyList<string> Species,
    IReadOnlyList<ElementaryStep> Steps,
    IReadOnlyList<EnergyLevel>? Levels = null,
    double ReferenceTemperatureKelvin = 298.15,
    StandardConcentration? StandardState = null)
{
    /// <summary>The standard state in force (1 mol/L solution when none is given).</summary>
    public StandardConcentration StandardStateOrDefault => StandardState ?? new StandardConcentration();

    /// <summary>The energy levels, or none.</summary>
    public IReadOnlyList<EnergyLevel> LevelsOrEmpty => Levels ?? [];

    /// <summary>
    /// Throws <see cref="ArgumentException"/> naming the step, species or level for: no species, repeated labels, a step with
    /// an unknown species or level, a non-positive coefficient, a molecularity above 3, rate constants that are negative or not
    /// finite, or an energy that is not finite.
    /// </summary>
    public void Validate()
    {
        if (Species is null || Species.Count == 0) throw new ArgumentException("The network has no species.", nameof(Species));
        if (Steps is null || Steps.Count == 0) throw new ArgumentException("The network has no steps.", nameof(Steps));
        var species = new HashSet<string>(StringComparer.Ordinal);
        foreach (var s in Species)
        {
            if (string.IsNullOrWhiteSpace(s)) throw new ArgumentException("A species has an empty label.", nameof(Species));
            if (!species.Add(s)) throw new ArgumentException($"Species '{s}' is listed twice.", nameof(Species));
        }
        var levels = new Dictionary<string, EnergyLevel>(StringComparer.Ordinal);
        foreach (var l in LevelsOrEmpty)
        {
            if (l is null || string.IsNullOrWhiteSpace(l.Key)) throw new ArgumentException("An energy level has no key.", nameof(Levels));
            if (!levels.TryAdd(l.Key, l)) throw new ArgumentException($"Energy level '{l.Key}' is listed twice.", nameof(Levels));
            if (!double.IsFinite(l.Gibbs.Hartree)) throw new ArgumentException($"Energy level '{l.Key}' has a Gibbs energy that is not finite.", nameof(Levels));
            if (l.Enthalpy is { } h && !double.IsFinite(h.Hartree)) throw new ArgumentException($"Energy level '{l.Key}' has an enthalpy that is not finite.", nameof(Levels));
            if (!(l.UncertaintyKcalPerMol >= 0) || !double.IsFinite(l.UncertaintyKcalPerMol))
                throw new ArgumentException($"Energy level '{l.Key}' has an uncertainty of {l.UncertaintyKcalPerMol} kcal/mol; it must be zero or positive.", nameof(Levels));
        }
        if (!(ReferenceTemperatureKelvin > 0) || !double.IsFinite(ReferenceTemperatureKelvin))
            throw new ArgumentException($"Reference temperature must be positive, got {ReferenceTemperatureKelvin} K.", nameof(ReferenceTemperatureKelvin));
        var labels = new HashSet<string>(StringComparer.Ordinal);
        for (var i = 0; i < Steps.Count; i++)
        {
            var step = Steps[i] ?? throw new ArgumentException($"Step {i + 1} is null.", nameof(Steps));
            var name = string.IsNullOrWhiteSpace(step.Label) ? $"step {i + 1}" : $"step '{step.Label}'";
            if (!string.IsNullOrWhiteSpace(step.Label) && !labels.Add(step.Label))
                throw new ArgumentException($"Step label '{step.Label}' is used twice.", nameof(Steps));
            if (step.Reactants is null || step.Reactants.Count == 0) throw new ArgumentException($"{name} has no reactants.", nameof(Steps));
            if (step.Products is null) throw new ArgumentException($"{name} has no product list.", nameof(Steps));
            foreach (var t in step.Reactants.Concat(step.Products))
            {
                if (t is null || !species.Contains(t.Species))
                    throw new ArgumentException($"{name} names species '{t?.Species}', which is not in the network.", nameof(Steps));
                if (t.Coefficient < 1) throw new ArgumentException($"{name}: species '{t.Species}' has coefficient {t.Coefficient}; coefficients must be positive.", nameof(Steps));
            }
            if (step.ForwardOrder > 3 || step.ReverseOrder > 3)
                throw new ArgumentException($"{name} has molecularity {step.ForwardOrder} forwards and {step.ReverseOrder} backwards; elementary steps have at most 3.", nameof(Steps));
            switch (step.Rate)
            {
                case FixedRates f:
                    if (!(f.Forward >= 0) || !double.IsFinite(f.Forward) || !(f.Reverse >= 0) || !double.IsFinite(f.Reverse))
                        throw new ArgumentException($"{name}: rate constants must be zero or positive and finite, got {f.Forward} and {f.Reverse}.", nameof(Steps));
                    break;
                case EyringRates e:
                    foreach (var key in new[] { e.From, e.SaddlePoint, e.To })
                        if (key is null || !levels.ContainsKey(key))
                            throw new ArgumentException($"{name} refers to energy level '{key}', which is not in the network.", nameof(Steps));
                    break;
                default:
                    throw new ArgumentException($"{name} has no rate.", nameof(Steps));
            }
        }
    }
}
