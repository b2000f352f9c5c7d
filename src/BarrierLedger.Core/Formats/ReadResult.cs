using System.Collections.Immutable;

namespace BarrierLedger.Core.Formats;

/// <summary>
/// What a reader returns: the value when the input could be used, and every issue found (errors and warnings).
/// <see cref="Value"/> is null exactly when there is at least one error.
/// </summary>
public sealed record ReadResult<T> where T : class
{
    public ReadResult(T? value, IEnumerable<ReadIssue> issues)
    {
        Issues = [.. issues];
        Value = Issues.Any(i => i.IsError) ? null : value;
        if (Value is null && !Issues.Any(i => i.IsError))
            throw new ArgumentException("A read result without a value must carry at least one error.", nameof(issues));
    }

    public T? Value { get; }
    public ImmutableArray<ReadIssue> Issues { get; }
    public bool Succeeded => Value is not null;
    public IEnumerable<ReadIssue> Errors => Issues.Where(i => i.IsError);
    public IEnumerable<ReadIssue> Warnings => Issues.Where(i => !i.IsError);

    /// <summary>The value, or an <see cref="InvalidDataException"/> listing the errors.</summary>
    public T GetValueOrThrow() =>
        Value ?? throw new InvalidDataException(string.Join(Environment.NewLine, Errors.Select(e => e.ToString())));

    public ReadResult<TOut> Map<TOut>(Func<T, TOut> map) where TOut : class =>
        new(Value is null ? null : map(Value), Issues);
}
