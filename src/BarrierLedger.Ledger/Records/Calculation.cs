using BarrierLedger.Core.Chemistry;
using BarrierLedger.Ledger.Reviews;

namespace BarrierLedger.Ledger.Records;

/// <summary>
/// One result for one species. Arrays are stored as compact little-endian blobs (see <see cref="Storage.Blobs"/>):
/// atomic numbers one byte each, positions 3N doubles in Å, frequencies in cm⁻¹ (negative = imaginary),
/// modes as M × 3N doubles (unit Cartesian displacements), the Hessian as (3N)² doubles in hartree/bohr².
/// </summary>
public class Calculation : IVersioned, IRetirable
{
    public int Id { get; set; }
    public int SpeciesId { get; set; }
    public Species? Species { get; set; }
    public int UploadId { get; set; }
    public Upload? Upload { get; set; }
    /// <summary>Label given in the upload (unique per upload).</summary>
    public string Label { get; set; } = "";
    public CalculationKind Kind { get; set; }
    /// <summary>
    /// The conformer of the species this calculation belongs to ("c1", "anti"...): calculations with the same label are one
    /// conformer (its optimisation, frequencies, single points). Empty when the species was given as one structure only; the
    /// empty label is then the species' one conformer.
    /// </summary>
    public string Conformer { get; set; } = "";
    /// <summary>The longest conformer label the store keeps.</summary>
    public const int MaxConformerLength = 100;

    /// <summary>Level of theory as written ("A//B" for a single point at A on geometry from B).</summary>
    public string LevelOfTheory { get; set; } = "";
    public string Method { get; set; } = "";
    public string Basis { get; set; } = "";
    public string Solvation { get; set; } = "";
    /// <summary>The level the geometry came from (the part after "//"), empty when the same.</summary>
    public string GeometryLevel { get; set; } = "";
    /// <summary>The energy-producing part of the level (before "//"), normalised for matching against an energy model.</summary>
    public string EnergyLevelKey { get; set; } = "";

    public double? EnergyHartree { get; set; }
    public int AtomCount { get; set; }
    public byte[]? AtomicNumbers { get; set; }
    public byte[]? PositionsAngstrom { get; set; }
    public byte[]? FrequenciesCm1 { get; set; }
    /// <summary>Normal modes as given or as derived from the Hessian on upload.</summary>
    public byte[]? Modes { get; set; }
    public byte[]? HessianHartreePerBohr2 { get; set; }

    /// <summary>Program-reported thermal corrections (hartree) at <see cref="ThermalTemperatureKelvin"/>, if given.</summary>
    public double? ThermalTemperatureKelvin { get; set; }
    public double? ZeroPointHartree { get; set; }
    public double? EnthalpyCorrectionHartree { get; set; }
    public double? GibbsCorrectionHartree { get; set; }

    /// <summary>The stored original file this calculation came from (its own file, or the bundle manifest).</summary>
    public int? StoredFileId { get; set; }
    public StoredFile? StoredFile { get; set; }
    /// <summary>SHA-256 (hex) of that file: with the species and label, what makes an upload a duplicate.</summary>
    public string SourceSha256 { get; set; } = "";
    public string Note { get; set; } = "";
    public string UploadedByUserId { get; set; } = "";
    public DateTimeOffset UploadedAt { get; set; }

    /// <summary>
    /// Where this saddle point stands in review: the state its newest <see cref="Review"/> entry leads to
    /// (<see cref="ReviewStates.After"/>), kept by the ledger whenever an entry is written, so the review queue finds the waiting
    /// saddle points without reading every history. The history stays the truth; this is its summary. Not a user edit: writing
    /// it does not bump <see cref="Version"/>.
    /// </summary>
    public ReviewState ReviewState { get; set; } = ReviewState.AwaitingReview;

    public bool Retired { get; set; }
    public DateTimeOffset? RetiredAt { get; set; }
    public string? RetiredByUserId { get; set; }
    public long Version { get; set; }

    /// <summary>Sets the level of theory and the parts the energy model matches on (method, basis, solvation, geometry level, energy key).</summary>
    public void SetLevel(LevelOfTheory level)
    {
        ArgumentNullException.ThrowIfNull(level);
        LevelOfTheory = level.ToString();
        Method = level.Method;
        Basis = level.Basis;
        Solvation = level.Solvation;
        GeometryLevel = level.GeometryLevel?.EnergyPart ?? "";
        EnergyLevelKey = Derivation.EnergyLevels.Key(level.EnergyPart);
    }
}
