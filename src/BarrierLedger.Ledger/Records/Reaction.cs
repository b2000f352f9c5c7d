namespace BarrierLedger.Ledger.Records;

/// <summary>A pathway of ordered states in a study.</summary>
public class Reaction : IVersioned, IRetirable
{
    public int Id { get; set; }
    public int StudyId { get; set; }
    public Study? Study { get; set; }
    public string Label { get; set; } = "";
    public string Description { get; set; } = "";
    public string OwnerUserId { get; set; } = "";
    /// <summary>Incremented whenever an input of its derived values changes (states, calculations of its species).</summary>
    public long InputsRevision { get; set; } = 1;
    public bool Retired { get; set; }
    public DateTimeOffset? RetiredAt { get; set; }
    public string? RetiredByUserId { get; set; }
    public long Version { get; set; }

    public List<ReactionState> States { get; set; } = [];
    public ReactionDerivation? Derivation { get; set; }
}

/// <summary>Whether a state is a minimum or a saddle point.</summary>
public enum StateKind
{
    Minimum,
    SaddlePoint,
}

/// <summary>One state of a pathway ("A + B", "TS1"): a sum of species with coefficients.</summary>
public class ReactionState
{
    public int Id { get; set; }
    public int ReactionId { get; set; }
    public Reaction? Reaction { get; set; }
    /// <summary>0-based position along the pathway.</summary>
    public int Position { get; set; }
    public string Label { get; set; } = "";
    public StateKind Kind { get; set; }
    /// <summary>For a saddle point: the calculation whose check and review govern this state.</summary>
    public int? SaddleCalculationId { get; set; }
    public Calculation? SaddleCalculation { get; set; }

    public List<ReactionStateTerm> Terms { get; set; } = [];
    public List<ReactionCoordinatePair> CoordinatePairs { get; set; } = [];
}

/// <summary>A species in a state with its whole positive coefficient.</summary>
public class ReactionStateTerm
{
    public int Id { get; set; }
    public int ReactionStateId { get; set; }
    public int SpeciesId { get; set; }
    public Species? Species { get; set; }
    public int Coefficient { get; set; } = 1;
}

/// <summary>An atom pair (1-based, as in the saddle point's file) that forms or breaks at a saddle-point state.</summary>
public class ReactionCoordinatePair
{
    public int Id { get; set; }
    public int ReactionStateId { get; set; }
    public int AtomA { get; set; }
    public int AtomB { get; set; }
}
