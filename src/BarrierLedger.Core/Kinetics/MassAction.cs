using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Kinetics;

/// <summary>
/// Temperature during a simulation: constant, or a linear ramp T(t) = T₀ + β t that holds at <see cref="FinalKelvin"/> once it
/// gets there.
/// </summary>
/// <param name="StartKelvin">T₀ in K.</param>
/// <param name="RampKelvinPerSecond">β in K/s (0 for an isothermal run; negative to cool).</param>
/// <param name="FinalKelvin">Temperature at which the ramp stops, or null to ramp to the end of the run.</param>
public sealed record TemperatureProgram(double StartKelvin, double RampKelvinPerSecond = 0.0, double? FinalKelvin = null)
{
    /// <summary>A constant temperature.</summary>
    public static TemperatureProgram Isothermal(double kelvin) => new(kelvin);

    /// <summary>True when the temperature never changes.</summary>
    public bool IsIsothermal => RampKelvinPerSecond == 0.0;

    /// <summary>Time in s at which the ramp reaches <see cref="FinalKelvin"/>, or null if it never stops.</summary>
    public double? HoldTimeSeconds => IsIsothermal || FinalKelvin is not { } f ? null : (f - StartKelvin) / RampKelvinPerSecond;

    /// <summary>T(t) in K.</summary>
    public double At(double timeSeconds)
    {
        if (IsIsothermal) return StartKelvin;
        if (HoldTimeSeconds is { } hold && timeSeconds >= hold) return FinalKelvin!.Value;
        return StartKelvin + RampKelvinPerSecond * timeSeconds;
    }

    /// <summary>dT/dt in K/s at t (0 once the ramp holds).</summary>
    public double SlopeAt(double timeSeconds) =>
        IsIsothermal || (HoldTimeSeconds is { } hold && timeSeconds >= hold) ? 0.0 : RampKelvinPerSecond;

    /// <summary>Throws <see cref="ArgumentException"/> for a temperature that is not positive or a ramp that moves away from its final value.</summary>
    public void Validate()
    {
        if (!(StartKelvin > 0) || !double.IsFinite(StartKelvin))
            throw new ArgumentException($"Start temperature must be positive, got {StartKelvin} K.", nameof(StartKelvin));
        if (!double.IsFinite(RampKelvinPerSecond)) throw new ArgumentException("The ramp rate must be finite.", nameof(RampKelvinPerSecond));
        if (FinalKelvin is { } f)
        {
            if (!(f > 0) || !double.IsFinite(f)) throw new ArgumentException($"Final temperature must be positive, got {f} K.", nameof(FinalKelvin));
            if (!IsIsothermal && Math.Sign(f - StartKelvin) != Math.Sign(RampKelvinPerSecond))
                throw new ArgumentException($"A ramp of {RampKelvinPerSecond} K/s from {StartKelvin} K never reaches {f} K.", nameof(FinalKelvin));
        }
    }

    /// <summary>Lowest temperature reached over [0, t_end] (the run must stay above 0 K).</summary>
    public double MinimumUpTo(double endSeconds) => Math.Min(At(0), At(endSeconds));
}

/// <summary>Rate constants of one step at one temperature, in (mol/L)^{1−m} s⁻¹, with what they came from.</summary>
/// <param name="Label">Step label.</param>
/// <param name="Forward">k_f.</param>
/// <param name="Reverse">k_r (0 for an irreversible step).</param>
/// <param name="ForwardUnit">"s⁻¹", "M⁻¹ s⁻¹" or "M⁻² s⁻¹".</param>
/// <param name="ReverseUnit">Unit of k_r.</param>
/// <param name="TemperatureKelvin">T at which they hold.</param>
/// <param name="GibbsBarrier">ΔG‡ used (after raising a negative barrier to max(0, ΔG_r)), null for given rate constants.</param>
/// <param name="GibbsReactionEnergy">ΔG_r used, null for given rate constants.</param>
/// <param name="Kappa">Tunnelling κ used.</param>
/// <param name="BarrierRaised">Whether the saddle point lay below one of its minima and the barrier was raised.</param>
public sealed record StepRateConstants(
    string Label, double Forward, double Reverse, string ForwardUnit, string ReverseUnit, double TemperatureKelvin,
    Energy? GibbsBarrier, Energy? GibbsReactionEnergy, double Kappa, bool BarrierRaised);

/// <summary>
/// A <see cref="ReactionNetwork"/> turned into arrays: species and level indices, stoichiometry, and the rule that gives each
/// step's k_f and k_r at a temperature (optionally with every level shifted, for the Monte Carlo).
/// </summary>
internal sealed class CompiledNetwork
{
    private const double R = PhysicalConstants.GasConstantJoulePerMoleKelvin;

    public readonly ReactionNetwork Network;
    public readonly int SpeciesCount;
    public readonly int StepCount;
    public readonly Dictionary<string, int> SpeciesIndex;
    // Each side of a step as three factor slots (a coefficient of 2 fills two slots; unused slots hold SpeciesCount, the index of
    // a constant 1 appended to the concentrations): the rate of a side is k · Y[f₀] · Y[f₁] · Y[f₂].
    public readonly int[] ForwardFactors, ReverseFactors;
    // Species each step changes, with their net coefficients, for step s at NetStart[s] .. NetStart[s + 1] − 1.
    public readonly int[] NetStart, NetSpecies;
    public readonly double[] NetCoefficient;
    // Per step: -1 for fixed rates, else level indices.
    private readonly int[] _from, _saddle, _to;
    private readonly double[] _fixedForward, _fixedReverse;
    private readonly TunnellingModel?[] _tunnelling;
    public readonly double[] LevelGibbsJoule, LevelEnthalpyJoule, LevelSigmaKcal;
    public readonly string[] LevelKeys;
    public readonly double ReferenceTemperature;
    private readonly StandardConcentration _standard;
    private readonly int[] _forwardOrder, _reverseOrder;

    public CompiledNetwork(ReactionNetwork network)
    {
        ArgumentNullException.ThrowIfNull(network);
        network.Validate();
        Network = network;
        SpeciesCount = network.Species.Count;
        StepCount = network.Steps.Count;
        SpeciesIndex = network.Species.Select((s, i) => (s, i)).ToDictionary(x => x.s, x => x.i, StringComparer.Ordinal);
        var levels = network.LevelsOrEmpty;
        var levelIndex = levels.Select((l, i) => (l.Key, i)).ToDictionary(x => x.Key, x => x.i, StringComparer.Ordinal);
        LevelKeys = [.. levels.Select(l => l.Key)];
        LevelGibbsJoule = [.. levels.Select(l => l.Gibbs.KJPerMol * 1000.0)];
        LevelEnthalpyJoule = [.. levels.Select(l => l.Enthalpy is { } h ? h.KJPerMol * 1000.0 : double.NaN)];
        LevelSigmaKcal = [.. levels.Select(l => l.UncertaintyKcalPerMol)];
        ReferenceTemperature = network.ReferenceTemperatureKelvin;
        _standard = network.StandardStateOrDefault;

        ForwardFactors = new int[3 * StepCount];
        ReverseFactors = new int[3 * StepCount];
        NetStart = new int[StepCount + 1];
        var netSpecies = new List<int>();
        var netCoefficient = new List<double>();
        _from = new int[StepCount]; _saddle = new int[StepCount]; _to = new int[StepCount];
        _fixedForward = new double[StepCount]; _fixedReverse = new double[StepCount];
        _tunnelling = new TunnellingModel?[StepCount];
        _forwardOrder = [.. network.Steps.Select(x => x.ForwardOrder)];
        _reverseOrder = [.. network.Steps.Select(x => x.ReverseOrder)];
        for (var s = 0; s < StepCount; s++)
        {
            var step = network.Steps[s];
            Factors(step.Reactants, ForwardFactors.AsSpan(3 * s, 3));
            Factors(step.Products, ReverseFactors.AsSpan(3 * s, 3));
            var net = new SortedDictionary<int, double>();
            foreach (var t in step.Reactants) net[SpeciesIndex[t.Species]] = net.GetValueOrDefault(SpeciesIndex[t.Species]) - t.Coefficient;
            foreach (var t in step.Products) net[SpeciesIndex[t.Species]] = net.GetValueOrDefault(SpeciesIndex[t.Species]) + t.Coefficient;
            foreach (var (i, nu) in net)
            {
                if (nu == 0) continue;
                netSpecies.Add(i);
                netCoefficient.Add(nu);
            }
            NetStart[s + 1] = netSpecies.Count;
            switch (step.Rate)
            {
                case FixedRates f:
                    _from[s] = _saddle[s] = _to[s] = -1;
                    _fixedForward[s] = f.Forward;
                    _fixedReverse[s] = f.Reverse;
                    break;
                case EyringRates e:
                    _from[s] = levelIndex[e.From];
                    _saddle[s] = levelIndex[e.SaddlePoint];
                    _to[s] = levelIndex[e.To];
                    _tunnelling[s] = e.Tunnelling;
                    break;
            }
        }
        NetSpecies = [.. netSpecies];
        NetCoefficient = [.. netCoefficient];
    }

    public bool IsFixed(int step) => _from[step] < 0;

    private SparsePattern? _pattern;
    private int[]? _forwardSlots, _reverseSlots;

    /// <summary>
    /// The Jacobian's pattern (entry (i, j) when species j is a reactant or product of a step that changes species i), its
    /// elimination order, and where each partial derivative goes: for step s, factor slot m of a side and the step's changed
    /// species p, slot[(3s + m) · 6 + p − NetStart[s]] (a step changes at most six species) (−1 for a constant factor). Computed once per network and shared by every
    /// simulation of it (the Monte Carlo's samples).
    /// </summary>
    public (SparsePattern Pattern, int[] ForwardSlots, int[] ReverseSlots) Sparsity
    {
        get
        {
            if (_pattern is null)
            {
                lock (NetStart)
                {
                    if (_pattern is null)
                    {
                        var index = new Dictionary<(int, int), int>();
                        var entries = new List<(int, int)>();
                        int[] Slots(int[] factors)
                        {
                            var slots = new int[18 * StepCount];
                            Array.Fill(slots, -1);
                            for (var s = 0; s < StepCount; s++)
                                for (var m = 0; m < 3; m++)
                                {
                                    var column = factors[3 * s + m];
                                    if (column == SpeciesCount) continue;
                                    for (var p = NetStart[s]; p < NetStart[s + 1]; p++)
                                    {
                                        var key = (NetSpecies[p], column);
                                        if (!index.TryGetValue(key, out var slot)) { slot = entries.Count; index[key] = slot; entries.Add(key); }
                                        slots[(3 * s + m) * 6 + p - NetStart[s]] = slot;
                                    }
                                }
                            return slots;
                        }
                        _forwardSlots = Slots(ForwardFactors);
                        _reverseSlots = Slots(ReverseFactors);
                        _pattern = SparsePattern.Analyze(SpeciesCount, entries);
                    }
                }
            }
            return (_pattern, _forwardSlots!, _reverseSlots!);
        }
    }

    public bool HasEnthalpies(int step) =>
        IsFixed(step) || (!double.IsNaN(LevelEnthalpyJoule[_from[step]]) && !double.IsNaN(LevelEnthalpyJoule[_saddle[step]]) && !double.IsNaN(LevelEnthalpyJoule[_to[step]]));

    public (int From, int Saddle, int To) LevelsOf(int step) => (_from[step], _saddle[step], _to[step]);

    // Validation keeps each side at three molecules or fewer.
    private void Factors(IReadOnlyList<StepTerm> terms, Span<int> slots)
    {
        slots.Fill(SpeciesCount);
        var k = 0;
        foreach (var t in terms.OrderBy(t => SpeciesIndex[t.Species]))
            for (var c = 0; c < t.Coefficient; c++) slots[k++] = SpeciesIndex[t.Species];
    }

    /// <summary>G of a level at T in J/mol with a shift: G(T) = H − T (H − G_ref)/T_ref, or G_ref when H is unknown.</summary>
    private double LevelGibbs(int level, double t, ReadOnlySpan<double> shiftJoule)
    {
        var g = LevelGibbsJoule[level];
        var h = LevelEnthalpyJoule[level];
        var value = double.IsNaN(h) || t == ReferenceTemperature ? g : h - t * (h - g) / ReferenceTemperature;
        return shiftJoule.IsEmpty ? value : value + shiftJoule[level];
    }

    /// <summary>k_f and k_r of every step at T, levels shifted by <paramref name="shiftJoule"/> (J/mol; empty for none).</summary>
    public void RateConstants(double t, ReadOnlySpan<double> shiftJoule, Span<double> forward, Span<double> reverse, Span<bool> raised = default)
    {
        var rt = R * t;
        var frequency = Eyring.FrequencyFactorPerSecond(t);
        var c0 = _standard.MolPerL(t);
        for (var s = 0; s < StepCount; s++)
        {
            if (_from[s] < 0)
            {
                forward[s] = _fixedForward[s];
                reverse[s] = _fixedReverse[s];
                if (!raised.IsEmpty) raised[s] = false;
                continue;
            }
            var gFrom = LevelGibbs(_from[s], t, shiftJoule);
            var barrier = LevelGibbs(_saddle[s], t, shiftJoule) - gFrom;
            var reaction = LevelGibbs(_to[s], t, shiftJoule) - gFrom;
            var floor = Math.Max(0.0, reaction);
            var isRaised = barrier < floor;
            if (isRaised) barrier = floor;
            if (!raised.IsEmpty) raised[s] = isRaised;
            var kappa = _tunnelling[s] is { } tm && !isRaised ? tm.Kappa(t) : 1.0;
            var m = _forwardOrder[s];
            var dn = _reverseOrder[s] - m;
            var kf = kappa * frequency * Math.Pow(c0, 1 - m) * Math.Exp(-barrier / rt);
            // k_r = k_f / K_c, K_c = exp(−ΔG_r/RT) (c°)^{Δn}
            var kr = kappa * frequency * Math.Pow(c0, 1 - m - dn) * Math.Exp(-(barrier - reaction) / rt);
            forward[s] = kf;
            reverse[s] = kr;
        }
    }

    /// <summary>Rate constants of every step at T as records, for tables.</summary>
    public IReadOnlyList<StepRateConstants> Describe(double t, ReadOnlySpan<double> shiftJoule = default)
    {
        var kf = new double[StepCount];
        var kr = new double[StepCount];
        var raised = new bool[StepCount];
        RateConstants(t, shiftJoule, kf, kr, raised);
        var list = new List<StepRateConstants>(StepCount);
        for (var s = 0; s < StepCount; s++)
        {
            var step = Network.Steps[s];
            Energy? barrier = null, reaction = null;
            var kappa = 1.0;
            if (_from[s] >= 0)
            {
                var gFrom = LevelGibbs(_from[s], t, shiftJoule);
                var r = LevelGibbs(_to[s], t, shiftJoule) - gFrom;
                var b = raised[s] ? Math.Max(0.0, r) : LevelGibbs(_saddle[s], t, shiftJoule) - gFrom;
                barrier = Energy.FromKJPerMol(b / 1000.0);
                reaction = Energy.FromKJPerMol(r / 1000.0);
                kappa = _tunnelling[s] is { } tm && !raised[s] ? tm.Kappa(t) : 1.0;
            }
            list.Add(new StepRateConstants(step.Label, kf[s], kr[s], Unit(step.ForwardOrder), Unit(step.ReverseOrder), t, barrier, reaction, kappa, raised[s]));
        }
        return list;
    }

    /// <summary>"s⁻¹", "M⁻¹ s⁻¹", "M⁻² s⁻¹" for a step of molecularity m (M = mol/L).</summary>
    public static string Unit(int molecularity) => molecularity switch
    {
        0 => "M s⁻¹",
        1 => "s⁻¹",
        2 => "M⁻¹ s⁻¹",
        3 => "M⁻² s⁻¹",
        _ => $"M^{1 - molecularity} s⁻¹",
    };
}

/// <summary>
/// The mass-action ODE system of a compiled network at a temperature program: d[X]/dt = Σ_s ν_Xs (k_f,s Π[R]^ν − k_r,s Π[P]^ν),
/// with its analytic Jacobian and, under a temperature ramp, ∂f/∂t = Σ_s ν_Xs (dk_f/dT Π[R]^ν − dk_r/dT Π[P]^ν) dT/dt
/// (dk/dT by central difference in T). The Jacobian is also given by its nonzero entries alone, in the network's
/// <see cref="CompiledNetwork.Sparsity"/> pattern.
/// </summary>
internal sealed class MassActionSystem : ISparseStiffSystem
{
    private readonly CompiledNetwork _net;
    private readonly TemperatureProgram _program;
    private readonly double[] _shift;
    private readonly double[] _kf, _kr, _kfPlus, _krPlus, _kfMinus, _krMinus;
    // Concentrations with a constant 1 appended (the unused factor slots point at it), and dense-Jacobian scratch.
    private readonly double[] _padded;
    private double[]? _values;
    private double _cachedTemperature = double.NaN;

    public MassActionSystem(CompiledNetwork network, TemperatureProgram program, double[]? levelShiftJoule = null)
    {
        _net = network;
        _program = program;
        _shift = levelShiftJoule ?? [];
        var n = network.StepCount;
        _kf = new double[n]; _kr = new double[n];
        _kfPlus = new double[n]; _krPlus = new double[n]; _kfMinus = new double[n]; _krMinus = new double[n];
        _padded = new double[network.SpeciesCount + 1];
    }

    public int Dimension => _net.SpeciesCount;

    /// <summary>Rate constants at time t (cached while T does not change).</summary>
    public (double[] Forward, double[] Reverse) ConstantsAt(double t)
    {
        var temperature = _program.At(t);
        if (temperature != _cachedTemperature)
        {
            _net.RateConstants(temperature, _shift, _kf, _kr);
            _cachedTemperature = temperature;
        }
        return (_kf, _kr);
    }

    public void Derivative(double t, ReadOnlySpan<double> y, Span<double> dydt)
    {
        var (kf, kr) = ConstantsAt(t);
        Rates(kf, kr, y, dydt);
    }

    // dydt = Σ_s ν_s (k_f,s Π[R] − k_r,s Π[P]).
    private void Rates(double[] kf, double[] kr, ReadOnlySpan<double> y, Span<double> dydt)
    {
        var c = Pad(y);
        var ff = _net.ForwardFactors;
        var rf = _net.ReverseFactors;
        var start = _net.NetStart;
        var species = _net.NetSpecies;
        var nu = _net.NetCoefficient;
        dydt.Clear();
        for (var s = 0; s < _net.StepCount; s++)
        {
            var f = 3 * s;
            var rate = kf[s] * (c[ff[f]] * c[ff[f + 1]] * c[ff[f + 2]]) - kr[s] * (c[rf[f]] * c[rf[f + 1]] * c[rf[f + 2]]);
            for (var p = start[s]; p < start[s + 1]; p++) dydt[species[p]] += nu[p] * rate;
        }
    }

    private double[] Pad(ReadOnlySpan<double> y)
    {
        y.CopyTo(_padded);
        _padded[^1] = 1.0;
        return _padded;
    }

    public void Jacobian(double t, ReadOnlySpan<double> y, double[] jacobian)
    {
        var entries = JacobianPattern.Entries;
        var values = _values ??= new double[entries.Count];
        JacobianValues(t, y, values);
        var n = _net.SpeciesCount;
        Array.Clear(jacobian);
        for (var e = 0; e < entries.Count; e++) jacobian[entries[e].Row + entries[e].Column * n] += values[e];
    }

    public SparsePattern JacobianPattern => _net.Sparsity.Pattern;

    // ∂/∂y_j of k Y[f₀] Y[f₁] Y[f₂] = k Σ over the slots m holding j of the product of the other two.
    public void JacobianValues(double t, ReadOnlySpan<double> y, Span<double> values)
    {
        var (kf, kr) = ConstantsAt(t);
        var (_, forwardSlots, reverseSlots) = _net.Sparsity;
        var c = Pad(y);
        values.Clear();
        for (var s = 0; s < _net.StepCount; s++)
        {
            AddPartials(s, kf[s], _net.ForwardFactors, forwardSlots, c, values);
            AddPartials(s, -kr[s], _net.ReverseFactors, reverseSlots, c, values);
        }
    }

    private void AddPartials(int s, double k, int[] factors, int[] slots, double[] c, Span<double> values)
    {
        if (k == 0.0) return;
        var f = 3 * s;
        var (a, b, d) = (c[factors[f]], c[factors[f + 1]], c[factors[f + 2]]);
        var start = _net.NetStart[s];
        var count = _net.NetStart[s + 1] - start;
        var nu = _net.NetCoefficient;
        for (var m = 0; m < 3; m++)
        {
            if (factors[f + m] == _net.SpeciesCount) continue;
            var partial = k * (m == 0 ? b * d : m == 1 ? a * d : a * b);
            if (partial == 0.0) continue;
            var slot = (f + m) * 6;
            for (var p = 0; p < count; p++) values[slots[slot + p]] += nu[start + p] * partial;
        }
    }

    public bool TimeDerivative(double t, ReadOnlySpan<double> y, Span<double> dfdt)
    {
        var slope = _program.SlopeAt(t);
        if (slope == 0.0) return false;
        var temperature = _program.At(t);
        var dT = 1e-3 * Math.Max(1.0, temperature * 1e-3);
        _net.RateConstants(temperature + dT, _shift, _kfPlus, _krPlus);
        _net.RateConstants(temperature - dT, _shift, _kfMinus, _krMinus);
        // ∂f/∂t = Σ_s ν_s (dk_f/dT Π[R] − dk_r/dT Π[P]) dT/dt: the rates with k replaced by dk/dt.
        for (var s = 0; s < _net.StepCount; s++)
        {
            _kfPlus[s] = (_kfPlus[s] - _kfMinus[s]) / (2 * dT) * slope;
            _krPlus[s] = (_krPlus[s] - _krMinus[s]) / (2 * dT) * slope;
        }
        Rates(_kfPlus, _krPlus, y, dfdt);
        return true;
    }
}
