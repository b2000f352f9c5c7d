using BarrierLedger.Demo;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Auditing;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Web.Hosting;
using Microsoft.AspNetCore.Identity;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Web.Components.Account;

/// <summary>One row of the account list. <see cref="Disabled"/>: turned off by an admin; <see cref="LockedOut"/>: locked for a while after failed sign-ins.</summary>
public sealed record UserRow(string Id, string UserName, string DisplayName, IReadOnlyList<string> Roles, bool LockedOut, bool MustChangePassword, bool Disabled = false);

/// <summary>
/// Account administration for the Admin page. Each call uses its own scope (and so its own DbContext). Every change names the
/// acting user and is refused unless the store says that user is an active Admin now (an open page may have outlived the role).
/// </summary>
public sealed class UserAdminService(IServiceScopeFactory scopes, AccountAccess access, AuditService audit, IDbContextFactory<LedgerDbContext> factory)
{
    /// <summary>
    /// A disabled account is locked out until this far-off date (Identity's lockout, so sign-in, open pages and access tokens all
    /// refuse it); a lockout after failed sign-ins ends much sooner and is what "unlock" clears.
    /// </summary>
    public static readonly DateTimeOffset DisabledUntil = new(9999, 1, 1, 0, 0, 0, TimeSpan.Zero);

    public static bool IsDisabled(LedgerUser u) => u.LockoutEnd is { } end && end >= DisabledUntil;

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
            var disabled = IsDisabled(u);
            var locked = !disabled && u.LockoutEnd is { } end && end > DateTimeOffset.UtcNow;
            rows.Add(new UserRow(u.Id, u.UserName ?? "", u.DisplayName, [.. roles.Order()], locked, u.MustChangePassword, disabled));
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
        await AuditAsync(actorUserId, "account.created", user, "Account created with a one-time password and the Member role.");
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
        await AuditAsync(actorUserId, member ? "account.role-added" : "account.role-removed", user, $"{(member ? "added to" : "removed from")} {role}; sessions renewed.");
        return (true, $"{user.UserName}: {(member ? "added to" : "removed from")} {role}.");
    }

    /// <summary>Turns an account off (no sign-in, open pages closed, tokens refused) or on again. Not yourself, not the last admin.</summary>
    public async Task<(bool Ok, string Message)> SetDisabledAsync(string actorUserId, string userId, bool disabled)
    {
        if (!await ActorIsAdminAsync(actorUserId)) return (false, NotAdminMessage);
        await using var scope = scopes.CreateAsyncScope();
        var users = scope.ServiceProvider.GetRequiredService<UserManager<LedgerUser>>();
        var user = await users.FindByIdAsync(userId);
        if (user is null) return (false, "That account no longer exists.");
        if (disabled && user.Id == actorUserId) return (false, "You cannot disable your own account.");
        if (disabled && await IsLastActiveAdminAsync(users, user)) return (false, "This is the last admin; make someone else admin first.");
        if (IsDisabled(user) == disabled) return (true, "No change.");
        await users.SetLockoutEnabledAsync(user, true);
        var result = await users.SetLockoutEndDateAsync(user, disabled ? DisabledUntil : null);
        if (!result.Succeeded) return (false, Errors(result));
        await users.UpdateSecurityStampAsync(user);
        await AuditAsync(actorUserId, disabled ? "account.disabled" : "account.enabled", user, disabled ? "Account disabled; its sessions and access tokens stop working." : "Account enabled again.");
        return (true, $"{user.UserName}: {(disabled ? "disabled" : "enabled")}.");
    }

    /// <summary>Ends a lockout after failed sign-ins (a disabled account stays disabled).</summary>
    public async Task<(bool Ok, string Message)> UnlockAsync(string actorUserId, string userId)
    {
        if (!await ActorIsAdminAsync(actorUserId)) return (false, NotAdminMessage);
        await using var scope = scopes.CreateAsyncScope();
        var users = scope.ServiceProvider.GetRequiredService<UserManager<LedgerUser>>();
        var user = await users.FindByIdAsync(userId);
        if (user is null) return (false, "That account no longer exists.");
        if (IsDisabled(user)) return (false, $"{user.UserName} is disabled, not locked; enable the account instead.");
        await users.SetLockoutEndDateAsync(user, null);
        await users.ResetAccessFailedCountAsync(user);
        await AuditAsync(actorUserId, "account.unlocked", user, "Lockout after failed sign-ins ended by an admin.");
        return (true, $"{user.UserName}: unlocked.");
    }

    /// <summary>Gives the account a new one-time password (returned once); the user must choose their own at next sign-in, and every session ends.</summary>
    public async Task<(bool Ok, string Message, string? OneTimePassword)> ResetPasswordAsync(string actorUserId, string userId)
    {
        if (!await ActorIsAdminAsync(actorUserId)) return (false, NotAdminMessage, null);
        await using var scope = scopes.CreateAsyncScope();
        var users = scope.ServiceProvider.GetRequiredService<UserManager<LedgerUser>>();
        var user = await users.FindByIdAsync(userId);
        if (user is null) return (false, "That account no longer exists.", null);
        var password = AccountBootstrap.OneTimePassword();
        var result = await users.ResetPasswordAsync(user, await users.GeneratePasswordResetTokenAsync(user), password);
        if (!result.Succeeded) return (false, Errors(result), null);
        user.MustChangePassword = true;
        await users.UpdateAsync(user);
        await AuditAsync(actorUserId, "account.password-reset", user, "Password reset to a one-time password by an admin; sessions ended.");
        return (true, $"{user.UserName}: new one-time password below (shown only now); they choose their own at next sign-in.", password);
    }

    /// <summary>Deletes an account (sign-in, roles, access tokens). Its records and audit trail keep its user id. Not yourself, not the last admin.</summary>
    public async Task<(bool Ok, string Message)> DeleteAsync(string actorUserId, string userId)
    {
        if (!await ActorIsAdminAsync(actorUserId)) return (false, NotAdminMessage);
        await using var scope = scopes.CreateAsyncScope();
        var users = scope.ServiceProvider.GetRequiredService<UserManager<LedgerUser>>();
        var user = await users.FindByIdAsync(userId);
        if (user is null) return (false, "That account no longer exists.");
        if (user.Id == actorUserId) return (false, "You cannot delete your own account.");
        if (await IsLastActiveAdminAsync(users, user)) return (false, "This is the last admin; make someone else admin first.");
        return await DeleteUserAsync(users, actorUserId, user);
    }

    /// <summary>Whether the demo study or a demo account is still there (the Accounts page then offers to remove them).</summary>
    public async Task<bool> DemoPresentAsync()
    {
        await using var scope = scopes.CreateAsyncScope();
        var users = scope.ServiceProvider.GetRequiredService<UserManager<LedgerUser>>();
        var studies = await scope.ServiceProvider.GetRequiredService<LedgerQueryService>().GetStudiesAsync(includeRetired: false);
        return studies.Any(s => s.Name == DemoScenario.StudyName)
            || await users.FindByNameAsync(DemoAccounts.MemberUserName) is not null
            || await users.FindByNameAsync(DemoAccounts.ReviewerUserName) is not null;
    }

    /// <summary>One click: retires the demo study (records are retired, never deleted) and deletes both demo accounts, audited.</summary>
    public async Task<(bool Ok, string Message)> RemoveDemoAsync(string actorUserId)
    {
        if (!await ActorIsAdminAsync(actorUserId)) return (false, NotAdminMessage);
        await using var scope = scopes.CreateAsyncScope();
        var users = scope.ServiceProvider.GetRequiredService<UserManager<LedgerUser>>();
        var records = scope.ServiceProvider.GetRequiredService<RecordService>();
        var done = new List<string>();
        foreach (var study in (await scope.ServiceProvider.GetRequiredService<LedgerQueryService>().GetStudiesAsync(includeRetired: false)).Where(s => s.Name == DemoScenario.StudyName))
        {
            var retired = await records.RetireAsync(RecordKind.Study, study.Id, study.Version, actorUserId, "demo study removed by an admin");
            if (!retired.Saved) return (false, "The demo study was not retired: " + (retired.Conflict ?? string.Join(" ", retired.Errors)));
            done.Add($"demo study '{study.Name}' retired");
        }
        foreach (var name in new[] { DemoAccounts.MemberUserName, DemoAccounts.ReviewerUserName })
        {
            if (await users.FindByNameAsync(name) is not { } user) continue;
            var (ok, message) = await DeleteUserAsync(users, actorUserId, user);
            if (!ok) return (false, message);
            done.Add($"account {name} deleted");
        }
        return (true, done.Count == 0 ? "No demo study or demo account was left." : string.Join("; ", done) + ".");
    }

    private async Task<(bool Ok, string Message)> DeleteUserAsync(UserManager<LedgerUser> users, string actorUserId, LedgerUser user)
    {
        var name = user.UserName;
        var result = await users.DeleteAsync(user);
        if (!result.Succeeded) return (false, Errors(result));
        await AuditAsync(actorUserId, "account.deleted", user, $"Account {name} deleted (its records keep its user id).");
        return (true, $"{name}: deleted.");
    }

    private static async Task<bool> IsLastActiveAdminAsync(UserManager<LedgerUser> users, LedgerUser user) =>
        await users.IsInRoleAsync(user, Roles.Admin)
        && (await users.GetUsersInRoleAsync(Roles.Admin)).Count(a => a.Id != user.Id && !IsDisabled(a)) == 0;

    private async Task AuditAsync(string actorUserId, string action, LedgerUser user, string summary)
    {
        await using var db = await factory.CreateDbContextAsync();
        audit.Record(db, actorUserId, action, "Account", user.Id, $"{user.UserName}: {summary}");
        await db.SaveChangesAsync();
    }

    private static string Errors(IdentityResult result) => string.Join(" ", result.Errors.Select(e => e.Description));
}
