using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Tests.ReferenceData;

/// <summary>
/// CODATA 2018 values (E. Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021); NIST SP 961 (2019)), typed from the published tables.
/// Energy equivalents of one hartree: 27.211386245988 eV; 2.1947463136320e7 m⁻¹ = 219474.63136320 cm⁻¹; E_h N_A = 2625.4996394799 kJ/mol,
/// and with the thermochemical calorie (4.184 J, exact) 627.5094740631 kcal/mol. Relative tolerance 1e-9 (issue 3).
/// </summary>
public static class Codata2018
{
    public const string Source = "CODATA 2018, NIST SP 961";
    public const double RelativeTolerance = 1e-9;

    public static TheoryData<EnergyUnit, double> HartreeEquivalents => new()
    {
        { EnergyUnit.KcalPerMol, 627.5094740631 },
        { EnergyUnit.KJPerMol, 2625.4996394799 },
        { EnergyUnit.ElectronVolt, 27.211386245988 },
        { EnergyUnit.Wavenumber, 219474.63136320 },
    };

    /// <summary>Recommended (not exact) constants as published, with their last digits.</summary>
    public const double HartreeJoule = 4.3597447222071e-18;
    public const double BohrMetre = 5.29177210903e-11;
    public const double AtomicMassConstantKilogram = 1.66053906660e-27;

    /// <summary>Exact by the 2019 SI.</summary>
    public const double Planck = 6.62607015e-34;
    public const double Boltzmann = 1.380649e-23;
    public const double Avogadro = 6.02214076e23;
    public const double SpeedOfLight = 299792458.0;
    public const double ElementaryCharge = 1.602176634e-19;

    /// <summary>Molar gas constant R = 8.314462618… J mol⁻¹ K⁻¹ (exact, quoted to 10 digits).</summary>
    public const double GasConstant = 8.314462618;
}
