using System.IO.Compression;
using System.Text.Json;
using BarrierLedger.Core.Pathways;
using BarrierLedger.Core.Scans;

namespace BarrierLedger.Core.Formats;

/// <summary>
/// Writes a <see cref="Bundle"/> as BarrierLedger's own manifest (docs/formats.md, docs/bundle.schema.json) that
/// <see cref="BundleReader"/> reads back to the same records: numbers in their shortest round-trip form, atoms 1-based in the
/// file, kinds by their manifest names. A calculation's <see cref="BundleCalculation.File"/> and a scan's points or geometries
/// file are written as references; <see cref="ToZip"/> puts those files beside the manifest.
/// </summary>
public static class BundleWriter
{
    /// <summary>The manifest as UTF-8 JSON (indented).</summary>
    public static byte[] ToManifest(Bundle bundle)
    {
        ArgumentNullException.ThrowIfNull(bundle);
        using var buffer = new MemoryStream();
        using (var w = new Utf8JsonWriter(buffer, new JsonWriterOptions { Indented = true }))
        {
            w.WriteStartObject();
            w.WriteString("format", BundleSchema.FormatName);
            w.WriteNumber("format_version", BundleSchema.CurrentFormatVersion);
            w.WriteStartObject("study");
            w.WriteString("name", bundle.Study.Name);
            w.WriteString("description", bundle.Study.Description);
            if (bundle.Study.EnergyModel is { } em)
            {
                w.WriteStartObject("energy_model");
                if (em.EnergiesFrom is { } ef) w.WriteString("energies_from", ef);
                if (em.ThermalFrom is { } tf) w.WriteString("thermal_from", tf);
                if (em.TemperatureKelvin is { } t) w.WriteNumber("temperature_kelvin", t);
                if (em.StandardState is { } ss) w.WriteString("standard_state", Thermochemistry.StandardStateNames.Text(ss));
                if (em.LowModes is { } lm) w.WriteString("low_modes", Thermochemistry.LowModeNames.Name(lm));
                if (em.LowModeCutoffCm1 is { } c) w.WriteNumber("low_mode_cutoff_cm1", c);
                if (em.WignerTunnelling is { } wt) w.WriteString("tunnelling", wt ? "wigner" : "none");
                if (em.Conformers is { } co) w.WriteString("conformers", BundleEnergyModel.ConformerName(co));
                w.WriteEndObject();
            }
            w.WriteEndObject();
            Objects(w, "species", bundle.Species, s =>
            {
                w.WriteString("label", s.Label);
                w.WriteNumber("charge", s.Charge);
                w.WriteNumber("multiplicity", s.Multiplicity);
                if (s.SymmetryNumber is { } sigma) w.WriteNumber("symmetry_number", sigma);
                var conformers = bundle.Calculations.Where(c => c.Species == s.Label && c.Conformer.Length > 0)
                    .GroupBy(c => c.Conformer, StringComparer.Ordinal).ToList();
                if (conformers.Count > 0)
                    Objects(w, "conformers", conformers, g =>
                    {
                        w.WriteString("label", g.Key);
                        w.WriteStartArray("calculations");
                        foreach (var c in g) w.WriteStringValue(c.Label);
                        w.WriteEndArray();
                    });
            });
            Objects(w, "calculations", bundle.Calculations, c => Calculation(w, c));
            Objects(w, "reactions", bundle.Reactions, r =>
            {
                w.WriteString("label", r.Label);
                w.WriteString("description", r.Description);
                Objects(w, "states", r.States, s =>
                {
                    w.WriteString("label", s.Label);
                    w.WriteString("kind", s.Kind == StateKind.SaddlePoint ? "saddle_point" : "minimum");
                    Objects(w, "terms", s.Terms, t =>
                    {
                        w.WriteString("species", t.Species);
                        w.WriteNumber("coefficient", t.Coefficient);
                    });
                    if (s.Calculation is not null) w.WriteString("calculation", s.Calculation);
                    if (s.ReactionCoordinate.Length > 0)
                    {
                        w.WriteStartArray("reacting_bonds");
                        foreach (var p in s.ReactionCoordinate) { w.WriteStartArray(); w.WriteNumberValue(p.First); w.WriteNumberValue(p.Second); w.WriteEndArray(); }
                        w.WriteEndArray();
                    }
                });
                if (r.Kinetics is { IsEmpty: false } k)
                {
                    w.WriteStartObject("kinetics");
                    if (k.Channels.Count > 0)
                    {
                        w.WriteStartArray("competing_channels");
                        foreach (var c in k.Channels) w.WriteStringValue(c);
                        w.WriteEndArray();
                        if (k.Enantiomeric) w.WriteBoolean("enantiomeric", true);
                    }
                    if (k.TemperatureKelvin is { } t) w.WriteNumber("temperature_kelvin", t);
                    if (k.TimeHours is { } h) w.WriteNumber("time_hours", h);
                    w.WriteEndObject();
                }
            });
            Objects(w, "scans", bundle.Scans, s => Scan(w, s));
            if (bundle.Ircs.Length > 0)
                Objects(w, "ircs", bundle.Ircs, i =>
                {
                    w.WriteString("label", i.Label);
                    w.WriteString("saddle_point", i.SaddlePoint);
                    if (i.LevelOfTheory is { } level) w.WriteString("level_of_theory", level.ToString());
                    if (i.PathFile is not null) w.WriteString("path_file", i.PathFile);
                    if (i.ForwardFile is not null) w.WriteString("forward_file", i.ForwardFile);
                    if (i.BackwardFile is not null) w.WriteString("backward_file", i.BackwardFile);
                });
            w.WriteEndObject();
        }
        return buffer.ToArray();
    }

    /// <summary>
    /// A zip with the manifest as <c>bundle.json</c> at its root and every file of <see cref="Bundle.Files"/> under its path,
    /// bytes unchanged. Paths must be relative and safe (no "..", "\", ":" or leading "/"), as the reader demands.
    /// </summary>
    public static byte[] ToZip(Bundle bundle)
    {
        ArgumentNullException.ThrowIfNull(bundle);
        foreach (var path in bundle.Files.Keys)
            if (!BundleFiles.IsSafeRelativePath(path) || path == BundleSchema.ManifestEntryName)
                throw new ArgumentException($"file path '{path}' cannot go into a bundle zip (relative, '/' separated, no '..', '\\' or ':', not the manifest's name)", nameof(bundle));
        using var buffer = new MemoryStream();
        using (var zip = new ZipArchive(buffer, ZipArchiveMode.Create, leaveOpen: true))
        {
            Entry(zip, BundleSchema.ManifestEntryName, ToManifest(bundle));
            foreach (var (path, bytes) in bundle.Files.OrderBy(f => f.Key, StringComparer.Ordinal)) Entry(zip, path, [.. bytes]);
        }
        return buffer.ToArray();
    }

    private static void Entry(ZipArchive zip, string path, byte[] bytes)
    {
        // A fixed time stamp: the same bundle gives the same zip.
        var entry = zip.CreateEntry(path, CompressionLevel.Optimal);
        entry.LastWriteTime = new DateTimeOffset(2000, 1, 1, 0, 0, 0, TimeSpan.Zero);
        using var s = entry.Open();
        s.Write(bytes);
    }

    private static void Calculation(Utf8JsonWriter w, BundleCalculation c)
    {
        w.WriteString("label", c.Label);
        w.WriteString("species", c.Species);
        w.WriteString("kind", BundleSchema.KindNames.Single(k => k.Value == c.Kind).Key);
        w.WriteString("level_of_theory", c.LevelOfTheory.ToString());
        if (c.EnergyHartree is { } e) w.WriteNumber("energy_hartree", e);
        if (c.File is not null) w.WriteString("file", c.File);
        if (c.Geometry is { } g)
        {
            w.WriteStartObject("geometry");
            w.WriteStartArray("symbols");
            foreach (var el in g.Elements) w.WriteStringValue(el.Symbol);
            w.WriteEndArray();
            w.WriteStartArray("positions_angstrom");
            foreach (var p in g.PositionsAngstrom) Vector(w, p.X, p.Y, p.Z);
            w.WriteEndArray();
            w.WriteEndObject();
        }
        if (c.Modes.Length > 0)
            Objects(w, "modes", c.Modes, m =>
            {
                w.WriteNumber("frequency_cm1", m.FrequencyCm1);
                w.WriteStartArray("displacements");
                foreach (var d in m.DisplacementCartesian) Vector(w, d.X, d.Y, d.Z);
                w.WriteEndArray();
                if (double.IsFinite(m.ReducedMassDalton)) w.WriteNumber("reduced_mass_da", m.ReducedMassDalton);
                if (double.IsFinite(m.ForceConstantNewtonPerMetre)) w.WriteNumber("force_constant_n_per_m", m.ForceConstantNewtonPerMetre);
            });
        else if (c.FrequenciesCm1.Length > 0) Numbers(w, "frequencies_cm1", c.FrequenciesCm1);
        if (c.HessianHartreePerBohr2.Length > 0) Numbers(w, "hessian_hartree_per_bohr2", c.HessianHartreePerBohr2);
        if (c.ThermalCorrections is { } t)
        {
            w.WriteStartObject("thermal_corrections");
            w.WriteNumber("temperature_kelvin", t.TemperatureKelvin);
            if (t.ZeroPointHartree is { } z) w.WriteNumber("zero_point_hartree", z);
            if (t.EnthalpyHartree is { } h) w.WriteNumber("enthalpy_hartree", h);
            if (t.GibbsHartree is { } gi) w.WriteNumber("gibbs_hartree", gi);
            w.WriteEndObject();
        }
        if (c.Note.Length > 0) w.WriteString("note", c.Note);
    }

    private static void Scan(Utf8JsonWriter w, BundleScan s)
    {
        w.WriteString("label", s.Label);
        w.WriteString("species", s.Species);
        if (s.LevelOfTheory is { } level) w.WriteString("level_of_theory", level.ToString());
        w.WriteStartObject("coordinate");
        w.WriteString("kind", s.Coordinate.Kind switch
        {
            ScanCoordinateKind.Distance => "distance",
            ScanCoordinateKind.Angle => "angle",
            _ => "dihedral",
        });
        w.WriteStartArray("atoms");
        foreach (var a in s.Coordinate.Atoms) w.WriteNumberValue(a + 1);
        w.WriteEndArray();
        w.WriteEndObject();
        if (s.PointsFile is not null) w.WriteString("points_file", s.PointsFile);
        else
            Objects(w, "points", s.Points, p =>
            {
                w.WriteNumber("coordinate", p.Coordinate);
                w.WriteNumber("energy_hartree", p.EnergyHartree);
                w.WriteBoolean("converged", p.Converged);
            });
        if (s.GeometriesFile is not null) w.WriteString("geometries_file", s.GeometriesFile);
    }

    private static void Objects<T>(Utf8JsonWriter w, string name, IEnumerable<T> items, Action<T> body)
    {
        w.WriteStartArray(name);
        foreach (var item in items)
        {
            w.WriteStartObject();
            body(item);
            w.WriteEndObject();
        }
        w.WriteEndArray();
    }

    private static void Numbers(Utf8JsonWriter w, string name, IEnumerable<double> values)
    {
        w.WriteStartArray(name);
        foreach (var v in values) w.WriteNumberValue(v);
        w.WriteEndArray();
    }

    private static void Vector(Utf8JsonWriter w, double x, double y, double z)
    {
        w.WriteStartArray();
        w.WriteNumberValue(x);
        w.WriteNumberValue(y);
        w.WriteNumberValue(z);
        w.WriteEndArray();
    }
}
