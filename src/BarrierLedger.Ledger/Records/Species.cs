namespace BarrierLedger.Ledger.Records;

/// <summary>A chemical entity of a study: label (unique in the study), charge, spin multiplicity, elemental formula.</summary>
public class Species : IVersioned, IRetirable
{
    public int Id { get; set; }
    public int StudyId { get; set; }
    public Study? Study { get; set; }
    public string Label { get; set; } = "";
    /// <summary>Free text a member writes about the species (conformer, how it was found); empty when none.</summary>
    public string Description { get; set; } = "";
    public int Charge { get; set; }
    public int Multiplicity { get; set; } = 1;
    /// <summary>Hill formula, from the first geometry stored; empty until one is.</summary>
    public string Formula { get; set; } = "";
    /// <summary>
    /// Rotational symmetry number σ used for its thermochemistry: <see cref="SymmetryNumberOverride"/> when a member or a bundle
    /// gave one, else <see cref="DetectedSymmetryNumber"/>, else 1. Kept by <see cref="Derivation.SpeciesSymmetry"/>.
    /// </summary>
    public int SymmetryNumber { get; set; } = 1;
    /// <summary>Point group (Schoenflies) of the geometry used for its thermochemistry; empty until a geometry is stored.</summary>
    public string PointGroup { get; set; } = "";
    /// <summary>σ of <see cref="PointGroup"/>; null until a geometry is stored.</summary>
    public int? DetectedSymmetryNumber { get; set; }
    /// <summary>"nearly D2h: …" when the geometry is close to a higher group; empty otherwise.</summary>
    public string SymmetryNote { get; set; } = "";
    /// <summary>The calculation whose geometry gave <see cref="PointGroup"/>.</summary>
    public int? SymmetryCalculationId { get; set; }
    /// <summary>σ a member or a bundle's <c>symmetry_number</c> set; it wins over the detected one. Null when none.</summary>
    public int? SymmetryNumberOverride { get; set; }
    public bool Retired { get; set; }
    public DateTimeOffset? RetiredAt { get; set; }
    public string? RetiredByUserId { get; set; }
    public long Version { get; set; }

    public List<Calculation> Calculations { get; set; } = [];
}
