using BarrierLedger.Demo;
using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.IsotopeEffects;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Uploads;
using Microsoft.AspNetCore.Identity;

namespace BarrierLedger.Web.Hosting;

/// <summary>Settings of the demo scenario loaded into an empty store.</summary>
public sealed class DemoOptions
{
    /// <summary>Whether a first start with an empty store loads the demo study and demo accounts, and why (<see cref="DemoPolicy"/>).</summary>
    public DemoPolicy.Decision Policy { get; init; } = new(true, "first local start on the embedded store");

    /// <summary>Folder with the demo files; by default the repository's seed-data/ found above the app.</summary>
    public string? DemoDirectory { get; init; }
}

/// <summary>The two demo accounts. Their passwords are public on purpose and shown on the sign-in page while the demo study is loaded.</summary>
public static class DemoAccounts
{
    public const string MemberUserName = "demo-member";
    public const string ReviewerUserName = "demo-reviewer";
    public const string MemberPassword = "Demo-member-2026";
    public const string ReviewerPassword = "Demo-reviewer-2026";
}

/// <summary>
/// On first start with an empty store, creates the demo accounts and stores the demo scenario through the same
/// upload workflow a member uses (so the demo exercises the readers, checks and derivations).
/// </summary>
public sealed class DemoSetup(
    UserManager<LedgerUser> users,
    UploadService uploads,
    RecomputeService recompute,
    LedgerQueryService ledger,
    IsotopeEffectService isotopes,
    DemoOptions options,
    ILogger<DemoSetup> log)
{
    private static readonly HashSet<string> s_dataExtensions = new(StringComparer.OrdinalIgnoreCase) { ".json", ".xyz", ".extxyz", ".csv", ".zip" };

    public async Task LoadIfEmptyAsync(bool storeWasEmpty, CancellationToken ct = default)
    {
        if (!storeWasEmpty) return;
        if (!options.Policy.Load)
        {
            log.LogInformation("No demo study or demo accounts: {Reason}.", options.Policy.Reason);
            return;
        }
        var dir = options.DemoDirectory ?? FindDemoDirectory();
        if (dir is null || !Directory.Exists(dir))
        {
            log.LogWarning("No demo files found (looked for seed-data/ above the app); starting with an empty ledger.");
            return;
        }
        var member = await EnsureUserAsync(DemoAccounts.MemberUserName, "Demo Member", DemoAccounts.MemberPassword, [Roles.Member]);
        await EnsureUserAsync(DemoAccounts.ReviewerUserName, "Demo Reviewer", DemoAccounts.ReviewerPassword, [Roles.Member, Roles.Reviewer]);

        var files = Directory.EnumerateFiles(dir, "*", SearchOption.AllDirectories)
            .Where(f => !Path.GetFileName(f).StartsWith('.') && s_dataExtensions.Contains(Path.GetExtension(f)))
            .Order(StringComparer.Ordinal)
            .Select(f => new UploadFile(Path.GetRelativePath(dir, f).Replace('\\', '/'), File.ReadAllBytes(f)))
            .ToList();
        var outcome = await uploads.StoreAsync(files, new UploadChoices(), member.Id, ct);
        if (!outcome.Stored || outcome.StudyId is not { } studyId)
        {
            log.LogError("The demo files in {Dir} could not be stored: {Errors}", dir, string.Join("; ", outcome.Errors));
            return;
        }
        // The bundle states the study's energy model (study.energy_model); the upload set it before deriving anything.
        await recompute.WhenIdleAsync();
        foreach (var (reaction, position, name, substitutions) in DemoScenario.IsotopologueSets)
        {
            var id = await isotopes.FindReactionAsync(studyId, reaction, ct);
            var set = id is null ? null : await isotopes.CreateAsync(id.Value, position, name, substitutions, null, member.Id, ct);
            if (set is not { Saved: true }) log.LogWarning("Demo isotopologue set '{Name}' not stored: {Why}", name, set is null ? $"no reaction {reaction}" : string.Join("; ", set.Errors));
        }
        log.LogInformation("Loaded the demo study ({Calcs} calculations, {Reactions} reactions) from {Dir}.",
            outcome.CalculationIds.Count, outcome.ReactionIds.Count, dir);
    }

    /// <summary>True while the demo study is in the ledger (not retired): then the sign-in page shows the demo accounts.</summary>
    public async Task<bool> IsDemoLoadedAsync(CancellationToken ct = default) =>
        (await ledger.GetStudiesAsync(includeRetired: false, ct)).Any(s => s.Name == DemoScenario.StudyName)
        && await users.FindByNameAsync(DemoAccounts.MemberUserName) is not null;

    private async Task<LedgerUser> EnsureUserAsync(string userName, string displayName, string password, string[] roles)
    {
        var user = await users.FindByNameAsync(userName);
        if (user is null)
        {
            user = new LedgerUser { UserName = userName, DisplayName = displayName };
            var created = await users.CreateAsync(user, password);
            if (!created.Succeeded)
                throw new InvalidOperationException($"Could not create demo account {userName}: " + string.Join("; ", created.Errors.Select(e => e.Description)));
        }
        foreach (var role in roles)
            if (!await users.IsInRoleAsync(user, role)) await users.AddToRoleAsync(user, role);
        return user;
    }

    /// <summary>seed-data/ in the nearest folder above the app's binaries or the current directory.</summary>
    public static string? FindDemoDirectory()
    {
        foreach (var start in new[] { AppContext.BaseDirectory, Directory.GetCurrentDirectory() })
            for (var d = new DirectoryInfo(start); d is not null; d = d.Parent)
            {
                var candidate = Path.Combine(d.FullName, "seed-data");
                if (Directory.Exists(candidate) && Directory.EnumerateFiles(candidate, "*.json").Any()) return candidate;
            }
        return null;
    }
}
