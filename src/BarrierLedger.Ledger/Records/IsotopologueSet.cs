namespace BarrierLedger.Ledger.Records;

/// <summary>How the substituted atoms of a saddle point were found in the reactant state.</summary>
public enum IsotopeMapping
{
    /// <summary>The saddle point lists its atoms in the order of the reactant state's species (their files, one after the other),
    /// so saddle-point atom k is the k-th atom of the reactant state.</summary>
    SameAtomOrder,
    /// <summary>The member gave the reactant-side atoms and confirmed that they are the same atoms.</summary>
    Confirmed,
}

/// <summary>
/// A named isotopologue of one saddle point of a reaction ("D at H4, primary"): which atoms (1-based, as in the saddle point's file)
/// become which isotopes, and the same atoms in the reactant species before it. The kinetic isotope effect itself is not stored:
/// it is computed from the stored Hessians and the energy model in force whenever it is shown (Core <c>KineticIsotopeEffect</c>).
/// Retired, never deleted; every change is audited.
/// </summary>
public class IsotopologueSet : IVersioned, IRetirable
{
    public int Id { get; set; }
    public int ReactionId { get; set; }
    public Reaction? Reaction { get; set; }
    /// <summary>Position (0-based) of the saddle-point state in the pathway; the reactant state is the minimum before it.</summary>
    public int SaddlePosition { get; set; }
    public string Name { get; set; } = "";
    /// <summary>Saddle-point substitutions as "4=2H, 2=13C" (atom numbers of the saddle point's file).</summary>
    public string SaddleSubstitutions { get; set; } = "";
    /// <summary>Reactant-side substitutions, one line per species: "speciesId:4=2H, 2=13C".</summary>
    public string ReactantSubstitutions { get; set; } = "";
    public IsotopeMapping Mapping { get; set; }
    public string CreatedByUserId { get; set; } = "";
    public DateTimeOffset CreatedAt { get; set; }

    public bool Retired { get; set; }
    public DateTimeOffset? RetiredAt { get; set; }
    public string? RetiredByUserId { get; set; }
    public long Version { get; set; }
}
