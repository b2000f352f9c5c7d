using System.Collections.Immutable;
using System.Globalization;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.IsotopeEffects;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Auditing;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;
using ThermoCalc = BarrierLedger.Core.Thermochemistry.IdealGasThermo;

namespace BarrierLedger.Ledger.IsotopeEffects;

/// <summary>The substitutions of one reactant species of a set (atom numbers of that species' file).</summary>
public sealed record ReactantSubstitutions(int SpeciesId, string SpeciesLabel, ImmutableArray<IsotopeSubstitution> Substitutions);

/// <summary>A stored isotopologue set as shown.</summary>
public sealed record IsotopologueSetView(int Id, long Version, string Name, int SaddlePosition, string SaddleLabel,
    ImmutableArray<IsotopeSubstitution> SaddleSubstitutions, IReadOnlyList<ReactantSubstitutions> Reactants, IsotopeMapping Mapping,
    string CreatedBy, DateTimeOffset CreatedAt, bool Retired)
{
    /// <summary>"H4→D" on the saddle point, then "= acetaldehyde H4→D" on the reactant side.</summary>
    public string Describe() =>
        string.Join(", ", SaddleSubstitutions.Select(s => s.Describe())) + " ⇔ " +
        string.Join("; ", Reactants.Select(r => $"{r.SpeciesLabel} {string.Join(", ", r.Substitutions.Select(s => s.Describe()))}"));
}

/// <summary>
/// One set's kinetic isotope effect under the model in force, or why there is none (<see cref="Unavailable"/>), with the cautions
/// that go with it on screen and in every export.
/// </summary>
public sealed record IsotopeEffectView(IsotopologueSetView Set, KieResult? Result, string? Unavailable, IReadOnlyList<string> Cautions,
    IReadOnlyList<string> PrimaryAtoms);

/// <summary>The saddle points of a reaction that can carry sets, with their reactant state.</summary>
public sealed record KieSaddleOption(int Position, string Label, string ReactantLabel);

/// <summary>Everything the "Isotope effects" panel, the KIE export, the API and the CLI show for a reaction.</summary>
public sealed record IsotopeEffectsReport(int ReactionId, string ReactionLabel, string StudyName, ModelSettings Model,
    IReadOnlyList<KieSaddleOption> Saddles, IReadOnlyList<IsotopeEffectView> Effects);

/// <summary>Outcome of creating, retiring or restoring a set.</summary>
public sealed record IsotopologueSetSave(bool Saved, int? Id, IReadOnlyList<string> Errors, bool NeedsReactantAtoms = false);

/// <summary>
/// Isotopologue sets of a reaction's saddle points (stored, audited, retired rather than deleted) and their kinetic isotope effects,
/// computed on demand by Core's <see cref="KineticIsotopeEffect"/> from the Hessians of the calculations the stored derivation used,
/// under the energy model in force. Barriers are never derived here: the electronic barrier comes from the stored derivation.
/// </summary>
public sealed class IsotopeEffectService(IDbContextFactory<LedgerDbContext> factory, AuditService audit, TimeProvider time)
{
    /// <summary>Every set of the reaction with its KIE or the reason there is none; null when the reaction does not exist.</summary>
    public async Task<IsotopeEffectsReport?> GetForReactionAsync(int reactionId, bool includeRetired = false, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        var ctx = await LoadAsync(db, reactionId, ct);
        if (ctx is null) return null;
        var sets = await db.IsotopologueSets.AsNoTracking().Where(s => s.ReactionId == reactionId && (includeRetired || !s.Retired))
            .OrderBy(s => s.SaddlePosition).ThenBy(s => s.Id).ToListAsync(ct);
        var names = await UserNamesAsync(db, sets.Select(s => s.CreatedByUserId), ct);
        var effects = new List<IsotopeEffectView>();
        foreach (var set in sets) effects.Add(await ComputeAsync(db, ctx, set, names.GetValueOrDefault(set.CreatedByUserId) ?? set.CreatedByUserId, ct));
        return new IsotopeEffectsReport(reactionId, ctx.Reaction.Label, ctx.StudyName, ctx.Model, ctx.Saddles, effects);
    }

    /// <summary>
    /// Stores a new set. <paramref name="reactantText"/> null or blank: the reactant-side atoms are found by atom order (the saddle
    /// point lists its atoms as the reactant state's species one after the other); when that fails the result says so with
    /// <see cref="IsotopologueSetSave.NeedsReactantAtoms"/> and nothing is stored. Otherwise it gives the reactant-side atoms the member
    /// confirms, one line per species: "acetaldehyde: 4=D".
    /// </summary>
    public async Task<IsotopologueSetSave> CreateAsync(int reactionId, int saddlePosition, string name, string saddleText, string? reactantText,
        string userId, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        var ctx = await LoadAsync(db, reactionId, ct);
        if (ctx is null) return new(false, null, [$"There is no reaction {reactionId}."]);
        var errors = new List<string>();
        name = (name ?? "").Trim();
        if (name.Length == 0) errors.Add("Give the set a name (for example \"D at H4, primary\").");
        if (name.Length > 200) errors.Add("The name is longer than 200 characters.");
        var saddle = ctx.States.FirstOrDefault(s => s.Position == saddlePosition && s.Kind == StateKind.SaddlePoint);
        if (saddle is null) return new(false, null, [$"The reaction has no saddle point at position {saddlePosition + 1}."]);
        var reactant = ctx.States.FirstOrDefault(s => s.Position == saddlePosition - 1);
        if (reactant is null || reactant.Kind != StateKind.Minimum) return new(false, null, [$"Saddle point {saddle.Label} has no minimum before it."]);
        if (!IsotopeSubstitution.TryParseList(saddleText, out var saddleSubs, out var parseError)) return new(false, null, [$"Saddle point: {parseError}"]);

        var saddleMol = await SaddleMoleculeAsync(db, saddle, ct);
        if (saddleMol is null) return new(false, null, [$"Saddle point {saddle.Label} has no stored structure."]);
        try { IsotopeSubstitution.Masses(saddleMol, saddleSubs); }
        catch (ArgumentException ex) { return new(false, null, [$"Saddle point {saddle.Label}: {ex.Message.Split(" (Parameter")[0]}"]); }

        var speciesMols = await ReactantMoleculesAsync(db, reactant, ct);
        List<(int SpeciesId, string Label, ImmutableArray<IsotopeSubstitution> Subs)> reactantSubs;
        IsotopeMapping mapping;
        if (string.IsNullOrWhiteSpace(reactantText))
        {
            var mapped = IsotopeAtomMapping.ByAtomOrder(saddleMol, [.. speciesMols.Select(x => x.Molecule)], saddleSubs, out var why);
            if (mapped is not { } perSpecies)
                return new(false, null, [$"The substituted atoms cannot be found in {reactant.Label} by atom order: {why} Give the reactant-side atoms and confirm them."], true);
            reactantSubs = [.. speciesMols.Zip(perSpecies).Where(p => p.Second.Length > 0).Select(p => (p.First.SpeciesId, p.First.Label, p.Second))];
            mapping = IsotopeMapping.SameAtomOrder;
        }
        else
        {
            reactantSubs = [];
            foreach (var line in reactantText.Split(['\n', '|'], StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
            {
                var colon = line.IndexOf(':');
                if (colon < 0) { errors.Add($"Reactant line '{line}': expected species: atoms, e.g. \"{speciesMols.FirstOrDefault().Label}: 4=D\"."); continue; }
                var label = line[..colon].Trim();
                var sp = speciesMols.FirstOrDefault(x => string.Equals(x.Label, label, StringComparison.OrdinalIgnoreCase));
                if (sp.Molecule is null) { errors.Add($"Reactant line '{line}': {reactant.Label} has no species '{label}' (it has {string.Join(", ", speciesMols.Select(x => x.Label))})."); continue; }
                if (!IsotopeSubstitution.TryParseList(line[(colon + 1)..], out var subs, out var e)) { errors.Add($"Reactant line '{line}': {e}"); continue; }
                try { IsotopeSubstitution.Masses(sp.Molecule, subs); reactantSubs.Add((sp.SpeciesId, sp.Label, subs)); }
                catch (ArgumentException ex) { errors.Add($"Reactant {sp.Label}: {ex.Message.Split(" (Parameter")[0]}"); }
            }
            mapping = IsotopeMapping.Confirmed;
        }
        if (errors.Count > 0) return new(false, null, errors);

        var set = new IsotopologueSet
        {
            ReactionId = reactionId, SaddlePosition = saddlePosition, Name = name,
            SaddleSubstitutions = string.Join(", ", saddleSubs),
            ReactantSubstitutions = string.Join("\n", reactantSubs.Select(r => $"{r.SpeciesId.ToString(CultureInfo.InvariantCulture)}:{string.Join(", ", r.Subs)}")),
            Mapping = mapping, CreatedByUserId = userId, CreatedAt = time.GetUtcNow(),
        };
        // The two sides must substitute the same isotopes (Core refuses otherwise); say it now rather than on every view.
        var left = string.Join(",", saddleSubs.Select(s => s.Isotope.Label).Order(StringComparer.Ordinal));
        var right = string.Join(",", reactantSubs.SelectMany(r => r.Subs).Select(s => s.Isotope.Label).Order(StringComparer.Ordinal));
        if (left != right) return new(false, null, [$"The saddle point substitutes {left} but the reactant side {(right.Length == 0 ? "nothing" : right)}: the same atoms must be substituted on both sides."]);

        db.IsotopologueSets.Add(set);
        await db.SaveChangesAsync(ct);
        audit.Record(db, userId, "isotopologue-set.created", nameof(IsotopologueSet), set.Id,
            $"Isotopologue set '{set.Name}' on {saddle.Label} of reaction '{ctx.Reaction.Label}': {set.SaddleSubstitutions} ({mapping}).",
            after: $"saddle: {set.SaddleSubstitutions}; reactants: {set.ReactantSubstitutions.Replace('\n', ';')}");
        await db.SaveChangesAsync(ct);
        return new(true, set.Id, []);
    }

    /// <summary>The id of the reaction with this label in a study (not retired), or null.</summary>
    public async Task<int?> FindReactionAsync(int studyId, string label, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        return await db.Reactions.AsNoTracking().Where(r => r.StudyId == studyId && r.Label == label && !r.Retired).Select(r => (int?)r.Id).FirstOrDefaultAsync(ct);
    }

    /// <summary>Retires (<paramref name="retire"/> true) or restores a set, audited; refuses a stale version.</summary>
    public async Task<IsotopologueSetSave> SetRetiredAsync(int setId, bool retire, long expectedVersion, string userId, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        var set = await db.IsotopologueSets.FirstOrDefaultAsync(s => s.Id == setId, ct);
        if (set is null) return new(false, null, [$"There is no isotopologue set {setId}."]);
        if (set.Version != expectedVersion) return new(false, setId, ["Someone changed this set meanwhile; reload the page."]);
        if (set.Retired == retire) return new(true, setId, []);
        set.Retired = retire;
        set.RetiredAt = retire ? time.GetUtcNow() : null;
        set.RetiredByUserId = retire ? userId : null;
        audit.Record(db, userId, retire ? "isotopologue-set.retired" : "isotopologue-set.restored", nameof(IsotopologueSet), set.Id,
            $"Isotopologue set '{set.Name}' {(retire ? "retired" : "restored")}.");
        try { await db.SaveChangesAsync(ct); }
        catch (DbUpdateConcurrencyException) { return new(false, setId, ["Someone changed this set meanwhile; reload the page."]); }
        return new(true, setId, []);
    }

    private sealed record Context(Reaction Reaction, string StudyName, ModelSettings Model, List<ReactionState> States,
        ReactionDerivation? Derivation, bool Stale, IReadOnlyList<KieSaddleOption> Saddles);

    private static async Task<Context?> LoadAsync(LedgerDbContext db, int reactionId, CancellationToken ct)
    {
        var reaction = await db.Reactions.AsNoTracking().Include(r => r.Derivation).Include(r => r.Study).FirstOrDefaultAsync(r => r.Id == reactionId, ct);
        if (reaction is null) return null;
        var (settings, _) = await DerivationService.EffectiveModelAsync(db, reaction.StudyId, ct);
        var states = await db.ReactionStates.AsNoTracking().Where(s => s.ReactionId == reactionId).OrderBy(s => s.Position)
            .Include(s => s.Terms).ThenInclude(t => t.Species).Include(s => s.CoordinatePairs).AsSplitQuery().ToListAsync(ct);
        var d = reaction.Derivation;
        var stale = d is null || d.ModelFingerprint != settings.Fingerprint || d.InputsRevision != reaction.InputsRevision;
        var saddles = states.Where(s => s.Kind == StateKind.SaddlePoint)
            .Select(s => new KieSaddleOption(s.Position, s.Label, states.FirstOrDefault(x => x.Position == s.Position - 1)?.Label ?? "—")).ToList();
        return new Context(reaction, reaction.Study?.Name ?? "", settings, states, d, stale, saddles);
    }

    private async Task<IsotopeEffectView> ComputeAsync(LedgerDbContext db, Context ctx, IsotopologueSet set, string createdBy, CancellationToken ct)
    {
        var saddle = ctx.States.FirstOrDefault(s => s.Position == set.SaddlePosition);
        var reactant = ctx.States.FirstOrDefault(s => s.Position == set.SaddlePosition - 1);
        var saddleSubs = IsotopeSubstitution.TryParseList(set.SaddleSubstitutions, out var ss, out _) ? ss : [];
        var reactantSubs = ParseReactantSide(set.ReactantSubstitutions, ctx.States);
        var view = new IsotopologueSetView(set.Id, set.Version, set.Name, set.SaddlePosition, saddle?.Label ?? $"position {set.SaddlePosition + 1}",
            saddleSubs, reactantSubs, set.Mapping, createdBy, set.CreatedAt, set.Retired);
        var cautions = new List<string>();
        if (set.Mapping == IsotopeMapping.Confirmed) cautions.Add("The reactant-side atoms were given and confirmed by a member, not found by atom order.");
        IsotopeEffectView None(string why) => new(view, null, why, cautions, []);
        if (saddle is null || saddle.Kind != StateKind.SaddlePoint || reactant is null)
            return None("The saddle point or the minimum before it is no longer in the pathway.");
        if (ctx.Derivation is null) return None("The reaction has no derived values yet; they are being computed.");
        if (ctx.Stale) cautions.Add("The derived values are being recomputed for the energy model in force; the barrier used for Bell and Skodje–Truhlar may change.");
        if (!ctx.Derivation.Consistent) cautions.Add("This reaction breaks a consistency rule (see the reaction page); the KIE uses only the saddle point and the reactant state's Hessians.");

        var derivedStates = DerivedJson.Read<List<DerivedState>>(ctx.Derivation.StatesJson);
        var steps = DerivedJson.Read<List<DerivedStep>>(ctx.Derivation.StepsJson);
        var thermalIds = derivedStates.Where(s => s.Position == saddle.Position || s.Position == reactant.Position).SelectMany(s => s.ThermalCalculationIds).ToList();
        if (saddle.SaddleCalculationId is { } sid) thermalIds.Add(sid);
        var calcs = await db.Calculations.AsNoTracking().Where(c => thermalIds.Contains(c.Id)).ToListAsync(ct);
        var saddleSpeciesId = saddle.Terms.Count == 1 ? saddle.Terms[0].SpeciesId : (int?)null;
        var saddleCalc = calcs.Where(c => derivedStates.Single(s => s.Position == saddle.Position).ThermalCalculationIds.Contains(c.Id) && c.SpeciesId == saddleSpeciesId).FirstOrDefault()
                         ?? calcs.FirstOrDefault(c => c.Id == saddle.SaddleCalculationId);
        if (saddleCalc is null) return None($"No calculation with frequencies supplies {saddle.Label} under the energy model in force.");
        var status = await db.Reviews.AsNoTracking().Where(r => r.CalculationId == saddleCalc.Id).OrderByDescending(r => r.Id).Select(r => (ReviewOutcome?)r.Outcome).FirstOrDefaultAsync(ct);
        if (status != ReviewOutcome.Verified) cautions.Add($"Saddle point {saddle.Label} is not verified by a reviewer.");

        var reactantIds = derivedStates.Single(s => s.Position == reactant.Position).ThermalCalculationIds;
        var structures = new List<KieStructure>();
        var species = saddle.Terms.Concat(reactant.Terms).Select(t => t.Species!).DistinctBy(s => s.Id).ToDictionary(s => s.Id);
        KieStructure? Structure(Calculation c, string label, ImmutableArray<IsotopeSubstitution> subs, int symmetry, out string? why)
        {
            why = null;
            var sp = species.GetValueOrDefault(c.SpeciesId);
            var mol = Blobs.ToMolecule(c.AtomicNumbers, c.PositionsAngstrom, sp?.Charge ?? 0, sp?.Multiplicity ?? 1);
            if (mol is null) { why = $"{label} ({c.Label}) has no stored geometry."; return null; }
            if (c.HessianHartreePerBohr2 is null)
            {
                why = c.FrequenciesCm1 is null
                    ? $"{label} ({c.Label}) has neither a Hessian nor frequencies: no isotope effect can be computed."
                    : $"{label} ({c.Label}) has frequencies but no Cartesian Hessian: the frequencies of another isotopologue cannot be recomputed from them, so no KIE is offered.";
                return null;
            }
            return new KieStructure(label, mol, Blobs.ToDoubles(c.HessianHartreePerBohr2), subs, Math.Max(1, symmetry));
        }
        var ts = Structure(saddleCalc, saddle.Label, saddleSubs, species.GetValueOrDefault(saddleCalc.SpeciesId)?.SymmetryNumber ?? 1, out var tsWhy);
        if (ts is null) return None(tsWhy!);
        foreach (var r in reactantSubs)
        {
            var calc = calcs.FirstOrDefault(c => reactantIds.Contains(c.Id) && c.SpeciesId == r.SpeciesId);
            if (calc is null) return None($"No calculation with frequencies supplies {r.SpeciesLabel} in {reactant.Label} under the energy model in force.");
            var st = Structure(calc, r.SpeciesLabel, r.Substitutions, species.GetValueOrDefault(r.SpeciesId)?.SymmetryNumber ?? 1, out var why);
            if (st is null) return None(why!);
            structures.Add(st);
        }

        foreach (var st in structures.Prepend(ts).Where(x => x.SymmetryNumber > 1))
            cautions.Add($"{st.Label} has σ = {st.SymmetryNumber}; the isotopologue is given the same σ. A substitution that lowers the symmetry " +
                         "changes σ and with it the KIE by the ratio of the symmetry numbers (a statistical factor), which is not included.");

        // The parent's zero-point-corrected barrier: the stored electronic barrier of this step plus the zero-point energies of the
        // calculations the derivation used (harmonic, from their stored wavenumbers).
        Energy? zeroPointBarrier = null;
        var step = steps.FirstOrDefault(s => s.SaddlePosition == saddle.Position);
        if (step is not null)
        {
            double Zpe(Calculation c)
            {
                var sp = species.GetValueOrDefault(c.SpeciesId);
                var mol = Blobs.ToMolecule(c.AtomicNumbers, c.PositionsAngstrom, sp?.Charge ?? 0, sp?.Multiplicity ?? 1);
                if (mol is null || mol.AtomCount == 1 || c.FrequenciesCm1 is null) return 0.0;
                return ThermoCalc.Compute(mol, Blobs.ToDoubles(c.FrequenciesCm1), new ThermoOptions(ctx.Model.TemperatureKelvin)).ZeroPointEnergy.Hartree;
            }
            var reactantZpe = reactant.Terms.Sum(t => t.Coefficient * (calcs.FirstOrDefault(c => reactantIds.Contains(c.Id) && c.SpeciesId == t.SpeciesId) is { } c ? Zpe(c) : double.NaN));
            var v0 = step.BarrierEHartree + Zpe(saddleCalc) - reactantZpe;
            if (double.IsFinite(v0)) zeroPointBarrier = Energy.FromHartree(v0);
        }

        var options = new KieOptions(ctx.Model.TemperatureKelvin, ctx.Model.Treatment, ctx.Model.QuasiRrhoCutoffCm1,
            ctx.Model.Tunnelling == TunnellingCorrection.Wigner ? KieTunnelling.Wigner : KieTunnelling.None, zeroPointBarrier);
        var primary = saddleSubs.Where(s => saddle.CoordinatePairs.Any(p => p.AtomA == s.AtomNumber || p.AtomB == s.AtomNumber))
            .Select(s => s.Describe()).ToList();
        try
        {
            var result = KineticIsotopeEffect.Compute(ts, structures, options);
            return new IsotopeEffectView(view, result, null, cautions, primary);
        }
        catch (ArgumentException ex)
        {
            return new IsotopeEffectView(view, null, ex.Message.Split(" (Parameter")[0], cautions, primary);
        }
    }

    private static List<ReactantSubstitutions> ParseReactantSide(string text, List<ReactionState> states)
    {
        var labels = states.SelectMany(s => s.Terms).Where(t => t.Species is not null).DistinctBy(t => t.SpeciesId).ToDictionary(t => t.SpeciesId, t => t.Species!.Label);
        var list = new List<ReactantSubstitutions>();
        foreach (var line in text.Split('\n', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
        {
            var colon = line.IndexOf(':');
            if (colon < 0 || !int.TryParse(line[..colon], NumberStyles.None, CultureInfo.InvariantCulture, out var id)) continue;
            if (!IsotopeSubstitution.TryParseList(line[(colon + 1)..], out var subs, out _)) continue;
            list.Add(new ReactantSubstitutions(id, labels.GetValueOrDefault(id) ?? $"species {id}", subs));
        }
        return list;
    }

    private static async Task<Molecule?> SaddleMoleculeAsync(LedgerDbContext db, ReactionState saddle, CancellationToken ct)
    {
        if (saddle.SaddleCalculationId is not { } id) return null;
        var c = await db.Calculations.AsNoTracking().Include(x => x.Species).FirstOrDefaultAsync(x => x.Id == id, ct);
        return c is null ? null : Blobs.ToMolecule(c.AtomicNumbers, c.PositionsAngstrom, c.Species?.Charge ?? 0, c.Species?.Multiplicity ?? 1);
    }

    /// <summary>Each reactant species (in term order, repeated by its coefficient) with the geometry of its newest structure calculation.</summary>
    private static async Task<List<(int SpeciesId, string Label, Molecule Molecule)>> ReactantMoleculesAsync(LedgerDbContext db, ReactionState reactant, CancellationToken ct)
    {
        var ids = reactant.Terms.Select(t => t.SpeciesId).ToList();
        var calcs = await db.Calculations.AsNoTracking().Where(c => ids.Contains(c.SpeciesId) && !c.Retired && c.AtomicNumbers != null)
            .OrderByDescending(c => c.Id).ToListAsync(ct);
        var list = new List<(int, string, Molecule)>();
        foreach (var t in reactant.Terms.OrderBy(t => t.Id))
        {
            var c = calcs.FirstOrDefault(x => x.SpeciesId == t.SpeciesId && x.HessianHartreePerBohr2 != null) ?? calcs.FirstOrDefault(x => x.SpeciesId == t.SpeciesId);
            var mol = c is null ? null : Blobs.ToMolecule(c.AtomicNumbers, c.PositionsAngstrom, t.Species!.Charge, t.Species.Multiplicity);
            if (mol is null) continue;
            for (var k = 0; k < t.Coefficient; k++) list.Add((t.SpeciesId, t.Species!.Label, mol));
        }
        return list;
    }

    private static async Task<Dictionary<string, string>> UserNamesAsync(LedgerDbContext db, IEnumerable<string> ids, CancellationToken ct)
    {
        var list = ids.Distinct().ToList();
        return await db.Users.AsNoTracking().Where(u => list.Contains(u.Id))
            .ToDictionaryAsync(u => u.Id, u => u.DisplayName != "" ? u.DisplayName : u.UserName ?? u.Id, ct);
    }
}
