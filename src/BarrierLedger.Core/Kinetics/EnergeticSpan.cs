using System.Collections.Immutable;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Kinetics;

/// <summary>One state of a catalytic cycle: a label (e.g. "INT2", "TS3"), its Gibbs energy relative to any common zero, and its kind.</summary>
public sealed record CycleState(string Label, Energy Gibbs, StateKind Kind);

/// <summary>Degree of TOF control X_TOF of one state (Kozuch and Shaik 2011), between 0 and 1; they sum to 1 over each kind.</summary>
public sealed record DegreeOfControl(CycleState State, double Degree);

/// <summary>
/// Result of <see cref="EnergeticSpan.Analyze"/>.
/// </summary>
/// <param name="Tdts">TOF-determining transition state.</param>
/// <param name="Tdi">TOF-determining intermediate.</param>
/// <param name="EnergeticSpanEnergy">δE = T_TDTS − I_TDI if the TDTS comes after the TDI, T_TDTS − I_TDI + ΔG_r if before.</param>
/// <param name="TdtsAfterTdi">Whether the TDTS comes after the TDI in cycle order.</param>
/// <param name="TurnoverFrequencyPerSecond">TOF from the full energetic-span expression, s⁻¹ (negative if the cycle is endergonic).</param>
/// <param name="ApproximateTurnoverFrequencyPerSecond">(k_B T/h) exp(−δE/RT), s⁻¹.</param>
/// <param name="TransitionStateControl">X_TOF of every transition state, in cycle order.</param>
/// <param name="IntermediateControl">X_TOF of every intermediate, in cycle order.</param>
/// <param name="ReactionEnergy">ΔG_r of one turnover (negative when exergonic).</param>
/// <param name="TemperatureKelvin">Temperature used.</param>
/// <param name="Notes">Plain-language warnings (endergonic cycle, close competitors).</param>
public sealed record EnergeticSpanResult(
    CycleState Tdts,
    CycleState Tdi,
    Energy EnergeticSpanEnergy,
    bool TdtsAfterTdi,
    double TurnoverFrequencyPerSecond,
    double ApproximateTurnoverFrequencyPerSecond,
    ImmutableArray<DegreeOfControl> TransitionStateControl,
    ImmutableArray<DegreeOfControl> IntermediateControl,
    Energy ReactionEnergy,
    double TemperatureKelvin,
    ImmutableArray<string> Notes);

/// <summary>
/// The energetic-span model of a catalytic cycle (S. Kozuch and S. Shaik, Acc. Chem. Res. 2011, 44, 101; J. Am. Chem. Soc. 2006,
/// 128, 3355). States are given in cycle order starting with the intermediate that begins a turnover; the cycle closes at that
/// intermediate shifted by ΔG_r. With T_i, I_j the Gibbs energies of transition states and intermediates:
/// TOF = (k_B T/h) (e^{−ΔG_r/RT} − 1) / Σ_ij e^{(T_i − I_j − δG′_ij)/RT}, δG′_ij = ΔG_r if T_i comes after I_j in the cycle, else 0.
/// Degrees of TOF control X_i = Σ_j e^{(T_i − I_j − δG′_ij)/RT} / Σ_ij (…), X_j likewise. The TDTS and TDI are the pair with the
/// largest span, δE = max over pairs of (T_i − I_j) for T after I and (T_i − I_j + ΔG_r) for T before I, and TOF ≈ (k_B T/h) e^{−δE/RT}.
/// </summary>
public static class EnergeticSpan
{
    private const double R = PhysicalConstants.GasConstantJoulePerMoleKelvin;

    /// <summary>Energetic-span analysis; see the class summary for formulas and source.</summary>
    public static EnergeticSpanResult Analyze(IReadOnlyList<CycleState> states, Energy reactionEnergy, double temperatureKelvin)
    {
        ArgumentNullException.ThrowIfNull(states);
        if (!(temperatureKelvin > 0) || !double.IsFinite(temperatureKelvin))
            throw new ArgumentException($"Temperature must be positive and finite, got {temperatureKelvin} K.", nameof(temperatureKelvin));
        if (!double.IsFinite(reactionEnergy.Hartree))
            throw new ArgumentException("Reaction energy must be finite.", nameof(reactionEnergy));
        if (states.Count < 2) throw new ArgumentException("A cycle needs at least one intermediate and one transition state.", nameof(states));
        for (var i = 0; i < states.Count; i++)
        {
            if (states[i] is null) throw new ArgumentException($"State {i + 1} is null.", nameof(states));
            if (!double.IsFinite(states[i].Gibbs.Hartree)) throw new ArgumentException($"State {i + 1} ({states[i].Label}) has a non-finite energy.", nameof(states));
        }
        if (states[0].Kind != StateKind.Minimum)
            throw new ArgumentException($"The cycle must start with the intermediate that begins a turnover; '{states[0].Label}' is a transition state.", nameof(states));
        var tsIndex = Enumerable.Range(0, states.Count).Where(i => states[i].Kind == StateKind.SaddlePoint).ToArray();
        var intIndex = Enumerable.Range(0, states.Count).Where(i => states[i].Kind == StateKind.Minimum).ToArray();
        if (tsIndex.Length == 0) throw new ArgumentException("The cycle has no transition state.", nameof(states));

        var rt = R * temperatureKelvin / 1000.0; // kJ/mol
        var dGr = reactionEnergy.KJPerMol;
        // Span of each pair in kJ/mol: T − I when T after I, T − I + ΔG_r when T before I. Exponents of the TOF sum are span − ΔG_r.
        var span = new double[tsIndex.Length, intIndex.Length];
        var best = double.NegativeInfinity;
        var (bi, bj) = (0, 0);
        for (var a = 0; a < tsIndex.Length; a++)
            for (var b = 0; b < intIndex.Length; b++)
            {
                var after = tsIndex[a] > intIndex[b];
                span[a, b] = states[tsIndex[a]].Gibbs.KJPerMol - states[intIndex[b]].Gibbs.KJPerMol + (after ? 0.0 : dGr);
                if (span[a, b] > best) { best = span[a, b]; (bi, bj) = (a, b); }
            }
        // Σ_ij e^{(span_ij − ΔG_r)/RT}, scaled by e^{−(best − ΔG_r)/RT} to stay finite.
        var weights = new double[tsIndex.Length, intIndex.Length];
        var total = 0.0;
        for (var a = 0; a < tsIndex.Length; a++)
            for (var b = 0; b < intIndex.Length; b++)
                total += weights[a, b] = Math.Exp((span[a, b] - best) / rt);
        // TOF = (k_B T/h)(e^{−ΔG_r/RT} − 1) e^{ΔG_r/RT} e^{−best/RT} / total = (k_B T/h)(1 − e^{ΔG_r/RT}) e^{−best/RT} / total
        var frequency = Eyring.FrequencyFactorPerSecond(temperatureKelvin);
        var tof = frequency * -ExpM1(dGr / rt) * Math.Exp(-best / rt) / total;
        var approx = frequency * Math.Exp(-best / rt);

        var tsControl = tsIndex.Select((i, a) => new DegreeOfControl(states[i], Enumerable.Range(0, intIndex.Length).Sum(b => weights[a, b]) / total)).ToImmutableArray();
        var intControl = intIndex.Select((j, b) => new DegreeOfControl(states[j], Enumerable.Range(0, tsIndex.Length).Sum(a => weights[a, b]) / total)).ToImmutableArray();

        var notes = ImmutableArray.CreateBuilder<string>();
        if (dGr >= 0)
            notes.Add($"The cycle is not exergonic (ΔG_r = {reactionEnergy.KcalPerMol:F2} kcal/mol): it does not turn over forwards, and the TOF is {(dGr == 0 ? "zero" : "negative")}.");
        var tdtsDegree = tsControl[bi].Degree;
        if (tdtsDegree < 0.8)
            notes.Add($"No single rate-determining transition state: {states[tsIndex[bi]].Label} controls only {tdtsDegree:P0} of the TOF.");
        var tdiDegree = intControl[bj].Degree;
        if (tdiDegree < 0.8)
            notes.Add($"No single rate-determining intermediate: {states[intIndex[bj]].Label} controls only {tdiDegree:P0} of the TOF.");

        return new EnergeticSpanResult(
            states[tsIndex[bi]], states[intIndex[bj]], Energy.FromKJPerMol(best), tsIndex[bi] > intIndex[bj],
            tof, approx, tsControl, intControl, reactionEnergy, temperatureKelvin, notes.ToImmutable());
    }

    private static double ExpM1(double x) => Math.Abs(x) < 1e-5 ? x + 0.5 * x * x : Math.Exp(x) - 1.0;
}
