using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Pathways;

/// <summary>
/// Thermal corrections of one species, to add to its electronic energy (per molecule): H = E + Enthalpy, G = E + Gibbs.
/// </summary>
/// <param name="ZeroPoint">Zero-point energy.</param>
/// <param name="Enthalpy">Enthalpy correction (ZPE and thermal energy included).</param>
/// <param name="Gibbs">Gibbs-energy correction.</param>
/// <param name="Level">Level of theory of the frequencies behind the corrections.</param>
/// <param name="TemperatureKelvin">Temperature they were computed at.</param>
/// <param name="StandardState">Reference state of their translational entropy.</param>
/// <param name="Source">Where they come from, e.g. "reported" or "computed (RRHO)".</param>
public sealed record ThermalCorrection(
    Energy ZeroPoint, Energy Enthalpy, Energy Gibbs, LevelOfTheory Level, double TemperatureKelvin,
    StandardState StandardState = StandardState.Gas1Atm, string Source = "reported")
{
    /// <summary>True when computed here from geometry and frequencies, false when reported by the program.</summary>
    public bool IsComputed => Source.StartsWith("computed", StringComparison.Ordinal);
}

/// <summary>
/// One species as a pathway uses it: identity (formula, charge, multiplicity), its electronic energy with level of theory,
/// and optionally reported thermal corrections and/or the geometry and frequencies to compute them, with the rotational
/// symmetry number σ and (for display only) the point group it came from.
/// </summary>
public sealed record SpeciesRecord(
    string Label,
    Formula Formula,
    int Charge,
    int Multiplicity,
    Energy ElectronicEnergy,
    LevelOfTheory ElectronicLevel,
    ThermalCorrection? Thermal = null,
    Molecule? Geometry = null,
    IReadOnlyList<double>? FrequenciesCm1 = null,
    LevelOfTheory? FrequencyLevel = null,
    int SymmetryNumber = 1,
    string? PointGroup = null,
    IReadOnlyList<ConformerRecord>? Conformers = null)
{
    /// <summary>Electrons: Σ Z − charge.</summary>
    public int ElectronCount => Formula.NuclearCharge - Charge;
}

/// <summary>
/// One conformer of a species with several (<see cref="SpeciesRecord.Conformers"/>): its own record (energy, geometry and
/// frequencies or reported corrections), whether a saddle-point conformer passed its frequency check, and the conformer it
/// duplicates (index into the same list) with how close they are. The energy model's <see cref="Conformers.ConformerChoice"/>
/// decides how they make the species' energies (<see cref="Conformers.ConformerSelection"/>).
/// </summary>
public sealed record ConformerRecord(string Label, SpeciesRecord Record, bool CheckPassed = true, int? DuplicateOf = null, string? DuplicateNote = null);

/// <summary>Whether a state is a minimum (reactant, intermediate, product) or a saddle point.</summary>
public enum StateKind
{
    Minimum,
    SaddlePoint,
}

/// <summary>A species with its (positive, integer) coefficient in a state.</summary>
public sealed record StateTerm(SpeciesRecord Species, int Coefficient = 1);

/// <summary>
/// One state of a pathway: a sum of species, e.g. "A + B", "TS1", "P + H2O". A saddle point may give its imaginary frequency
/// (cm⁻¹, negative as programs print it) for the tunnelling correction of its step.
/// </summary>
public sealed record PathwayState(string Label, StateKind Kind, IReadOnlyList<StateTerm> Terms, double? ImaginaryFrequencyCm1 = null)
{
    /// <summary>Elemental formula of the whole state.</summary>
    public Formula Formula => Formula.Sum(Terms.Select(t => (t.Species.Formula, t.Coefficient)));

    /// <summary>Total charge.</summary>
    public int Charge => Terms.Sum(t => t.Coefficient * t.Species.Charge);

    /// <summary>Total electrons.</summary>
    public int ElectronCount => Terms.Sum(t => t.Coefficient * t.Species.ElectronCount);

    /// <summary>Number of molecules (sum of coefficients).</summary>
    public int MoleculeCount => Terms.Sum(t => t.Coefficient);

    /// <summary>"2 × H2O (1)" style list of multiplicities, for messages.</summary>
    public string SpinText => string.Join(" + ", Terms.Select(t => $"{(t.Coefficient == 1 ? "" : $"{t.Coefficient} × ")}{t.Species.Label} ({t.Species.Multiplicity})"));

    /// <summary>Σ coefficient × electronic energy.</summary>
    public Energy ElectronicEnergy => Terms.Aggregate(Energy.Zero, (s, t) => s + t.Coefficient * t.Species.ElectronicEnergy);
}

/// <summary>An ordered pathway of states (first state is the reference).</summary>
public sealed record Pathway(string Name, IReadOnlyList<PathwayState> States)
{
    /// <summary>Throws <see cref="ArgumentException"/> for an empty pathway, an empty state or a non-positive coefficient.</summary>
    public void Validate()
    {
        if (States is null || States.Count == 0) throw new ArgumentException($"Pathway '{Name}' has no states.", nameof(States));
        for (var i = 0; i < States.Count; i++)
        {
            var s = States[i];
            if (s.Terms is null || s.Terms.Count == 0)
                throw new ArgumentException($"Pathway '{Name}', state {i + 1} ('{s.Label}') has no species.", nameof(States));
            foreach (var t in s.Terms)
                if (t.Coefficient <= 0)
                    throw new ArgumentException($"Pathway '{Name}', state '{s.Label}': species '{t.Species.Label}' has coefficient {t.Coefficient}; coefficients must be positive.", nameof(States));
        }
    }
}
