using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Symmetry;
using BarrierLedger.Core.Tests.ReferenceData;
using BarrierLedger.Core.Tests.Support;
using BarrierLedger.Core.Thermochemistry;
using Thermo = BarrierLedger.Core.Thermochemistry.IdealGasThermo;

namespace BarrierLedger.Core.Tests.Symmetry;

/// <summary>
/// Standard entropies with the symmetry number found from the geometry, never given: RRHO from experimental structures and
/// fundamentals (<see cref="Spectroscopy"/>, from memory) against NIST-JANAF S°(298.15 K, 1 bar) within 0.5 J/(mol K)
/// (anharmonicity and rotation–vibration coupling, which the tables include and RRHO does not). With σ = 1 every one of them
/// would be off by R ln σ (5.8 to 20.7 J/(mol K)), so the check fails unless σ is found right.
/// </summary>
public class SymmetryNumberEntropyTests
{
    public static TheoryData<string, double> Cases => new()
    {
        { "H2O", NistJanaf.WaterEntropy },
        { "NH3", NistJanaf.AmmoniaEntropy },
        { "CH4", NistJanaf.MethaneEntropy },
        { "CO2", NistJanaf.CarbonDioxideEntropy },
        { "C2H4", NistJanaf.EthyleneEntropy },
    };

    private static (Molecule Molecule, double[] Frequencies) Input(string name) => name switch
    {
        "H2O" => (SymmetryReference.Water, Spectroscopy.H2OFundamentalsCm1),
        "NH3" => (SymmetryReference.Ammonia, Spectroscopy.NH3FundamentalsCm1),
        "CH4" => (SymmetryReference.Methane, Spectroscopy.CH4FundamentalsCm1),
        "CO2" => (SymmetryReference.CarbonDioxide, Spectroscopy.CO2FundamentalsCm1),
        "C2H4" => (SymmetryReference.Ethylene, Spectroscopy.C2H4FundamentalsCm1),
        _ => throw new ArgumentException(name, nameof(name)),
    };

    [Theory, MemberData(nameof(Cases))]
    public void StandardEntropy_WithDetectedSymmetryNumber_MatchesJanaf(string name, double janaf)
    {
        var (molecule, frequencies) = Input(name);
        var sigma = PointGroups.Detect(molecule).SymmetryNumber;
        var r = Thermo.Compute(molecule, frequencies, new ThermoOptions(StandardState: StandardState.Gas1Bar, SymmetryNumber: sigma));
        Close.Absolute(janaf, r.EntropyJoulePerMoleKelvin, NistJanaf.PolyatomicEntropyTolerance, $"S°({name}, 298.15 K, 1 bar) with σ = {sigma} detected",
            NistJanaf.Source + (name is "NH3" or "CH4" or "C2H4" ? ", from memory" : ""));
    }
}
