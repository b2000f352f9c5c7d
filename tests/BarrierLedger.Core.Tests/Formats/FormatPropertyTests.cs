using BarrierLedger.Core.Chemistry;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Geometry;
using BarrierLedger.Core.Units;
using FsCheck;
using FsCheck.Xunit;
using static BarrierLedger.Core.Tests.Formats.FormatTestHelpers;

namespace BarrierLedger.Core.Tests.Formats;

/// <summary>Property checks (FsCheck): writers and readers agree for arbitrary molecules and values.</summary>
public class FormatPropertyTests
{
    /// <summary>
    /// A molecule from arbitrary numbers: elements H–Rn picked by the numbers, atoms spread along x at least 1 Å apart
    /// (so no duplicates) with arbitrary finite offsets in y and z.
    /// </summary>
    private static Molecule Build(NormalFloat[] numbers, int charge, bool extended)
    {
        var n = Math.Clamp(numbers.Length / 2, 1, 40);
        var all = Elements.All;
        var elements = new List<Element>();
        var positions = new List<Vec3>();
        for (var i = 0; i < n; i++)
        {
            var a = numbers.Length == 0 ? 0.0 : numbers[(2 * i) % numbers.Length].Get;
            var b = numbers.Length == 0 ? 0.0 : numbers[(2 * i + 1) % numbers.Length].Get;
            elements.Add(all[(int)(Math.Abs(a * 7919) % all.Count)]);
            positions.Add(new Vec3(1.5 * i + Math.Abs(a % 0.5), b % 1e4, (a * b) % 1e4));
        }
        var electrons = elements.Sum(e => e.AtomicNumber) - (extended ? charge : 0);
        return new Molecule(elements, positions, extended ? charge : 0, electrons % 2 == 0 ? 1 : 2);
    }

    [Property(MaxTest = 300)]
    public bool Plain_xyz_round_trip_keeps_elements_positions_and_energy(NormalFloat[] numbers)
    {
        var m = Build(numbers, 0, extended: false);
        var energy = StructureChecks.LowestPlausibleEnergyHartree(m) / 3.0;
        var r = XyzReader.Read(Utf8(XyzWriter.ToText(m, energy)), "p.xyz");
        if (!r.Succeeded) throw new InvalidOperationException(string.Join("\n", r.Issues));
        var f = r.Value!.Frames.Single();
        return f.EnergyHartree == energy
               && f.Molecule.Elements.SequenceEqual(m.Elements)
               && f.Molecule.PositionsAngstrom.SequenceEqual(m.PositionsAngstrom);
    }

    [Property(MaxTest = 300)]
    public bool Extended_xyz_round_trip_keeps_charge_multiplicity_and_any_one_line_value(NormalFloat[] numbers, short charge, NonNull<string> value)
    {
        // Text files hold no NUL (the writer refuses it, the reader calls such a file binary).
        var text = value.Get.Replace('\n', ' ').Replace('\r', ' ').Replace('\0', ' ');
        var m = Build(numbers, charge % 5, extended: true);
        var r = XyzReader.Read(Utf8(XyzWriter.ToExtendedText(m, null, [new("note", text)])), "p.extxyz");
        if (!r.Succeeded) throw new InvalidOperationException(string.Join("\n", r.Issues));
        var f = r.Value!.Frames.Single();
        return f.Molecule.SameAs(m, 0.0) && f.Keys["note"] == text && f.EnergyHartree is null;
    }

    [Property(MaxTest = 500)]
    public bool Key_value_quoting_round_trips_any_one_line_string(NonNull<string> value)
    {
        var v = value.Get.Replace('\n', ' ').Replace('\r', ' ');
        return KeyValueLine.TryParse("k=" + KeyValueLine.FormatValue(v) + " z=1", out var pairs, out _)
               && pairs.Count == 2 && pairs[0].Value == v && pairs[1].Value == "1";
    }

    [Property(MaxTest = 300)]
    public bool Csv_scan_energies_convert_from_every_unit(NormalFloat[] values, bool semicolon)
    {
        var units = new[] { EnergyUnit.Hartree, EnergyUnit.KcalPerMol, EnergyUnit.KJPerMol, EnergyUnit.ElectronVolt };
        var unit = units[values.Length % units.Length];
        var energies = values.Select(v => v.Get % 1e6).Append(0.0).Append(1.0).ToArray();
        var d = semicolon ? ';' : ',';
        var text = $"r{d}energy ({Energy.Symbol(unit)})\n" + string.Concat(energies.Select((e, i) => $"{i}{d}{Numbers.Format(e)}\n"));
        var r = ScanTableReader.Read(Utf8(text), "p.csv");
        if (!r.Succeeded) throw new InvalidOperationException(string.Join("\n", r.Issues));
        return r.Value!.Points.Select(p => p.EnergyHartree).SequenceEqual(energies.Select(e => Energy.From(e, unit).Hartree));
    }

    [Property(MaxTest = 300)]
    public bool Any_text_gives_a_value_exactly_when_there_is_no_error(NonNull<string> text)
    {
        foreach (var r in new object[]
        {
            XyzReader.Read(Utf8(text.Get), "f.xyz"),
            ScanTableReader.Read(Utf8(text.Get), "f.csv"),
            QcSchemaReader.Read(Utf8(text.Get), "f.json"),
            BundleReader.Read(Utf8(text.Get), "f.json"),
        })
        {
            var (succeeded, issues) = r switch
            {
                ReadResult<XyzDocument> x => (x.Succeeded, x.Issues),
                ReadResult<ScanTable> s => (s.Succeeded, s.Issues),
                ReadResult<QcSchemaResult> q => (q.Succeeded, q.Issues),
                ReadResult<Bundle> b => (b.Succeeded, b.Issues),
                _ => throw new InvalidOperationException(),
            };
            if (succeeded == issues.Any(i => i.IsError)) return false;
            if (issues.Any(i => string.IsNullOrWhiteSpace(i.Message) || i.Line is < 1)) return false;
        }
        return true;
    }

    [Property(MaxTest = 200)]
    public bool Hessian_check_accepts_every_symmetric_matrix_and_names_wrong_sizes(NormalFloat[] values, PositiveInt atoms)
    {
        var n = Math.Clamp(atoms.Get % 4 + 1, 1, 4);
        var dim = 3 * n;
        var h = new double[dim * dim];
        for (var i = 0; i < dim; i++)
            for (var j = 0; j <= i; j++)
                h[i * dim + j] = h[j * dim + i] = values.Length == 0 ? 0 : values[(i * dim + j) % values.Length].Get;
        var ok = StructureChecks.CheckHessian(h, n).Errors.Count == 0;
        var wrong = StructureChecks.CheckHessian(h, n + 1).Errors.Single().Contains($"expected (3 × {n + 1})²");
        return ok && wrong;
    }
}
