using System.Collections.Immutable;
using System.Text.Json;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using static BarrierLedger.Core.Formats.BundleManifestReader;
using static BarrierLedger.Core.Formats.BundleSchema;

namespace BarrierLedger.Core.Formats;

/// <summary>Reads one IRC of the manifest: the saddle point it belongs to and either its path file or its two endpoint files.</summary>
internal static class BundleIrcReader
{
    internal static BundleIrc? ReadIrc(JsonElement e, string p, JsonInput j, Dictionary<string, SpeciesInfo> species,
        IReadOnlyDictionary<string, BundleCalculation> calculations, ReaderLimits limits, BundleFiles files)
    {
        if (!j.RequireObject(e, p)) return null;
        j.WarnUnknown(e, p, KnownKeys["irc"]);
        var issues = j.Issues;
        var ok = true;
        var label = j.String(e, p, "label", required: true);
        var saddleLabel = j.String(e, p, "saddle_point", required: true);
        BundleCalculation? saddle = null;
        if (saddleLabel is not null && calculations.TryGetValue(saddleLabel, out saddle) && saddle.Kind != CalculationKind.SaddlePoint)
        {
            issues.ErrorAt(JsonInput.Child(p, "saddle_point"), $"names calculation '{saddleLabel}', which is a {KindNames.First(k => k.Value == saddle.Kind).Key}; an IRC belongs to a saddle_point calculation");
            ok = false;
        }
        LevelOfTheory? level = null;
        if (j.String(e, p, "level_of_theory", required: false) is { } lt && !LevelOfTheory.TryParse(lt, out level, out var why))
        {
            issues.ErrorAt(JsonInput.Child(p, "level_of_theory"), $"cannot be read: {why}");
            ok = false;
        }

        var pathFile = j.String(e, p, "path_file", required: false);
        var forwardFile = j.String(e, p, "forward_file", required: false);
        var backwardFile = j.String(e, p, "backward_file", required: false);
        if (pathFile is not null && (forwardFile is not null || backwardFile is not null))
        {
            issues.ErrorAt(p, "gives both 'path_file' and endpoint files; expected either 'path_file' or both 'forward_file' and 'backward_file'");
            return null;
        }
        if (pathFile is null && (forwardFile is null || backwardFile is null))
        {
            issues.ErrorAt(p, forwardFile is null && backwardFile is null
                ? "gives neither 'path_file' nor 'forward_file' and 'backward_file'; expected one of the two forms"
                : $"gives '{(forwardFile is null ? "backward_file" : "forward_file")}' without '{(forwardFile is null ? "forward_file" : "backward_file")}'; an endpoint pair needs both ends");
            return null;
        }

        XyzDocument? Xyz(string file, string key)
        {
            if (files.Get(file, JsonInput.Child(p, key), issues) is not { } bytes) return null;
            var r = XyzReader.Read(new MemoryStream(bytes), files.DisplayName(file), limits, warnUnstatedOddElectrons: false);
            issues.AddRange(r.Issues);
            return r.Value;
        }
        ReadResult<IrcStructures>? structures = null;
        if (pathFile is not null)
        {
            if (Xyz(pathFile, "path_file") is { } doc) structures = IrcFiles.Path(doc, files.DisplayName(pathFile));
        }
        else
        {
            var f = Xyz(forwardFile!, "forward_file");
            var b = Xyz(backwardFile!, "backward_file");
            if (f is not null && b is not null) structures = IrcFiles.Endpoints(f, files.DisplayName(forwardFile!), b, files.DisplayName(backwardFile!));
        }
        if (structures is null) return null;
        issues.AddRange(structures.Issues);
        if (structures.Value is not { } value) return null;

        // A saddle point of this bundle: the IRC lists its atoms in its order, and takes its species' charge and multiplicity.
        if (saddle?.Geometry is { } sg && IrcFiles.Differs(sg, value.First) is { } differs)
        {
            issues.ErrorAt(JsonInput.Child(p, pathFile is not null ? "path_file" : "forward_file"),
                $"the IRC {differs} as in saddle point '{saddle.Label}'; an IRC lists the saddle point's atoms in its order");
            ok = false;
        }
        if (saddle is not null && species.TryGetValue(saddle.Species, out var sp))
            value = value with { Structures = [.. value.Structures.Select(s => s with { Geometry = new Molecule(s.Geometry.Elements, s.Geometry.PositionsAngstrom, sp.Species.Charge, sp.Species.Multiplicity) })] };

        return ok && label is not null && saddleLabel is not null
            ? new BundleIrc(label, saddleLabel, level, value, pathFile, forwardFile, backwardFile)
            : null;
    }
}
