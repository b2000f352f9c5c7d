using System.Security.Cryptography;
using BarrierLedger.Ledger.Accounts;
using Microsoft.AspNetCore.Identity;

namespace BarrierLedger.Web.Components.Account;

/// <summary>Creates the roles and, on an empty store, one Admin with a random one-time password printed once.</summary>
public sealed class AccountBootstrap(UserManager<LedgerUser> users, RoleManager<IdentityRole> roles, ILogger<AccountBootstrap> logger)
{
    public const string FirstAdminUserName = "admin";

    /// <summary>Returns true when the store had no accounts (a first start).</summary>
    public async Task<bool> EnsureRolesAndFirstAdminAsync(TextWriter console)
    {
        foreach (var role in Roles.All)
            if (!await roles.RoleExistsAsync(role))
                await roles.CreateAsync(new IdentityRole(role));

        if (users.Users.Any()) return false;

        var password = OneTimePassword();
        var admin = new LedgerUser { UserName = FirstAdminUserName, DisplayName = "Administrator", MustChangePassword = true };
        var created = await users.CreateAsync(admin, password);
        if (!created.Succeeded)
            throw new InvalidOperationException("Could not create the first admin: " + string.Join("; ", created.Errors.Select(e => e.Description)));
        await users.AddToRolesAsync(admin, [Roles.Admin, Roles.Reviewer, Roles.Member]);
        logger.LogInformation("Created the first admin account '{User}'.", FirstAdminUserName);
        await console.WriteLineAsync($"First sign-in: user '{FirstAdminUserName}', one-time password: {password}");
        await console.WriteLineAsync("(shown once; you will be asked to choose your own password at first sign-in)");
        await console.FlushAsync();
        return true;
    }

    /// <summary>16 characters from an alphabet without look-alikes (no 0/O, 1/l/I), from a cryptographic RNG.</summary>
    public static string OneTimePassword()
    {
        const string alphabet = "abcdefghijkmnpqrstuvwxyzABCDEFGHJKLMNPQRSTUVWXYZ23456789";
        var body = RandomNumberGenerator.GetString(alphabet, 14);
        return body[..7] + "-" + body[7..] + "9";
    }
}
