using Microsoft.AspNetCore.Identity;

namespace BarrierLedger.Ledger.Accounts;

/// <summary>A person who signs in: a member, a reviewer or an admin (roles in <see cref="Roles"/>).</summary>
public class LedgerUser : IdentityUser
{
    /// <summary>Name shown in tables ("owner", "reviewer").</summary>
    public string DisplayName { get; set; } = "";

    /// <summary>Set for accounts created with a one-time password; cleared when the user sets their own.</summary>
    public bool MustChangePassword { get; set; }

    public DateTimeOffset CreatedAt { get; set; } = DateTimeOffset.UtcNow;
}
