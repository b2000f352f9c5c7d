using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Reviews;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Export;

/// <summary>A study that can be exported.</summary>
public sealed record ExportStudy(int Id, string Name, IReadOnlyList<ExportReaction> Reactions);

/// <summary>A reaction of a study, with whether its derived values exist yet.</summary>
public sealed record ExportReaction(int Id, string Label, bool HasDerivedValues);

/// <summary>
/// Reads what the exports need from the ledger (derived values as stored by the derivation, checks, latest reviews, the
/// study's energy model) and maps it to the writers' plain records. Never changes the ledger.
/// </summary>
public sealed class ExportQueryService(IDbContextFactory<LedgerDbContext> factory)
{
    public async Task<IReadOnlyList<ExportStudy>> ListStudiesAsync(CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        var studies = await db.Studies.AsNoTracking().Where(s => !s.Retired).OrderBy(s => s.Name).Select(s => new { s.Id, s.Name }).ToListAsync(ct);
        var reactions = (await db.Reactions.AsNoTracking().Where(r => !r.Retired).OrderBy(r => r.Label)
            .Select(r => new { r.Id, r.StudyId, r.Label, Has = r.Derivation != null }).ToListAsync(ct)).ToLookup(r => r.StudyId);
        return [.. studies.Select(s => new ExportStudy(s.Id, s.Name, [.. reactions[s.Id].Select(r => new ExportReaction(r.Id, r.Label, r.Has))]))];
    }

    /// <summary>The study's energy model as exports state it; <paramref name="levels"/> are the levels the numbers came from.</summary>
    private static async Task<ExportModel> ModelAsync(LedgerDbContext db, int studyId, IEnumerable<string> levels, CancellationToken ct)
    {
        var (m, _) = await DerivationService.EffectiveModelAsync(db, studyId, ct);
        var distinct = levels.SelectMany(l => l.Split("; ", StringSplitOptions.RemoveEmptyEntries)).Distinct(StringComparer.OrdinalIgnoreCase).ToList();
        var level = distinct.Count > 0 ? string.Join("; ", distinct) : m.EnergyLevel.Length > 0 ? m.EnergyLevel : "each state's own calculation";
        return new ExportModel(level, m.TemperatureKelvin, m.StandardState, m.Treatment, m.QuasiRrhoCutoffCm1,
            m.Tunnelling == TunnellingCorrection.Wigner ? "Wigner" : "none", m.Uncertainty) { Conformers = m.Conformers };
    }

    /// <summary>
    /// One row per elementary step of each chosen reaction (all live reactions of the study when <paramref name="reactionIds"/>
    /// is null), in reaction and pathway order. Throws <see cref="ArgumentException"/> for an unknown study.
    /// </summary>
    public async Task<BarrierTableSource> GetTableSourceAsync(int studyId, IReadOnlyCollection<int>? reactionIds = null, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        var study = await db.Studies.AsNoTracking().FirstOrDefaultAsync(s => s.Id == studyId && !s.Retired, ct)
            ?? throw new ArgumentException($"There is no study with id {studyId}.", nameof(studyId));
        var q = db.Reactions.AsNoTracking().Where(r => r.StudyId == studyId && !r.Retired);
        if (reactionIds is not null) q = q.Where(r => reactionIds.Contains(r.Id));
        var reactions = await q.OrderBy(r => r.Label)
            .Select(r => new { r.Id, r.Label, r.Derivation, States = r.States.Select(s => new { s.Position, s.SaddleCalculationId }).ToList() })
            .ToListAsync(ct);
        if (reactionIds is not null && reactions.Count != reactionIds.Count)
            throw new ArgumentException($"Reaction(s) {string.Join(", ", reactionIds.Except(reactions.Select(r => r.Id)))} are not live reactions of study {studyId}.", nameof(reactionIds));

        var calcIds = reactions.SelectMany(r => r.States).Where(s => s.SaddleCalculationId != null).Select(s => s.SaddleCalculationId!.Value).Distinct().ToList();
        var checks = await db.FrequencyChecks.AsNoTracking().Where(c => calcIds.Contains(c.CalculationId)).ToDictionaryAsync(c => c.CalculationId, ct);
        var reviews = await LatestReviewsAsync(db, calcIds, ct);

        var rows = new List<BarrierRow>();
        foreach (var r in reactions)
        {
            if (r.Derivation is null)
            {
                rows.Add(BarrierRow.Without(r.Label, "", ["no derived values yet (the reaction has not been computed)"]));
                continue;
            }
            var steps = DerivedJson.Read<List<DerivedStep>>(r.Derivation.StepsJson);
            var stored = DerivedJson.Read<List<CheckReason>>(r.Derivation.ConsistencyJson);
            var problems = stored.Where(c => c.Blocking).Select(c => c.Message).ToList();
            if (!r.Derivation.Consistent && problems.Count == 0) problems.Add("inconsistent pathway");
            // The conformer checks (issue 21) do not block a barrier but can mislead: every row of the reaction footnotes them.
            var cautions = ConformerCautions(stored);
            if (steps.Count == 0)
            {
                // A reaction whose barriers could not be formed under the model still gets its row, saying why, not a silent gap.
                rows.Add(BarrierRow.Without(r.Label, r.Derivation.LevelOfTheory, problems.Count > 0 ? problems : ["no barrier could be formed under this energy model"]) with { Cautions = cautions });
                continue;
            }
            foreach (var s in steps)
            {
                var calcId = r.States.FirstOrDefault(x => x.Position == s.SaddlePosition)?.SaddleCalculationId;
                var (verdict, reasons) = CheckOf(calcId, checks);
                rows.Add(new BarrierRow(r.Label, $"{s.From} → {s.To}", s.Label,
                    H(s.BarrierEHartree), H(s.BarrierHHartree), H(s.BarrierGHartree), H(s.ReactionGHartree),
                    s.RateConstant, s.HalfLifeSeconds, s.ImaginaryCm1, verdict, reasons,
                    calcId is { } id && reviews.TryGetValue(id, out var rv) ? rv : ReviewState.AwaitingReview,
                    r.Derivation.LevelOfTheory, problems, s.RateConstantUnit) { Cautions = cautions });
            }
        }
        var model = await ModelAsync(db, studyId, reactions.Where(r => r.Derivation is not null).Select(r => r.Derivation!.LevelOfTheory), ct);
        return new BarrierTableSource(study.Name, model, rows);
    }

    /// <summary>The conformer checks (issue 21) among stored reasons: they do not block a barrier but can mislead, so exports footnote them.</summary>
    private static List<string> ConformerCautions(IEnumerable<CheckReason> stored) =>
        [.. stored.Where(c => !c.Blocking && c.Code.StartsWith("conformers.", StringComparison.Ordinal)).Select(c => c.Message)];

    /// <summary>The reaction's profile for a figure; <paramref name="quantity"/> is "ΔG", "ΔH" or "ΔE".</summary>
    public async Task<DiagramSource> GetDiagramSourceAsync(int reactionId, string quantity = "ΔG", CancellationToken ct = default)
    {
        if (quantity is not ("ΔG" or "ΔH" or "ΔE")) throw new ArgumentException($"Quantity must be ΔG, ΔH or ΔE, not '{quantity}'.", nameof(quantity));
        await using var db = await factory.CreateDbContextAsync(ct);
        var r = await db.Reactions.AsNoTracking().Where(x => x.Id == reactionId && !x.Retired)
            .Select(x => new { x.Id, x.StudyId, x.Label, x.Derivation, States = x.States.Select(s => new { s.Position, s.SaddleCalculationId }).ToList() })
            .FirstOrDefaultAsync(ct) ?? throw new ArgumentException($"There is no live reaction with id {reactionId}.", nameof(reactionId));
        if (r.Derivation is null) throw new InvalidOperationException($"Reaction '{r.Label}' has no derived values yet, so there is nothing to draw.");
        var states = DerivedJson.Read<List<DerivedState>>(r.Derivation.StatesJson);
        var calcIds = r.States.Where(s => s.SaddleCalculationId != null).Select(s => s.SaddleCalculationId!.Value).ToList();
        var checks = await db.FrequencyChecks.AsNoTracking().Where(c => calcIds.Contains(c.CalculationId)).ToDictionaryAsync(c => c.CalculationId, ct);
        var reviews = await LatestReviewsAsync(db, calcIds, ct);
        var missing = states.Where(s => Pick(s, quantity) is null).Select(s => s.Label).ToList();
        if (missing.Count > 0) throw new InvalidOperationException($"Reaction '{r.Label}': no {quantity} for {string.Join(", ", missing)}; choose another quantity.");
        var infos = states.OrderBy(s => s.Position).Select(s =>
        {
            var saddle = s.Kind == nameof(StateKind.SaddlePoint);
            var calcId = r.States.FirstOrDefault(x => x.Position == s.Position)?.SaddleCalculationId;
            var (verdict, reasons) = CheckOf(calcId, checks);
            return new DiagramStateInfo(s.Label, Energy.FromHartree(Pick(s, quantity)!.Value), saddle,
                calcId is { } id && reviews.TryGetValue(id, out var rv) ? rv : ReviewState.AwaitingReview, verdict, reasons);
        }).ToList();
        var stored = DerivedJson.Read<List<CheckReason>>(r.Derivation.ConsistencyJson);
        var problems = r.Derivation.Consistent ? [] : stored.Where(c => c.Blocking).Select(c => c.Message).ToList();
        if (!r.Derivation.Consistent && problems.Count == 0) problems.Add("inconsistent pathway");
        var model = await ModelAsync(db, r.StudyId, [r.Derivation.LevelOfTheory], ct);
        return new DiagramSource(r.Label, model, quantity, infos, problems) { Cautions = ConformerCautions(stored) };
    }

    /// <summary>
    /// Every live species of the study that has a geometry, with exactly the values the derivation used: for a species in a
    /// reaction, its stored terms (electronic energy, zero-point, enthalpy and Gibbs corrections, point group and σ, and the
    /// calculations behind them; a species used with different calculations in different reactions is listed once per set);
    /// for a species in no reaction, the same <see cref="StateResolver"/> and Core derivation a reaction would use. Nothing is
    /// chosen or computed here by rules of its own.
    /// </summary>
    public async Task<(string Study, ExportModel Model, IReadOnlyList<SiStructure> Structures)> GetSupportingInfoAsync(int studyId, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        var study = await db.Studies.AsNoTracking().FirstOrDefaultAsync(s => s.Id == studyId && !s.Retired, ct)
            ?? throw new ArgumentException($"There is no study with id {studyId}.", nameof(studyId));
        var (settings, _) = await DerivationService.EffectiveModelAsync(db, studyId, ct);
        var species = await db.Species.AsNoTracking().Where(s => s.StudyId == studyId && !s.Retired).OrderBy(s => s.Label)
            .Select(s => new { s.Id, s.Label, s.Charge, s.Multiplicity }).ToListAsync(ct);
        var ids = species.Select(s => s.Id).ToList();
        var calcs = (await db.Calculations.AsNoTracking().Where(c => ids.Contains(c.SpeciesId) && !c.Retired).OrderBy(c => c.Id)
            .Select(c => new { c.Id, c.SpeciesId, c.Kind, c.LevelOfTheory, c.AtomicNumbers, c.PositionsAngstrom, c.FrequenciesCm1 }).ToListAsync(ct));
        var calcById = calcs.ToDictionary(c => c.Id);
        var calcsBySpecies = calcs.ToLookup(c => c.SpeciesId);
        var saddleSpecies = (await db.ReactionStateTerms.AsNoTracking()
            .Where(t => db.ReactionStates.Any(s => s.Id == t.ReactionStateId && s.Kind == StateKind.SaddlePoint && !s.Reaction!.Retired))
            .Select(t => t.SpeciesId).ToListAsync(ct)).ToHashSet();

        // What the stored derivations used, per species, in reaction order.
        var derived = await db.Reactions.AsNoTracking().Where(r => r.StudyId == studyId && !r.Retired && r.Derivation != null).OrderBy(r => r.Label)
            .Select(r => r.Derivation!.StatesJson).ToListAsync(ct);
        var used = derived.SelectMany(json => DerivedJson.Read<List<DerivedState>>(json)).SelectMany(s => s.Terms ?? [])
            .GroupBy(t => t.SpeciesId).ToDictionary(g => g.Key, g => g.DistinctBy(t => (t.EnergyCalculationId, t.ThermalCalculationId)).ToList());

        // A species in no reaction: the one resolver and the one Core derivation, as if it stood in a state of its own.
        var alone = species.Where(s => !used.ContainsKey(s.Id)).Select(s => s.Id).ToList();
        if (alone.Count > 0)
        {
            var inputs = await DerivationInputs.ForReactionsAsync(db, [], ct, alone);
            var resolver = new StateResolver(settings, inputs);
            foreach (var id in alone)
            {
                if (!inputs.Species.TryGetValue(id, out var sp)) continue;
                var all = resolver.Resolve(sp, null, sp.Label);
                if (all.Record is null) continue;
                var term = Core.Pathways.PathwayEnergies.SpeciesEnergies(all.Record, resolver.CoreModel, out _);
                var (rs, record, thermal) = (all.Of(term.Conformer?.Lowest), term.Species, term.Species.Thermal);
                used[id] = [new DerivedTerm(id, sp.Label, 1, rs.Energy!.Id, record.ElectronicEnergy.Hartree, record.ElectronicLevel.ToString(),
                    rs.ThermalUsed(thermal)?.Id, thermal?.ZeroPoint.Hartree, thermal?.Enthalpy.Hartree, thermal?.Gibbs.Hartree, thermal?.Source,
                    record.PointGroup, record.SymmetryNumber, term.Conformer?.Description)];
            }
        }

        var structures = new List<SiStructure>();
        foreach (var sp in species)
        {
            var list = calcsBySpecies[sp.Id].ToList();
            var terms = used.TryGetValue(sp.Id, out var t) ? t : [];
            foreach (var term in terms.Count > 0 ? terms.Cast<DerivedTerm?>() : [null])
            {
                var energy = term is null ? null : calcById.GetValueOrDefault(term.EnergyCalculationId);
                var thermal = term?.ThermalCalculationId is { } tid ? calcById.GetValueOrDefault(tid) : null;
                var geometryCalc = new[] { thermal, energy }.FirstOrDefault(c => c?.AtomicNumbers is { Length: > 0 } && c.PositionsAngstrom is not null)
                    ?? list.LastOrDefault(c => c.AtomicNumbers is { Length: > 0 } && c.PositionsAngstrom is not null);
                var molecule = geometryCalc is null ? null : Blobs.ToMolecule(geometryCalc.AtomicNumbers, geometryCalc.PositionsAngstrom, sp.Charge, sp.Multiplicity);
                if (molecule is null) continue;
                var level = term?.LevelOfTheory ?? geometryCalc!.LevelOfTheory;
                if (!level.Contains("//") && !EnergyLevels.Key(geometryCalc!.LevelOfTheory).Equals(EnergyLevels.Key(level), StringComparison.Ordinal))
                    level = $"{level}//{geometryCalc.LevelOfTheory}";
                var frequencies = Blobs.ToDoubles((thermal ?? energy)?.FrequenciesCm1);
                var role = saddleSpecies.Contains(sp.Id) || list.Any(c => c.Kind == CalculationKind.SaddlePoint) ? "saddle point" : "minimum";
                var label = terms.Count > 1 ? $"{sp.Label} (calculation {term!.EnergyCalculationId})" : sp.Label;
                structures.Add(new SiStructure(label, role, level, term?.ElectronicHartree, term?.ZeroPointHartree, term?.EnthalpyCorrectionHartree,
                    term?.GibbsCorrectionHartree, [.. frequencies.Where(f => f < 0)], molecule, term?.PointGroup, term?.SymmetryNumber ?? 1,
                    ThermalWords(term?.ThermalSource, settings.ThermalLevel, list.Where(c => c.FrequenciesCm1 is { Length: > 0 }).Select(c => c.LevelOfTheory))));
            }
        }
        var model = await ModelAsync(db, studyId, structures.Select(s => s.LevelOfTheory), ct);
        return (study.Name, model, structures);
    }

    /// <summary>
    /// Where a thermal correction came from, in words for the supporting information. When none was used although the species
    /// has frequencies at another level than the model's thermal level, the words say so and name both, so that a reader does
    /// not take "none" for "never computed".
    /// </summary>
    internal static string ThermalWords(string? source, string modelThermalLevel, IEnumerable<string> levelsWithFrequencies) => source switch
    {
        null when modelThermalLevel.Length > 0
                  && levelsWithFrequencies.Where(l => EnergyLevels.Key(l) != EnergyLevels.Key(modelThermalLevel)).Distinct().ToList() is { Count: > 0 } others =>
            $"none: the model takes thermal corrections at {modelThermalLevel}, and this species has frequencies only at {string.Join(", ", others)}",
        null => "none (no frequencies and no reported corrections)",
        _ when source.StartsWith("computed", StringComparison.Ordinal) => "computed from the frequencies under the model above",
        _ => "as reported by the program, moved to the model's standard state",
    };

    private static Energy? H(double? hartree) => hartree is { } v ? Energy.FromHartree(v) : null;

    private static double? Pick(DerivedState s, string quantity) => quantity switch
    {
        "ΔE" => s.DeltaEHartree,
        "ΔH" => s.DeltaHHartree,
        _ => s.DeltaGHartree,
    };

    private static (Verdict?, IReadOnlyList<string>) CheckOf(int? calcId, Dictionary<int, FrequencyCheck> checks)
    {
        if (calcId is not { } id || !checks.TryGetValue(id, out var c)) return (null, []);
        var reasons = DerivedJson.Read<List<CheckReason>>(c.ReasonsJson).Where(r => r.Severity != CheckSeverity.Info).Select(r => r.Message).ToList();
        return (c.Verdict, reasons);
    }

    private static async Task<Dictionary<int, ReviewState>> LatestReviewsAsync(LedgerDbContext db, List<int> calcIds, CancellationToken ct)
    {
        var all = await db.Reviews.AsNoTracking().Where(r => calcIds.Contains(r.CalculationId)).Select(r => new { r.CalculationId, r.Outcome, r.At, r.Id }).ToListAsync(ct);
        return all.GroupBy(r => r.CalculationId).ToDictionary(g => g.Key, g => ReviewStates.After(g.MaxBy(r => r.Id)!.Outcome));
    }
}
