using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Paths;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Core.Vibrations;
using BarrierLedger.Ledger.Reactions;
using BarrierLedger.Ledger.Records;
using Microsoft.EntityFrameworkCore;
using Storage = BarrierLedger.Ledger.Storage;

namespace BarrierLedger.Ledger.Uploads;

/// <summary>
/// An IRC to write: its saddle point (a calculation of this upload by label, or a stored one by id), its level of theory, and the
/// path with its path lengths (for the path form).
/// </summary>
internal sealed record PlannedIrc(DraftIrc Draft, string? SaddleInUpload, int? StoredSaddleId, string SaddleLabel, string LevelOfTheory,
    ReactionPath? Path, string SourceSha);

/// <summary>A calculation to write, with the modes and frequencies it will carry (derived from its Hessian when only that was given).</summary>
internal sealed record PlannedCalculation(DraftCalculation Draft, string SourceSha, IReadOnlyList<double> Frequencies, IReadOnlyList<NormalMode> Modes, string Formula);

/// <summary>
/// A draft matched against the store: which study and species it lands in, what is new, what is a duplicate, and every
/// error that forbids storing it. Built inside the write transaction when storing, so what it read cannot change under it.
/// </summary>
internal sealed class UploadPlan
{
    private UploadPlan(UploadDraft draft) => Draft = draft;

    public UploadDraft Draft { get; }
    public List<UploadIssue> Issues { get; } = [];
    public Study? Study { get; private set; }
    public string? StudyName { get; private set; }
    public Dictionary<string, Species> SpeciesByLabel { get; } = new(StringComparer.Ordinal);
    public List<Species> NewSpecies { get; } = [];
    public List<(Species Species, string Formula)> FormulaUpdates { get; } = [];
    /// <summary>Stored species whose σ override this upload sets (a bundle's <c>symmetry_number</c>).</summary>
    public List<(Species Species, int SymmetryNumber)> SymmetryOverrides { get; } = [];
    /// <summary>Point group and σ detected from the upload's own geometry of each species (the one its thermochemistry would use).</summary>
    public Dictionary<string, (string Group, int Sigma, string Calculation)> DetectedSymmetry { get; } = new(StringComparer.Ordinal);
    public Dictionary<string, string> FileSha { get; } = new(StringComparer.Ordinal);
    public List<PlannedCalculation> NewCalculations { get; } = [];
    public List<(string Label, int Id)> DuplicateCalculationIds { get; } = [];
    public List<DraftScan> NewScans { get; } = [];
    public List<string> DuplicateScans { get; } = [];
    public List<DraftReaction> NewReactions { get; } = [];
    public List<PlannedIrc> NewIrcs { get; } = [];
    public List<string> DuplicateIrcs { get; } = [];
    public List<(ReactionState State, string CalculationLabel)> StateRelinks { get; } = [];
    private readonly List<string> _existingReactions = [];

    public string ShaOf(string? file) => (file ?? Draft.PrimaryFile) is { } f && FileSha.TryGetValue(f, out var sha) ? sha : "";

    public string Summary() =>
        $"{NewCalculations.Count} calculation(s), {NewScans.Count} scan(s), {NewIrcs.Count} IRC(s), {NewReactions.Count} new reaction(s), {StateRelinks.Count} saddle point(s) re-linked, " +
        $"{DuplicateCalculationIds.Count + DuplicateScans.Count + DuplicateIrcs.Count} already stored; files: {string.Join(", ", FileSha.Keys)}";

    private void Error(string file, string message, string? jsonPath = null) => Issues.Add(new UploadIssue(file, null, jsonPath, message));

    public static async Task<UploadPlan> ResolveAsync(Storage.LedgerDbContext db, UploadDraft draft, UploadChoices choices, CancellationToken ct)
    {
        var plan = new UploadPlan(draft);
        plan.Issues.AddRange(draft.Issues);
        foreach (var (name, bytes) in draft.Files) plan.FileSha[name] = UploadService.Sha256Hex(bytes);
        var primary = draft.PrimaryFile ?? draft.Files.Keys.FirstOrDefault() ?? "(upload)";

        // Study
        if (choices.StudyId is { } sid)
        {
            plan.Study = await db.Studies.FirstOrDefaultAsync(s => s.Id == sid, ct);
            if (plan.Study is null) plan.Error(primary, $"study {sid} does not exist");
            else if (plan.Study.Retired) plan.Error(primary, $"study '{plan.Study.Name}' is retired; restore it before adding to it");
        }
        else
        {
            var name = (choices.NewStudyName ?? draft.StudyName)?.Trim();
            if (string.IsNullOrEmpty(name)) plan.Error(primary, "no study: choose a study or give a name for a new one");
            else if (Core.Text.TextRules.LabelProblem(name, "study name") is { } bad) plan.Error(primary, bad);
            else
            {
                plan.Study = await db.Studies.FirstOrDefaultAsync(s => s.Name == name && !s.Retired, ct);
                plan.StudyName = name;
            }
        }
        plan.StudyName ??= plan.Study?.Name;
        if (plan.Issues.Any(i => i.IsError) && plan.Study is null && plan.StudyName is null) return plan;
        if (plan.Study is not null && draft.StudyEnergyModel is not null)
            plan.Issues.Add(new UploadIssue(primary, null, "$.study.energy_model",
                $"study '{plan.Study.Name}' exists and keeps its own energy model; the bundle's energy model is not applied (change the model on the Settings page)", IsError: false));

        // Species: reuse by label within the study; charge and multiplicity must agree.
        var existing = plan.Study is null ? [] :
            await db.Species.Where(s => s.StudyId == plan.Study.Id).ToListAsync(ct);
        var existingByLabel = existing.ToDictionary(s => s.Label, StringComparer.Ordinal);
        foreach (var ds in draft.Species.GroupBy(s => s.Label, StringComparer.Ordinal))
        {
            var d = ds.First();
            if (ds.Any(x => x.Charge != d.Charge || x.Multiplicity != d.Multiplicity))
                plan.Error(primary, $"species '{d.Label}' is given with different charges or multiplicities in one upload");
            if (ds.Any(x => x.SymmetryNumber != d.SymmetryNumber))
                plan.Error(primary, $"species '{d.Label}' is given with different symmetry numbers in one upload");
            if (existingByLabel.TryGetValue(d.Label, out var s))
            {
                if (s.Retired) plan.Error(primary, $"species '{d.Label}' is retired in this study; restore it first");
                if (s.Charge != d.Charge || s.Multiplicity != d.Multiplicity)
                    plan.Error(primary, $"species '{d.Label}' is stored with charge {s.Charge} and multiplicity {s.Multiplicity}, " +
                                        $"but this upload gives charge {d.Charge} and multiplicity {d.Multiplicity}");
                plan.SpeciesByLabel[d.Label] = s;
                if (d.SymmetryNumber is { } given && given != s.SymmetryNumberOverride) plan.SymmetryOverrides.Add((s, given));
            }
            else
            {
                var created = new Species
                {
                    Label = d.Label, Charge = d.Charge, Multiplicity = d.Multiplicity, SymmetryNumberOverride = d.SymmetryNumber, SymmetryNumber = d.SymmetryNumber ?? 1,
                };
                plan.NewSpecies.Add(created);
                plan.SpeciesByLabel[d.Label] = created;
            }
        }
        Species? Lookup(string label, string file, string what)
        {
            if (plan.SpeciesByLabel.TryGetValue(label, out var s)) return s;
            if (existingByLabel.TryGetValue(label, out s)) { plan.SpeciesByLabel[label] = s; return s; }
            plan.Error(file, $"{what} names species '{label}', which is neither in this upload nor in the study");
            return null;
        }

        // Calculations
        var formulas = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (var s in plan.SpeciesByLabel.Values.Where(s => s.Formula.Length > 0)) formulas[s.Label] = s.Formula;
        var seenLabels = new HashSet<string>(StringComparer.Ordinal);
        foreach (var c in draft.Calculations)
        {
            var file = c.File ?? primary;
            if (!seenLabels.Add(c.Label)) { plan.Error(file, $"calculation label '{c.Label}' is used twice in this upload"); continue; }
            var species = Lookup(c.Species, file, $"calculation '{c.Label}'");
            if (species is null) continue;
            var formula = "";
            if (c.Geometry is { } g)
            {
                formula = Formula.Of(g).ToString();
                if (g.Charge != species.Charge || g.Multiplicity != species.Multiplicity)
                    plan.Error(file, $"calculation '{c.Label}' has charge {g.Charge} and multiplicity {g.Multiplicity}, but species '{species.Label}' has {species.Charge} and {species.Multiplicity}");
                if (formulas.TryGetValue(species.Label, out var known) && known != formula)
                    plan.Error(file, $"calculation '{c.Label}' has formula {formula}, but species '{species.Label}' is {known}: a species keeps one formula");
                else formulas[species.Label] = formula;
                if ((g.ElectronCount % 2 == 0) == (species.Multiplicity % 2 == 0))
                    plan.Error(file, $"calculation '{c.Label}': {g.ElectronCount} electrons cannot have spin multiplicity {species.Multiplicity}");
            }
            if (c.EnergyHartree is { } e && !double.IsFinite(e)) plan.Error(file, $"calculation '{c.Label}' has a non-finite energy");
            if (c.Conformer.Length > Calculation.MaxConformerLength)
                plan.Error(file, $"calculation '{c.Label}': conformer label '{c.Conformer[..20]}…' is {c.Conformer.Length} characters long; at most {Calculation.MaxConformerLength} fit");
            if (c.Kind is CalculationKind.SaddlePoint or CalculationKind.Frequencies && c.Geometry is null)
                plan.Error(file, $"calculation '{c.Label}' ({c.Kind.Words()}) has no geometry");

            var frequencies = c.FrequenciesCm1;
            var modes = c.Modes;
            if (modes.Count == 0 && c.HessianHartreePerBohr2.Count > 0 && c.Geometry is { } hg)
            {
                if (!FrequencyAnalysis.TryFromHessian(hg, [.. c.HessianHartreePerBohr2], out var analysis, out var why))
                    plan.Error(file, $"calculation '{c.Label}': the Hessian cannot be analysed: {why}");
                else
                {
                    modes = analysis!.Modes;
                    if (frequencies.Count == 0) frequencies = analysis.FrequenciesCm1;
                }
            }
            if (modes.Count > 0 && frequencies.Count == 0) frequencies = [.. modes.Select(m => m.FrequencyCm1)];
            if (modes.Count > 0 && c.Geometry is { } mg && modes.Any(m => m.DisplacementCartesian.Length != mg.AtomCount))
                plan.Error(file, $"calculation '{c.Label}': its normal modes do not have one displacement per atom ({mg.AtomCount})");

            var sha = plan.ShaOf(c.File);
            if (species.Id != 0 && await db.Calculations.AnyAsync(x => x.SpeciesId == species.Id && x.SourceSha256 == sha && x.Label == c.Label && !x.Retired, ct))
            {
                var id = await db.Calculations.Where(x => x.SpeciesId == species.Id && x.SourceSha256 == sha && x.Label == c.Label && !x.Retired)
                    .Select(x => x.Id).FirstAsync(ct);
                plan.DuplicateCalculationIds.Add((c.Label, id));
                continue;
            }
            plan.NewCalculations.Add(new PlannedCalculation(c, sha, frequencies, modes, formula));
        }
        foreach (var (label, formula) in formulas)
            if (plan.SpeciesByLabel.TryGetValue(label, out var s) && s.Formula != formula)
            {
                if (s.Id == 0) s.Formula = formula;
                else plan.FormulaUpdates.Add((s, formula));
            }

        plan.CheckSymmetryNumbers(primary);

        // Scans
        foreach (var s in draft.Scans)
        {
            var file = s.File ?? primary;
            var species = Lookup(s.Species, file, $"scan '{s.Label}'");
            if (species is null) continue;
            if (s.Points.Count == 0) { plan.Error(file, $"scan '{s.Label}' has no points"); continue; }
            foreach (var (p, i) in s.Points.Select((p, i) => (p, i)))
            {
                if (!double.IsFinite(p.Coordinate) || !double.IsFinite(p.EnergyHartree))
                    plan.Error(file, $"scan '{s.Label}' point {i + 1} has a non-finite coordinate or energy");
                if (p.Geometry is { } g && s.Coordinate.Atoms.Any(a => a >= g.AtomCount))
                    plan.Error(file, $"scan '{s.Label}' point {i + 1}: the coordinate's atoms go beyond its {g.AtomCount} atoms");
            }
            var sha = plan.ShaOf(s.File);
            if (species.Id != 0 && await db.Scans.AnyAsync(x => x.SpeciesId == species.Id && x.SourceSha256 == sha && x.Label == s.Label && !x.Retired, ct))
            {
                plan.DuplicateScans.Add(s.Label);
                continue;
            }
            plan.NewScans.Add(s);
        }

        // Reactions
        var calcByLabel = draft.Calculations.GroupBy(c => c.Label).ToDictionary(g => g.Key, g => g.First(), StringComparer.Ordinal);
        var liveReactions = plan.Study is null ? [] : await db.Reactions.Where(r => r.StudyId == plan.Study.Id && !r.Retired)
            .Include(r => r.States).ToListAsync(ct);
        foreach (var r in draft.Reactions)
        {
            var where = $"reaction '{r.Label}'";
            foreach (var s in r.States)
                foreach (var t in s.Terms) Lookup(t.Species, primary, $"{where}, state '{s.Label}'");
            var shape = r.States.Select(s => new RuleState(s.Label, s.Kind, [.. s.Terms.Select(t => (t.Species, t.Coefficient))], s.Calculation,
                s.Calculation is not null && calcByLabel.TryGetValue(s.Calculation, out var c) ? new RuleCalculation(c.Label, c.Kind, c.Species, c.Geometry?.AtomCount ?? 0) : null,
                s.ReactionCoordinate)).ToList();
            foreach (var (_, message) in ReactionRules.Check(where, shape, "which is not in this upload")) plan.Error(primary, message);
            var live = liveReactions.FirstOrDefault(x => x.Label == r.Label);
            if (live is null) { plan.NewReactions.Add(r); continue; }
            // An existing reaction: the upload may bring new saddle-point calculations for its states, nothing else.
            plan._existingReactions.Add(r.Label);
            var states = live.States.OrderBy(s => s.Position).ToList();
            if (states.Count != r.States.Count || states.Zip(r.States).Any(p => p.First.Label != p.Second.Label || p.First.Kind != p.Second.Kind))
            {
                plan.Error(primary, $"{where} already exists in this study with states {string.Join(" → ", states.Select(s => s.Label))}; " +
                                    $"this upload gives {string.Join(" → ", r.States.Select(s => s.Label))}. Give the new pathway another label.");
                continue;
            }
            foreach (var (state, ds) in states.Zip(r.States))
                if (ds.Calculation is { } cl && plan.NewCalculations.Any(c => c.Draft.Label == cl)) plan.StateRelinks.Add((state, cl));
        }

        await plan.ResolveIrcsAsync(db, primary, ct);

        if (choices.AttachToStateId is { } stateId)
        {
            var state = await db.ReactionStates.Include(s => s.Reaction).FirstOrDefaultAsync(s => s.Id == stateId, ct);
            var saddles = plan.NewCalculations.Where(c => c.Draft.Kind == CalculationKind.SaddlePoint).ToList();
            if (state is null) plan.Error(primary, $"reaction state {stateId} does not exist");
            else if (state.Kind != StateKind.SaddlePoint) plan.Error(primary, $"state '{state.Label}' is a minimum; only a saddle-point state takes a saddle-point calculation");
            else if (plan.Study is not null && state.Reaction!.StudyId != plan.Study.Id) plan.Error(primary, $"state '{state.Label}' belongs to another study");
            else if (saddles.Count != 1) plan.Error(primary, $"to replace the saddle point of state '{state.Label}' the upload must hold exactly one saddle-point calculation; it holds {saddles.Count}");
            else plan.StateRelinks.Add((state, saddles[0].Draft.Label));
        }
        return plan;
    }

    /// <summary>
    /// Detects the point group of each species from this upload's geometry its thermochemistry would use (the newest with
    /// frequencies, else the newest optimised structure) and warns where a given <c>symmetry_number</c> differs from it.
    /// </summary>
    private void CheckSymmetryNumbers(string primary)
    {
        foreach (var group in NewCalculations.Where(c => c.Draft.Geometry is not null).GroupBy(c => c.Draft.Species, StringComparer.Ordinal))
        {
            var source = group.LastOrDefault(c => c.Frequencies.Count > 0 || c.Draft.Geometry!.AtomCount == 1)
                         ?? group.LastOrDefault(c => c.Draft.Kind is CalculationKind.Minimum or CalculationKind.SaddlePoint) ?? group.Last();
            var found = Core.Symmetry.PointGroups.Detect(source.Draft.Geometry!);
            DetectedSymmetry[group.Key] = (found.Group.Name, found.SymmetryNumber, source.Draft.Label);
            var given = Draft.Species.FirstOrDefault(s => s.Label == group.Key)?.SymmetryNumber;
            if (given is { } g && g != found.SymmetryNumber)
                Issues.Add(new UploadIssue(primary, null, null,
                    $"species '{group.Key}': symmetry_number {g} is given, but its geometry (calculation '{source.Draft.Label}') is {found.Group.Name}, σ = {found.SymmetryNumber}" +
                    (found.Note.Length > 0 ? $" ({found.Note})" : "") + $"; the given σ = {g} is used", IsError: false));
        }
    }

    /// <summary>
    /// Each IRC's saddle point: a saddle-point calculation of this upload by label, else the newest live one of that label stored
    /// in the study. The IRC must list the saddle point's atoms in its order; a path gets its path lengths from the saddle geometry.
    /// </summary>
    private async Task ResolveIrcsAsync(Storage.LedgerDbContext db, string primary, CancellationToken ct)
    {
        var seen = new HashSet<string>(StringComparer.Ordinal);
        foreach (var irc in Draft.Ircs)
        {
            var file = irc.File ?? primary;
            var what = $"IRC '{irc.Label}'";
            if (!seen.Add($"{irc.SaddleCalculation}\u0000{irc.Label}")) { Error(file, $"{what} of saddle point '{irc.SaddleCalculation}' is given twice in this upload"); continue; }
            Molecule? saddle;
            string? inUpload = null;
            int? storedId = null;
            string saddleLevel;
            var draftCalc = Draft.Calculations.FirstOrDefault(c => c.Label == irc.SaddleCalculation);
            if (draftCalc is not null)
            {
                if (draftCalc.Kind != CalculationKind.SaddlePoint)
                {
                    Error(file, $"{what} names calculation '{draftCalc.Label}', which is a {draftCalc.Kind}; an IRC belongs to a saddle-point calculation");
                    continue;
                }
                saddle = draftCalc.Geometry;
                saddleLevel = draftCalc.LevelOfTheory.ToString();
                var duplicate = DuplicateCalculationIds.FirstOrDefault(d => d.Label == draftCalc.Label);
                if (duplicate.Label is not null) storedId = duplicate.Id;
                else inUpload = draftCalc.Label;
            }
            else
            {
                var stored = Study is null ? null : await db.Calculations.AsNoTracking()
                    .Where(c => c.Label == irc.SaddleCalculation && c.Kind == CalculationKind.SaddlePoint && !c.Retired && c.Species!.StudyId == Study.Id)
                    .OrderByDescending(c => c.Id)
                    .Select(c => new { c.Id, c.AtomicNumbers, c.PositionsAngstrom, c.LevelOfTheory, c.Species!.Charge, c.Species.Multiplicity })
                    .FirstOrDefaultAsync(ct);
                if (stored is null)
                {
                    Error(file, $"{what} names saddle point '{irc.SaddleCalculation}', which is neither a saddle-point calculation in this upload nor one stored in study '{StudyName}'");
                    continue;
                }
                storedId = stored.Id;
                saddle = Storage.Blobs.ToMolecule(stored.AtomicNumbers, stored.PositionsAngstrom, stored.Charge, stored.Multiplicity);
                saddleLevel = stored.LevelOfTheory;
            }
            if (saddle is null) { Error(file, $"{what}: saddle point '{irc.SaddleCalculation}' has no geometry to compare the IRC with"); continue; }
            var bad = irc.Structures.Structures.Select((st, k) => (k, why: IrcFiles.Differs(saddle, st.Geometry))).FirstOrDefault(x => x.why is not null);
            if (bad.why is not null)
            {
                var frame = irc.Structures.Form == IrcForm.Path ? $"frame {bad.k + 1}" : bad.k == 0 ? "the forward end" : "the backward end";
                Issues.Add(new UploadIssue(bad.k == 1 && irc.BackwardFile is not null ? irc.BackwardFile : file, irc.Structures.Structures[bad.k].Line, null,
                    $"{what}: {frame} {bad.why} as in saddle point '{irc.SaddleCalculation}'; an IRC lists the saddle point's atoms in its order"));
                continue;
            }
            ReactionPath? path = null;
            if (irc.Structures.Form == IrcForm.Path)
                path = IrcPath.FromFrames([.. irc.Structures.Structures.Select(x => x.Geometry)], [.. irc.Structures.Structures.Select(x => x.EnergyHartree!.Value)], saddle);
            var sha = irc.BackwardFile is null ? ShaOf(irc.File)
                : UploadService.Sha256Hex(System.Text.Encoding.ASCII.GetBytes(ShaOf(irc.File) + ShaOf(irc.BackwardFile)));
            if (storedId is { } sid && await db.Ircs.AnyAsync(x => x.SaddleCalculationId == sid && x.SourceSha256 == sha && x.Label == irc.Label && !x.Retired, ct))
            {
                DuplicateIrcs.Add(irc.Label);
                continue;
            }
            NewIrcs.Add(new PlannedIrc(irc, inUpload, storedId, irc.SaddleCalculation, irc.LevelOfTheory ?? saddleLevel, path, sha));
        }
    }

    public UploadPreview ToPreview() => new(
        StudyName, Study is null,
        [.. Draft.Files.Select(f => new PreviewFile(f.Key, f.Value.LongLength, FileSha[f.Key]))],
        [.. SpeciesByLabel.Values.Select(s => new PreviewSpecies(s.Label, s.Charge, s.Multiplicity, s.Formula, s.Id != 0,
            DetectedSymmetry.TryGetValue(s.Label, out var d) ? d.Group : s.PointGroup, DetectedSymmetry.TryGetValue(s.Label, out var dd) ? dd.Sigma : s.DetectedSymmetryNumber,
            Draft.Species.FirstOrDefault(x => x.Label == s.Label)?.SymmetryNumber))],
        [.. Draft.Calculations.Select(c =>
        {
            var planned = NewCalculations.FirstOrDefault(p => p.Draft.Label == c.Label);
            var freqs = planned?.Frequencies ?? c.FrequenciesCm1;
            return new PreviewCalculation(c.Label, c.Species, c.Kind, c.LevelOfTheory.ToString(), c.Geometry?.AtomCount ?? 0,
                c.Geometry is { } g ? Formula.Of(g).ToString() : "", c.EnergyHartree, freqs, freqs.Count(f => f < 0),
                c.HessianHartreePerBohr2.Count > 0, DuplicateCalculationIds.Any(d => d.Label == c.Label), c.File, c.Conformer);
        })],
        [.. Draft.Reactions.Select(r => new PreviewReaction(r.Label, string.Join(" → ", r.States.Select(s => s.Label)), _existingReactions.Contains(r.Label)))],
        [.. Draft.Scans.Select(s => new PreviewScan(s.Label, s.Species, $"{s.Coordinate.Kind} {string.Join("–", s.Coordinate.Atoms.Select(a => a + 1))}",
            s.Points.Count, s.Points.Any(p => p.Geometry is not null), DuplicateScans.Contains(s.Label)))],
        Issues)
    {
        Ircs = [.. Draft.Ircs.Select(i => new PreviewIrc(i.Label, i.SaddleCalculation, i.Structures.Form == IrcForm.Path ? "path" : "endpoint pair",
            i.Structures.Structures.Length, DuplicateIrcs.Contains(i.Label), i.BackwardFile is null ? i.File : $"{i.File}, {i.BackwardFile}"))],
    };
}
