using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Reviews;
using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Queries;

/// <summary>A study as listed.</summary>
public sealed record StudySummary(int Id, string Name, string Description, int ReactionCount, bool Retired, long Version, DateTimeOffset CreatedAt);

/// <summary>Filters of the ledger screen (all optional).</summary>
public sealed record LedgerFilter
{
    public string? OwnerUserId { get; init; }
    /// <summary>Case-insensitive text in the reaction's label, description or level of theory.</summary>
    public string? Text { get; init; }
    public ReviewState? ReviewStatus { get; init; }
    public Verdict? Verdict { get; init; }
    public bool IncludeRetired { get; init; }
    /// <summary>Only reactions whose barrier breaks a consistency rule (or has no derivation yet).</summary>
    public bool OnlyInconsistent { get; init; }

    public static LedgerFilter None { get; } = new();
}

/// <summary>
/// One reaction as the ledger shows it. Energies per molecule as <see cref="Energy"/> (convert with the model's display unit);
/// <see cref="RateConstantPerSecond"/> and <see cref="HalfLifeSeconds"/> at <see cref="TemperatureKelvin"/>.
/// <see cref="Verdict"/> is the worst frequency-check verdict of its saddle points; <see cref="ReviewStatus"/> is Verified
/// only when all are verified, Returned when any is returned. <see cref="Stale"/>: the values predate the current energy model
/// or inputs and must be shown as such.
/// </summary>
public sealed record LedgerRow(
    int ReactionId, string Label, string Description, string OwnerUserId, string OwnerName,
    Energy? BarrierGibbs, Energy? ReactionGibbs, Energy? BarrierElectronic, double? RateConstantPerSecond, double? HalfLifeSeconds, double? TemperatureKelvin,
    Verdict? Verdict, ReviewState? ReviewStatus, int SaddlePointCount, string LevelOfTheory, bool Consistent,
    IReadOnlyList<CheckReason> ConsistencyReasons, bool Derived, bool Stale, bool Retired, long Version);

/// <summary>The ledger of one study: its rows and the energy model they were (or should be) computed under.</summary>
public sealed record StudyLedger(int StudyId, string StudyName, EnergyModelView Model, IReadOnlyList<LedgerRow> Rows)
{
    public int StaleCount => Rows.Count(r => r.Stale);
}

/// <summary>The queries of the ledger screen, each one round trip to the store (no per-row queries).</summary>
public sealed class LedgerQueryService(IDbContextFactory<LedgerDbContext> factory)
{
    public async Task<IReadOnlyList<StudySummary>> GetStudiesAsync(bool includeRetired = false, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        return await db.Studies.AsNoTracking().Where(s => includeRetired || !s.Retired).OrderBy(s => s.Name)
            .Select(s => new StudySummary(s.Id, s.Name, s.Description, s.Reactions.Count(r => !r.Retired), s.Retired, s.Version, s.CreatedAt))
            .ToListAsync(ct);
    }

    /// <summary>Every reaction of a study with its derived values, check verdict and review status, in one query.</summary>
    public async Task<StudyLedger> GetLedgerRowsAsync(int studyId, LedgerFilter? filter = null, CancellationToken ct = default)
    {
        filter ??= LedgerFilter.None;
        await using var db = await factory.CreateDbContextAsync(ct);
        var study = await db.Studies.AsNoTracking().Where(s => s.Id == studyId).Select(s => new { s.Name }).FirstOrDefaultAsync(ct)
            ?? throw new ArgumentException($"Study {studyId} does not exist.", nameof(studyId));
        var (settings, modelRow) = await DerivationService.EffectiveModelAsync(db, studyId, ct);
        var model = new EnergyModelView(settings, studyId, modelRow?.StudyId == studyId, modelRow?.Version ?? 0, modelRow?.UpdatedAt, modelRow?.UpdatedByUserId);
        var fingerprint = settings.Fingerprint;

        var q = db.Reactions.AsNoTracking().Where(r => r.StudyId == studyId);
        if (!filter.IncludeRetired) q = q.Where(r => !r.Retired);
        if (filter.OwnerUserId is { } owner) q = q.Where(r => r.OwnerUserId == owner);
        if (filter.OnlyInconsistent) q = q.Where(r => r.Derivation == null || !r.Derivation.Consistent);
        // The status filters go to the store; a reaction whose summary was never computed (SaddlePointCount null: stored
        // before the summary existed) is read too and filtered below once its status is known.
        var reviewStates = filter.ReviewStatus is { } wanted ? ReviewStates.Matching(wanted) : null;
        if (reviewStates is not null)
            q = q.Where(r => r.SaddlePointCount == null || (r.ReviewStatus != null && reviewStates.Contains(r.ReviewStatus.Value)));
        if (filter.Verdict is { } verdict) q = q.Where(r => r.SaddlePointCount == null || r.CheckVerdict == verdict);
        // One projected query over the reaction, its derivation row and its owner: the check and review status were summarised
        // onto the reaction when they last changed (ReactionStatusSummary), so no state, check or review row is read here.
        var raw = await q.OrderBy(r => r.Label).Select(r => new
        {
            r.Id, r.Label, r.Description, r.OwnerUserId, r.Retired, r.Version, r.InputsRevision,
            r.SaddlePointCount, r.CheckVerdict, r.ReviewStatus,
            OwnerName = db.Users.Where(u => u.Id == r.OwnerUserId).Select(u => u.DisplayName != "" ? u.DisplayName : u.UserName).FirstOrDefault(),
            D = r.Derivation == null ? null : new
            {
                r.Derivation.BarrierGibbsHartree, r.Derivation.ReactionGibbsHartree, r.Derivation.BarrierElectronicHartree, r.Derivation.RateConstantPerSecond,
                r.Derivation.HalfLifeSeconds, r.Derivation.TemperatureKelvin, r.Derivation.LevelOfTheory, r.Derivation.Consistent, r.Derivation.ConsistencyJson,
                r.Derivation.ModelFingerprint, r.Derivation.InputsRevision,
            },
        }).ToListAsync(ct);

        var missing = raw.Where(r => r.SaddlePointCount is null).Select(r => r.Id).ToList();
        var computed = missing.Count == 0 ? null : await ReactionStatusSummary.ComputeAsync(db, missing, ct);
        // Most reactions share a handful of reason lists ("[]" above all): read each distinct text once.
        var reasonLists = new Dictionary<string, IReadOnlyList<CheckReason>>(StringComparer.Ordinal);
        IReadOnlyList<CheckReason> Reasons(string json)
        {
            if (!reasonLists.TryGetValue(json, out var list)) reasonLists[json] = list = DerivedJson.Read<List<CheckReason>>(json);
            return list;
        }

        var rows = new List<LedgerRow>(raw.Count);
        foreach (var r in raw)
        {
            var status = computed is not null && computed.TryGetValue(r.Id, out var c) ? c
                : new ReactionStatus(r.SaddlePointCount ?? 0, r.CheckVerdict, r.ReviewStatus);
            var d = r.D;
            var stale = d is null || d.ModelFingerprint != fingerprint || d.InputsRevision != r.InputsRevision;
            var row = new LedgerRow(r.Id, r.Label, r.Description, r.OwnerUserId, r.OwnerName ?? r.OwnerUserId,
                E(d?.BarrierGibbsHartree), E(d?.ReactionGibbsHartree), E(d?.BarrierElectronicHartree), d?.RateConstantPerSecond, d?.HalfLifeSeconds, d?.TemperatureKelvin,
                status.Verdict, status.ReviewStatus, status.SaddlePointCount, d?.LevelOfTheory ?? "", d?.Consistent ?? false,
                d is null ? [] : Reasons(d.ConsistencyJson), d is not null, stale, r.Retired, r.Version);
            if (reviewStates is not null && !(row.ReviewStatus is { } rs && reviewStates.Contains(rs))) continue;
            if (filter.Verdict is { } v && row.Verdict != v) continue;
            if (!string.IsNullOrWhiteSpace(filter.Text) && !(row.Label.Contains(filter.Text, StringComparison.OrdinalIgnoreCase)
                    || row.Description.Contains(filter.Text, StringComparison.OrdinalIgnoreCase)
                    || row.LevelOfTheory.Contains(filter.Text, StringComparison.OrdinalIgnoreCase))) continue;
            rows.Add(row);
        }
        return new StudyLedger(studyId, study.Name, model, rows);
    }

    private static Energy? E(double? hartree) => hartree is { } h ? Energy.FromHartree(h) : null;
}
