using System.Collections.Immutable;
using BarrierLedger.Core.Chemistry;

namespace BarrierLedger.Core.Formats;

/// <summary>
/// The bundle manifest's vocabulary as this reader knows it: the format name and version, the manifest's name inside a zip,
/// the keys of each manifest object and the calculation kinds. <c>docs/bundle.schema.json</c> states the same, and a test
/// keeps the two in step.
/// </summary>
public static class BundleSchema
{
    /// <summary>The format name every manifest carries in "format".</summary>
    public const string FormatName = "barrierledger-bundle";

    /// <summary>The manifest version this reader writes and reads.</summary>
    public const int CurrentFormatVersion = 1;

    /// <summary>The manifest's name inside a bundle zip.</summary>
    public const string ManifestEntryName = "bundle.json";

    /// <summary>Keys the reader knows for each object of the manifest, by the schema's $defs name ("bundle" is the root). Unknown keys get a warning.</summary>
    public static readonly ImmutableDictionary<string, ImmutableArray<string>> KnownKeys = new Dictionary<string, ImmutableArray<string>>
    {
        ["bundle"] = ["format", "format_version", "study", "species", "calculations", "reactions", "scans", "ircs"],
        ["study"] = ["name", "description", "energy_model"],
        ["energy_model"] = ["energies_from", "thermal_from", "temperature_kelvin", "standard_state", "low_modes", "low_mode_cutoff_cm1", "tunnelling", "conformers"],
        ["species"] = ["label", "charge", "multiplicity", "symmetry_number", "conformers"],
        ["conformer"] = ["label", "calculations"],
        ["calculation"] = ["label", "species", "kind", "level_of_theory", "energy_hartree", "file", "geometry", "frequencies_cm1", "modes",
            "hessian_hartree_per_bohr2", "thermal_corrections", "note"],
        ["geometry"] = ["symbols", "positions_angstrom"],
        // reduced_mass_amu and force_constant_mdyn_per_angstrom are the names format_version 1 bundles were first written with:
        // still read (the force constant converted to N/m), never written.
        ["mode"] = ["frequency_cm1", "displacements", "reduced_mass_da", "force_constant_n_per_m", "reduced_mass_amu", "force_constant_mdyn_per_angstrom"],
        ["thermal_corrections"] = ["temperature_kelvin", "zero_point_hartree", "enthalpy_hartree", "gibbs_hartree"],
        ["reaction"] = ["label", "description", "states", "kinetics"],
        ["kinetics"] = ["competing_channels", "enantiomeric", "temperature_kelvin", "time_hours"],
        // reaction_coordinate is the first name of reacting_bonds: still read, never written.
        ["state"] = ["label", "kind", "terms", "calculation", "reacting_bonds", "reaction_coordinate"],
        ["term"] = ["species", "coefficient"],
        ["scan"] = ["label", "species", "level_of_theory", "coordinate", "points", "points_file", "energy_unit", "geometries_file"],
        ["coordinate"] = ["kind", "atoms"],
        ["point"] = ["coordinate", "energy_hartree", "converged"],
        ["irc"] = ["label", "saddle_point", "level_of_theory", "path_file", "forward_file", "backward_file"],
    }.ToImmutableDictionary();

    /// <summary>Calculation kinds as written in the manifest.</summary>
    public static readonly ImmutableDictionary<string, CalculationKind> KindNames = new Dictionary<string, CalculationKind>
    {
        ["minimum"] = CalculationKind.Minimum,
        ["saddle_point"] = CalculationKind.SaddlePoint,
        ["single_point"] = CalculationKind.SinglePoint,
        ["frequencies"] = CalculationKind.Frequencies,
        ["relaxed_scan"] = CalculationKind.RelaxedScan,
        ["endpoint"] = CalculationKind.Endpoint,
    }.ToImmutableDictionary();
}
