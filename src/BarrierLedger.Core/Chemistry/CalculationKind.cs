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

/// <summary>The words a person reads for a <see cref="CalculationKind"/> on every screen and in every message (the bundle's
/// own spelling, <c>saddle_point</c>, stays in the manifest).</summary>
public static class CalculationKindWords
{
    /// <summary>"minimum", "saddle point", "single point", "frequencies", "relaxed scan", "IRC endpoint".</summary>
    public static string Words(this CalculationKind kind) => kind switch
    {
        CalculationKind.Minimum => "minimum",
        CalculationKind.SaddlePoint => "saddle point",
        CalculationKind.SinglePoint => "single point",
        CalculationKind.Frequencies => "frequencies",
        CalculationKind.RelaxedScan => "relaxed scan",
        CalculationKind.Endpoint => "IRC endpoint",
        _ => kind.ToString(),
    };
}
