namespace BarrierLedger.Ledger.Accounts;

/// <summary>The three roles. A reviewer is also a member; an admin manages accounts and the instance.</summary>
public static class Roles
{
    public const string Member = "Member";
    public const string Reviewer = "Reviewer";
    public const string Admin = "Admin";

    public static IReadOnlyList<string> All { get; } = [Member, Reviewer, Admin];

    /// <summary>
    /// The one rule for signing off saddle points and setting the group's energy model, on screen, in the API and in the
    /// services: the Reviewer role. Admin manages accounts and grants nothing scientific by itself (the first admin account
    /// is created with the Reviewer role too). Documented in docs/ledger.md, "Who reviews".
    /// </summary>
    public static string[] MayReview => [Reviewer];
}
