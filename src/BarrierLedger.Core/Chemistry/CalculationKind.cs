namespace BarrierLedger.Core.Chemistry;

/// <summary>What a calculation result is.</summary>
public enum CalculationKind
{
    /// <summary>An optimised minimum (reactant, intermediate, product).</summary>
    Minimum,
    /// <summary>An optimised first-order saddle point (transition state).</summary>
    SaddlePoint,
    /// <summary>An energy at a fixed geometry.</summary>
    SinglePoint,
    /// <summary>A frequency (Hessian) calculation.</summary>
    Frequencies,
    /// <summary>A relaxed scan along one coordinate.</summary>
    RelaxedScan,
    /// <summary>An IRC or displaced-endpoint optimisation.</summary>
    Endpoint,
}
