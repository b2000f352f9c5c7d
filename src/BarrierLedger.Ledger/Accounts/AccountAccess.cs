using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Accounts;

/// <summary>An account as the store holds it now: whether it may act at all, and its roles.</summary>
public sealed record AccountStanding(bool Exists, bool Active, IReadOnlyList<string> Roles)
{
    public static AccountStanding Missing { get; } = new(false, false, []);

    /// <summary>Active and holding at least one of <paramref name="anyOf"/>.</summary>
    public bool Holds(IEnumerable<string> anyOf) => Active && anyOf.Any(r => Roles.Contains(r, StringComparer.Ordinal));
}

/// <summary>
/// Reads an account's standing from the store at the moment something is granted. A sign-in cookie or an open page carries the
/// roles of the moment it was issued; whatever grants a privilege asks here instead, so a removed role or a locked account
/// stops working at once.
/// </summary>
public sealed class AccountAccess(IDbContextFactory<LedgerDbContext> factory, TimeProvider time)
{
    public async Task<AccountStanding> GetAsync(string? userId, CancellationToken ct = default)
    {
        if (string.IsNullOrEmpty(userId)) return AccountStanding.Missing;
        await using var db = await factory.CreateDbContextAsync(ct);
        var user = await db.Users.AsNoTracking().Where(u => u.Id == userId).Select(u => new { u.LockoutEnd }).SingleOrDefaultAsync(ct);
        if (user is null) return AccountStanding.Missing;
        var roles = await db.UserRoles.Where(ur => ur.UserId == userId)
            .Join(db.Roles, ur => ur.RoleId, r => r.Id, (_, r) => r.Name!)
            .ToListAsync(ct);
        var active = !(user.LockoutEnd is { } end && end > time.GetUtcNow());
        return new AccountStanding(true, active, roles);
    }

    /// <summary>True when the account exists, is active and holds one of <paramref name="anyOf"/> in the store now.</summary>
    public async Task<bool> HoldsAsync(string? userId, IEnumerable<string> anyOf, CancellationToken ct = default) =>
        (await GetAsync(userId, ct)).Holds(anyOf);
}
