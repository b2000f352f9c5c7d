namespace BarrierLedger.Ledger.Accounts;

/// <summary>The three roles. A reviewer is also a member; an admin manages accounts and the instance.</summary>
public static class Roles
{
    public const string Member = "Member";
    public const string Reviewer = "Reviewer";
    public const string Admin = "Admin";

    public static IReadOnlyList<string> All { get; } = [Member, Reviewer, Admin];
}
