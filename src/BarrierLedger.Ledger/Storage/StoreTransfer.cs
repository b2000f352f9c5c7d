using System.Security.Cryptography;
using BarrierLedger.Ledger.Coordination;
using BarrierLedger.Ledger.Records;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Metadata;

namespace BarrierLedger.Ledger.Storage;

/// <summary>One table of a store transfer: rows read from the source, rows in the target after the copy, rows the copy replaced.</summary>
public sealed record TransferredTable(string Table, long SourceRows, long TargetRows, long ReplacedRows);

/// <summary>What <see cref="StoreTransfer.CopyAsync"/> did.</summary>
/// <param name="Tables">Every copied table in the order it was written (parents before children).</param>
/// <param name="FilesVerified">Stored original files whose content in the target hashes to the SHA-256 the source records.</param>
/// <param name="Replaced">Whether the target held a ledger that the copy replaced (only with force).</param>
public sealed record TransferReport(IReadOnlyList<TransferredTable> Tables, int FilesVerified, bool Replaced)
{
    public long TotalRows => Tables.Sum(t => t.TargetRows);
}

/// <summary>A transfer that was refused or failed its verification; nothing was written to the target.</summary>
public sealed class StoreTransferException(string message) : Exception(message);

/// <summary>
/// Copies a whole ledger from one store to another (SQLite to PostgreSQL, or either way) through the EF model, so each value
/// goes through the same type mapping the app uses: every mapped table (accounts and roles, access tokens, studies and every
/// record under them, stored files, uploads, audit, reviews, derivations, energy models, data-protection keys) with its ids
/// and versions as they are. Leases on background work are runtime state of the instances on the source and are not copied.
/// The whole copy is one transaction on the target: row counts per table and the SHA-256 of every stored file are checked
/// before it commits, and PostgreSQL's identity sequences are moved past the copied ids. The source is read in one
/// transaction too, so a running app cannot make the copy inconsistent.
/// A target that already holds rows is refused unless <c>force</c>, which deletes them (reported per table) in the same
/// transaction. Both stores must already be at the current schema (the caller migrates the target).
/// Times are kept to the target's resolution: PostgreSQL stores microseconds, where SQLite kept .NET's 100 ns ticks.
/// </summary>
public static class StoreTransfer
{
    private const int BatchSize = 500;

    public static async Task<TransferReport> CopyAsync(LedgerDbContext source, LedgerDbContext target, bool force, TextWriter? log = null, CancellationToken ct = default)
    {
        var tables = OrderedTables(source.Model);
        await using var readTx = await source.Database.BeginTransactionAsync(ct);
        await using var writeTx = await target.Database.BeginTransactionAsync(ct);
        target.ChangeTracker.AutoDetectChangesEnabled = false;
        target.KeepVersionsAsGiven = true;

        var existing = new Dictionary<string, long>();
        foreach (var t in tables) existing[t.Table] = await t.Ops.CountAsync(target, ct);
        var occupied = existing.Where(e => e.Value > 0).ToList();
        if (occupied.Count > 0 && !force)
            throw new StoreTransferException("the target already holds a ledger (" + string.Join(", ", occupied.Select(e => $"{e.Key} {e.Value}"))
                + "); give --force to replace it, or point --to at an empty database");
        if (occupied.Count > 0)
        {
            log?.WriteLine("replacing the target's ledger: " + string.Join(", ", occupied.Select(e => $"{e.Key} {e.Value}")));
            foreach (var t in Enumerable.Reverse(tables)) await t.Ops.DeleteAllAsync(target, ct);
        }

        var results = new List<TransferredTable>();
        foreach (var t in tables)
        {
            var read = await t.Ops.CopyAsync(source, target, ct);
            log?.WriteLine($"copied {t.Table}: {read} row(s)");
            results.Add(new TransferredTable(t.Table, read, 0, existing[t.Table]));
        }
        if (target.Database.ProviderName?.StartsWith("Npgsql", StringComparison.Ordinal) == true)
            foreach (var t in tables) await ResetIdentitySequenceAsync(target, t.EntityType, ct);

        // Verification inside the transaction: a mismatch rolls everything back.
        for (var i = 0; i < results.Count; i++)
        {
            var t = tables[i];
            var inSource = await t.Ops.CountAsync(source, ct);
            var inTarget = await t.Ops.CountAsync(target, ct);
            if (inSource != results[i].SourceRows || inTarget != inSource)
                throw new StoreTransferException($"row count of {t.Table} differs after the copy: source {inSource}, target {inTarget}; nothing was written");
            results[i] = results[i] with { TargetRows = inTarget };
        }
        var files = await VerifyFilesAsync(source, target, ct);
        await writeTx.CommitAsync(ct);
        return new TransferReport(results, files, occupied.Count > 0);
    }

    /// <summary>The SHA-256 of every stored file in the target, computed from its content, must equal what the source records for that id.</summary>
    private static async Task<int> VerifyFilesAsync(LedgerDbContext source, LedgerDbContext target, CancellationToken ct)
    {
        var expected = await source.StoredFiles.AsNoTracking().ToDictionaryAsync(f => f.Id, f => f.Sha256, ct);
        var checkedFiles = 0;
        foreach (var id in expected.Keys.Order())
        {
            var content = await target.StoredFiles.AsNoTracking().Where(f => f.Id == id).Select(f => f.Content).SingleOrDefaultAsync(ct)
                ?? throw new StoreTransferException($"stored file {id} is missing from the target; nothing was written");
            var actual = Convert.ToHexStringLower(SHA256.HashData(content));
            if (actual != expected[id])
                throw new StoreTransferException($"stored file {id} hashes to {actual} in the target but the source records {expected[id]}; nothing was written");
            checkedFiles++;
        }
        return checkedFiles;
    }

    /// <summary>PostgreSQL: after explicit ids were inserted, the identity sequence must continue after the largest one.</summary>
    private static async Task ResetIdentitySequenceAsync(LedgerDbContext target, IEntityType type, CancellationToken ct)
    {
        var key = type.FindPrimaryKey();
        if (key is not { Properties.Count: 1 } || key.Properties[0].ValueGenerated != ValueGenerated.OnAdd) return;
        var clr = Nullable.GetUnderlyingType(key.Properties[0].ClrType) ?? key.Properties[0].ClrType;
        if (clr != typeof(int) && clr != typeof(long)) return;
        var table = type.GetTableName()!;
        var schema = type.GetSchema();
        var column = key.Properties[0].GetColumnName(StoreObjectIdentifier.Table(table, schema))!;
        var qualified = (schema is null ? "" : Quote(schema) + ".") + Quote(table);
        var sql = $"SELECT setval(pg_get_serial_sequence('{qualified.Replace("'", "''")}', '{column.Replace("'", "''")}'), "
            + $"COALESCE((SELECT MAX({Quote(column)}) FROM {qualified}), 0) + 1, false)";
        await target.Database.ExecuteSqlRawAsync(sql, ct);
    }

    private static string Quote(string identifier) => "\"" + identifier.Replace("\"", "\"\"") + "\"";

    private sealed record TableEntry(string Table, IEntityType EntityType, ITableOps Ops);

    /// <summary>Every mapped table except the leases, parents before children (foreign keys), ties by name.</summary>
    private static List<TableEntry> OrderedTables(IModel model)
    {
        var types = model.GetEntityTypes()
            .Where(t => !t.IsOwned() && t.GetTableName() is not null && t.ClrType != typeof(WorkLease))
            .OrderBy(t => t.GetTableName(), StringComparer.Ordinal)
            .ToList();
        var ordered = new List<IEntityType>();
        var placed = new HashSet<IEntityType>();
        while (ordered.Count < types.Count)
        {
            var next = types.FirstOrDefault(t => !placed.Contains(t)
                && t.GetForeignKeys().All(fk => fk.PrincipalEntityType == t || placed.Contains(fk.PrincipalEntityType) || !types.Contains(fk.PrincipalEntityType)))
                ?? throw new InvalidOperationException("The ledger model has a cycle of foreign keys; the tables cannot be copied parent-first.");
            ordered.Add(next);
            placed.Add(next);
        }
        return [.. ordered.Select(t => new TableEntry(t.GetTableName()!, t, (ITableOps)Activator.CreateInstance(typeof(TableOps<>).MakeGenericType(t.ClrType))!))];
    }

    private interface ITableOps
    {
        Task<long> CountAsync(LedgerDbContext db, CancellationToken ct);
        Task<long> CopyAsync(LedgerDbContext source, LedgerDbContext target, CancellationToken ct);
        Task DeleteAllAsync(LedgerDbContext db, CancellationToken ct);
    }

    private sealed class TableOps<T> : ITableOps where T : class
    {
        public Task<long> CountAsync(LedgerDbContext db, CancellationToken ct) => db.Set<T>().LongCountAsync(ct);

        public Task DeleteAllAsync(LedgerDbContext db, CancellationToken ct) => db.Set<T>().ExecuteDeleteAsync(ct);

        public async Task<long> CopyAsync(LedgerDbContext source, LedgerDbContext target, CancellationToken ct)
        {
            long rows = 0;
            var pending = 0;
            await foreach (var row in source.Set<T>().AsNoTracking().AsAsyncEnumerable().WithCancellation(ct))
            {
                target.Set<T>().Add(row);
                rows++;
                if (++pending < BatchSize) continue;
                await target.SaveChangesAsync(ct);
                target.ChangeTracker.Clear();
                pending = 0;
            }
            if (pending > 0)
            {
                await target.SaveChangesAsync(ct);
                target.ChangeTracker.Clear();
            }
            return rows;
        }
    }
}
