using System.Collections.Immutable;
using System.Globalization;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Scans;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Storage;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Reactions;

/// <summary>A reaction as a bundle zip to download, and what the bundle format cannot carry (said beside the download).</summary>
public sealed record ReactionBundleFile(string FileName, byte[] Zip, IReadOnlyList<string> NotCarried);

/// <summary>
/// Writes one reaction as a BarrierLedger bundle zip that uploads again to the same reaction in another ledger: the study's name,
/// every species of its states, every live calculation and relaxed scan of those species (the derivation chooses among all of a
/// species' results, so all go) with the stored numbers inline and the original XYZ, QCSchema and CSV files beside the manifest,
/// bytes unchanged. A stored Hessian travels without the modes derived from it, so the upload derives them again the same way.
/// </summary>
public sealed class ReactionBundleService(IDbContextFactory<LedgerDbContext> factory)
{
    public async Task<ReactionBundleFile?> ExportAsync(int reactionId, CancellationToken ct = default)
    {
        await using var db = await factory.CreateDbContextAsync(ct);
        var reaction = await db.Reactions.AsNoTracking().Include(r => r.Study)
            .Include(r => r.States).ThenInclude(s => s.Terms)
            .Include(r => r.States).ThenInclude(s => s.CoordinatePairs)
            .AsSplitQuery().FirstOrDefaultAsync(r => r.Id == reactionId, ct);
        if (reaction is null) return null;
        var states = reaction.States.OrderBy(s => s.Position).ToList();
        var saddleIds = states.Where(s => s.SaddleCalculationId is not null).Select(s => s.SaddleCalculationId!.Value).ToList();
        var saddleSpecies = await db.Calculations.AsNoTracking().Where(c => saddleIds.Contains(c.Id)).Select(c => c.SpeciesId).ToListAsync(ct);
        var speciesIds = states.SelectMany(s => s.Terms).Select(t => t.SpeciesId).Concat(saddleSpecies).Distinct().ToList();
        var species = await db.Species.AsNoTracking().Where(s => speciesIds.Contains(s.Id)).OrderBy(s => s.Id).ToListAsync(ct);
        var calcs = await db.Calculations.AsNoTracking().Where(c => speciesIds.Contains(c.SpeciesId) && (!c.Retired || saddleIds.Contains(c.Id)))
            .OrderBy(c => c.Id).ToListAsync(ct);
        var scans = await db.Scans.AsNoTracking().Where(s => speciesIds.Contains(s.SpeciesId) && !s.Retired).OrderBy(s => s.Id).ToListAsync(ct);
        var scanIds = scans.Select(s => s.Id).ToList();
        var points = (await db.ScanPoints.AsNoTracking().Where(p => scanIds.Contains(p.ScanId)).OrderBy(p => p.Index).ToListAsync(ct)).ToLookup(p => p.ScanId);
        var fileIds = calcs.Select(c => c.StoredFileId).Concat(scans.Select(s => s.StoredFileId)).OfType<int>().Distinct().ToList();
        var stored = await db.StoredFiles.AsNoTracking().Where(f => fileIds.Contains(f.Id)).ToDictionaryAsync(f => f.Id, ct);

        var files = new Files(stored);
        var speciesLabel = species.ToDictionary(s => s.Id, s => s.Label);
        var calcLabels = UniqueLabels(calcs.Select(c => (c.Id, c.Label)));
        var scanLabels = UniqueLabels(scans.Select(s => (s.Id, s.Label)));

        var bundleCalcs = calcs.Select(c =>
        {
            var sp = species.First(s => s.Id == c.SpeciesId);
            var geometry = Blobs.ToMolecule(c.AtomicNumbers, c.PositionsAngstrom, sp.Charge, sp.Multiplicity);
            var (file, format) = files.Reference(c.StoredFileId, FileFormat.Xyz, FileFormat.QcSchema);
            var hessian = Blobs.ToDoubles(c.HessianHartreePerBohr2);
            var derivedFromHessian = hessian.Length > 0;
            return new BundleCalculation(calcLabels[c.Id], speciesLabel[c.SpeciesId], c.Kind, Level(c.LevelOfTheory), c.EnergyHartree, geometry,
                derivedFromHessian ? [] : [.. Blobs.ToDoubles(c.FrequenciesCm1)],
                derivedFromHessian || c.AtomCount == 0 ? [] : [.. Blobs.ToModes(c.Modes, c.AtomCount)],
                format == FileFormat.QcSchema ? [] : [.. hessian],
                c.ThermalTemperatureKelvin is { } t ? new BundleThermalCorrections(t, c.ZeroPointHartree, c.EnthalpyCorrectionHartree, c.GibbsCorrectionHartree) : null,
                file, c.Note, c.Conformer);
        }).ToImmutableArray();

        var bundleScans = scans.Select(s =>
        {
            var (file, format) = files.Reference(s.StoredFileId, FileFormat.CsvScan, FileFormat.Xyz);
            var atoms = s.CoordinateAtoms.Split(',', StringSplitOptions.RemoveEmptyEntries).Select(a => int.Parse(a, CultureInfo.InvariantCulture) - 1).ToImmutableArray();
            var pts = points[s.Id].Select(p => new ScanPoint(p.Coordinate, p.EnergyHartree, p.Converged)).ToImmutableArray();
            string? geometriesFile = format == FileFormat.Xyz ? file : null;
            if (geometriesFile is null && points[s.Id].Any(p => p.PositionsAngstrom is not null) && s.AtomicNumbers is { } z)
            {
                // Point geometries that came in some other file travel as a multi-frame XYZ written from the stored numbers.
                var sp = species.First(x => x.Id == s.SpeciesId);
                var text = string.Concat(points[s.Id].Select(p => XyzWriter.ToExtendedText(
                    Blobs.ToMolecule(z, p.PositionsAngstrom, sp.Charge, sp.Multiplicity)!, p.EnergyHartree)));
                geometriesFile = files.Add($"scans/{Safe(scanLabels[s.Id])}.xyz", System.Text.Encoding.UTF8.GetBytes(text));
            }
            return new BundleScan(scanLabels[s.Id], speciesLabel[s.SpeciesId], s.LevelOfTheory.Length == 0 ? null : Level(s.LevelOfTheory),
                new ScanCoordinate(s.CoordinateKind, atoms), pts, format == FileFormat.CsvScan ? file : null, geometriesFile);
        }).ToImmutableArray();

        var bundleReaction = new BundleReaction(reaction.Label, reaction.Description, [.. states.Select(s => new BundleState(s.Label,
            s.Kind,
            [.. s.Terms.OrderBy(t => t.Id).Select(t => new BundleTerm(speciesLabel[t.SpeciesId], t.Coefficient))],
            s.SaddleCalculationId is { } cid ? calcLabels[cid] : null,
            [.. s.CoordinatePairs.OrderBy(p => p.Id).Select(p => new BundleAtomPair(p.AtomA, p.AtomB))]))], ReactionDefinition.ReadKinetics(reaction.Kinetics));

        // The study's energy model in force (its own or the group default) travels as study.energy_model, so that an upload that
        // creates the study elsewhere derives the same numbers whatever that ledger's group default is.
        var (model, _) = await Derivation.DerivationService.EffectiveModelAsync(db, reaction.StudyId, ct);
        var bundle = new Bundle(BundleSchema.CurrentFormatVersion, new BundleStudy(reaction.Study!.Name, reaction.Study.Description, model.ToBundle()),
            [.. species.Select(s => new BundleSpecies(s.Label, s.Charge, s.Multiplicity, s.SymmetryNumberOverride))], bundleCalcs, [bundleReaction], bundleScans, [],
            files.Written.ToImmutableDictionary(f => f.Key, f => ImmutableArray.Create(f.Value)));

        // σ travels as the bundle's symmetry_number where a member set it by hand; a detected σ is found again from the same geometry.
        var notCarried = new List<string>();
        var ircCount = await db.Ircs.CountAsync(i => saddleIds.Contains(i.SaddleCalculationId), ct);
        if (ircCount > 0)
            notCarried.Add($"{ircCount} IRC result(s) of its saddle points are not carried by this download; upload them again with the saddle point (\"IRC of saddle point\")");
        return new ReactionBundleFile($"{Safe(reaction.Label)}.zip", BundleWriter.ToZip(bundle), notCarried);
    }

    private static LevelOfTheory Level(string text) => LevelOfTheory.TryParse(text, out var l, out _) ? l : new LevelOfTheory(text, "");

    /// <summary>Labels as stored, made unique within the bundle (labels are unique per upload only) by the record's id.</summary>
    private static Dictionary<int, string> UniqueLabels(IEnumerable<(int Id, string Label)> records)
    {
        var list = records.ToList();
        var repeated = list.GroupBy(r => r.Label, StringComparer.Ordinal).Where(g => g.Count() > 1).Select(g => g.Key).ToHashSet(StringComparer.Ordinal);
        return list.ToDictionary(r => r.Id, r => repeated.Contains(r.Label) ? $"{r.Label} #{r.Id}" : r.Label);
    }

    private static string Safe(string name)
    {
        var chars = name.Select(ch => char.IsLetterOrDigit(ch) || ch is '-' or '_' or '.' ? ch : '_').ToArray();
        var s = new string(chars).Trim('.', '_');
        return s.Length == 0 ? "reaction" : s;
    }

    /// <summary>The original files the bundle names, each once (by SHA-256) under files/ with its own name made safe.</summary>
    private sealed class Files(Dictionary<int, StoredFile> stored)
    {
        private readonly Dictionary<string, string> _pathBySha = new(StringComparer.Ordinal);
        public Dictionary<string, byte[]> Written { get; } = new(StringComparer.Ordinal);

        /// <summary>The bundle path of a stored file when it is one of <paramref name="formats"/> (a manifest or zip a record came from is not).</summary>
        public (string? Path, FileFormat Format) Reference(int? fileId, params FileFormat[] formats)
        {
            if (fileId is not { } id || !stored.TryGetValue(id, out var f)) return (null, FileFormat.Unknown);
            var name = f.FileName[(f.FileName.LastIndexOf('!') + 1)..];
            var format = FileFormats.Detect(name, f.Content.AsSpan(0, Math.Min(f.Content.Length, 512)));
            if (!formats.Contains(format)) return (null, format);
            if (_pathBySha.TryGetValue(f.Sha256, out var known)) return (known, format);
            return (Add("files/" + Safe(Path.GetFileName(name)), f.Content, f.Sha256), format);
        }

        public string Add(string path, byte[] bytes, string? sha = null)
        {
            var unique = path;
            for (var i = 2; Written.ContainsKey(unique); i++)
                unique = $"{Path.GetDirectoryName(path)?.Replace('\\', '/')}/{i}-{Path.GetFileName(path)}";
            Written[unique] = bytes;
            if (sha is not null) _pathBySha[sha] = unique;
            return unique;
        }
    }
}
