using BarrierLedger.Ledger.Auditing;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Derivation;

/// <summary>An energy model as shown on the settings screen.</summary>
/// <param name="Settings">The values.</param>
/// <param name="StudyId">Null for the group default.</param>
/// <param name="IsOverride">True when a study has its own model (false when it inherits the group default).</param>
/// <param name="Version">Pass back when saving (optimistic concurrency); 0 when nothing is stored yet.</param>
public sealed record EnergyModelView(ModelSettings Settings, int? StudyId, bool IsOverride, long Version, DateTimeOffset? UpdatedAt, string? UpdatedByUserId)
{
    public string Description => Settings.Describe();
}

/// <summary>The outcome of an edit: saved, or refused with a conflict (someone saved first) or with errors, in words.</summary>
public sealed record EditResult(bool Saved, long Version, string? Conflict, IReadOnlyList<string> Errors)
{
    public static EditResult Ok(long version) => new(true, version, null, []);
    public static EditResult Invalid(IEnumerable<string> errors) => new(false, 0, null, [.. errors]);
    public static EditResult Conflicted(string message) => new(false, 0, message, []);
}

/// <summary>
/// The group's default energy model and per-study overrides. Saving one marks the affected derived values stale (their
/// model fingerprint no longer matches) and asks <see cref="RecomputeService"/> for a background pass.
/// </summary>
public sealed class EnergyModelService(IDbContextFactory<LedgerDbContext> factory, RecomputeService recompute, AuditService audit, TimeProvider time)
{
    public async Task<EnergyModelView> GetGroupDefaultAsync(CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        var row = await db.EnergyModels.AsNoTracking().FirstOrDefaultAsync(m => m.StudyId == null, ct);
        return View(row, null);
    }

    /// <summary>The model in force for a study (its override, else the group default).</summary>
    public async Task<EnergyModelView> GetForStudyAsync(int studyId, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        var (_, row) = await DerivationService.EffectiveModelAsync(db, studyId, ct);
        return View(row, studyId);
    }

    public Task<EditResult> SaveGroupDefaultAsync(ModelSettings settings, long expectedVersion, string userId, CancellationToken ct = default) =>
        SaveAsync(null, settings, expectedVersion, userId, ct);

    public Task<EditResult> SaveStudyOverrideAsync(int studyId, ModelSettings settings, long expectedVersion, string userId, CancellationToken ct = default) =>
        SaveAsync(studyId, settings, expectedVersion, userId, ct);

    /// <summary>Removes a study's override; the study then follows the group default.</summary>
    public async Task<EditResult> RemoveStudyOverrideAsync(int studyId, long expectedVersion, string userId, CancellationToken ct = default)
    {
        var result = await LedgerRetry.RunAsync(async token =>
        {
            await using var db = await factory.CreateDbContextAsync(token);
            var row = await db.EnergyModels.FirstOrDefaultAsync(m => m.StudyId == studyId, token);
            if (row is null) return EditResult.Ok(0);
            if (row.Version != expectedVersion) return EditResult.Conflicted(ConflictText(row));
            db.EnergyModels.Remove(row);
            audit.Record(db, userId, "energy-model.override-removed", nameof(EnergyModel), studyId, "The study follows the group default again.",
                before: ModelSettings.From(row).Describe());
            await db.SaveChangesAsync(token);
            return EditResult.Ok(0);
        }, ct);
        if (result.Saved) _ = recompute.Request(studyId); // background pass; progress via RecomputeService.Current
        return result;
    }

    private async Task<EditResult> SaveAsync(int? studyId, ModelSettings settings, long expectedVersion, string userId, CancellationToken ct)
    {
        ArgumentNullException.ThrowIfNull(settings);
        var errors = settings.Validate();
        if (errors.Count > 0) return EditResult.Invalid(errors);
        var result = await LedgerRetry.RunAsync(async token =>
        {
            await using var db = await factory.CreateDbContextAsync(token);
            if (studyId is { } sid && !await db.Studies.AnyAsync(s => s.Id == sid, token)) return EditResult.Invalid([$"study {sid} does not exist"]);
            var row = await db.EnergyModels.FirstOrDefaultAsync(m => m.StudyId == studyId, token);
            var before = row is null ? null : Audited(ModelSettings.From(row));
            if (row is null)
            {
                if (expectedVersion != 0) return EditResult.Conflicted("The model you edited has been removed in the meantime; reload and try again.");
                row = new EnergyModel { StudyId = studyId };
                db.EnergyModels.Add(row);
            }
            else
            {
                // The version the editor saw is the original value: if someone saved since, the UPDATE matches no row.
                db.Entry(row).Property(m => m.Version).OriginalValue = expectedVersion;
            }
            settings.CopyTo(row);
            row.UpdatedAt = time.GetUtcNow();
            row.UpdatedByUserId = userId;
            audit.Record(db, userId, studyId is null ? "energy-model.default-saved" : "energy-model.override-saved", nameof(EnergyModel),
                studyId?.ToString(System.Globalization.CultureInfo.InvariantCulture) ?? "default", Audited(settings), before, Audited(settings));
            try
            {
                await db.SaveChangesAsync(token);
            }
            catch (DbUpdateConcurrencyException)
            {
                await using var fresh = await factory.CreateDbContextAsync(token);
                var now = await fresh.EnergyModels.AsNoTracking().FirstOrDefaultAsync(m => m.StudyId == studyId, token);
                return EditResult.Conflicted(now is null ? "The model was removed while you edited it." : ConflictText(now));
            }
            return EditResult.Ok(row.Version);
        }, ct);
        if (result.Saved) _ = recompute.Request(studyId); // background pass; progress via RecomputeService.Current
        return result;
    }

    private static string Audited(ModelSettings s) => $"{s.Describe()}; {s.DescribeUncertainty()}";

    private static string ConflictText(EnergyModel now) =>
        $"Someone else saved this energy model at {now.UpdatedAt:u} (user {now.UpdatedByUserId}) after you opened it: it now reads \"{ModelSettings.From(now).Describe()}\". " +
        "Your change was not saved; reload, check their change, and save again.";

    private static EnergyModelView View(EnergyModel? row, int? studyId) => row is null
        ? new EnergyModelView(ModelSettings.Default, studyId, false, 0, null, null)
        : new EnergyModelView(ModelSettings.From(row), studyId, row.StudyId is not null && row.StudyId == studyId, row.Version, row.UpdatedAt, row.UpdatedByUserId);
}
