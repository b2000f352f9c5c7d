using System.Collections.Immutable;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Units;
using BarrierLedger.Core.Vibrations;

namespace BarrierLedger.Core.Thermochemistry;

/// <summary>
/// Ideal-gas, rigid-rotor, harmonic-oscillator thermochemistry (McQuarrie, Statistical Mechanics, 1976, ch. 5–8; the same
/// standard formulas in Hill, An Introduction to Statistical Thermodynamics, 1960, ch. 8–9). Per mole, with isotope masses:
/// <list type="bullet">
/// <item>Translation (Sackur–Tetrode): S = R [ln((2π m k_B T/h²)^{3/2} k_B T/p) + 5/2], U = 3/2 RT, C_V = 3/2 R.</item>
/// <item>Rotation, linear: S = R [ln(T/(σ θ_r)) + 1], U = RT; non-linear: S = R [ln(√π T^{3/2}/(σ √(θ_A θ_B θ_C))) + 3/2],
/// U = 3/2 RT; θ = h²/(8π² I k_B).</item>
/// <item>Vibration: <see cref="HarmonicOscillator"/> (or <see cref="QuasiRrho"/>) summed over real modes; imaginary modes are left out and listed.</item>
/// <item>Electronic: S = R ln(2S+1) from the spin multiplicity, U = 0 (no low-lying excited states).</item>
/// <item>H = U + RT; G = H − TS.</item>
/// </list>
/// Constants CODATA 2018.
/// </summary>
public static class IdealGasThermo
{
    private const double R = PhysicalConstants.GasConstantJoulePerMoleKelvin;

    /// <summary>Modes below this wavenumber are flagged in RRHO results (common practice, no source: the harmonic entropy of such
    /// modes is unreliable, which is what quasi-RRHO addresses).</summary>
    public const double LowModeWarningCm1 = 100.0;

    /// <summary>
    /// Thermochemistry from the real modes of a vibrational analysis (imaginary ones are excluded and listed), with the atomic masses
    /// the analysis used (<see cref="VibrationalAnalysis.MassesAmu"/>), so an isotopologue's translation and rotation use its own masses.
    /// </summary>
    public static ThermoResult Compute(VibrationalAnalysis analysis, ThermoOptions options)
    {
        ArgumentNullException.ThrowIfNull(analysis);
        return Compute(analysis.Molecule, analysis.FrequenciesCm1, options, analysis.MassesAmu);
    }

    /// <summary>
    /// Thermal corrections for <paramref name="molecule"/> (geometry for the moments, multiplicity for the electronic entropy) with
    /// vibrational wavenumbers <paramref name="frequenciesCm1"/> (cm⁻¹, imaginary as negative; translations and rotations not included).
    /// <paramref name="massesAmu"/> gives one atomic mass per atom (amu) for an isotopologue; null for the most abundant isotopes.
    /// </summary>
    public static ThermoResult Compute(Molecule molecule, IReadOnlyList<double> frequenciesCm1, ThermoOptions options, IReadOnlyList<double>? massesAmu = null)
    {
        ArgumentNullException.ThrowIfNull(molecule);
        ArgumentNullException.ThrowIfNull(frequenciesCm1);
        ArgumentNullException.ThrowIfNull(options);
        Validate(molecule, frequenciesCm1, options);
        var masses = massesAmu ?? Inertia.MassesAmu(molecule);
        if (masses.Count != molecule.AtomCount)
            throw new ArgumentException($"{masses.Count} masses given for {molecule.AtomCount} atoms.", nameof(massesAmu));
        var t = options.TemperatureKelvin;
        var notes = ImmutableArray.CreateBuilder<string>();
        var shape = Inertia.Shape(molecule);
        var pressure = ReferencePressurePascal(t, options.StandardState, options.PressurePascal, options.ConcentrationMolPerL);

        // Translation
        var massKg = masses.Sum() * PhysicalConstants.AtomicMassConstantKilogram;
        var translational = new ThermoContribution(
            Molar(1.5 * R * t),
            R * (Math.Log(TranslationalPartitionFunction(massKg, t, pressure)) + 2.5),
            1.5 * R);

        // Rotation
        var rotational = ThermoContribution.None;
        var sigma = options.SymmetryNumber;
        if (shape != MolecularShape.Atom)
        {
            var moments = Inertia.PrincipalAxes(molecule, masses).MomentsAmuAngstrom2;
            if (shape == MolecularShape.Linear)
            {
                if (sigma > 2) notes.Add($"Symmetry number {sigma} given for a linear molecule, which has σ = 1 or 2.");
                var theta = RotationalTemperatureKelvin(moments[2]);
                rotational = new ThermoContribution(Molar(R * t), R * (Math.Log(t / (sigma * theta)) + 1.0), R);
            }
            else
            {
                var thetaProduct = RotationalTemperatureKelvin(moments[0]) * RotationalTemperatureKelvin(moments[1]) * RotationalTemperatureKelvin(moments[2]);
                var q = Math.Sqrt(Math.PI) * Math.Pow(t, 1.5) / (sigma * Math.Sqrt(thetaProduct));
                rotational = new ThermoContribution(Molar(1.5 * R * t), R * (Math.Log(q) + 1.5), 1.5 * R);
            }
        }

        // Vibration
        var expected = 3 * molecule.AtomCount - Inertia.ExternalDegreesOfFreedom(shape);
        if (frequenciesCm1.Count != expected)
            notes.Add($"{frequenciesCm1.Count} wavenumbers given where a {shape} structure of {molecule.AtomCount} atoms has {expected} vibrations.");
        var imaginary = frequenciesCm1.Where(v => v < 0).ToImmutableArray();
        if (imaginary.Length > 0)
            notes.Add($"{imaginary.Length} imaginary mode(s) ({string.Join(", ", imaginary.Select(v => $"{-v:F1}i"))} cm⁻¹) left out of ZPE, U, S and G.");
        var zeros = frequenciesCm1.Count(v => v == 0);
        if (zeros > 0) notes.Add($"{zeros} zero wavenumber(s) left out.");
        double zpe = 0, uVib = 0, sVib = 0, cvVib = 0;
        var low = 0;
        var qS = options.Treatment is ThermoTreatment.QuasiRrhoEntropy or ThermoTreatment.QuasiRrhoEntropyAndEnthalpy;
        var qH = options.Treatment is ThermoTreatment.QuasiRrhoEntropyAndEnthalpy;
        foreach (var nu in frequenciesCm1)
        {
            if (nu <= 0) continue;
            if (nu < LowModeWarningCm1) low++;
            zpe += HarmonicOscillator.ZeroPointEnergyJoulePerMole(nu);
            sVib += qS ? QuasiRrho.EntropyJoulePerMoleKelvin(nu, t, options.QuasiRrhoCutoffCm1) : HarmonicOscillator.EntropyJoulePerMoleKelvin(nu, t);
            uVib += qH ? QuasiRrho.ThermalEnergyJoulePerMole(nu, t, options.QuasiRrhoCutoffCm1) : HarmonicOscillator.ThermalEnergyJoulePerMole(nu, t);
            cvVib += qH ? QuasiRrho.HeatCapacityJoulePerMoleKelvin(nu, t, options.QuasiRrhoCutoffCm1) : HarmonicOscillator.HeatCapacityJoulePerMoleKelvin(nu, t);
        }
        if (low > 0 && options.Treatment == ThermoTreatment.Rrho)
            notes.Add($"{low} mode(s) below {LowModeWarningCm1:F0} cm⁻¹ treated as harmonic oscillators; their entropy is unreliable (consider quasi-RRHO).");
        var vibrational = new ThermoContribution(Molar(uVib), sVib, cvVib);

        var electronic = new ThermoContribution(Energy.Zero, R * Math.Log(molecule.Multiplicity), 0.0);

        var s = translational.EntropyJoulePerMoleKelvin + rotational.EntropyJoulePerMoleKelvin + vibrational.EntropyJoulePerMoleKelvin + electronic.EntropyJoulePerMoleKelvin;
        var u = translational.ThermalEnergy + rotational.ThermalEnergy + vibrational.ThermalEnergy + electronic.ThermalEnergy;
        var h = u + Molar(R * t);
        var g = h - Molar(t * s);
        return new ThermoResult(options, shape, Molar(zpe), u, h, g, s, translational, rotational, vibrational, electronic,
            imaginary, pressure, notes.ToImmutable());
    }

    /// <summary>
    /// Free-energy change of moving a species from one standard state to another at temperature T (K):
    /// ΔG = R T ln(p_to / p_from), where a solution state of concentration c counts as the ideal-gas pressure p = c R T
    /// (c in mol/m³). 1 atm → 1 mol/L at 298.15 K: R T ln(24.46) = +1.89 kcal/mol. Per molecule, hartree inside.
    /// </summary>
    public static Energy StandardStateCorrection(double temperatureKelvin, StandardState from, StandardState to, double solutionConcentrationMolPerL = 1.0)
    {
        if (!(temperatureKelvin > 0) || !double.IsFinite(temperatureKelvin))
            throw new ArgumentException($"Temperature must be positive and finite, got {temperatureKelvin} K.", nameof(temperatureKelvin));
        var pFrom = ReferencePressurePascal(temperatureKelvin, from, PhysicalConstants.StandardAtmospherePascal, solutionConcentrationMolPerL);
        var pTo = ReferencePressurePascal(temperatureKelvin, to, PhysicalConstants.StandardAtmospherePascal, solutionConcentrationMolPerL);
        return Molar(R * temperatureKelvin * Math.Log(pTo / pFrom));
    }

    /// <summary>
    /// Pressure in Pa that the translational partition function uses for a standard state: p for the gas at 1 atm (or the given
    /// pressure), 10⁵ Pa for 1 bar, c R T for a solution of c mol/L.
    /// </summary>
    public static double ReferencePressurePascal(double temperatureKelvin, StandardState state, double gasPressurePascal = PhysicalConstants.StandardAtmospherePascal, double? concentrationMolPerL = null)
    {
        var c = concentrationMolPerL ?? 1.0;
        if (!(c > 0) || !double.IsFinite(c))
            throw new ArgumentException($"Concentration must be positive and finite, got {c} mol/L.", nameof(concentrationMolPerL));
        return state switch
        {
            StandardState.Gas1Atm => gasPressurePascal,
            StandardState.Gas1Bar => PhysicalConstants.BarPascal,
            StandardState.Solution1Molar => c * 1000.0 * R * temperatureKelvin,
            _ => throw new ArgumentOutOfRangeException(nameof(state), state, "Unknown standard state."),
        };
    }

    /// <summary>Translational partition function per molecule, q = (2π m k_B T/h²)^{3/2} k_B T / p (dimensionless).</summary>
    public static double TranslationalPartitionFunction(double massKg, double temperatureKelvin, double pressurePascal)
    {
        var kT = PhysicalConstants.BoltzmannJoulePerKelvin * temperatureKelvin;
        var h = PhysicalConstants.PlanckJouleSecond;
        return Math.Pow(2.0 * Math.PI * massKg * kT / (h * h), 1.5) * kT / pressurePascal;
    }

    /// <summary>Rotational temperature θ = h² / (8π² I k_B) in K for a moment in amu·Å².</summary>
    public static double RotationalTemperatureKelvin(double momentAmuAngstrom2)
    {
        var i = momentAmuAngstrom2 * PhysicalConstants.AtomicMassConstantKilogram * 1e-20;
        var h = PhysicalConstants.PlanckJouleSecond;
        return h * h / (8.0 * Math.PI * Math.PI * i * PhysicalConstants.BoltzmannJoulePerKelvin);
    }

    private static Energy Molar(double joulePerMole) => Energy.FromKJPerMol(joulePerMole / 1000.0);

    private static void Validate(Molecule molecule, IReadOnlyList<double> frequenciesCm1, ThermoOptions o)
    {
        if (molecule.AtomCount == 0) throw new ArgumentException("The molecule has no atoms.", nameof(molecule));
        if (!(o.TemperatureKelvin > 0) || !double.IsFinite(o.TemperatureKelvin))
            throw new ArgumentException($"Temperature must be positive and finite, got {o.TemperatureKelvin} K.", nameof(o.TemperatureKelvin));
        if (!(o.PressurePascal > 0) || !double.IsFinite(o.PressurePascal))
            throw new ArgumentException($"Pressure must be positive and finite, got {o.PressurePascal} Pa.", nameof(o.PressurePascal));
        if (o.SymmetryNumber < 1)
            throw new ArgumentException($"Symmetry number must be 1 or more, got {o.SymmetryNumber}.", nameof(o.SymmetryNumber));
        if (!(o.QuasiRrhoCutoffCm1 > 0) || !double.IsFinite(o.QuasiRrhoCutoffCm1))
            throw new ArgumentException($"Quasi-RRHO cut-off must be positive, got {o.QuasiRrhoCutoffCm1} cm⁻¹.", nameof(o.QuasiRrhoCutoffCm1));
        if (o.StandardState != StandardState.Gas1Atm && o.PressurePascal != PhysicalConstants.StandardAtmospherePascal)
            throw new ArgumentException(
                $"A pressure of {o.PressurePascal} Pa was given with the standard state {o.StandardState}, which fixes its own pressure; give a pressure only with {StandardState.Gas1Atm}.",
                nameof(o.PressurePascal));
        if (o.ConcentrationMolPerL is not null && o.StandardState != StandardState.Solution1Molar)
            throw new ArgumentException($"A concentration was given with the standard state {o.StandardState}; it applies only to {StandardState.Solution1Molar}.",
                nameof(o.ConcentrationMolPerL));
        for (var i = 0; i < frequenciesCm1.Count; i++)
            if (!double.IsFinite(frequenciesCm1[i]))
                throw new ArgumentException($"Wavenumber {i + 1} is not finite ({frequenciesCm1[i]}).", nameof(frequenciesCm1));
    }
}
