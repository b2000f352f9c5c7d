namespace BarrierLedger.Core.Units;

/// <summary>
/// Physical constants, CODATA 2018 (Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021);
/// NIST SP 961 (2019)). Values marked exact are exact by the 2019 SI definition.
/// </summary>
public static class PhysicalConstants
{
    /// <summary>Planck constant h in J s (exact).</summary>
    public const double PlanckJouleSecond = 6.62607015e-34;

    /// <summary>Boltzmann constant k_B in J/K (exact).</summary>
    public const double BoltzmannJoulePerKelvin = 1.380649e-23;

    /// <summary>Avogadro constant N_A in 1/mol (exact).</summary>
    public const double AvogadroPerMole = 6.02214076e23;

    /// <summary>Speed of light in vacuum c in m/s (exact).</summary>
    public const double SpeedOfLightMetrePerSecond = 299792458.0;

    /// <summary>Elementary charge e in C (exact).</summary>
    public const double ElementaryChargeCoulomb = 1.602176634e-19;

    /// <summary>Molar gas constant R = N_A k_B in J/(mol K) (exact).</summary>
    public const double GasConstantJoulePerMoleKelvin = AvogadroPerMole * BoltzmannJoulePerKelvin;

    /// <summary>Hartree energy E_h in J, CODATA 2018 recommended: 4.3597447222071(85)e-18 J.</summary>
    public const double HartreeJoule = 4.3597447222071e-18;

    /// <summary>Bohr radius a_0 in m, CODATA 2018 recommended: 5.29177210903(80)e-11 m.</summary>
    public const double BohrMetre = 5.29177210903e-11;

    /// <summary>Bohr radius a_0 in Å.</summary>
    public const double BohrAngstrom = BohrMetre * 1e10;

    /// <summary>Atomic mass constant m_u in kg, CODATA 2018 recommended: 1.66053906660(50)e-27 kg.</summary>
    public const double AtomicMassConstantKilogram = 1.66053906660e-27;

    /// <summary>Thermochemical calorie in J (exact by definition).</summary>
    public const double ThermochemicalCalorieJoule = 4.184;

    /// <summary>Standard atmosphere in Pa (exact by definition).</summary>
    public const double StandardAtmospherePascal = 101325.0;

    /// <summary>Standard-state pressure of 1 bar in Pa (IUPAC).</summary>
    public const double BarPascal = 100000.0;
}
