namespace BarrierLedger.Demo.Tests.ReferenceData;

/// <summary>
/// Typical geometry of closed-shell organic molecules, used to check the hand-built demo structures.
/// Source: typical bond lengths of organic molecules as tabulated in organic-chemistry textbooks (from memory); ranges span
/// single to double bonds where both occur in the demo (C–C 1.33 to 1.57 Å, C–O 1.21 to 1.43 Å).
/// </summary>
internal static class StandardGeometry
{
    public const string Source = "typical bond lengths of organic molecules (textbook values, from memory)";

    /// <summary>Allowed bond length range (Å) by element pair, symbols in ordinal order.</summary>
    public static readonly IReadOnlyDictionary<string, (double Min, double Max)> BondLengthAngstrom = new Dictionary<string, (double, double)>
    {
        ["C-H"] = (1.07, 1.12),
        ["C-C"] = (1.32, 1.58), // up to the long C3–C4 bond of strained cyclobutene (1.57 Å)
        ["C-N"] = (1.44, 1.51),
        ["C-O"] = (1.19, 1.44),
        ["C-F"] = (1.37, 1.41),
        ["C-Cl"] = (1.76, 1.80),
        ["C-I"] = (2.12, 2.16),
        ["H-N"] = (1.00, 1.03),
        ["H-O"] = (0.95, 0.98),
        ["F-H"] = (0.91, 0.93),
    };

    /// <summary>
    /// Closest allowed approach (Å) of two atoms that are neither bonded nor share a bonded neighbour: twice the Bondi van der
    /// Waals radius of H (1.20 Å, from memory) is 2.4 Å; contacts down to ~2.0 Å occur in crowded saddle points, below 1.9 Å
    /// the structure is implausible. Common practice, no source.
    /// </summary>
    public const double MinNonbondedContactAngstrom = 1.9;

    /// <summary>Partly formed bonds at a C–C forming saddle point (Diels–Alder type): 2.0–2.3 Å. From memory.</summary>
    public static readonly (double Min, double Max) FormingCarbonCarbonAngstrom = (2.0, 2.3);
}
