using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Kinetics;

/// <summary>
/// Boltzmann weighting of conformers or states with Gibbs energies G_i (per molecule, any common zero) at temperature T:
/// p_i = exp(−G_i/RT) / Σ_j exp(−G_j/RT) (McQuarrie, Statistical Mechanics, ch. 2). Energies are shifted by their minimum first,
/// so large absolute energies (hartree totals) do not overflow.
/// </summary>
public static class Boltzmann
{
    private const double R = PhysicalConstants.GasConstantJoulePerMoleKelvin;

    /// <summary>Populations p_i (sum 1), in input order.</summary>
    public static double[] Populations(IReadOnlyList<Energy> gibbsEnergies, double temperatureKelvin) =>
        Populations(gibbsEnergies, null, temperatureKelvin);

    /// <summary>
    /// Populations with degeneracies: p_i = g_i exp(−G_i/RT) / Σ_j g_j exp(−G_j/RT), where g_i counts the equivalent copies of
    /// conformer i that are not listed separately (2 for a chiral conformer of an achiral molecule listed without its mirror
    /// image, such as gauche butane; McQuarrie, Statistical Mechanics, ch. 2). The population of conformer i includes its copies.
    /// </summary>
    public static double[] Populations(IReadOnlyList<Energy> gibbsEnergies, IReadOnlyList<int>? degeneracies, double temperatureKelvin)
    {
        Validate(gibbsEnergies, temperatureKelvin, nameof(gibbsEnergies));
        ValidateDegeneracies(degeneracies, gibbsEnergies.Count);
        var rt = R * temperatureKelvin;
        var min = gibbsEnergies.Min();
        var w = gibbsEnergies.Select((g, i) => (degeneracies?[i] ?? 1) * Math.Exp(-(g - min).KJPerMol * 1000.0 / rt)).ToArray();
        var sum = w.Sum();
        for (var i = 0; i < w.Length; i++) w[i] /= sum;
        return w;
    }

    /// <summary>
    /// Free energy of the ensemble, G_ens = −RT ln Σ exp(−G_i/RT) = G_min − RT ln Σ exp(−(G_i − G_min)/RT); below G_min by at most
    /// RT ln n.
    /// </summary>
    public static Energy EnsembleFreeEnergy(IReadOnlyList<Energy> gibbsEnergies, double temperatureKelvin) =>
        EnsembleFreeEnergy(gibbsEnergies, null, temperatureKelvin);

    /// <summary>
    /// Free energy of the ensemble with degeneracies, G_ens = −RT ln Σ g_i exp(−G_i/RT) (see
    /// <see cref="Populations(IReadOnlyList{Energy}, IReadOnlyList{int}?, double)"/>). Listing a conformer twice counts it twice: the
    /// ensemble comes out lower by up to RT ln 2 per repeated conformer, which is why duplicates are found first.
    /// </summary>
    public static Energy EnsembleFreeEnergy(IReadOnlyList<Energy> gibbsEnergies, IReadOnlyList<int>? degeneracies, double temperatureKelvin)
    {
        Validate(gibbsEnergies, temperatureKelvin, nameof(gibbsEnergies));
        ValidateDegeneracies(degeneracies, gibbsEnergies.Count);
        var rt = R * temperatureKelvin;
        var min = gibbsEnergies.Min();
        var sum = gibbsEnergies.Select((g, i) => (degeneracies?[i] ?? 1) * Math.Exp(-(g - min).KJPerMol * 1000.0 / rt)).Sum();
        return min - Energy.FromKJPerMol(rt * Math.Log(sum) / 1000.0);
    }

    private static void ValidateDegeneracies(IReadOnlyList<int>? degeneracies, int count)
    {
        if (degeneracies is null) return;
        if (degeneracies.Count != count)
            throw new ArgumentException($"{degeneracies.Count} degeneracies for {count} energies.", nameof(degeneracies));
        for (var i = 0; i < count; i++)
            if (degeneracies[i] < 1) throw new ArgumentException($"Degeneracy {i + 1} must be 1 or more, got {degeneracies[i]}.", nameof(degeneracies));
    }

    /// <summary>
    /// Effective barrier over conformer ensembles of reactant and transition state (Curtin–Hammett / Winstein–Holness conditions:
    /// conformers interconvert faster than they react): ΔG‡_eff = G_ens(TS conformers) − G_ens(reactant conformers).
    /// </summary>
    public static Energy EffectiveBarrier(IReadOnlyList<Energy> reactantConformers, IReadOnlyList<Energy> transitionStateConformers, double temperatureKelvin) =>
        EnsembleFreeEnergy(transitionStateConformers, temperatureKelvin) - EnsembleFreeEnergy(reactantConformers, temperatureKelvin);

    /// <summary>Boltzmann-weighted average of <paramref name="values"/> with weights from <paramref name="gibbsEnergies"/>.</summary>
    public static double WeightedAverage(IReadOnlyList<double> values, IReadOnlyList<Energy> gibbsEnergies, double temperatureKelvin)
    {
        if (values.Count != gibbsEnergies.Count)
            throw new ArgumentException($"{values.Count} values for {gibbsEnergies.Count} energies.", nameof(values));
        var p = Populations(gibbsEnergies, temperatureKelvin);
        return p.Select((w, i) => w * values[i]).Sum();
    }

    private static void Validate(IReadOnlyList<Energy> energies, double temperatureKelvin, string name)
    {
        ArgumentNullException.ThrowIfNull(energies, name);
        if (energies.Count == 0) throw new ArgumentException("At least one energy is needed.", name);
        for (var i = 0; i < energies.Count; i++)
            if (!double.IsFinite(energies[i].Hartree)) throw new ArgumentException($"Energy {i + 1} is not finite.", name);
        if (!(temperatureKelvin > 0) || !double.IsFinite(temperatureKelvin))
            throw new ArgumentException($"Temperature must be positive and finite, got {temperatureKelvin} K.", nameof(temperatureKelvin));
    }
}
