using BarrierLedger.Ledger.Accounts;
using Microsoft.AspNetCore.Identity;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Web.Components.Account;

/// <summary>One row of the account list.</summary>
public sealed record UserRow(string Id, string UserName, string DisplayName, IReadOnlyList<string> Roles, bool LockedOut, bool MustChangePassword);

/// <summary>
/// Account administration for the Admin page. Each call uses its own scope (and so its own DbContext). Every change names the
/// acting user and is refused unless the store says that user is an active Admin now (an open page may have outlived the role).
/// </summary>
public sealed class UserAdminService(IServiceScopeFactory scopes, AccountAccess access)
{
    public const string NotAdminMessage = "Not changed: your account is no longer an active Admin (the store says so; reload the page).";

    private Task<bool> ActorIsAdminAsync(string actorUserId) => access.HoldsAsync(actorUserId, Policies.RolesFor(Policies.Admin));

    public async Task<IReadOnlyList<UserRow>> ListAsync()
    {
        await using var scope = scopes.CreateAsyncScope();
        var users = scope.ServiceProvider.GetRequiredService<UserManager<LedgerUser>>();
        var rows = new List<UserRow>();
        foreach (var u in await users.Users.OrderBy(u => u.UserName).ToListAsync())
        {
            var roles = await users.GetRolesAsync(u);
            var locked = u.LockoutEnd is { } end && end > DateTimeOffset.UtcNow;
            rows.Add(new UserRow(u.Id, u.UserName ?? "", u.DisplayName, [.. roles.Order()], locked, u.MustChangePassword));
        }
        return rows;
    }

    /// <summary>Creates an account with a one-time password (returned once) and the Member role.</summary>
    public async Task<(bool Ok, string Message, string? OneTimePassword)> CreateAsync(string actorUserId, string userName, string displayName)
    {
        if (!await ActorIsAdminAsync(actorUserId)) return (false, NotAdminMessage, null);
        userName = userName.Trim();
        if (userName.Length < 2) return (false, "A user name needs at least 2 characters.", null);
        await using var scope = scopes.CreateAsyncScope();
        var users = scope.ServiceProvider.GetRequiredService<UserManager<LedgerUser>>();
        var password = AccountBootstrap.OneTimePassword();
        var user = new LedgerUser { UserName = userName, DisplayName = displayName.Trim(), MustChangePassword = true };
        var result = await users.CreateAsync(user, password);
        if (!result.Succeeded) return (false, string.Join(" ", result.Errors.Select(e => e.Description)), null);
        await users.AddToRoleAsync(user, Roles.Member);
        return (true, $"Created '{userName}'. Give them the one-time password below; it is shown only now.", password);
    }

    /// <summary>Adds or removes one role. Refuses to remove the last Admin's Admin role.</summary>
    public async Task<(bool Ok, string Message)> SetRoleAsync(string actorUserId, string userId, string role, bool member)
    {
        if (!await ActorIsAdminAsync(actorUserId)) return (false, NotAdminMessage);
        if (!Roles.All.Contains(role)) return (false, $"Unknown role '{role}'.");
        await using var scope = scopes.CreateAsyncScope();
        var users = scope.ServiceProvider.GetRequiredService<UserManager<LedgerUser>>();
        var user = await users.FindByIdAsync(userId);
        if (user is null) return (false, "That account no longer exists.");
        var has = await users.IsInRoleAsync(user, role);
        if (has == member) return (true, "No change.");
        if (!member && role == Roles.Admin && (await users.GetUsersInRoleAsync(Roles.Admin)).Count <= 1)
            return (false, "This is the last admin; make someone else admin first.");
        var result = member ? await users.AddToRoleAsync(user, role) : await users.RemoveFromRoleAsync(user, role);
        if (!result.Succeeded) return (false, string.Join(" ", result.Errors.Select(e => e.Description)));
        await users.UpdateSecurityStampAsync(user);
        return (true, $"{user.UserName}: {(member ? "added to" : "removed from")} {role}.");
    }
}
