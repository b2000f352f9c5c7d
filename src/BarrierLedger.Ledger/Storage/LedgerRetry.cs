using Microsoft.Data.Sqlite;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Storage;

/// <summary>
/// Runs a write operation again when SQLite reports the file busy or locked beyond the connection's busy timeout, so that
/// "database is locked" does not reach the user while several people store at once. Each attempt must use a fresh context.
/// </summary>
public static class LedgerRetry
{
    public const int MaxAttempts = 8;

    public static async Task<T> RunAsync<T>(Func<CancellationToken, Task<T>> operation, CancellationToken ct = default)
    {
        for (var attempt = 1; ; attempt++)
        {
            try
            {
                return await operation(ct);
            }
            catch (Exception ex) when (attempt < MaxAttempts && IsBusy(ex))
            {
                await Task.Delay(TimeSpan.FromMilliseconds(25 * attempt + Random.Shared.Next(25)), ct);
            }
        }
    }

    /// <summary>SQLITE_BUSY (5) or SQLITE_LOCKED (6), directly or wrapped by EF.</summary>
    public static bool IsBusy(Exception ex)
    {
        for (var e = ex; e is not null; e = e.InnerException)
            if (e is SqliteException { SqliteErrorCode: 5 or 6 }) return true;
        return false;
    }

    /// <summary>Opens the context's connection and starts a write transaction at once (BEGIN IMMEDIATE), so the write lock is
    /// taken before anything is read and a deferred read-to-write upgrade cannot fail with SQLITE_BUSY mid-operation.</summary>
    public static async Task<Microsoft.EntityFrameworkCore.Storage.IDbContextTransaction> BeginWriteAsync(LedgerDbContext db, CancellationToken ct) =>
        await db.Database.BeginTransactionAsync(ct);
}
