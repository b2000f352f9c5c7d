namespace BarrierLedger.Core.Vibrations;

/// <summary>What is wrong with a Cartesian Hessian handed to <see cref="FrequencyAnalysis"/>.</summary>
public enum HessianProblem
{
    /// <summary>The number of elements is not (3N)² for the molecule's N atoms.</summary>
    SizeMismatch,
    /// <summary>An element is NaN or infinite.</summary>
    NonFinite,
    /// <summary>H_ij and H_ji differ by more than the tolerance.</summary>
    Asymmetric,
    /// <summary>The masses given do not fit the molecule.</summary>
    BadMasses,
    /// <summary>The molecule has no atoms.</summary>
    EmptyMolecule,
}

/// <summary>
/// A Hessian that cannot be analysed. The message says what is wrong and where (row, column, atom labels).
/// Derives from <see cref="ArgumentException"/>, as bad input to a public API should.
/// </summary>
public sealed class HessianException(HessianProblem problem, string message, string? paramName = "hessianHartreePerBohr2")
    : ArgumentException(message, paramName)
{
    /// <summary>Which check failed.</summary>
    public HessianProblem Problem { get; } = problem;
}
