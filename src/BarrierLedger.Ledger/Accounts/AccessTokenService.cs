using System.Security.Cryptography;
using System.Text;
using System.Text.Json;
using System.Text.Json.Serialization;
using BarrierLedger.Ledger.Auditing;
using BarrierLedger.Ledger.Storage;
using Microsoft.AspNetCore.Identity;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Accounts;

/// <summary>
/// Personal access tokens for the HTTP API. A token reads <c>bltk_&lt;id&gt;_&lt;secret&gt;</c>; it is kept in Identity's
/// AspNetUserTokens table (login provider <see cref="LoginProvider"/>, name = the public id, value = JSON holding the SHA-256
/// of the secret, scope, creation, expiry, label and revocation time). The secret itself is never stored: it is shown to its
/// owner once. Creation, revocation and every accepted use are written to the audit trail.
/// </summary>
public sealed class AccessTokenService(IDbContextFactory<LedgerDbContext> factory, AuditService audit, TimeProvider time)
{
    /// <summary>The AspNetUserTokens login provider that marks a row as one of our access tokens.</summary>
    public const string LoginProvider = "BarrierLedger.AccessToken";
    public const string Prefix = "bltk";
    public const int IdLength = 10;
    public const int SecretLength = 40;
    public const int MaxLabelLength = 80;
    public static readonly TimeSpan MaxLifetime = TimeSpan.FromDays(366);
    public const string AuditEntityType = "AccessToken";

    private const string IdAlphabet = "abcdefghijklmnopqrstuvwxyz0123456789";
    private const string SecretAlphabet = "ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789";

    private static readonly JsonSerializerOptions Json = new(JsonSerializerDefaults.Web) { DefaultIgnoreCondition = JsonIgnoreCondition.Never };

    /// <summary>Creates a token for <paramref name="userId"/>; the returned text is the only copy of the secret.</summary>
    public async Task<CreatedAccessToken> CreateAsync(string userId, string label, string scope, TimeSpan lifetime, CancellationToken ct = default)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(userId);
        label = (label ?? "").Trim();
        if (label.Length == 0) throw new ArgumentException("A token needs a label saying where it is used (e.g. 'cluster job scripts').", nameof(label));
        if (label.Length > MaxLabelLength) throw new ArgumentException($"The label is {label.Length} characters; at most {MaxLabelLength}.", nameof(label));
        if (!TokenScopes.All.Contains(scope)) throw new ArgumentException($"Unknown scope '{scope}'; expected one of: {string.Join(", ", TokenScopes.All)}.", nameof(scope));
        if (lifetime <= TimeSpan.Zero || lifetime > MaxLifetime)
            throw new ArgumentException($"A token lives between 1 day and {MaxLifetime.TotalDays:F0} days; {lifetime.TotalDays:F1} days was asked.", nameof(lifetime));

        await using var db = await factory.CreateDbContextAsync(ct);
        if (!await db.Users.AnyAsync(u => u.Id == userId, ct)) throw new ArgumentException($"No account with id '{userId}'.", nameof(userId));

        var now = time.GetUtcNow();
        var id = RandomNumberGenerator.GetString(IdAlphabet, IdLength);
        var secret = RandomNumberGenerator.GetString(SecretAlphabet, SecretLength);
        var stored = new StoredToken(HashHex(secret), scope, now, now + lifetime, label, null);
        db.UserTokens.Add(new IdentityUserToken<string> { UserId = userId, LoginProvider = LoginProvider, Name = id, Value = JsonSerializer.Serialize(stored, Json) });
        audit.Record(db, userId, "token.created", AuditEntityType, id, $"Access token '{label}' ({scope}) created, expires {stored.Expires:yyyy-MM-dd}.");
        await db.SaveChangesAsync(ct);
        return new CreatedAccessToken(stored.ToInfo(id), $"{Prefix}_{id}_{secret}");
    }

    /// <summary>The user's tokens, newest first, active or not.</summary>
    public async Task<IReadOnlyList<AccessTokenInfo>> ListAsync(string userId, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        var rows = await db.UserTokens.AsNoTracking()
            .Where(t => t.UserId == userId && t.LoginProvider == LoginProvider)
            .Select(t => new { t.Name, t.Value })
            .ToListAsync(ct);
        return [.. rows.Select(r => Parse(r.Value).ToInfo(r.Name)).OrderByDescending(t => t.CreatedAt)];
    }

    /// <summary>Revokes one of the user's own tokens. False when the user has no such token; revoking twice keeps the first time.</summary>
    public async Task<bool> RevokeAsync(string userId, string tokenId, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        var row = await db.UserTokens.SingleOrDefaultAsync(t => t.UserId == userId && t.LoginProvider == LoginProvider && t.Name == tokenId, ct);
        if (row is null) return false;
        var stored = Parse(row.Value);
        if (stored.Revoked is not null) return true;
        row.Value = JsonSerializer.Serialize(stored with { Revoked = time.GetUtcNow() }, Json);
        audit.Record(db, userId, "token.revoked", AuditEntityType, tokenId, $"Access token '{stored.Label}' revoked.");
        await db.SaveChangesAsync(ct);
        return true;
    }

    /// <summary>
    /// Checks a presented token. When accepted, records its use (<paramref name="use"/>, e.g. "POST /api/v1/uploads") in the
    /// audit trail and returns the user with their current roles.
    /// </summary>
    public async Task<TokenCheck> AuthenticateAsync(string presented, string use, CancellationToken ct = default)
    {
        if (!TryParse(presented, out var id, out var secret)) return TokenCheck.Refused(TokenRejection.Malformed);
        await using var db = await factory.CreateDbContextAsync(ct);
        var row = await db.UserTokens.AsNoTracking()
            .Where(t => t.LoginProvider == LoginProvider && t.Name == id)
            .Select(t => new { t.UserId, t.Value })
            .SingleOrDefaultAsync(ct);
        if (row is null) return TokenCheck.Refused(TokenRejection.Unknown);
        var stored = Parse(row.Value);
        var expected = Convert.FromHexString(stored.Sha256);
        if (!CryptographicOperations.FixedTimeEquals(expected, SHA256.HashData(Encoding.UTF8.GetBytes(secret))))
            return TokenCheck.Refused(TokenRejection.Unknown);

        var info = stored.ToInfo(id);
        var now = time.GetUtcNow();
        if (info.RevokedAt is not null) return TokenCheck.Refused(TokenRejection.Revoked, info);
        if (now >= info.ExpiresAt) return TokenCheck.Refused(TokenRejection.Expired, info);

        var user = await db.Users.AsNoTracking().SingleOrDefaultAsync(u => u.Id == row.UserId, ct);
        if (user is null || (user.LockoutEnd is { } end && end > now)) return TokenCheck.Refused(TokenRejection.AccountUnavailable, info);
        var roles = await db.UserRoles.Where(ur => ur.UserId == user.Id)
            .Join(db.Roles, ur => ur.RoleId, r => r.Id, (_, r) => r.Name!)
            .ToListAsync(ct);

        audit.Record(db, user.Id, "token.used", AuditEntityType, id, $"Access token '{info.Label}' ({info.Scope}) used: {use}");
        await db.SaveChangesAsync(ct);
        return new TokenCheck(TokenRejection.None, user.Id, user.UserName, user.DisplayName, roles, info);
    }

    /// <summary>Splits <c>bltk_&lt;id&gt;_&lt;secret&gt;</c>; false for anything else (wrong prefix, lengths or characters).</summary>
    public static bool TryParse(string? text, out string id, out string secret)
    {
        id = secret = "";
        if (text is null) return false;
        var parts = text.Trim().Split('_');
        if (parts.Length != 3 || parts[0] != Prefix || parts[1].Length != IdLength || parts[2].Length != SecretLength) return false;
        if (!parts[1].All(c => IdAlphabet.Contains(c)) || !parts[2].All(c => SecretAlphabet.Contains(c))) return false;
        (id, secret) = (parts[1], parts[2]);
        return true;
    }

    private static string HashHex(string secret) => Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(secret)));

    private static StoredToken Parse(string? value) =>
        JsonSerializer.Deserialize<StoredToken>(value ?? "", Json) ?? throw new InvalidDataException("An access-token row holds no value.");

    /// <summary>The JSON kept in AspNetUserTokens.Value.</summary>
    private sealed record StoredToken(string Sha256, string Scope, DateTimeOffset Created, DateTimeOffset Expires, string Label, DateTimeOffset? Revoked)
    {
        public AccessTokenInfo ToInfo(string id) => new(id, Label, Scope, Created, Expires, Revoked);
    }
}
