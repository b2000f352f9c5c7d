using System.Collections.Immutable;
using System.Text.Json;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Formats;

/// <summary>What a QCSchema result computed.</summary>
public enum QcDriver
{
    Energy,
    Gradient,
    Hessian,
}

/// <summary>
/// A MolSSI QCSchema <c>AtomicResult</c> as BarrierLedger uses it.
/// </summary>
/// <param name="Molecule">Elements, positions converted from bohr to Å (× <see cref="PhysicalConstants.BohrAngstrom"/>), charge, multiplicity.</param>
/// <param name="Driver">energy, gradient or hessian.</param>
/// <param name="EnergyHartree">properties.return_energy, or return_result for the energy driver; null when neither is given.</param>
/// <param name="GradientHartreePerBohr">3N Cartesian gradient for the gradient driver; empty otherwise.</param>
/// <param name="HessianHartreePerBohr2">(3N)² row-major Cartesian Hessian for the hessian driver; empty otherwise.</param>
/// <param name="LevelOfTheory">From model.method and model.basis; null when model is missing.</param>
/// <param name="Program">provenance.creator when given.</param>
public sealed record QcSchemaResult(
    Molecule Molecule,
    QcDriver Driver,
    double? EnergyHartree,
    ImmutableArray<double> GradientHartreePerBohr,
    ImmutableArray<double> HessianHartreePerBohr2,
    LevelOfTheory? LevelOfTheory,
    string? Program);

/// <summary>
/// Reads a MolSSI QCSchema <c>AtomicResult</c> (schema_name <c>qcschema_output</c>): molecule.symbols,
/// molecule.geometry (flat, bohr), molecular_charge, molecular_multiplicity, driver, model, return_result,
/// properties.return_energy, success. Other members of the schema are accepted and ignored.
/// </summary>
public static class QcSchemaReader
{
    public static ReadResult<QcSchemaResult> Read(Stream stream, string fileName, ReaderLimits? limits = null)
    {
        limits ??= ReaderLimits.Default;
        var issues = new IssueCollector(fileName, limits.MaxIssues);
        var bytes = TextInput.ReadBytes(stream, limits.MaxBytes, issues);
        if (bytes is null) return issues.Result<QcSchemaResult>(null);
        using var doc = JsonInput.Parse(bytes, issues);
        if (doc is null) return issues.Result<QcSchemaResult>(null);
        var value = ReadRoot(doc.RootElement, new JsonInput(issues), limits);
        return issues.Result(value);
    }

    internal static QcSchemaResult? ReadRoot(JsonElement root, JsonInput j, ReaderLimits limits)
    {
        const string P = "$";
        if (!j.RequireObject(root, P)) return null;
        var schema = j.String(root, P, "schema_name", required: true);
        if (schema is null) return null;
        if (schema is not ("qcschema_output" or "qc_schema_output"))
        {
            var hint = schema.Contains("input", StringComparison.OrdinalIgnoreCase)
                ? " (this is a calculation input; results are in a qcschema_output)"
                : "";
            j.Issues.ErrorAt("$.schema_name", $"is '{schema}'; expected 'qcschema_output' (a QCSchema AtomicResult){hint}");
            return null;
        }
        if (j.Bool(root, P, "success") == false)
        {
            var reason = JsonInput.Member(root, "error") is { ValueKind: JsonValueKind.Object } err && JsonInput.Member(err, "error_message") is { ValueKind: JsonValueKind.String } m
                ? $": {m.GetString()}"
                : "";
            j.Issues.ErrorAt("$.success", $"is false: the calculation reports that it failed{reason}");
        }

        var molecule = ReadMolecule(root, j, limits);
        var driverText = j.String(root, P, "driver", required: true);
        QcDriver? driver = driverText switch
        {
            "energy" => QcDriver.Energy,
            "gradient" => QcDriver.Gradient,
            "hessian" => QcDriver.Hessian,
            null => null,
            _ => null,
        };
        if (driverText is not null && driver is null)
            j.Issues.ErrorAt("$.driver", $"is '{driverText}'; expected 'energy', 'gradient' or 'hessian'");

        LevelOfTheory? level = null;
        if (j.Object(root, P, "model", required: false) is { } model)
        {
            var method = j.String(model, "$.model", "method", required: true);
            var basis = "";
            if (JsonInput.Member(model, "basis") is { } b)
            {
                if (b.ValueKind == JsonValueKind.String) basis = b.GetString() ?? "";
                else if (b.ValueKind == JsonValueKind.Object) basis = j.String(b, "$.model.basis", "name", required: true) ?? "";
                else j.Issues.ErrorAt("$.model.basis", $"expected a string or a basis object with a name, found {JsonInput.KindName(b.ValueKind)}");
            }
            if (method is not null) level = new LevelOfTheory(method, basis);
        }
        else j.Issues.WarningAt("$.model", "missing: the level of theory is unknown");

        string? program = null;
        if (JsonInput.Member(root, "provenance") is { ValueKind: JsonValueKind.Object } prov)
            program = j.String(prov, "$.provenance", "creator", required: false);

        double? propertiesEnergy = null;
        if (j.Object(root, P, "properties", required: false) is { } props)
            propertiesEnergy = j.Number(props, "$.properties", "return_energy", required: false);

        double? energy = propertiesEnergy;
        var gradient = ImmutableArray<double>.Empty;
        var hessian = ImmutableArray<double>.Empty;
        var result = JsonInput.Member(root, "return_result");
        if (result is null && driver is not null)
            j.Issues.ErrorAt("$.return_result", $"missing; expected the {driverText} result");
        else if (result is { } rr && driver is { } d && molecule is not null)
        {
            var n = 3 * molecule.AtomCount;
            switch (d)
            {
                case QcDriver.Energy:
                    if (j.NumberValue(rr, "$.return_result") is { } e)
                    {
                        if (propertiesEnergy is { } pe && Math.Abs(pe - e) > 1e-8)
                            j.Issues.WarningAt("$.properties.return_energy", $"is {Numbers.Format(pe)} but return_result is {Numbers.Format(e)}; return_result is used");
                        energy = e;
                    }
                    break;
                case QcDriver.Gradient:
                    if (j.Numbers(rr, "$.return_result", allowNested: true, maxCount: n) is { } g)
                    {
                        if (g.Length != n) j.Issues.ErrorAt("$.return_result", $"gradient has {g.Length} numbers, expected 3 × {molecule.AtomCount} atoms = {n}");
                        else gradient = [.. g];
                    }
                    break;
                case QcDriver.Hessian:
                    if (j.Numbers(rr, "$.return_result", allowNested: true, maxCount: Math.Max((long)n * n, 1) * 4) is { } h)
                    {
                        var (errors, warnings) = StructureChecks.CheckHessian(h, molecule.AtomCount);
                        foreach (var m in errors) j.Issues.ErrorAt("$.return_result", m);
                        foreach (var m in warnings) j.Issues.WarningAt("$.return_result", m);
                        if (errors.Count == 0) hessian = [.. h];
                    }
                    break;
            }
        }

        if (molecule is not null && energy is { } en && StructureChecks.ImplausibleEnergy(en, molecule) is { } why)
            j.Issues.ErrorAt(propertiesEnergy is not null ? "$.properties.return_energy" : "$.return_result", why);
        if (molecule is null || driver is null || j.Issues.HasErrors) return null;
        return new QcSchemaResult(molecule, driver.Value, energy, gradient, hessian, level, program);
    }

    private static Molecule? ReadMolecule(JsonElement root, JsonInput j, ReaderLimits limits)
    {
        var mol = j.Object(root, "$", "molecule", required: true);
        if (mol is not { } m) return null;
        const string P = "$.molecule";
        var symbols = j.Array(m, P, "symbols", required: true);
        var geometry = j.Array(m, P, "geometry", required: true);
        var charge = 0;
        if (JsonInput.Member(m, "molecular_charge") is { } c)
            charge = j.IntegerValue(c, "$.molecule.molecular_charge") ?? 0;
        var multiplicity = j.Integer(m, P, "molecular_multiplicity", required: false, min: 1) ?? 1;
        if (symbols is not { } s || geometry is not { } g) return null;
        var count = s.GetArrayLength();
        if (count == 0) { j.Issues.ErrorAt("$.molecule.symbols", "is empty; expected at least one element symbol"); return null; }
        if (count > limits.MaxAtoms) { j.Issues.ErrorAt("$.molecule.symbols", $"has {count} atoms, above the limit of {limits.MaxAtoms} (ReaderLimits.MaxAtoms)"); return null; }
        var elements = new Element[count];
        var ok = true;
        var k = 0;
        foreach (var sym in s.EnumerateArray())
        {
            var path = JsonInput.Index("$.molecule.symbols", k);
            if (sym.ValueKind != JsonValueKind.String) { j.Issues.ErrorAt(path, $"expected an element symbol, found {JsonInput.KindName(sym.ValueKind)}"); ok = false; }
            else if (!Elements.TryGet(sym.GetString()!, out elements[k])) { j.Issues.ErrorAt(path, $"unknown element {TextInput.Quote(sym.GetString()!)}; expected a symbol such as C or Cl"); ok = false; }
            k++;
        }
        var xyz = j.Numbers(g, "$.molecule.geometry", allowNested: true, maxCount: 3L * count + 3);
        if (xyz is null) return null;
        if (xyz.Length != 3 * count)
        {
            j.Issues.ErrorAt("$.molecule.geometry", $"has {xyz.Length} numbers, expected 3 × {count} atoms = {3 * count} (x y z in bohr for each symbol)");
            return null;
        }
        if (!ok) return null;
        var bohr = PhysicalConstants.BohrAngstrom;
        var positions = Enumerable.Range(0, count).Select(i => new Vec3(xyz[3 * i] * bohr, xyz[3 * i + 1] * bohr, xyz[3 * i + 2] * bohr));
        var molecule = new Molecule(elements, positions, charge, multiplicity);
        foreach (var msg in StructureChecks.GeometryMessages(molecule)) j.Issues.ErrorAt("$.molecule.geometry", msg);
        if (molecule.ElectronCount % 2 == multiplicity % 2)
            j.Issues.ErrorAt("$.molecule.molecular_multiplicity",
                $"{molecule.ElectronCount} electrons cannot have spin multiplicity {multiplicity} (an even electron count needs an odd multiplicity and vice versa)");
        return molecule;
    }
}
