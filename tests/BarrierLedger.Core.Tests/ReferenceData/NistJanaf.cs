namespace BarrierLedger.Core.Tests.ReferenceData;

/// <summary>
/// NIST-JANAF Thermochemical Tables (M. W. Chase Jr., J. Phys. Chem. Ref. Data, Monograph 9, 4th ed., 1998), ideal gas at
/// 298.15 K and p° = 1 bar. S° values as quoted in issue 3 (they match the tables); H°(298.15) − H°(0) values from memory.
/// </summary>
public static class NistJanaf
{
    public const string Source = "NIST-JANAF Tables, 4th ed. (1998)";
    public const string SourceFromMemory = "NIST-JANAF Tables, 4th ed. (1998), from memory";

    public const double ArgonEntropy = 154.845;
    /// <summary>Sackur–Tetrode is exact for a monatomic ideal gas; 0.05 J/(mol K) covers the isotope-mass (⁴⁰Ar vs 39.948) difference of 0.004.</summary>
    public const double ArgonEntropyTolerance = 0.05;

    public const double NitrogenEntropy = 191.609;
    public const double WaterEntropy = 188.834;
    public const double CarbonDioxideEntropy = 213.795;
    /// <summary>S°(298.15 K, 1 bar) of NH₃ 192.774, CH₄ 186.251, C₂H₄ 219.330 J/(mol K) (from memory).</summary>
    public const double AmmoniaEntropy = 192.774;
    public const double MethaneEntropy = 186.251;
    public const double EthyleneEntropy = 219.330;
    /// <summary>RRHO from experimental r_e and fundamentals within 0.5 J/(mol K): the rest is anharmonicity, centrifugal distortion
    /// and vibration–rotation coupling, which the tables include and RRHO does not.</summary>
    public const double PolyatomicEntropyTolerance = 0.5;

    /// <summary>H°(298.15 K) − H°(0 K) in kJ/mol: Ar 6.197, N₂ 8.670, H₂O 9.904, CO₂ 9.364 (from memory).</summary>
    public const double ArgonEnthalpyIncrement = 6.197;
    public const double NitrogenEnthalpyIncrement = 8.670;
    public const double WaterEnthalpyIncrement = 9.904;
    public const double CarbonDioxideEnthalpyIncrement = 9.364;
    /// <summary>0.05 kJ/mol, the same anharmonicity allowance.</summary>
    public const double EnthalpyIncrementTolerance = 0.05;
}
