using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Reviews;
using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Queries;

/// <summary>
/// One stored result as the study workspace lists it. <see cref="ImaginaryCm1"/> are the stored negative wavenumbers;
/// <see cref="CheckVerdict"/> is the stored frequency check (a saddle point is checked once a reaction uses it, so null
/// before). <see cref="InReaction"/>: its species appears in a live reaction of the study.
/// </summary>
public sealed record WorkspaceCalculation(int Id, int SpeciesId, string Label, CalculationKind Kind, string LevelOfTheory, double? EnergyHartree, int AtomCount,
    IReadOnlyList<double> ImaginaryCm1, int FrequencyCount, bool HasModes, bool HasHessian, Verdict? CheckVerdict,
    string UploadedByName, DateTimeOffset UploadedAt, int? StoredFileId, string? FileName, string SourceSha256, string Note,
    bool InReaction, bool Retired, long Version);

/// <summary>A species with its calculations (newest last).</summary>
public sealed record WorkspaceSpecies(int Id, string Label, string Description, int Charge, int Multiplicity, string Formula, int SymmetryNumber,
    bool InReaction, bool Retired, long Version, IReadOnlyList<WorkspaceCalculation> Calculations, SpeciesSymmetryView? Symmetry = null)
{
    /// <summary>The stored symmetry, or "no geometry yet" when none was read.</summary>
    public SpeciesSymmetryView SymmetryOrNone => Symmetry ?? SpeciesSymmetryView.None;
}

/// <summary>
/// A species' symmetry as stored: the point group and σ detected from the geometry its thermochemistry uses (empty / null until one
/// is stored), the calculation that geometry came from, a "nearly" note, and the σ a member or bundle set instead (null when none).
/// </summary>
public sealed record SpeciesSymmetryView(string PointGroup, int? DetectedSymmetryNumber, int? CalculationId, string Note, int? Override)
{
    public static SpeciesSymmetryView None { get; } = new("", null, null, "", null);

    /// <summary>"C2v, σ = 2 (detected)" or "σ = 3 (set by hand; the geometry is C1, σ = 1)".</summary>
    public string Describe(int inUse) => Override is null
        ? (PointGroup.Length > 0 ? $"{PointGroup}, σ = {inUse} (detected from the geometry)" : $"σ = {inUse} (no geometry stored yet)")
        : $"σ = {inUse} (set by hand or by an upload" + (PointGroup.Length > 0 ? $"; the geometry is {PointGroup}, σ = {DetectedSymmetryNumber})" : ")");
}

/// <summary>A relaxed scan: its species, coordinate ("distance C1–C6"), points and original file.</summary>
public sealed record WorkspaceScan(int Id, string Label, int SpeciesId, string SpeciesLabel, string LevelOfTheory, string Coordinate, int PointCount,
    bool HasGeometries, string UploadedByName, DateTimeOffset UploadedAt, int? StoredFileId, string? FileName, bool InReaction, bool Retired, long Version);

/// <summary>A reaction of the study: its states in order ("A + B → TS → P"), its ledger status and stored barrier.</summary>
public sealed record WorkspaceReaction(int Id, string Label, string Description, string Pathway, int StateCount, Verdict? Verdict, ReviewState? ReviewStatus,
    double? BarrierGibbsHartree, bool Consistent, bool Retired, long Version);

/// <summary>
/// Everything the study workspace shows. <see cref="Unassigned"/> counts the live results (calculations and scans of live
/// species) whose species no live reaction of the study uses yet.
/// </summary>
public sealed record StudyWorkspace(int Id, string Name, string Description, bool Retired, long Version, DateTimeOffset CreatedAt,
    IReadOnlyList<WorkspaceSpecies> Species, IReadOnlyList<WorkspaceScan> Scans, IReadOnlyList<WorkspaceReaction> Reactions)
{
    public int Unassigned =>
        Species.Where(s => !s.Retired && !s.InReaction).Sum(s => s.Calculations.Count(c => !c.Retired))
        + Scans.Count(s => !s.Retired && !s.InReaction && Species.Any(sp => sp.Id == s.SpeciesId && !sp.Retired));
}

/// <summary>A species page: the species, the study it belongs to, its structure (from its newest live calculation with a geometry), scans and reactions.</summary>
public sealed record SpeciesDetail(int StudyId, string StudyName, WorkspaceSpecies Species, Molecule? Structure, int? StructureCalculationId,
    IReadOnlyList<WorkspaceScan> Scans, IReadOnlyList<WorkspaceReaction> Reactions);

/// <summary>An original file, byte for byte as uploaded.</summary>
public sealed record StoredFileContent(int Id, string FileName, string Sha256, byte[] Content);

/// <summary>
/// The queries of the study workspace and the species page: a fixed number of round trips per page, whatever the number of species
/// or calculations (arrays are not read except the frequencies, a few hundred bytes per calculation).
/// </summary>
public sealed class WorkspaceQueryService(IDbContextFactory<LedgerDbContext> factory)
{
    /// <summary>The study with every species, calculation, scan and reaction, retired ones included (marked); null when there is no such study.</summary>
    public async Task<StudyWorkspace?> GetWorkspaceAsync(int studyId, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        var study = await db.Studies.AsNoTracking().Where(s => s.Id == studyId)
            .Select(s => new { s.Id, s.Name, s.Description, s.Retired, s.Version, s.CreatedAt }).FirstOrDefaultAsync(ct);
        if (study is null) return null;
        var used = await UsedSpeciesAsync(db, studyId, ct);
        var species = await SpeciesAsync(db, studyId, null, used, ct);
        var scans = await ScansAsync(db, studyId, null, used, ct);
        var reactions = await ReactionsAsync(db, studyId, null, ct);
        return new StudyWorkspace(study.Id, study.Name, study.Description, study.Retired, study.Version, study.CreatedAt, species, scans, reactions);
    }

    /// <summary>One species with its calculations, structure, scans and the reactions that use it; null when there is none.</summary>
    public async Task<SpeciesDetail?> GetSpeciesAsync(int speciesId, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        var head = await db.Species.AsNoTracking().Where(s => s.Id == speciesId)
            .Select(s => new { s.StudyId, StudyName = s.Study!.Name, s.Charge, s.Multiplicity }).FirstOrDefaultAsync(ct);
        if (head is null) return null;
        var used = await UsedSpeciesAsync(db, head.StudyId, ct);
        var species = (await SpeciesAsync(db, head.StudyId, speciesId, used, ct)).Single();
        var scans = await ScansAsync(db, head.StudyId, speciesId, used, ct);
        var reactions = await ReactionsAsync(db, head.StudyId, speciesId, ct);
        // The structure shown: the newest live minimum or saddle point with a geometry, else any newest with one.
        var withGeometry = species.Calculations.Where(c => !c.Retired && c.AtomCount > 0).ToList();
        var pick = withGeometry.LastOrDefault(c => c.Kind is CalculationKind.Minimum or CalculationKind.SaddlePoint) ?? withGeometry.LastOrDefault();
        Molecule? structure = null;
        if (pick is not null)
        {
            var blobs = await db.Calculations.AsNoTracking().Where(c => c.Id == pick.Id).Select(c => new { c.AtomicNumbers, c.PositionsAngstrom }).FirstAsync(ct);
            structure = Blobs.ToMolecule(blobs.AtomicNumbers, blobs.PositionsAngstrom, head.Charge, head.Multiplicity);
        }
        return new SpeciesDetail(head.StudyId, head.StudyName, species, structure, structure is null ? null : pick!.Id, scans, reactions);
    }

    /// <summary>A calculation's geometry with its species' charge and multiplicity (atoms in file order), or null when it has none.</summary>
    public async Task<Molecule?> GetGeometryAsync(int calculationId, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        var c = await db.Calculations.AsNoTracking().Where(x => x.Id == calculationId)
            .Select(x => new { x.AtomicNumbers, x.PositionsAngstrom, x.Species!.Charge, x.Species.Multiplicity }).FirstOrDefaultAsync(ct);
        return c is null ? null : Blobs.ToMolecule(c.AtomicNumbers, c.PositionsAngstrom, c.Charge, c.Multiplicity);
    }

    /// <summary>A stored original file, or null when there is none with this id.</summary>
    public async Task<StoredFileContent?> GetStoredFileAsync(int fileId, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        return await db.StoredFiles.AsNoTracking().Where(f => f.Id == fileId)
            .Select(f => new StoredFileContent(f.Id, f.FileName, f.Sha256, f.Content)).FirstOrDefaultAsync(ct);
    }

    /// <summary>Species that a live reaction of the study names in one of its states.</summary>
    private static async Task<HashSet<int>> UsedSpeciesAsync(LedgerDbContext db, int studyId, CancellationToken ct) =>
        [.. await db.ReactionStateTerms.AsNoTracking()
            .Where(t => db.ReactionStates.Any(s => s.Id == t.ReactionStateId && !s.Reaction!.Retired && s.Reaction.StudyId == studyId))
            .Select(t => t.SpeciesId).Distinct().ToListAsync(ct)];

    private static async Task<List<WorkspaceSpecies>> SpeciesAsync(LedgerDbContext db, int studyId, int? speciesId, HashSet<int> used, CancellationToken ct)
    {
        var sq = db.Species.AsNoTracking().Where(s => s.StudyId == studyId);
        if (speciesId is { } sid) sq = sq.Where(s => s.Id == sid);
        var species = await sq.OrderBy(s => s.Label).ToListAsync(ct);
        var ids = species.Select(s => s.Id).ToList();
        var calcs = await db.Calculations.AsNoTracking().Where(c => EF.Parameter(ids).Contains(c.SpeciesId)).OrderBy(c => c.Id)
            .Select(c => new
            {
                c.Id, c.SpeciesId, c.Label, c.Kind, c.LevelOfTheory, c.EnergyHartree, c.AtomCount, c.FrequenciesCm1,
                HasModes = c.Modes != null, HasHessian = c.HessianHartreePerBohr2 != null,
                Verdict = db.FrequencyChecks.Where(f => f.CalculationId == c.Id).Select(f => (Verdict?)f.Verdict).FirstOrDefault(),
                Uploader = db.Users.Where(u => u.Id == c.UploadedByUserId).Select(u => u.DisplayName != "" ? u.DisplayName : u.UserName).FirstOrDefault(),
                c.UploadedByUserId, c.UploadedAt, c.StoredFileId, FileName = c.StoredFile == null ? null : c.StoredFile.FileName,
                c.SourceSha256, c.Note, c.Retired, c.Version,
            }).ToListAsync(ct);
        var bySpecies = calcs.ToLookup(c => c.SpeciesId);
        return [.. species.Select(s => new WorkspaceSpecies(s.Id, s.Label, s.Description, s.Charge, s.Multiplicity, s.Formula, s.SymmetryNumber,
            used.Contains(s.Id), s.Retired, s.Version, Symmetry: new SpeciesSymmetryView(s.PointGroup, s.DetectedSymmetryNumber, s.SymmetryCalculationId, s.SymmetryNote,
                s.SymmetryNumberOverride), Calculations:
            [.. bySpecies[s.Id].Select(c =>
            {
                var freqs = Blobs.ToDoubles(c.FrequenciesCm1);
                return new WorkspaceCalculation(c.Id, c.SpeciesId, c.Label, c.Kind, c.LevelOfTheory, c.EnergyHartree, c.AtomCount,
                    [.. freqs.Where(f => f < 0).Order()], freqs.Length, c.HasModes, c.HasHessian, c.Verdict, c.Uploader ?? c.UploadedByUserId, c.UploadedAt,
                    c.StoredFileId, c.FileName, c.SourceSha256, c.Note, used.Contains(s.Id), c.Retired, c.Version);
            })]))];
    }

    private static async Task<List<WorkspaceScan>> ScansAsync(LedgerDbContext db, int studyId, int? speciesId, HashSet<int> used, CancellationToken ct)
    {
        var q = db.Scans.AsNoTracking().Where(s => s.Species!.StudyId == studyId);
        if (speciesId is { } sid) q = q.Where(s => s.SpeciesId == sid);
        var scans = await q.OrderBy(s => s.Id).Select(s => new
        {
            s.Id, s.Label, s.SpeciesId, SpeciesLabel = s.Species!.Label, s.LevelOfTheory, s.CoordinateKind, s.CoordinateAtoms, s.AtomicNumbers,
            Points = db.ScanPoints.Count(p => p.ScanId == s.Id),
            Uploader = db.Users.Where(u => u.Id == s.UploadedByUserId).Select(u => u.DisplayName != "" ? u.DisplayName : u.UserName).FirstOrDefault(),
            s.UploadedByUserId, s.UploadedAt, s.StoredFileId,
            FileName = db.StoredFiles.Where(f => f.Id == s.StoredFileId).Select(f => f.FileName).FirstOrDefault(),
            s.Retired, s.Version,
        }).ToListAsync(ct);
        return [.. scans.Select(s =>
        {
            var elements = s.AtomicNumbers is null ? null : Blobs.ToElements(s.AtomicNumbers);
            var atoms = s.CoordinateAtoms.Split(',', StringSplitOptions.RemoveEmptyEntries)
                .Select(a => int.Parse(a, System.Globalization.CultureInfo.InvariantCulture))
                .Select(a => elements is not null && a >= 1 && a <= elements.Length ? $"{elements[a - 1].Symbol}{a}" : a.ToString(System.Globalization.CultureInfo.InvariantCulture));
            var coordinate = $"{s.CoordinateKind.ToString().ToLowerInvariant()} {string.Join("–", atoms)}";
            return new WorkspaceScan(s.Id, s.Label, s.SpeciesId, s.SpeciesLabel, s.LevelOfTheory, coordinate, s.Points, s.AtomicNumbers is not null,
                s.Uploader ?? s.UploadedByUserId, s.UploadedAt, s.StoredFileId, s.FileName, used.Contains(s.SpeciesId), s.Retired, s.Version);
        })];
    }

    private static async Task<List<WorkspaceReaction>> ReactionsAsync(LedgerDbContext db, int studyId, int? speciesId, CancellationToken ct)
    {
        var q = db.Reactions.AsNoTracking().Where(r => r.StudyId == studyId);
        if (speciesId is { } sid) q = q.Where(r => r.States.Any(s => s.Terms.Any(t => t.SpeciesId == sid)));
        var reactions = await q.OrderBy(r => r.Label).Select(r => new
        {
            r.Id, r.Label, r.Description, r.CheckVerdict, r.ReviewStatus, r.Retired, r.Version,
            Barrier = r.Derivation == null ? null : r.Derivation.BarrierGibbsHartree,
            Consistent = r.Derivation != null && r.Derivation.Consistent,
            States = r.States.OrderBy(s => s.Position).Select(s => s.Label).ToList(),
        }).ToListAsync(ct);
        return [.. reactions.Select(r => new WorkspaceReaction(r.Id, r.Label, r.Description, string.Join(" → ", r.States), r.States.Count,
            r.CheckVerdict, r.ReviewStatus, r.Barrier, r.Consistent, r.Retired, r.Version))];
    }
}
