using Microsoft.Data.Sqlite;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Storage;

/// <summary>Start-up steps for the SQLite store: folder, WAL journal, migrations.</summary>
public static class SqliteSetup
{
    /// <summary>
    /// Creates the data folder, switches the file to WAL (persistent in the file: readers never block the writer),
    /// applies pending migrations and fills in the reaction status summaries a migrated ledger lacks.
    /// </summary>
    public static async Task PrepareAsync(LedgerOptions options, IDbContextFactory<LedgerDbContext> factory, CancellationToken ct = default)
    {
        Directory.CreateDirectory(options.ResolvedDataDirectory);
        await using (var connection = new SqliteConnection(options.SqliteConnectionString))
        {
            await connection.OpenAsync(ct);
            await using var command = connection.CreateCommand();
            command.CommandText = "PRAGMA journal_mode=WAL;";
            await command.ExecuteScalarAsync(ct);
        }
        await using var db = await factory.CreateDbContextAsync(ct);
        await db.Database.MigrateAsync(ct);
        // A ledger from before the reaction status summary (or a backup of one) gets it now, so its ledger lists read it.
        await Derivation.ReactionStatusSummary.FillMissingAsync(db, null, ct);
    }
}
