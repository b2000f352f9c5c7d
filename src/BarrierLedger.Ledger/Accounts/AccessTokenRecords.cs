namespace BarrierLedger.Ledger.Accounts;

/// <summary>
/// What a personal access token may do. <see cref="Read"/>: every GET of the API. <see cref="Upload"/>: everything read may,
/// plus the API's writes (uploads, and for a reviewer's token, verify/return).
/// </summary>
public static class TokenScopes
{
    public const string Read = "read";
    public const string Upload = "upload";

    public static IReadOnlyList<string> All { get; } = [Read, Upload];

    /// <summary>True when a token with scope <paramref name="granted"/> may do what needs <paramref name="needed"/>.</summary>
    public static bool Allows(string granted, string needed) =>
        granted == needed || (granted == Upload && needed == Read);
}

/// <summary>Why a presented token was refused (<see cref="None"/>: it was accepted).</summary>
public enum TokenRejection
{
    None,
    /// <summary>Not of the form <c>bltk_&lt;id&gt;_&lt;secret&gt;</c>.</summary>
    Malformed,
    /// <summary>No token with that id, or the secret does not match its hash (the two are not told apart).</summary>
    Unknown,
    Expired,
    Revoked,
    /// <summary>The token's account is locked out or gone.</summary>
    AccountUnavailable,
}

/// <summary>A token as its owner sees it in the list (never with its secret).</summary>
public sealed record AccessTokenInfo(string Id, string Label, string Scope, DateTimeOffset CreatedAt, DateTimeOffset ExpiresAt, DateTimeOffset? RevokedAt)
{
    public bool IsActive(DateTimeOffset now) => RevokedAt is null && now < ExpiresAt;

    public string Status(DateTimeOffset now) => RevokedAt is not null ? "revoked" : now >= ExpiresAt ? "expired" : "active";
}

/// <summary>A token just created: <see cref="Text"/> is shown to its owner once and is stored nowhere.</summary>
public sealed record CreatedAccessToken(AccessTokenInfo Info, string Text);

/// <summary>The outcome of checking a presented token: its user, that user's roles and the token, or why it was refused.</summary>
public sealed record TokenCheck(TokenRejection Rejection, string? UserId, string? UserName, string? DisplayName, IReadOnlyList<string> Roles, AccessTokenInfo? Token)
{
    public bool Accepted => Rejection == TokenRejection.None;

    internal static TokenCheck Refused(TokenRejection why, AccessTokenInfo? token = null) => new(why, null, null, null, [], token);
}
