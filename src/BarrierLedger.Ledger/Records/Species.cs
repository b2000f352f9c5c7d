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
    /// <summary>Rotational symmetry number σ used for its thermochemistry.</summary>
    public int SymmetryNumber { get; set; } = 1;
    public bool Retired { get; set; }
    public DateTimeOffset? RetiredAt { get; set; }
    public string? RetiredByUserId { get; set; }
    public long Version { get; set; }

    public List<Calculation> Calculations { get; set; } = [];
}
