using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Ledger.Reviews;

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
    /// <summary>What the definition says about its kinetics (competing channels, run conditions) as JSON, or null for nothing.</summary>
    public string? Kinetics { get; set; }

    // The ledger row's status, kept by the ledger whenever a check, a review or a saddle-point link changes
    // (see Derivation/ReactionStatusSummary.cs), so listing a study reads one row per reaction. Not a user edit: writing it
    // does not bump Version. SaddlePointCount is null until the summary was first computed (rows stored before it existed).
    /// <summary>Saddle-point states of the pathway; null when the summary has not been computed yet.</summary>
    public int? SaddlePointCount { get; set; }
    /// <summary>The worst frequency-check verdict of its saddle points (a saddle point without a check counts as failed); null without saddle points.</summary>
    public Verdict? CheckVerdict { get; set; }
    /// <summary>Verified only when every saddle point is, Returned when any is, else awaiting review; null without saddle points.</summary>
    public ReviewState? ReviewStatus { get; set; }

    public List<ReactionState> States { get; set; } = [];
    public ReactionDerivation? Derivation { get; set; }
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
