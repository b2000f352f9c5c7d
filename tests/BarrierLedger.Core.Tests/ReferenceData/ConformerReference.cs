namespace BarrierLedger.Core.Tests.ReferenceData;

/// <summary>Outside reference values for conformer ensembles, each with its source and tolerance.</summary>
public static class ConformerReference
{
    /// <summary>
    /// Gauche butane lies 3.8 kJ/mol (0.9 kcal/mol) above anti (McMurry, Organic Chemistry, ch. 3, "Conformations of other alkanes",
    /// the gauche interaction energy; from memory). Gauche has two mirror-image forms (±60°), so its degeneracy is 2.
    /// </summary>
    public const double ButaneGaucheAboveAntiKJPerMol = 3.8;

    /// <summary>
    /// Hand computation at 298.15 K from that value (RT = 8.314462618 × 298.15 J/mol = 2.478957 kJ/mol, CODATA 2018 R):
    /// x = exp(−3.8/2.478957) = 0.215908; p(anti) = 1/(1 + 2x) = 0.698414; p(gauche, both forms) = 2x/(1 + 2x) = 0.301586;
    /// G_ens − G_anti = −RT ln(1 + 2x) = −0.889806 kJ/mol. Checked with an independent general-purpose computation (Python 3 math
    /// module). Tolerance 1e-6 (six digits given).
    /// </summary>
    public const double ButaneAntiPopulation298 = 0.698414;
    public const double ButaneGauchePopulation298 = 0.301586;
    public const double ButaneEnsembleBelowAntiKJPerMol = -0.889806;
    public const double ButaneTolerance = 1e-6;

    /// <summary>
    /// The common textbook statement that butane is about 70 % anti and 30 % gauche at room temperature (conformational analysis
    /// of butane; from memory): ± 0.02.
    /// </summary>
    public const double ButaneAntiRoughly = 0.70;
    public const double ButaneRoughTolerance = 0.02;

    /// <summary>
    /// Carbon-frame RMSD of butane (C–C 1.53 Å, C–C–C 112°) at dihedral 65° against 180°, after optimal superposition and the better
    /// of the two carbon numberings (C1–C4 and C4–C1): 0.6807687140 Å; of +65° against −65°: 0.4895779074 Å. Independent
    /// general-purpose computation: NumPy 1.24.2 (numpy.linalg.svd, Kabsch with the determinant correction) on the same
    /// internal-coordinate construction, both numberings tried by brute force. Tolerance 1e-9 Å.
    /// </summary>
    public const double ButaneAntiGaucheCarbonRmsd = 0.6807687140;
    public const double ButaneGaucheMirrorPairCarbonRmsd = 0.4895779074;
    public const double RmsdTolerance = 1e-9;
}
