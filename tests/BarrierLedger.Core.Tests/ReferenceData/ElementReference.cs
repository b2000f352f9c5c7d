namespace BarrierLedger.Core.Tests.ReferenceData;

/// <summary>
/// Independent element data for cross-checking <c>Elements</c>: the most abundant isotope (mass number and mass in Da) and the
/// Cordero 2008 covalent radius (Å) for every element H–Rn that has a naturally abundant isotope.
/// Source: Debian package python3-periodictable 1.6.0 (P. Kienzle, NIST; masses from AME2003, radii from Cordero et al.,
/// Dalton Trans. 2008, 2832), exported once with a one-off script. Tolerances: masses within 3×10⁻⁵ Da (the AME revisions
/// 2003 → 2016 are below that for every element here), radii exact to the 0.01 Å Cordero publishes.
/// </summary>
public static class ElementReference
{
    public const double IsotopeMassToleranceDa = 3e-5;
    public const double CovalentRadiusToleranceAngstrom = 1e-9;
    public const string Source = "python3-periodictable 1.6.0 (AME2003 masses, Cordero 2008 radii)";

    public static readonly (int Z, string Symbol, int MassNumber, double IsotopeMassDa, double CovalentRadiusAngstrom)[] MostAbundantIsotopes =
    [
        (1, "H", 1, 1.0078250321, 0.31),
        (2, "He", 4, 4.0026032497, 0.28),
        (3, "Li", 7, 7.016004, 1.28),
        (4, "Be", 9, 9.0121821, 0.96),
        (5, "B", 11, 11.0093055, 0.84),
        (6, "C", 12, 12.0, 0.76),
        (7, "N", 14, 14.0030740052, 0.71),
        (8, "O", 16, 15.9949146221, 0.66),
        (9, "F", 19, 18.9984032, 0.57),
        (10, "Ne", 20, 19.9924401759, 0.58),
        (11, "Na", 23, 22.98976967, 1.66),
        (12, "Mg", 24, 23.9850419, 1.41),
        (13, "Al", 27, 26.98153844, 1.21),
        (14, "Si", 28, 27.9769265327, 1.11),
        (15, "P", 31, 30.97376151, 1.07),
        (16, "S", 32, 31.97207069, 1.05),
        (17, "Cl", 35, 34.96885271, 1.02),
        (18, "Ar", 40, 39.962383123, 1.06),
        (19, "K", 39, 38.9637069, 2.03),
        (20, "Ca", 40, 39.9625912, 1.76),
        (21, "Sc", 45, 44.9559102, 1.7),
        (22, "Ti", 48, 47.9479471, 1.6),
        (23, "V", 51, 50.9439637, 1.53),
        (24, "Cr", 52, 51.9405119, 1.39),
        (25, "Mn", 55, 54.9380496, 1.39),
        (26, "Fe", 56, 55.9349421, 1.32),
        (27, "Co", 59, 58.9332002, 1.26),
        (28, "Ni", 58, 57.9353479, 1.24),
        (29, "Cu", 63, 62.9296011, 1.32),
        (30, "Zn", 64, 63.9291466, 1.22),
        (31, "Ga", 69, 68.925581, 1.22),
        (32, "Ge", 74, 73.9211782, 1.2),
        (33, "As", 75, 74.9215964, 1.19),
        (34, "Se", 80, 79.9165218, 1.2),
        (35, "Br", 79, 78.9183376, 1.2),
        (36, "Kr", 84, 83.911507, 1.16),
        (37, "Rb", 85, 84.9117893, 2.2),
        (38, "Sr", 88, 87.9056143, 1.95),
        (39, "Y", 89, 88.9058479, 1.9),
        (40, "Zr", 90, 89.9047037, 1.75),
        (41, "Nb", 93, 92.9063775, 1.64),
        (42, "Mo", 98, 97.9054078, 1.54),
        (44, "Ru", 102, 101.9043495, 1.46),
        (45, "Rh", 103, 102.905504, 1.42),
        (46, "Pd", 106, 105.903483, 1.39),
        (47, "Ag", 107, 106.905093, 1.45),
        (48, "Cd", 114, 113.9033581, 1.44),
        (49, "In", 115, 114.903878, 1.42),
        (50, "Sn", 120, 119.9021966, 1.39),
        (51, "Sb", 121, 120.903818, 1.39),
        (52, "Te", 130, 129.9062228, 1.38),
        (53, "I", 127, 126.904468, 1.39),
        (54, "Xe", 132, 131.9041545, 1.4),
        (55, "Cs", 133, 132.905447, 2.44),
        (56, "Ba", 138, 137.905241, 2.15),
        (57, "La", 139, 138.906348, 2.07),
        (58, "Ce", 140, 139.905434, 2.04),
        (59, "Pr", 141, 140.907648, 2.03),
        (60, "Nd", 142, 141.907719, 2.01),
        (62, "Sm", 152, 151.919728, 1.98),
        (63, "Eu", 153, 152.921226, 1.98),
        (64, "Gd", 158, 157.924101, 1.96),
        (65, "Tb", 159, 158.925343, 1.94),
        (66, "Dy", 164, 163.929171, 1.92),
        (67, "Ho", 165, 164.930319, 1.92),
        (68, "Er", 166, 165.93029, 1.89),
        (69, "Tm", 169, 168.934211, 1.9),
        (70, "Yb", 174, 173.9388581, 1.87),
        (71, "Lu", 175, 174.9407679, 1.87),
        (72, "Hf", 180, 179.9465488, 1.75),
        (73, "Ta", 181, 180.947996, 1.7),
        (74, "W", 184, 183.9509326, 1.62),
        (75, "Re", 187, 186.9557508, 1.51),
        (76, "Os", 192, 191.961479, 1.44),
        (77, "Ir", 193, 192.962924, 1.41),
        (78, "Pt", 195, 194.964774, 1.36),
        (79, "Au", 197, 196.966552, 1.36),
        (80, "Hg", 202, 201.970626, 1.32),
        (81, "Tl", 205, 204.974412, 1.45),
        (82, "Pb", 208, 207.976636, 1.46),
        (83, "Bi", 209, 208.980383, 1.48),
    ];

    /// <summary>
    /// IUPAC conventional standard atomic weights after the 2009–2019 revisions (CIAAW; from memory, cross-checked in part
    /// against the older values in python3-periodictable). Tolerance: exact to the digits given.
    /// </summary>
    public static readonly (string Symbol, double Weight)[] StandardAtomicWeights =
    [
        ("H", 1.008), ("C", 12.011), ("N", 14.007), ("O", 15.999), ("S", 32.06), ("Cl", 35.45), ("Ar", 39.95),
        ("Br", 79.904), ("Pd", 106.42), ("Pt", 195.084), ("I", 126.90447), ("Fe", 55.845),
    ];
}
