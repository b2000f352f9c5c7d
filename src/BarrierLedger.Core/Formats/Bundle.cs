using System.Collections.Immutable;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Conformers;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Core.Scans;
using BarrierLedger.Core.Vibrations;

namespace BarrierLedger.Core.Formats;

/// <summary>
/// A BarrierLedger bundle as read: one study with its species, calculations, reactions, scans and IRCs
/// (format "barrierledger-bundle", documented by docs/bundle.schema.json and docs/formats.md).
/// Every cross-reference (species labels, calculation labels) has been checked to resolve, except an IRC's saddle point, which may
/// name a calculation already stored in the study.
/// </summary>
/// <param name="FormatVersion">The manifest's format_version (1).</param>
/// <param name="Study">Name and description of the study.</param>
/// <param name="Species">Species in manifest order, labels unique.</param>
/// <param name="Calculations">Calculations in manifest order, labels unique.</param>
/// <param name="Reactions">Reactions in manifest order, labels unique.</param>
/// <param name="Scans">Scans in manifest order, labels unique.</param>
/// <param name="Ircs">IRC paths and endpoint pairs in manifest order, labels unique.</param>
/// <param name="Files">Every file the manifest names that was found, by its relative path, with its bytes exactly as stored (for SHA-256 and archiving).</param>
public sealed record Bundle(
    int FormatVersion,
    BundleStudy Study,
    ImmutableArray<BundleSpecies> Species,
    ImmutableArray<BundleCalculation> Calculations,
    ImmutableArray<BundleReaction> Reactions,
    ImmutableArray<BundleScan> Scans,
    ImmutableArray<BundleIrc> Ircs,
    ImmutableDictionary<string, ImmutableArray<byte>> Files);

/// <summary>The study the bundle belongs to, with the energy model its numbers are meant under (<c>study.energy_model</c>), if given.</summary>
public sealed record BundleStudy(string Name, string Description, BundleEnergyModel? EnergyModel = null);

/// <summary>
/// A study's energy model as a bundle states it (<c>study.energy_model</c>); a key left out takes the ledger's group default.
/// <see cref="EnergiesFrom"/>: the level whose electronic energies are used ("" = each state's own calculation);
/// <see cref="ThermalFrom"/>: the level whose frequencies give thermal corrections; temperature in K; standard state; the
/// low-mode treatment under the names of <see cref="Thermochemistry.LowModeNames"/> with its cut-off ω₀ in cm⁻¹; tunnelling
/// "none" or "wigner"; conformers "lowest" or "boltzmann-ensemble".
/// </summary>
public sealed record BundleEnergyModel(string? EnergiesFrom = null, string? ThermalFrom = null, double? TemperatureKelvin = null,
    Thermochemistry.StandardState? StandardState = null, Thermochemistry.ThermoTreatment? LowModes = null, double? LowModeCutoffCm1 = null,
    bool? WignerTunnelling = null, ConformerChoice? Conformers = null)
{
    /// <summary>The words of <c>conformers</c>.</summary>
    public static string ConformerName(ConformerChoice c) =>
        c == ConformerChoice.BoltzmannEnsemble ? "boltzmann-ensemble" : "lowest";

    public static bool TryParseConformers(string text, out ConformerChoice choice)
    {
        (var ok, choice) = text.Trim().ToLowerInvariant() switch
        {
            "lowest" => (true, ConformerChoice.Lowest),
            "boltzmann-ensemble" => (true, ConformerChoice.BoltzmannEnsemble),
            _ => (false, ConformerChoice.Lowest),
        };
        return ok;
    }
}

/// <summary>
/// A chemical species: label unique in the bundle, total charge, spin multiplicity 2S+1, and optionally the rotational symmetry
/// number σ to use for it (<c>symmetry_number</c>; when absent the ledger detects σ from the geometry).
/// </summary>
public sealed record BundleSpecies(string Label, int Charge, int Multiplicity, int? SymmetryNumber = null);

/// <summary>Program-reported thermal corrections (hartree, added to the electronic energy) at a temperature.</summary>
public sealed record BundleThermalCorrections(
    double TemperatureKelvin,
    double? ZeroPointHartree,
    double? EnthalpyHartree,
    double? GibbsHartree);

/// <summary>
/// One calculation of one species. Data come inline or from <see cref="File"/> (XYZ, extended XYZ or QCSchema);
/// inline values take precedence, and a disagreement is reported as a warning.
/// </summary>
/// <param name="Label">Unique label, referred to by saddle-point states.</param>
/// <param name="Species">Label of the species computed.</param>
/// <param name="Kind">What the calculation is (minimum, saddle point, single point, frequencies, relaxed scan, endpoint).</param>
/// <param name="LevelOfTheory">As the trade writes it, "A//B" for a single point at A on a geometry from B.</param>
/// <param name="EnergyHartree">Electronic energy in hartree, inline or from the file; null when neither gives one.</param>
/// <param name="Geometry">Structure in Å, carrying the species' charge and multiplicity; null when neither inline nor in the file.</param>
/// <param name="FrequenciesCm1">Harmonic wavenumbers (negative = imaginary); from the modes when only modes are given.</param>
/// <param name="Modes">Normal modes with displacements normalised to unit length.</param>
/// <param name="HessianHartreePerBohr2">(3N)² row-major Cartesian Hessian, inline or from a QCSchema hessian file; empty when absent.</param>
/// <param name="ThermalCorrections">Program-reported corrections at a temperature; null when not given.</param>
/// <param name="File">Relative path of the file the calculation came from, a key of <see cref="Bundle.Files"/> when found.</param>
/// <param name="Note">Free text from the manifest; empty when none.</param>
/// <param name="Conformer">
/// The conformer of its species this calculation belongs to, from the species' <c>conformers</c> list; empty when the species lists
/// none (or does not list this calculation).
/// </param>
public sealed record BundleCalculation(
    string Label,
    string Species,
    CalculationKind Kind,
    LevelOfTheory LevelOfTheory,
    double? EnergyHartree,
    Molecule? Geometry,
    ImmutableArray<double> FrequenciesCm1,
    ImmutableArray<NormalMode> Modes,
    ImmutableArray<double> HessianHartreePerBohr2,
    BundleThermalCorrections? ThermalCorrections,
    string? File,
    string Note,
    string Conformer = "");

/// <summary>One species in a state with its (whole, positive) coefficient: "2 H2O" is ("H2O", 2).</summary>
public sealed record BundleTerm(string Species, int Coefficient);

/// <summary>A pair of atoms, 1-based as they appear in the saddle point's geometry (users read C4, H7).</summary>
public sealed record BundleAtomPair(int First, int Second);

/// <summary>
/// One state of a pathway: a sum of species. A saddle-point state names its <see cref="Calculation"/> and the atom
/// pairs that form or break there (<see cref="ReactionCoordinate"/>, 1-based).
/// </summary>
public sealed record BundleState(
    string Label,
    StateKind Kind,
    ImmutableArray<BundleTerm> Terms,
    string? Calculation,
    ImmutableArray<BundleAtomPair> ReactionCoordinate);

/// <summary>A reaction: its ordered states, first to last, and what its definition says about its kinetics (null: nothing).</summary>
public sealed record BundleReaction(string Label, string Description, ImmutableArray<BundleState> States, Kinetics.KineticsSetup? Kinetics = null);

/// <summary>
/// A relaxed scan of one species along one coordinate (atoms 0-based in <see cref="Coordinate"/>, 1-based in the file).
/// Points come inline or from <see cref="PointsFile"/> (CSV); geometries optionally from <see cref="GeometriesFile"/> (multi-frame XYZ, one frame per point).
/// </summary>
public sealed record BundleScan(
    string Label,
    string Species,
    LevelOfTheory? LevelOfTheory,
    ScanCoordinate Coordinate,
    ImmutableArray<ScanPoint> Points,
    string? PointsFile,
    string? GeometriesFile);

/// <summary>
/// An IRC (or the two ends of one) of a saddle-point calculation. <see cref="SaddlePoint"/> names a saddle_point calculation of the
/// bundle, or one already stored in the study (resolved by the store). Structures come from <see cref="PathFile"/> (multi-frame XYZ,
/// energy per frame) or from <see cref="ForwardFile"/> and <see cref="BackwardFile"/> (last frame of each).
/// </summary>
public sealed record BundleIrc(
    string Label,
    string SaddlePoint,
    LevelOfTheory? LevelOfTheory,
    IrcStructures Structures,
    string? PathFile,
    string? ForwardFile,
    string? BackwardFile);
