using System.Collections.Immutable;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Kinetics;

/// <summary>One of several competing channels: a saddle point leading to its own product from a common pool of states.</summary>
/// <param name="Label">The channel or its product, e.g. "TS-R → (R)-P".</param>
/// <param name="SaddleGibbs">G of the saddle point on a zero shared by all channels (e.g. relative to the common reactant).</param>
/// <param name="Kappa">Tunnelling κ of the channel (1 unless known).</param>
/// <param name="UncertaintyKcalPerMol">σ of the saddle point's level of theory (see <see cref="EnergyLevel.UncertaintyKcalPerMol"/>); 0 for none set.</param>
public sealed record CompetingChannel(string Label, Energy SaddleGibbs, double Kappa = 1.0, double UncertaintyKcalPerMol = 0.0);

/// <summary>The fraction of product a channel gives.</summary>
public sealed record ChannelShare(CompetingChannel Channel, double Fraction);

/// <summary>Product distribution of competing channels under kinetic (Curtin–Hammett) control.</summary>
/// <param name="Shares">Each channel's share of the product, in input order (they sum to 1).</param>
/// <param name="Major">Channel giving the most product.</param>
/// <param name="Minor">The runner-up.</param>
/// <param name="DeltaDeltaG">ΔΔG‡ = G‡(minor) − G‡(major) ≥ 0 when κ are equal.</param>
/// <param name="Ratio">major : minor product ratio, with its interval from the two saddle points' σ.</param>
/// <param name="EnantiomericExcess">For enantiomeric channels, ee = (r − 1)/(r + 1) of the major enantiomer, with its interval; else null.</param>
/// <param name="TemperatureKelvin">T used.</param>
/// <param name="Conditions">The conditions under which these numbers hold, in words.</param>
/// <param name="Sentence">One-sentence answer.</param>
public sealed record SelectivityResult(
    ImmutableArray<ChannelShare> Shares, CompetingChannel Major, CompetingChannel Minor, Energy DeltaDeltaG, UncertainValue Ratio,
    UncertainValue? EnantiomericExcess, double TemperatureKelvin, string Conditions, string Sentence);

/// <summary>
/// Selectivity of competing channels from ΔΔG‡ under Curtin–Hammett conditions (J. I. Seeman, Chem. Rev. 1983, 83, 83): when the
/// states that lead to the saddle points interconvert much faster than any of them reacts, and no product converts back
/// (kinetic control), each channel's share is proportional to κᵢ exp(−G‡ᵢ/RT), G‡ᵢ the saddle point's Gibbs energy on a common
/// zero, so the ratio of two products is (κ₁/κ₂) exp(−(G‡₁ − G‡₂)/RT) whatever the populations of the states before them. For
/// enantiomeric channels ee = (r − 1)/(r + 1) with r the major : minor ratio. The ratio's interval uses
/// σ(ΔΔG‡) = √((σ₁² + σ₂²)/2) (<see cref="RateUncertainty.DifferenceSigma"/>).
/// </summary>
public static class Selectivity
{
    private const double R = PhysicalConstants.GasConstantJoulePerMoleKelvin;

    /// <summary>The conditions in words, shown with every selectivity.</summary>
    public const string CurtinHammettConditions =
        "Curtin–Hammett conditions: the states before these saddle points interconvert much faster than any of them reacts, " +
        "and the products do not convert back (kinetic control); the ratio then depends only on the saddle points' Gibbs energies.";

    /// <summary>Product shares, ratio and (for enantiomeric channels) ee; see the class summary for formulas and source.</summary>
    public static SelectivityResult Compute(IReadOnlyList<CompetingChannel> channels, double temperatureKelvin, bool enantiomeric = false, double confidenceLevel = 0.95)
    {
        ArgumentNullException.ThrowIfNull(channels);
        if (channels.Count < 2) throw new ArgumentException($"Selectivity needs at least two competing channels, got {channels.Count}.", nameof(channels));
        if (enantiomeric && channels.Count != 2)
            throw new ArgumentException($"Enantiomeric channels come in pairs; got {channels.Count}.", nameof(channels));
        if (!(temperatureKelvin > 0) || !double.IsFinite(temperatureKelvin))
            throw new ArgumentException($"Temperature must be positive, got {temperatureKelvin} K.", nameof(temperatureKelvin));
        for (var i = 0; i < channels.Count; i++)
        {
            var c = channels[i] ?? throw new ArgumentException($"Channel {i + 1} is null.", nameof(channels));
            if (!double.IsFinite(c.SaddleGibbs.Hartree)) throw new ArgumentException($"Channel '{c.Label}' has an energy that is not finite.", nameof(channels));
            if (!(c.Kappa > 0) || !double.IsFinite(c.Kappa)) throw new ArgumentException($"Channel '{c.Label}' has κ = {c.Kappa}; it must be positive.", nameof(channels));
            if (!(c.UncertaintyKcalPerMol >= 0)) throw new ArgumentException($"Channel '{c.Label}' has a negative uncertainty.", nameof(channels));
        }
        var rt = R * temperatureKelvin;
        var lowest = channels.Min(c => c.SaddleGibbs.KJPerMol);
        var weights = channels.Select(c => c.Kappa * Math.Exp(-(c.SaddleGibbs.KJPerMol - lowest) * 1000.0 / rt)).ToArray();
        var total = weights.Sum();
        var shares = channels.Select((c, i) => new ChannelShare(c, weights[i] / total)).ToImmutableArray();
        var order = Enumerable.Range(0, channels.Count).OrderByDescending(i => weights[i]).ToArray();
        var (major, minor) = (channels[order[0]], channels[order[1]]);
        var ratio = weights[order[0]] / weights[order[1]];
        var sigma = RateUncertainty.DifferenceSigma(major.UncertaintyKcalPerMol, minor.UncertaintyKcalPerMol);
        var ratioInterval = RateUncertainty.Ratio(ratio, sigma, temperatureKelvin, confidenceLevel);
        UncertainValue? ee = null;
        if (enantiomeric)
            ee = new UncertainValue(Ee(ratio), Ee(ratioInterval.Lower), Ee(ratioInterval.Upper), confidenceLevel, sigma);
        var ddg = minor.SaddleGibbs - major.SaddleGibbs;
        var sentence = enantiomeric
            ? $"{major.Label} is favoured: {Microkinetics.Format.Sig(ratio)} : 1, ee {Microkinetics.Format.Percent(ee!.Value)}"
            : $"{major.Label} is favoured over {minor.Label} by {Microkinetics.Format.Sig(ratio)} : 1";
        sentence += $" at {temperatureKelvin:0} K (ΔΔG‡ = {ddg.KcalPerMol:0.0} kcal/mol)";
        sentence += sigma > 0
            ? $"; {Microkinetics.Format.Percent(confidenceLevel)} interval of the ratio {Microkinetics.Format.Sig(ratioInterval.Lower)} to {Microkinetics.Format.Sig(ratioInterval.Upper)}."
            : $"; {UncertainValue.NotSet}.";
        return new SelectivityResult(shares, major, minor, ddg, ratioInterval, ee, temperatureKelvin, CurtinHammettConditions, sentence);
    }

    private static double Ee(double ratio) => (ratio - 1.0) / (ratio + 1.0);
}
