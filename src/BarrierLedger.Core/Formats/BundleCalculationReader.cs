using System.Collections.Immutable;
using System.Text.Json;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Vibrations;
using static BarrierLedger.Core.Formats.BundleManifestReader;
using static BarrierLedger.Core.Formats.BundleSchema;

namespace BarrierLedger.Core.Formats;

/// <summary>Reads one calculation of the manifest: its file, inline geometry, frequencies, normal modes, Hessian and thermal corrections.</summary>
internal static class BundleCalculationReader
{
    internal static BundleCalculation? ReadCalculation(JsonElement c, string p, JsonInput j, Dictionary<string, SpeciesInfo> species,
        ReaderLimits limits, BundleFiles files)
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
        var mu = OneOf(m, p, j, "reduced_mass_da", "reduced_mass_amu", 1.0);
        // 1 mdyn/Å = 100 N/m exactly (definitions of the dyne and the ångström).
        var k = OneOf(m, p, j, "force_constant_n_per_m", "force_constant_mdyn_per_angstrom", 100.0);
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

    /// <summary>The value under <paramref name="key"/>, or under its older name scaled by <paramref name="oldToNew"/>; NaN when neither is given.</summary>
    private static double OneOf(JsonElement m, string p, JsonInput j, string key, string oldKey, double oldToNew)
    {
        if (m.TryGetProperty(key, out _) && m.TryGetProperty(oldKey, out _))
        {
            j.Issues.ErrorAt(JsonInput.Child(p, oldKey), $"gives the same quantity as '{key}' under its older name; give only '{key}'");
            return double.NaN;
        }
        if (m.TryGetProperty(oldKey, out _)) return (j.Number(m, p, oldKey, required: false) ?? double.NaN) * oldToNew;
        return j.Number(m, p, key, required: false) ?? double.NaN;
    }
}
