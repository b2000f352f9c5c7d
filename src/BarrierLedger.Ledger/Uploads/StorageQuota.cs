using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Uploads;

/// <summary>One account's stored original files: their count and bytes (the account may since have been deleted).</summary>
public sealed record StorageUsage(string UserId, string? UserName, int Files, long UsedBytes);

/// <summary>
/// An upload refused because it would take its uploader past the storage quota. Nothing was stored; the message names the quota,
/// what the user has stored and what this upload would have added.
/// </summary>
public sealed record QuotaRefusal(long QuotaBytes, long UsedBytes, long UploadBytes)
{
    public string Message =>
        $"Storage quota reached: your quota is {StorageQuota.Format(QuotaBytes)}, you have stored {StorageQuota.Format(UsedBytes)}, " +
        $"and this upload would add {StorageQuota.Format(UploadBytes)} of new files ({StorageQuota.Format(UsedBytes + UploadBytes - QuotaBytes)} too much); " +
        "nothing was stored. An admin can raise BarrierLedger:Uploads:UserQuotaMiB.";
}

/// <summary>
/// The per-user storage quota (issue 19, finding 7). What counts is the original files a user stored: a file already in the ledger
/// (the same bytes) is stored once and counts only for whoever stored it first, so sending it again costs nothing. The records read
/// from the files (geometries, scan points, IRC frames) are stored beside them and are not counted.
/// </summary>
public sealed class StorageQuota(UploadReadOptions options, IDbContextFactory<LedgerDbContext> factory)
{
    private const long MiB = 1024L * 1024;

    /// <summary>The quota in bytes, or null when none is set (<see cref="UploadReadOptions.UserQuotaMiB"/> 0 or less).</summary>
    public long? QuotaBytes => options.UserQuotaMiB > 0 ? options.UserQuotaMiB * MiB : null;

    public static Task<long> UsedBytesAsync(LedgerDbContext db, string userId, CancellationToken ct) =>
        db.StoredFiles.Where(f => f.UploadedByUserId == userId).SumAsync(f => f.SizeBytes, ct);

    /// <summary>
    /// Inside the upload's write transaction (so two uploads of one user cannot both slip under the quota): the refusal when the
    /// files of <paramref name="fileSha"/> that are not stored yet would take <paramref name="userId"/> past the quota, else null.
    /// </summary>
    internal async Task<QuotaRefusal?> CheckAsync(LedgerDbContext db, string userId, IReadOnlyDictionary<string, string> fileSha,
        IReadOnlyDictionary<string, byte[]> files, CancellationToken ct)
    {
        if (QuotaBytes is not { } quota) return null;
        var shas = fileSha.Values.Distinct().ToList();
        var stored = (await db.StoredFiles.Where(f => shas.Contains(f.Sha256)).Select(f => f.Sha256).ToListAsync(ct)).ToHashSet(StringComparer.Ordinal);
        var adding = fileSha.Where(p => !stored.Contains(p.Value)).DistinctBy(p => p.Value).Sum(p => files[p.Key].LongLength);
        if (adding == 0) return null;
        var used = await UsedBytesAsync(db, userId, ct);
        return used + adding > quota ? new QuotaRefusal(quota, used, adding) : null;
    }

    /// <summary>Every account that stored files, most bytes first, with its user name (null for a deleted account).</summary>
    public async Task<IReadOnlyList<StorageUsage>> PerUserAsync(CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        var sums = await db.StoredFiles.GroupBy(f => f.UploadedByUserId)
            .Select(g => new { UserId = g.Key, Files = g.Count(), Bytes = g.Sum(f => f.SizeBytes) }).ToListAsync(ct);
        var ids = sums.Select(s => s.UserId).ToList();
        var names = await db.Users.Where(u => ids.Contains(u.Id)).ToDictionaryAsync(u => u.Id, u => u.UserName, ct);
        return [.. sums.Select(s => new StorageUsage(s.UserId, names.GetValueOrDefault(s.UserId), s.Files, s.Bytes))
            .OrderByDescending(s => s.UsedBytes).ThenBy(s => s.UserName, StringComparer.Ordinal)];
    }

    /// <summary>Bytes as people read them: "512 bytes", "3.4 MiB", "2 GiB".</summary>
    public static string Format(long bytes) => bytes switch
    {
        >= 1024 * MiB => FormattableString.Invariant($"{bytes / (1024.0 * MiB):0.##} GiB"),
        >= MiB => FormattableString.Invariant($"{bytes / (double)MiB:0.#} MiB"),
        >= 1024 => FormattableString.Invariant($"{bytes / 1024.0:0.#} KiB"),
        _ => FormattableString.Invariant($"{bytes} bytes"),
    };
}
