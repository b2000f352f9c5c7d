using System.Data;
using Microsoft.Data.Sqlite;
using Microsoft.EntityFrameworkCore;
using Npgsql;

namespace BarrierLedger.Ledger.Storage;

/// <summary>
/// Runs a write operation again when the store says "try again": on SQLite the file busy or locked beyond the connection's busy
/// timeout; on PostgreSQL a serialization failure (40001) or deadlock (40P01) of the serializable write transaction, or a
/// transient connection error (server restarting, connection dropped). "Database is locked" or "could not serialize access" then
/// never reaches the user while several people store at once. Each attempt must use a fresh context.
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

    /// <summary>True when the operation may succeed if run again, directly or wrapped by EF.</summary>
    public static bool IsBusy(Exception ex)
    {
        for (var e = ex; e is not null; e = e.InnerException)
        {
            switch (e)
            {
                case SqliteException { SqliteErrorCode: 5 or 6 }: // SQLITE_BUSY, SQLITE_LOCKED
                case PostgresException { SqlState: PostgresErrorCodes.SerializationFailure or PostgresErrorCodes.DeadlockDetected }:
                case NpgsqlException { IsTransient: true }:
                    return true;
            }
        }
        return false;
    }

    /// <summary>
    /// Opens the context's connection and starts the write transaction. SQLite: BEGIN IMMEDIATE (Microsoft.Data.Sqlite's default),
    /// so the write lock is taken before anything is read and a read-to-write upgrade cannot fail mid-operation. PostgreSQL:
    /// SERIALIZABLE, so the find-or-create steps of an upload behave as if uploads ran one after another, as they do on SQLite;
    /// a conflict aborts one of them with 40001, which <see cref="RunAsync{T}"/> runs again.
    /// </summary>
    public static async Task<Microsoft.EntityFrameworkCore.Storage.IDbContextTransaction> BeginWriteAsync(LedgerDbContext db, CancellationToken ct) =>
        db is PostgreSqlLedgerDbContext
            ? await db.Database.BeginTransactionAsync(IsolationLevel.Serializable, ct)
            : await db.Database.BeginTransactionAsync(ct);
}
