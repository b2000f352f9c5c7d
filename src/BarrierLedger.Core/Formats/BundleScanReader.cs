using System.Text.Json;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Scans;
using BarrierLedger.Core.Units;
using static BarrierLedger.Core.Formats.BundleManifestReader;
using static BarrierLedger.Core.Formats.BundleSchema;

namespace BarrierLedger.Core.Formats;

/// <summary>Reads one relaxed scan of the manifest: its coordinate, points (inline or from a table file) and optional geometries file.</summary>
internal static class BundleScanReader
{
    internal static BundleScan? ReadScan(JsonElement s, string p, JsonInput j, Dictionary<string, SpeciesInfo> species, ReaderLimits limits, BundleFiles files)
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
}
