using System.Collections.Immutable;
using System.IO.Compression;
using System.Text.Json;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Scans;
using BarrierLedger.Core.Units;
using BarrierLedger.Core.Vibrations;

namespace BarrierLedger.Core.Formats;

/// <summary>
/// Reads a BarrierLedger bundle: the JSON manifest alone, or a .zip holding <c>bundle.json</c> at its root plus the
/// files it names. For a bare manifest, <c>openFile</c> (if given) opens the named files, e.g. beside the manifest
/// on disk; without it, file references are reported as not found. Zip entries are read from the stream with every
/// size bounded by <see cref="ReaderLimits"/> (the declared sizes in a zip are not trusted), and only the entries the
/// manifest names are read; names that climb out of the archive ("..", absolute paths) are refused.
/// </summary>
public static class BundleReader
{
    /// <summary>The format name every manifest carries in "format".</summary>
    public const string FormatName = "barrierledger-bundle";

    /// <summary>The manifest version this reader writes and reads.</summary>
    public const int CurrentFormatVersion = 1;

    /// <summary>The manifest's name inside a bundle zip.</summary>
    public const string ManifestEntryName = "bundle.json";

    /// <summary>Keys the reader knows for each object of the manifest, by the schema's $defs name ("bundle" is the root). Unknown keys get a warning.</summary>
    public static readonly ImmutableDictionary<string, ImmutableArray<string>> KnownKeys = new Dictionary<string, ImmutableArray<string>>
    {
        ["bundle"] = ["format", "format_version", "study", "species", "calculations", "reactions", "scans"],
        ["study"] = ["name", "description"],
        ["species"] = ["label", "charge", "multiplicity"],
        ["calculation"] = ["label", "species", "kind", "level_of_theory", "energy_hartree", "file", "geometry", "frequencies_cm1", "modes",
            "hessian_hartree_per_bohr2", "thermal_corrections", "note"],
        ["geometry"] = ["symbols", "positions_angstrom"],
        ["mode"] = ["frequency_cm1", "displacements", "reduced_mass_amu", "force_constant_mdyn_per_angstrom"],
        ["thermal_corrections"] = ["temperature_kelvin", "zero_point_hartree", "enthalpy_hartree", "gibbs_hartree"],
        ["reaction"] = ["label", "description", "states"],
        ["state"] = ["label", "kind", "terms", "calculation", "reaction_coordinate"],
        ["term"] = ["species", "coefficient"],
        ["scan"] = ["label", "species", "level_of_theory", "coordinate", "points", "points_file", "energy_unit", "geometries_file"],
        ["coordinate"] = ["kind", "atoms"],
        ["point"] = ["coordinate", "energy_hartree", "converged"],
    }.ToImmutableDictionary();

    /// <summary>Calculation kinds as written in the manifest.</summary>
    public static readonly ImmutableDictionary<string, CalculationKind> KindNames = new Dictionary<string, CalculationKind>
    {
        ["minimum"] = CalculationKind.Minimum,
        ["saddle_point"] = CalculationKind.SaddlePoint,
        ["single_point"] = CalculationKind.SinglePoint,
        ["frequencies"] = CalculationKind.Frequencies,
        ["relaxed_scan"] = CalculationKind.RelaxedScan,
        ["endpoint"] = CalculationKind.Endpoint,
    }.ToImmutableDictionary();

    public static ReadResult<Bundle> Read(Stream stream, string fileName, ReaderLimits? limits = null, Func<string, Stream?>? openFile = null)
    {
        limits ??= ReaderLimits.Default;
        var issues = new IssueCollector(fileName, limits.MaxIssues);
        var bytes = TextInput.ReadBytes(stream, limits.MaxBytes, issues);
        if (bytes is null) return issues.Result<Bundle>(null);
        if (bytes.Length >= 4 && bytes[0] == 'P' && bytes[1] == 'K' && bytes[2] == 3 && bytes[3] == 4)
            return ReadZip(bytes, fileName, limits, issues);
        var files = new FileSource(fileName, limits, openFile, null);
        return issues.Result(ReadManifest(bytes, issues, limits, files));
    }

    /// <summary>True when <paramref name="path"/> is a safe relative path: forward slashes, no "..", not absolute, no drive letter, no backslash.</summary>
    public static bool IsSafeRelativePath(string path) =>
        path.Length > 0 && path.Length <= 512 && !path.StartsWith('/') && !path.Contains('\\') && !path.Contains(':')
        && !path.Contains('\0') && path.Split('/').All(part => part.Length > 0 && part != ".." && part != ".");

    private static ReadResult<Bundle> ReadZip(byte[] bytes, string fileName, ReaderLimits limits, IssueCollector issues)
    {
        try
        {
            using var zip = new ZipArchive(new MemoryStream(bytes, writable: false), ZipArchiveMode.Read);
            if (zip.Entries.Count > limits.MaxZipEntries)
            {
                issues.Error(null, $"zip has {zip.Entries.Count} entries, more than the limit of {limits.MaxZipEntries} (ReaderLimits.MaxZipEntries)");
                return issues.Result<Bundle>(null);
            }
            var entries = new Dictionary<string, ZipArchiveEntry>(StringComparer.Ordinal);
            foreach (var e in zip.Entries)
            {
                if (e.FullName.EndsWith('/')) continue;
                if (!IsSafeRelativePath(e.FullName))
                {
                    issues.Error(null, $"zip entry {TextInput.Quote(e.FullName, 80)} has an unsafe path (absolute, '..', '\\' or ':'); expected paths relative to the bundle root");
                    continue;
                }
                entries[e.FullName] = e;
            }
            if (issues.HasErrors) return issues.Result<Bundle>(null);
            if (!entries.TryGetValue(ManifestEntryName, out var manifestEntry))
            {
                var roots = entries.Keys.Where(k => !k.Contains('/')).Take(10);
                issues.Error(null, $"zip has no '{ManifestEntryName}' at its root; found: {string.Join(", ", roots.DefaultIfEmpty("(no files)"))}");
                return issues.Result<Bundle>(null);
            }
            var files = new FileSource(fileName, limits, null, entries);
            var manifestBytes = files.ReadEntry(manifestEntry, issues);
            if (manifestBytes is null) return issues.Result<Bundle>(null);
            var manifestIssues = new IssueCollector($"{fileName}!{ManifestEntryName}", limits.MaxIssues);
            var bundle = ReadManifest(manifestBytes, manifestIssues, limits, files);
            issues.AddRange(manifestIssues.ToList());
            return issues.Result(bundle);
        }
        catch (InvalidDataException ex)
        {
            issues.Error(null, $"not a readable zip archive: {ex.Message}");
            return issues.Result<Bundle>(null);
        }
    }

    /// <summary>Opens the files a manifest names, from a zip or through a callback, with the shared byte budget.</summary>
    private sealed class FileSource(string bundleName, ReaderLimits limits, Func<string, Stream?>? open, Dictionary<string, ZipArchiveEntry>? entries)
    {
        private long _budget = limits.MaxBytes;
        public Dictionary<string, byte[]> Read { get; } = new(StringComparer.Ordinal);

        public string DisplayName(string path) => entries is null ? path : $"{bundleName}!{path}";

        public byte[]? ReadEntry(ZipArchiveEntry entry, IssueCollector issues)
        {
            using var s = entry.Open();
            var sub = new IssueCollector($"{bundleName}!{entry.FullName}", limits.MaxIssues);
            var bytes = TextInput.ReadBytes(s, _budget, sub);
            if (bytes is null)
            {
                issues.Error(null, $"zip entry '{entry.FullName}' expands beyond the remaining budget of {TextInput.FormatBytes(_budget)} " +
                                   $"(total uncompressed limit {TextInput.FormatBytes(limits.MaxBytes)}): refused as a possible zip bomb");
                return null;
            }
            _budget -= bytes.Length;
            return bytes;
        }

        /// <summary>The file's bytes, or null with an error at <paramref name="jsonPath"/>.</summary>
        public byte[]? Get(string path, string jsonPath, IssueCollector issues)
        {
            if (Read.TryGetValue(path, out var cached)) return cached;
            if (!IsSafeRelativePath(path))
            {
                issues.ErrorAt(jsonPath, $"file path {TextInput.Quote(path, 80)} is not allowed; expected a path relative to the bundle, with '/' and without '..'");
                return null;
            }
            byte[]? bytes = null;
            if (entries is not null)
            {
                if (!entries.TryGetValue(path, out var entry))
                {
                    issues.ErrorAt(jsonPath, $"file '{path}' is not in the zip");
                    return null;
                }
                bytes = ReadEntry(entry, issues);
            }
            else if (open is not null)
            {
                Stream? s;
                try { s = open(path); }
                catch (Exception ex) when (ex is IOException or UnauthorizedAccessException) { s = null; }
                if (s is null) { issues.ErrorAt(jsonPath, $"file '{path}' not found next to the bundle"); return null; }
                using (s)
                {
                    var sub = new IssueCollector(path, limits.MaxIssues);
                    bytes = TextInput.ReadBytes(s, _budget, sub);
                    if (bytes is null) { issues.ErrorAt(jsonPath, $"file '{path}' is larger than the remaining budget of {TextInput.FormatBytes(_budget)}"); return null; }
                    _budget -= bytes.Length;
                }
            }
            else
            {
                issues.ErrorAt(jsonPath, $"file '{path}' cannot be opened: a bare manifest was given; upload the bundle as a .zip with its files");
                return null;
            }
            if (bytes is not null) Read[path] = bytes;
            return bytes;
        }
    }

    private sealed record SpeciesInfo(BundleSpecies Species, string Path, bool Complete = true);

    private static Bundle? ReadManifest(byte[] bytes, IssueCollector issues, ReaderLimits limits, FileSource files)
    {
        using var doc = JsonInput.Parse(bytes, issues);
        if (doc is null) return null;
        var j = new JsonInput(issues);
        var root = doc.RootElement;
        if (!j.RequireObject(root, "$")) return null;
        var format = j.String(root, "$", "format", required: true);
        if (format is not null && format != FormatName)
        {
            var hint = JsonInput.Member(root, "schema_name") is not null ? " (this looks like a QCSchema file, not a bundle)" : "";
            issues.ErrorAt("$.format", $"is '{format}'; expected '{FormatName}'{hint}");
            return null;
        }
        if (format is null) return null;
        var version = j.Integer(root, "$", "format_version", required: true, min: 1);
        if (version is > CurrentFormatVersion)
        {
            issues.ErrorAt("$.format_version", $"is {version}; this reader understands format_version {CurrentFormatVersion} (written by a newer BarrierLedger?)");
            return null;
        }
        j.WarnUnknown(root, "$", KnownKeys["bundle"]);

        BundleStudy? study = null;
        if (j.Object(root, "$", "study", required: true) is { } st)
        {
            j.WarnUnknown(st, "$.study", KnownKeys["study"]);
            var name = j.String(st, "$.study", "name", required: true);
            var description = j.String(st, "$.study", "description", required: false, allowEmpty: true) ?? "";
            if (name is not null) study = new BundleStudy(name, description);
        }

        // Species.
        var species = new Dictionary<string, SpeciesInfo>(StringComparer.Ordinal);
        if (j.Array(root, "$", "species", required: true) is { } spArr)
        {
            var k = 0;
            foreach (var sp in spArr.EnumerateArray())
            {
                var p = JsonInput.Index("$.species", k++);
                if (!j.RequireObject(sp, p)) continue;
                j.WarnUnknown(sp, p, KnownKeys["species"]);
                var label = j.String(sp, p, "label", required: true);
                var charge = j.Integer(sp, p, "charge", required: true);
                var mult = j.Integer(sp, p, "multiplicity", required: true, min: 1);
                if (label is null) continue;
                if (species.TryGetValue(label, out var prior)) { issues.ErrorAt(JsonInput.Child(p, "label"), $"species '{label}' is already defined at {prior.Path}; labels must be unique"); continue; }
                // A species whose charge or multiplicity is wrong keeps its label (the error is already listed), so that
                // references to it do not raise a second, misleading "not in $.species" error.
                species[label] = new SpeciesInfo(new BundleSpecies(label, charge ?? 0, mult ?? 1), p, charge is not null && mult is not null);
            }
            if (k == 0) issues.ErrorAt("$.species", "is empty; expected at least one species");
        }

        // Calculations.
        var calculations = new List<BundleCalculation>();
        var calcPaths = new Dictionary<string, string>(StringComparer.Ordinal);
        if (j.Array(root, "$", "calculations", required: false) is { } cArr)
        {
            var k = 0;
            foreach (var c in cArr.EnumerateArray())
            {
                var p = JsonInput.Index("$.calculations", k++);
                if (ReadCalculation(c, p, j, species, limits, files) is { } calc)
                {
                    if (calcPaths.TryGetValue(calc.Label, out var prior)) issues.ErrorAt(JsonInput.Child(p, "label"), $"calculation '{calc.Label}' is already defined at {prior}; labels must be unique");
                    else { calcPaths[calc.Label] = p; calculations.Add(calc); }
                }
            }
        }
        var calcByLabel = calculations.ToDictionary(c => c.Label, StringComparer.Ordinal);

        // Reactions.
        var reactions = new List<BundleReaction>();
        var reactionLabels = new HashSet<string>(StringComparer.Ordinal);
        if (j.Array(root, "$", "reactions", required: false) is { } rArr)
        {
            var k = 0;
            foreach (var r in rArr.EnumerateArray())
            {
                var p = JsonInput.Index("$.reactions", k++);
                if (ReadReaction(r, p, j, species, calcByLabel) is { } reaction)
                {
                    if (!reactionLabels.Add(reaction.Label)) issues.ErrorAt(JsonInput.Child(p, "label"), $"reaction '{reaction.Label}' is defined twice; labels must be unique");
                    else reactions.Add(reaction);
                }
            }
        }

        // Scans.
        var scans = new List<BundleScan>();
        var scanLabels = new HashSet<string>(StringComparer.Ordinal);
        if (j.Array(root, "$", "scans", required: false) is { } sArr)
        {
            var k = 0;
            foreach (var s in sArr.EnumerateArray())
            {
                var p = JsonInput.Index("$.scans", k++);
                if (ReadScan(s, p, j, species, limits, files) is { } scan)
                {
                    if (!scanLabels.Add(scan.Label)) issues.ErrorAt(JsonInput.Child(p, "label"), $"scan '{scan.Label}' is defined twice; labels must be unique");
                    else scans.Add(scan);
                }
            }
        }

        if (issues.HasErrors || study is null || version is null) return null;
        return new Bundle(version.Value, study, [.. species.Values.Select(v => v.Species)], [.. calculations], [.. reactions], [.. scans],
            files.Read.ToImmutableDictionary(kv => kv.Key, kv => ImmutableArray.Create(kv.Value), StringComparer.Ordinal));
    }

    private static BundleCalculation? ReadCalculation(JsonElement c, string p, JsonInput j, Dictionary<string, SpeciesInfo> species,
        ReaderLimits limits, FileSource files)
    {
        if (!j.RequireObject(c, p)) return null;
        var issues = j.Issues;
        j.WarnUnknown(c, p, KnownKeys["calculation"]);
        var label = j.String(c, p, "label", required: true);
        var speciesLabel = j.String(c, p, "species", required: true);
        SpeciesInfo? sp = null;
        if (speciesLabel is not null && !species.TryGetValue(speciesLabel, out sp))
            issues.ErrorAt(JsonInput.Child(p, "species"), $"names species '{speciesLabel}', which is not in $.species; expected one of: {Known(species.Keys)}");
        var kindText = j.String(c, p, "kind", required: true);
        CalculationKind kind = default;
        if (kindText is not null && !KindNames.TryGetValue(kindText, out kind))
            issues.ErrorAt(JsonInput.Child(p, "kind"), $"is '{kindText}'; expected one of: {Known(KindNames.OrderBy(k => k.Value).Select(k => k.Key))}");
        LevelOfTheory? level = null;
        if (j.String(c, p, "level_of_theory", required: true) is { } lt)
        {
            if (!LevelOfTheory.TryParse(lt, out level, out var why)) { issues.ErrorAt(JsonInput.Child(p, "level_of_theory"), $"cannot be read: {why}"); level = null; }
        }
        var energy = j.Number(c, p, "energy_hartree", required: false);
        var note = j.String(c, p, "note", required: false, allowEmpty: true) ?? "";

        // File first, inline data override it.
        var filePath = j.String(c, p, "file", required: false);
        Molecule? geometry = null;
        double? fileEnergy = null;
        double[]? hessian = null;
        string? hessianPath = null;
        if (filePath is not null && files.Get(filePath, JsonInput.Child(p, "file"), issues) is { } bytes)
        {
            var format = FileFormats.Detect(filePath, bytes.AsSpan(0, Math.Min(bytes.Length, 4096)));
            var display = files.DisplayName(filePath);
            switch (format)
            {
                case FileFormat.Xyz:
                    var xr = XyzReader.Read(new MemoryStream(bytes), display, limits, warnUnstatedOddElectrons: false);
                    issues.AddRange(xr.Issues);
                    if (xr.Value is { } xdoc) { geometry = xdoc.Last.Molecule; fileEnergy = xdoc.Last.EnergyHartree; }
                    break;
                case FileFormat.QcSchema:
                    var qr = QcSchemaReader.Read(new MemoryStream(bytes), display, limits);
                    issues.AddRange(qr.Issues);
                    if (qr.Value is { } q)
                    {
                        geometry = q.Molecule;
                        fileEnergy = q.EnergyHartree;
                        if (!q.HessianHartreePerBohr2.IsDefaultOrEmpty) { hessian = [.. q.HessianHartreePerBohr2]; hessianPath = display; }
                        if (level is not null && q.LevelOfTheory is { } ql && !ql.SameAs(level with { GeometryLevel = null }) && !ql.SameAs(level))
                            issues.WarningAt(JsonInput.Child(p, "level_of_theory"), $"is '{level}' but {display} says '{ql}'");
                    }
                    break;
                default:
                    issues.ErrorAt(JsonInput.Child(p, "file"), $"'{filePath}' is not a calculation file; expected .xyz/.extxyz or a QCSchema .json");
                    break;
            }
            if (geometry is not null && sp is not null)
            {
                var declaresState = format == FileFormat.QcSchema || (geometry.Charge != 0 || geometry.Multiplicity != 1);
                if (declaresState && sp.Complete && (geometry.Charge != sp.Species.Charge || geometry.Multiplicity != sp.Species.Multiplicity))
                    issues.ErrorAt(JsonInput.Child(p, "file"), $"{display} has charge {geometry.Charge} and multiplicity {geometry.Multiplicity}, " +
                                                                $"but species '{sp.Species.Label}' has charge {sp.Species.Charge} and multiplicity {sp.Species.Multiplicity}");
            }
        }

        if (j.Object(c, p, "geometry", required: false) is { } g)
        {
            var inline = ReadGeometry(g, JsonInput.Child(p, "geometry"), j, limits);
            if (inline is not null && geometry is not null && !inline.SameAs(geometry with { Charge = inline.Charge, Multiplicity = inline.Multiplicity }, 1e-4))
                issues.WarningAt(JsonInput.Child(p, "geometry"), $"differs from the geometry in '{filePath}'; the inline geometry is used");
            geometry = inline ?? geometry;
        }
        if (geometry is not null && sp is not null)
        {
            geometry = new Molecule(geometry.Elements, geometry.PositionsAngstrom, sp.Species.Charge, sp.Species.Multiplicity);
            if (sp.Complete && geometry.ElectronCount % 2 == geometry.Multiplicity % 2)
                issues.ErrorAt(JsonInput.Child(sp.Path, "multiplicity"),
                    $"species '{sp.Species.Label}' has {geometry.ElectronCount} electrons (geometry of calculation '{label}') and multiplicity {geometry.Multiplicity}: " +
                    "an even electron count needs an odd multiplicity and vice versa");
        }
        if (energy is not null && fileEnergy is { } fe && Math.Abs(fe - energy.Value) > 1e-6)
            issues.WarningAt(JsonInput.Child(p, "energy_hartree"), $"is {Numbers.Format(energy.Value)} but '{filePath}' gives {Numbers.Format(fe)}; energy_hartree is used");
        energy ??= fileEnergy;
        if (energy is { } e && StructureChecks.ImplausibleEnergy(e, geometry) is { } bad)
            issues.ErrorAt(JsonInput.Child(p, "energy_hartree"), bad);

        // Frequencies, modes, Hessian, thermal corrections.
        var frequencies = ImmutableArray<double>.Empty;
        if (j.Array(c, p, "frequencies_cm1", required: false) is { } fr
            && j.Numbers(fr, JsonInput.Child(p, "frequencies_cm1"), allowNested: false, maxCount: 3L * limits.MaxAtoms) is { } f)
            frequencies = [.. f];
        var modes = ImmutableArray.CreateBuilder<NormalMode>();
        if (j.Array(c, p, "modes", required: false) is { } mArr)
        {
            if (geometry is null) issues.ErrorAt(JsonInput.Child(p, "modes"), "normal modes need a geometry (inline or from file) to know the atom count");
            else if (mArr.GetArrayLength() > 3 * geometry.AtomCount)
                issues.ErrorAt(JsonInput.Child(p, "modes"), $"has {mArr.GetArrayLength()} modes; {geometry.AtomCount} atoms have at most {3 * geometry.AtomCount}");
            else
            {
                var k = 0;
                foreach (var m in mArr.EnumerateArray())
                    if (ReadMode(m, JsonInput.Index(JsonInput.Child(p, "modes"), k++), j, geometry.AtomCount) is { } mode) modes.Add(mode);
            }
            if (modes.Count > 0)
            {
                var modeFreqs = modes.Select(m => m.FrequencyCm1).ToArray();
                if (frequencies.IsEmpty) frequencies = [.. modeFreqs];
                else if (frequencies.Length != modeFreqs.Length || frequencies.Zip(modeFreqs).Any(t => Math.Abs(t.First - t.Second) > 1e-6 * Math.Max(1, Math.Abs(t.First))))
                    issues.ErrorAt(JsonInput.Child(p, "frequencies_cm1"), "disagree with the frequencies of the modes; give one or make them match");
            }
        }
        if (j.Array(c, p, "hessian_hartree_per_bohr2", required: false) is { } hArr)
        {
            var hp = JsonInput.Child(p, "hessian_hartree_per_bohr2");
            if (hessian is not null) issues.WarningAt(hp, $"replaces the Hessian from {hessianPath}");
            if (geometry is null) issues.ErrorAt(hp, "a Hessian needs a geometry (inline or from file) to know the atom count");
            else if (j.Numbers(hArr, hp, allowNested: true, maxCount: 9L * geometry.AtomCount * geometry.AtomCount) is { } h)
            {
                hessian = h;
                hessianPath = hp;
            }
        }
        if (hessian is not null && geometry is not null)
        {
            var (errs, warns) = StructureChecks.CheckHessian(hessian, geometry.AtomCount);
            var at = hessianPath!.StartsWith('$') ? hessianPath : JsonInput.Child(p, "file");
            foreach (var m in errs) issues.ErrorAt(at, m);
            foreach (var m in warns) issues.WarningAt(at, m);
        }
        BundleThermalCorrections? thermal = null;
        if (j.Object(c, p, "thermal_corrections", required: false) is { } th)
        {
            var tp = JsonInput.Child(p, "thermal_corrections");
            j.WarnUnknown(th, tp, KnownKeys["thermal_corrections"]);
            var t = j.Number(th, tp, "temperature_kelvin", required: true);
            if (t is <= 0) issues.ErrorAt(JsonInput.Child(tp, "temperature_kelvin"), $"is {Numbers.Format(t.Value)}; expected a temperature above 0 K");
            var zpe = j.Number(th, tp, "zero_point_hartree", required: false);
            var h = j.Number(th, tp, "enthalpy_hartree", required: false);
            var gib = j.Number(th, tp, "gibbs_hartree", required: false);
            // Largest plausible correction: 0.05 Eh + 0.02 Eh per atom (CH4's ZPE is ~0.045 Eh for 5 atoms); 10 Eh without a geometry.
            // Common practice, no source.
            var bound = geometry is null ? 10.0 : 0.05 + 0.02 * geometry.AtomCount;
            foreach (var (name, v) in new[] { ("zero_point_hartree", zpe), ("enthalpy_hartree", h), ("gibbs_hartree", gib) })
                if (v is { } x && Math.Abs(x) > bound)
                    issues.ErrorAt(JsonInput.Child(tp, name), $"is {Numbers.Format(x)}, above {bound:0.###} Eh: a thermal correction is a fraction of a hartree " +
                                                             "(is it a total energy, or in kcal/mol?)");
            if (zpe is null && h is null && gib is null) issues.ErrorAt(tp, "gives no correction; expected zero_point_hartree, enthalpy_hartree or gibbs_hartree");
            if (t is not null) thermal = new BundleThermalCorrections(t.Value, zpe, h, gib);
        }

        if (label is null || speciesLabel is null || kindText is null || level is null) return null;
        return new BundleCalculation(label, speciesLabel, kind, level, energy, geometry, frequencies, modes.ToImmutable(),
            hessian is null ? [] : [.. hessian], thermal, filePath, note);
    }

    private static Molecule? ReadGeometry(JsonElement g, string p, JsonInput j, ReaderLimits limits)
    {
        j.WarnUnknown(g, p, KnownKeys["geometry"]);
        var symbols = j.Array(g, p, "symbols", required: true);
        var positions = j.Array(g, p, "positions_angstrom", required: true);
        if (symbols is not { } s || positions is not { } pos) return null;
        var n = s.GetArrayLength();
        if (n == 0) { j.Issues.ErrorAt(JsonInput.Child(p, "symbols"), "is empty; expected at least one atom"); return null; }
        if (n > limits.MaxAtoms) { j.Issues.ErrorAt(JsonInput.Child(p, "symbols"), $"has {n} atoms, above the limit of {limits.MaxAtoms}"); return null; }
        if (pos.GetArrayLength() != n)
        {
            j.Issues.ErrorAt(JsonInput.Child(p, "positions_angstrom"), $"has {pos.GetArrayLength()} positions for {n} symbols; expected one [x, y, z] per symbol");
            return null;
        }
        var elements = new Element[n];
        var ok = true;
        var k = 0;
        foreach (var sym in s.EnumerateArray())
        {
            var sp = JsonInput.Index(JsonInput.Child(p, "symbols"), k);
            if (sym.ValueKind != JsonValueKind.String || !Numbers.TryParseElement(sym.GetString()!, out elements[k], out _))
            {
                j.Issues.ErrorAt(sp, $"{(sym.ValueKind == JsonValueKind.String ? TextInput.Quote(sym.GetString()!) : JsonInput.KindName(sym.ValueKind))} is not an element; expected a symbol such as C or Cl");
                ok = false;
            }
            k++;
        }
        var vecs = new Vec3[n];
        k = 0;
        foreach (var row in pos.EnumerateArray())
        {
            var rp = JsonInput.Index(JsonInput.Child(p, "positions_angstrom"), k);
            if (row.ValueKind != JsonValueKind.Array || row.GetArrayLength() != 3)
            {
                j.Issues.ErrorAt(rp, $"expected [x, y, z] (three numbers), found {(row.ValueKind == JsonValueKind.Array ? $"{row.GetArrayLength()} numbers" : JsonInput.KindName(row.ValueKind))}");
                ok = false;
            }
            else if (j.Numbers(row, rp, allowNested: false, maxCount: 3) is { } xyz) vecs[k] = new Vec3(xyz[0], xyz[1], xyz[2]);
            else ok = false;
            k++;
        }
        if (!ok) return null;
        var molecule = new Molecule(elements, vecs);
        foreach (var m in StructureChecks.DuplicateAtomMessages(molecule)) j.Issues.ErrorAt(JsonInput.Child(p, "positions_angstrom"), m);
        return molecule;
    }

    private static NormalMode? ReadMode(JsonElement m, string p, JsonInput j, int atomCount)
    {
        if (!j.RequireObject(m, p)) return null;
        j.WarnUnknown(m, p, KnownKeys["mode"]);
        var freq = j.Number(m, p, "frequency_cm1", required: true);
        var d = j.Array(m, p, "displacements", required: true);
        var mu = j.Number(m, p, "reduced_mass_amu", required: false) ?? double.NaN;
        var k = j.Number(m, p, "force_constant_mdyn_per_angstrom", required: false) ?? double.NaN;
        if (freq is null || d is null) return null;
        var dp = JsonInput.Child(p, "displacements");
        var flat = j.Numbers(d.Value, dp, allowNested: true, maxCount: 3L * atomCount);
        if (flat is null) return null;
        if (flat.Length != 3 * atomCount) { j.Issues.ErrorAt(dp, $"has {flat.Length} numbers; expected [dx, dy, dz] for each of {atomCount} atoms"); return null; }
        var norm = Math.Sqrt(flat.Sum(x => x * x));
        if (norm == 0) { j.Issues.ErrorAt(dp, "is all zeros; a normal mode needs a non-zero displacement"); return null; }
        var vecs = Enumerable.Range(0, atomCount).Select(i => new Vec3(flat[3 * i], flat[3 * i + 1], flat[3 * i + 2]) / norm);
        return new NormalMode(freq.Value, [.. vecs], mu, k);
    }

    private static BundleReaction? ReadReaction(JsonElement r, string p, JsonInput j, Dictionary<string, SpeciesInfo> species,
        Dictionary<string, BundleCalculation> calcs)
    {
        if (!j.RequireObject(r, p)) return null;
        j.WarnUnknown(r, p, KnownKeys["reaction"]);
        var label = j.String(r, p, "label", required: true);
        var description = j.String(r, p, "description", required: false, allowEmpty: true) ?? "";
        var states = new List<BundleState>();
        var ok = true;
        if (j.Array(r, p, "states", required: true) is { } sArr)
        {
            if (sArr.GetArrayLength() < 2) { j.Issues.ErrorAt(JsonInput.Child(p, "states"), $"has {sArr.GetArrayLength()} state(s); a reaction needs at least 2 (reactants and products)"); ok = false; }
            var k = 0;
            foreach (var s in sArr.EnumerateArray())
            {
                var sp = JsonInput.Index(JsonInput.Child(p, "states"), k++);
                if (ReadState(s, sp, j, species, calcs) is { } st) states.Add(st);
                else ok = false;
            }
        }
        else ok = false;
        return ok && label is not null ? new BundleReaction(label, description, [.. states]) : null;
    }

    private static BundleState? ReadState(JsonElement s, string p, JsonInput j, Dictionary<string, SpeciesInfo> species,
        Dictionary<string, BundleCalculation> calcs)
    {
        if (!j.RequireObject(s, p)) return null;
        j.WarnUnknown(s, p, KnownKeys["state"]);
        var issues = j.Issues;
        var ok = true;
        var label = j.String(s, p, "label", required: true);
        var kindText = j.String(s, p, "kind", required: true);
        BundleStateKind kind = BundleStateKind.Minimum;
        if (kindText == "minimum") kind = BundleStateKind.Minimum;
        else if (kindText == "saddle_point") kind = BundleStateKind.SaddlePoint;
        else if (kindText is not null) { issues.ErrorAt(JsonInput.Child(p, "kind"), $"is '{kindText}'; expected 'minimum' or 'saddle_point'"); ok = false; }
        var terms = new List<BundleTerm>();
        if (j.Array(s, p, "terms", required: true) is { } tArr)
        {
            if (tArr.GetArrayLength() == 0) { issues.ErrorAt(JsonInput.Child(p, "terms"), "is empty; expected at least one species"); ok = false; }
            var k = 0;
            foreach (var t in tArr.EnumerateArray())
            {
                var tp = JsonInput.Index(JsonInput.Child(p, "terms"), k++);
                if (!j.RequireObject(t, tp)) { ok = false; continue; }
                j.WarnUnknown(t, tp, KnownKeys["term"]);
                var sl = j.String(t, tp, "species", required: true);
                var coef = JsonInput.Member(t, "coefficient") is null ? 1 : j.Integer(t, tp, "coefficient", required: true, min: 1);
                if (sl is not null && !species.ContainsKey(sl))
                {
                    issues.ErrorAt(JsonInput.Child(tp, "species"), $"names species '{sl}', which is not in $.species; expected one of: {Known(species.Keys)}");
                    ok = false;
                }
                if (sl is null || coef is null) { ok = false; continue; }
                terms.Add(new BundleTerm(sl, coef.Value));
            }
        }
        else ok = false;
        var calcLabel = j.String(s, p, "calculation", required: false);
        BundleCalculation? calc = null;
        if (calcLabel is not null && !calcs.TryGetValue(calcLabel, out calc))
        {
            issues.ErrorAt(JsonInput.Child(p, "calculation"), $"names calculation '{calcLabel}', which is not in $.calculations");
            ok = false;
        }
        if (kind == BundleStateKind.SaddlePoint && calcLabel is null)
        {
            issues.ErrorAt(p, "a saddle_point state must name its calculation (key 'calculation')");
            ok = false;
        }
        if (calc is not null && !terms.Any(t => t.Species == calc.Species))
        {
            issues.ErrorAt(JsonInput.Child(p, "calculation"), $"calculation '{calc.Label}' is of species '{calc.Species}', which is not among this state's terms");
            ok = false;
        }
        if (calc is not null && kind == BundleStateKind.SaddlePoint && calc.Kind is not (CalculationKind.SaddlePoint or CalculationKind.Frequencies or CalculationKind.SinglePoint))
            issues.WarningAt(JsonInput.Child(p, "calculation"), $"calculation '{calc.Label}' is of kind {calc.Kind}, not a saddle point");
        var pairs = new List<BundleAtomPair>();
        if (j.Array(s, p, "reaction_coordinate", required: false) is { } rc)
        {
            var rcp = JsonInput.Child(p, "reaction_coordinate");
            if (kind != BundleStateKind.SaddlePoint) { issues.ErrorAt(rcp, "only a saddle_point state has a reaction coordinate"); ok = false; }
            var atoms = calc?.Geometry?.AtomCount;
            var k = 0;
            foreach (var pair in rc.EnumerateArray())
            {
                var pp = JsonInput.Index(rcp, k++);
                if (pair.ValueKind != JsonValueKind.Array || pair.GetArrayLength() != 2)
                {
                    issues.ErrorAt(pp, $"expected a pair of atom numbers [a, b] (1-based), found {(pair.ValueKind == JsonValueKind.Array ? $"{pair.GetArrayLength()} values" : JsonInput.KindName(pair.ValueKind))}");
                    ok = false;
                    continue;
                }
                var a = j.IntegerValue(pair[0], JsonInput.Index(pp, 0), min: 1);
                var b = j.IntegerValue(pair[1], JsonInput.Index(pp, 1), min: 1);
                if (a is null || b is null) { ok = false; continue; }
                if (a == b) { issues.ErrorAt(pp, $"names atom {a} twice; expected two different atoms"); ok = false; continue; }
                if (atoms is { } n && (a > n || b > n))
                {
                    issues.ErrorAt(pp, $"atom {Math.Max(a.Value, b.Value)} does not exist: the geometry of calculation '{calc!.Label}' has {n} atoms (numbers are 1-based)");
                    ok = false;
                    continue;
                }
                pairs.Add(new BundleAtomPair(a.Value, b.Value));
            }
        }
        return ok && label is not null ? new BundleState(label, kind, [.. terms], calcLabel, [.. pairs]) : null;
    }

    private static BundleScan? ReadScan(JsonElement s, string p, JsonInput j, Dictionary<string, SpeciesInfo> species, ReaderLimits limits, FileSource files)
    {
        if (!j.RequireObject(s, p)) return null;
        j.WarnUnknown(s, p, KnownKeys["scan"]);
        var issues = j.Issues;
        var ok = true;
        var label = j.String(s, p, "label", required: true);
        var speciesLabel = j.String(s, p, "species", required: true);
        if (speciesLabel is not null && !species.ContainsKey(speciesLabel))
        {
            issues.ErrorAt(JsonInput.Child(p, "species"), $"names species '{speciesLabel}', which is not in $.species; expected one of: {Known(species.Keys)}");
            ok = false;
        }
        LevelOfTheory? level = null;
        if (j.String(s, p, "level_of_theory", required: false) is { } lt && !LevelOfTheory.TryParse(lt, out level, out var why))
        {
            issues.ErrorAt(JsonInput.Child(p, "level_of_theory"), $"cannot be read: {why}");
            ok = false;
        }
        ScanCoordinate? coordinate = null;
        if (j.Object(s, p, "coordinate", required: true) is { } co)
        {
            var cp = JsonInput.Child(p, "coordinate");
            j.WarnUnknown(co, cp, KnownKeys["coordinate"]);
            var kindText = j.String(co, cp, "kind", required: true);
            ScanCoordinateKind? kind = kindText switch { "distance" => ScanCoordinateKind.Distance, "angle" => ScanCoordinateKind.Angle, "dihedral" => ScanCoordinateKind.Dihedral, _ => null };
            if (kindText is not null && kind is null) issues.ErrorAt(JsonInput.Child(cp, "kind"), $"is '{kindText}'; expected 'distance', 'angle' or 'dihedral'");
            if (j.Array(co, cp, "atoms", required: true) is { } at && kind is { } kd)
            {
                var need = kd switch { ScanCoordinateKind.Distance => 2, ScanCoordinateKind.Angle => 3, _ => 4 };
                var ap = JsonInput.Child(cp, "atoms");
                if (at.GetArrayLength() != need) issues.ErrorAt(ap, $"has {at.GetArrayLength()} atoms; a {kindText} needs {need} (1-based atom numbers)");
                else
                {
                    var list = new List<int>();
                    var k = 0;
                    foreach (var a in at.EnumerateArray())
                        if (j.IntegerValue(a, JsonInput.Index(ap, k++), min: 1) is { } v) list.Add(v - 1);
                    if (list.Count == need)
                    {
                        if (list.Distinct().Count() != need) issues.ErrorAt(ap, "names the same atom twice; expected different atoms");
                        else coordinate = new ScanCoordinate(kd, list);
                    }
                }
            }
        }
        if (coordinate is null) ok = false;

        var points = new List<ScanPoint>();
        var pointsFile = j.String(s, p, "points_file", required: false);
        var inlinePoints = j.Array(s, p, "points", required: false);
        if (pointsFile is not null && inlinePoints is not null) { issues.ErrorAt(p, "gives both 'points' and 'points_file'; expected one"); ok = false; }
        else if (pointsFile is null && inlinePoints is null) { issues.ErrorAt(p, "gives neither 'points' nor 'points_file'; expected one"); ok = false; }
        EnergyUnit? unit = null;
        if (j.String(s, p, "energy_unit", required: false) is { } ut)
        {
            if (Energy.TryParseUnit(ut, out var u)) unit = u;
            else { issues.ErrorAt(JsonInput.Child(p, "energy_unit"), $"is '{ut}'; expected hartree, kcal/mol, kJ/mol, eV or cm-1"); ok = false; }
            if (pointsFile is null) issues.WarningAt(JsonInput.Child(p, "energy_unit"), "applies only to points_file; inline points are energy_hartree");
        }
        if (inlinePoints is { } ip)
        {
            if (ip.GetArrayLength() > limits.MaxFrames) { issues.ErrorAt(JsonInput.Child(p, "points"), $"has more than {limits.MaxFrames} points"); ok = false; }
            else
            {
                var k = 0;
                foreach (var pt in ip.EnumerateArray())
                {
                    var pp = JsonInput.Index(JsonInput.Child(p, "points"), k++);
                    if (!j.RequireObject(pt, pp)) { ok = false; continue; }
                    j.WarnUnknown(pt, pp, KnownKeys["point"]);
                    var x = j.Number(pt, pp, "coordinate", required: true);
                    var e = j.Number(pt, pp, "energy_hartree", required: true);
                    var conv = j.Bool(pt, pp, "converged") ?? true;
                    if (x is null || e is null) { ok = false; continue; }
                    points.Add(new ScanPoint(x.Value, e.Value, conv));
                }
                if (k < 2) { issues.ErrorAt(JsonInput.Child(p, "points"), $"has {k} point(s); a scan needs at least 2"); ok = false; }
            }
        }
        else if (pointsFile is not null && files.Get(pointsFile, JsonInput.Child(p, "points_file"), issues) is { } bytes)
        {
            var r = ScanTableReader.Read(new MemoryStream(bytes), files.DisplayName(pointsFile), unit, limits);
            issues.AddRange(r.Issues);
            if (r.Value is { } table) points.AddRange(table.Points); else ok = false;
        }
        else if (pointsFile is not null) ok = false;

        var geometriesFile = j.String(s, p, "geometries_file", required: false);
        if (geometriesFile is not null && files.Get(geometriesFile, JsonInput.Child(p, "geometries_file"), issues) is { } gbytes)
        {
            var r = XyzReader.Read(new MemoryStream(gbytes), files.DisplayName(geometriesFile), limits, warnUnstatedOddElectrons: false);
            issues.AddRange(r.Issues);
            if (r.Value is { } doc && points.Count > 0)
            {
                if (doc.Frames.Length != points.Count)
                {
                    issues.ErrorAt(JsonInput.Child(p, "geometries_file"), $"'{geometriesFile}' has {doc.Frames.Length} frames for {points.Count} points; expected one frame per point, in order");
                    ok = false;
                }
                else
                {
                    var sp = speciesLabel is not null && species.TryGetValue(speciesLabel, out var si) ? si.Species : null;
                    for (var i = 0; i < points.Count; i++)
                    {
                        var m = doc.Frames[i].Molecule;
                        if (sp is not null) m = new Molecule(m.Elements, m.PositionsAngstrom, sp.Charge, sp.Multiplicity);
                        points[i] = points[i] with { Geometry = m };
                    }
                    if (coordinate is not null && coordinate.Atoms.Max() >= doc.Frames[0].Molecule.AtomCount)
                    {
                        issues.ErrorAt(JsonInput.Child(JsonInput.Child(p, "coordinate"), "atoms"),
                            $"atom {coordinate.Atoms.Max() + 1} does not exist: the scan geometries have {doc.Frames[0].Molecule.AtomCount} atoms");
                        ok = false;
                    }
                }
            }
            else ok = false;
        }
        else if (geometriesFile is not null) ok = false;

        return ok && label is not null && speciesLabel is not null && coordinate is not null
            ? new BundleScan(label, speciesLabel, level, coordinate, [.. points], pointsFile, geometriesFile)
            : null;
    }

    private static string Known(IEnumerable<string> keys)
    {
        var list = keys.Take(12).ToList();
        return list.Count == 0 ? "(none defined)" : string.Join(", ", list.Select(k => $"'{k}'"));
    }
}
