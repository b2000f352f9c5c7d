using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Core.Scans;
using BarrierLedger.Core.Units;
using BarrierLedger.Core.Vibrations;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Reviews;
using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Queries;

/// <summary>One species of a state with its coefficient, formula, point group (empty without a geometry) and the σ its thermochemistry uses.</summary>
public sealed record StateTermView(int SpeciesId, string SpeciesLabel, int Coefficient, string Formula, string PointGroup = "", int SymmetryNumber = 1,
    bool SymmetryGivenByHand = false);

/// <summary>A state of the pathway with its species, its saddle-point calculation and reaction-coordinate pairs ("C1–H5").</summary>
public sealed record StateView(int Id, int Position, string Label, StateKind Kind, IReadOnlyList<StateTermView> Terms, int? SaddleCalculationId,
    IReadOnlyList<(int A, int B)> CoordinatePairs, IReadOnlyList<string> CoordinateLabels, ReviewState? ReviewStatus, IReadOnlyList<ReviewEntry> ReviewHistory);

/// <summary>A saddle point's frequency check with what the screen needs to animate its modes.</summary>
public sealed record SaddleCheckView(int StateId, int CalculationId, string CalculationLabel, string LevelOfTheory, string UploadedByUserId, DateTimeOffset UploadedAt,
    Verdict? Verdict, IReadOnlyList<CheckReason> Reasons, CheckEvidence? Evidence, bool CheckStale, Molecule? Geometry, IReadOnlyList<NormalMode> Modes);

/// <summary>A scan with its points and the Core analysis (spline, maxima, flags).</summary>
public sealed record ScanView(int Id, string Label, int SpeciesId, string SpeciesLabel, string LevelOfTheory, ScanCoordinate Coordinate,
    IReadOnlyList<ScanPoint> Points, ScanProfile Profile);

/// <summary>Everything the reaction screen shows.</summary>
public sealed record ReactionDetail(
    int Id, string Label, string Description, int StudyId, string StudyName, string OwnerUserId, string OwnerName, bool Retired, long Version,
    EnergyModelView Model, bool Derived, bool Stale, Energy? BarrierGibbs, Energy? ReactionGibbs, double? RateConstantPerSecond, double? HalfLifeSeconds,
    string LevelOfTheory, bool Consistent, IReadOnlyList<CheckReason> ConsistencyReasons,
    IReadOnlyList<StateView> States, IReadOnlyList<DerivedState> StateEnergies, IReadOnlyList<DerivedStep> Steps,
    IReadOnlyList<SaddleCheckView> SaddleChecks, IReadOnlyList<ScanView> Scans)
{
    /// <summary>What the reaction's definition says about its kinetics (competing channels, run conditions), or null.</summary>
    public Core.Kinetics.KineticsSetup? Kinetics { get; init; }
}

/// <summary>The reaction screen's query: a fixed number of round trips whatever the number of states, scans or checks.</summary>
public sealed class ReactionQueryService(IDbContextFactory<LedgerDbContext> factory)
{
    /// <summary>The reaction, or null when there is none with this id.</summary>
    public async Task<ReactionDetail?> GetReactionAsync(int id, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        var r = await db.Reactions.AsNoTracking().Where(x => x.Id == id).Select(x => new
        {
            x.Id, x.Label, x.Description, x.StudyId, StudyName = x.Study!.Name, x.OwnerUserId, x.Retired, x.Version, x.InputsRevision,
            OwnerName = db.Users.Where(u => u.Id == x.OwnerUserId).Select(u => u.DisplayName != "" ? u.DisplayName : u.UserName).FirstOrDefault(),
            x.Derivation, x.Kinetics,
        }).FirstOrDefaultAsync(ct);
        if (r is null) return null;
        var (settings, modelRow) = await DerivationService.EffectiveModelAsync(db, r.StudyId, ct);
        var model = new EnergyModelView(settings, r.StudyId, modelRow?.StudyId == r.StudyId, modelRow?.Version ?? 0, modelRow?.UpdatedAt, modelRow?.UpdatedByUserId);

        var states = await db.ReactionStates.AsNoTracking().Where(s => s.ReactionId == id).OrderBy(s => s.Position)
            .Include(s => s.Terms).ThenInclude(t => t.Species).Include(s => s.CoordinatePairs).AsSplitQuery().ToListAsync(ct);
        var saddleIds = states.Where(s => s.SaddleCalculationId is not null).Select(s => s.SaddleCalculationId!.Value).Distinct().ToList();
        var calcs = await db.Calculations.AsNoTracking().Include(c => c.Species).Where(c => saddleIds.Contains(c.Id)).ToDictionaryAsync(c => c.Id, ct);
        var checks = await db.FrequencyChecks.AsNoTracking().Where(c => saddleIds.Contains(c.CalculationId)).ToDictionaryAsync(c => c.CalculationId, ct);
        var latest = (await db.Reviews.AsNoTracking().Where(v => saddleIds.Contains(v.CalculationId)).Select(v => new { v.Id, v.CalculationId, v.Outcome }).ToListAsync(ct))
            .GroupBy(v => v.CalculationId).ToDictionary(g => g.Key, g => g.MaxBy(v => v.Id)!.Outcome);
        var history = await ReviewService.HistoryAsync(db, [.. states.Select(s => s.Id)], ct);

        var stateViews = new List<StateView>();
        var checkViews = new List<SaddleCheckView>();
        foreach (var s in states)
        {
            Calculation? calc = s.SaddleCalculationId is { } cid && calcs.TryGetValue(cid, out var c) ? c : null;
            var mol = calc is null ? null : Blobs.ToMolecule(calc.AtomicNumbers, calc.PositionsAngstrom, calc.Species!.Charge, calc.Species.Multiplicity);
            var pairs = s.CoordinatePairs.OrderBy(p => p.Id).Select(p => (p.AtomA, p.AtomB)).ToList();
            var labels = pairs.Select(p => mol is not null && p.AtomA <= mol.AtomCount && p.AtomB <= mol.AtomCount
                ? $"{mol.AtomLabel(p.AtomA - 1)}–{mol.AtomLabel(p.AtomB - 1)}" : $"{p.AtomA}–{p.AtomB}").ToList();
            ReviewState? status = s.Kind == StateKind.SaddlePoint
                ? ReviewStates.After(calc is not null && latest.TryGetValue(calc.Id, out var o) ? o : null) : null;
            stateViews.Add(new StateView(s.Id, s.Position, s.Label, s.Kind,
                [.. s.Terms.OrderBy(t => t.Id).Select(t => new StateTermView(t.SpeciesId, t.Species!.Label, t.Coefficient, t.Species.Formula,
                    t.Species.PointGroup, t.Species.SymmetryNumber, t.Species.SymmetryNumberOverride is not null))],
                s.SaddleCalculationId, pairs, labels, status, history.GetValueOrDefault(s.Id) ?? []));
            if (calc is not null)
            {
                checks.TryGetValue(calc.Id, out var check);
                var modes = mol is null ? [] : Blobs.ToModes(calc.Modes, calc.AtomCount);
                // The check is stale when the thresholds it used are not the model's (the recompute pass will refresh it).
                var evidence = check is null ? null : DerivedJson.Read<CheckEvidence>(check.EvidenceJson);
                checkViews.Add(new SaddleCheckView(s.Id, calc.Id, calc.Label, calc.LevelOfTheory, calc.UploadedByUserId, calc.UploadedAt, check?.Verdict,
                    check is null ? [] : DerivedJson.Read<List<CheckReason>>(check.ReasonsJson), evidence,
                    check is null || evidence is null || evidence.ThresholdCm1 != settings.SignificantImaginaryCm1, mol, modes));
            }
        }

        var speciesIds = states.SelectMany(s => s.Terms).Select(t => t.SpeciesId).Distinct().ToList();
        var scans = await db.Scans.AsNoTracking().Include(s => s.Species).Where(s => speciesIds.Contains(s.SpeciesId) && !s.Retired).OrderBy(s => s.Id).ToListAsync(ct);
        var scanIds = scans.Select(s => s.Id).ToList();
        var points = (await db.ScanPoints.AsNoTracking().Where(p => scanIds.Contains(p.ScanId)).OrderBy(p => p.Index).ToListAsync(ct)).ToLookup(p => p.ScanId);
        var scanViews = new List<ScanView>();
        foreach (var s in scans)
        {
            var coordinate = new ScanCoordinate(s.CoordinateKind, [.. s.CoordinateAtoms.Split(',', StringSplitOptions.RemoveEmptyEntries)
                .Select(a => int.Parse(a, System.Globalization.CultureInfo.InvariantCulture) - 1)]);
            var elements = s.AtomicNumbers is null ? null : Blobs.ToElements(s.AtomicNumbers);
            var pts = points[s.Id].Select(p => new ScanPoint(p.Coordinate, p.EnergyHartree, p.Converged,
                elements is not null && p.PositionsAngstrom is not null ? new Molecule(elements, Blobs.ToPositions(p.PositionsAngstrom), s.Species!.Charge, s.Species.Multiplicity) : null)).ToList();
            var profile = ScanAnalysis.Analyze(pts, coordinate, new ScanOptions(JumpThresholdKcalPerMol: settings.ScanJumpKcalPerMol));
            scanViews.Add(new ScanView(s.Id, s.Label, s.SpeciesId, s.Species!.Label, s.LevelOfTheory, coordinate, pts, profile));
        }

        var d = r.Derivation;
        var stale = d is null || d.ModelFingerprint != settings.Fingerprint || d.InputsRevision != r.InputsRevision;
        return new ReactionDetail(r.Id, r.Label, r.Description, r.StudyId, r.StudyName, r.OwnerUserId, r.OwnerName ?? r.OwnerUserId, r.Retired, r.Version,
            model, d is not null, stale, d?.BarrierGibbsHartree is { } bg ? Energy.FromHartree(bg) : null,
            d?.ReactionGibbsHartree is { } rg ? Energy.FromHartree(rg) : null, d?.RateConstantPerSecond, d?.HalfLifeSeconds, d?.LevelOfTheory ?? "",
            d?.Consistent ?? false, d is null ? [] : DerivedJson.Read<List<CheckReason>>(d.ConsistencyJson), stateViews,
            d is null ? [] : DerivedJson.Read<List<DerivedState>>(d.StatesJson), d is null ? [] : DerivedJson.Read<List<DerivedStep>>(d.StepsJson),
            checkViews, scanViews) { Kinetics = Reactions.ReactionDefinition.ReadKinetics(r.Kinetics) };
    }
}
