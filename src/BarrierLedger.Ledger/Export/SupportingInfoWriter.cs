using System.Globalization;
using System.IO.Compression;
using System.Text;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Geometry;

namespace BarrierLedger.Ledger.Export;

/// <summary>One structure for the supporting information (energies in hartree, per molecule).</summary>
/// <param name="Label">Species or calculation label.</param>
/// <param name="Role">"minimum", "saddle point", …</param>
/// <param name="LevelOfTheory">"single point // geometry".</param>
/// <param name="ElectronicEnergyHartree">Electronic energy.</param>
/// <param name="ZeroPointHartree">ZPE, when known.</param>
/// <param name="EnthalpyCorrectionHartree">H − E at the model temperature.</param>
/// <param name="GibbsCorrectionHartree">G − E at the model temperature.</param>
/// <param name="ImaginaryFrequenciesCm1">Imaginary wavenumbers as negative numbers; empty for a minimum.</param>
/// <param name="Geometry">Cartesian coordinates in Å.</param>
public sealed record SiStructure(string Label, string Role, string LevelOfTheory, double? ElectronicEnergyHartree,
    double? ZeroPointHartree, double? EnthalpyCorrectionHartree, double? GibbsCorrectionHartree,
    IReadOnlyList<double> ImaginaryFrequenciesCm1, Molecule Geometry, string? PointGroup = null, int SymmetryNumber = 1, string? ThermalSource = null);

/// <summary>
/// Supporting-information coordinates: one text file per study (each structure's label, role, level of theory, energies,
/// imaginary frequencies and XYZ block) and a zip of one extended-XYZ file per structure.
/// </summary>
public static class SupportingInfoWriter
{
    public static string WriteText(string study, ExportModel model, IReadOnlyList<SiStructure> structures)
    {
        ArgumentNullException.ThrowIfNull(model);
        ArgumentNullException.ThrowIfNull(structures);
        var sb = new StringBuilder();
        sb.Append($"Supporting information: Cartesian coordinates and energies\n");
        sb.Append($"Study: {study}\n");
        sb.Append($"Thermal corrections at {F(model.TemperatureKelvin, 2)} K, standard state {model.StandardStateText}, {model.TreatmentText}.\n");
        sb.Append($"{model.ConformerLine}.\n");
        sb.Append("Energies in hartree (Eh) per molecule; coordinates in Å; imaginary frequencies in cm⁻¹.\n");
        sb.Append($"{structures.Count} structure{(structures.Count == 1 ? "" : "s")}.\n");
        foreach (var s in structures)
        {
            sb.Append('\n').Append(new string('=', 72)).Append('\n');
            sb.Append($"{s.Label}\n");
            sb.Append($"Role: {s.Role}\n");
            sb.Append($"Level of theory: {s.LevelOfTheory}\n");
            sb.Append($"Charge: {s.Geometry.Charge}; multiplicity: {s.Geometry.Multiplicity}\n");
            sb.Append($"Point group: {(string.IsNullOrEmpty(s.PointGroup) ? "not determined" : s.PointGroup)}; rotational symmetry number σ = {s.SymmetryNumber}\n");
            sb.Append($"Thermal corrections: {s.ThermalSource ?? "none"}\n");
            sb.Append($"Electronic energy (Eh): {Opt(s.ElectronicEnergyHartree, 8)}\n");
            sb.Append($"Zero-point energy (Eh): {Opt(s.ZeroPointHartree, 6)}\n");
            sb.Append($"Enthalpy correction (Eh): {Opt(s.EnthalpyCorrectionHartree, 6)}\n");
            sb.Append($"Gibbs-energy correction (Eh): {Opt(s.GibbsCorrectionHartree, 6)}\n");
            var imag = s.ImaginaryFrequenciesCm1;
            sb.Append($"Imaginary frequencies: {imag.Count}{(imag.Count == 0 ? "" : " (" + string.Join(", ", imag.Select(f => F(Math.Abs(f), 1) + "i")) + ")")}\n");
            sb.Append(s.Geometry.AtomCount.ToString(CultureInfo.InvariantCulture)).Append('\n');
            sb.Append(s.Label).Append('\n');
            for (var i = 0; i < s.Geometry.AtomCount; i++)
            {
                var p = s.Geometry.PositionsAngstrom[i];
                sb.Append($"{s.Geometry.Elements[i].Symbol,-2} {F(p.X, 8),14} {F(p.Y, 8),14} {F(p.Z, 8),14}\n");
            }
        }
        return sb.ToString();
    }

    /// <summary>A zip with one extended XYZ per structure (keys: label, role, level_of_theory, energy in hartree).</summary>
    public static byte[] WriteXyzZip(IReadOnlyList<SiStructure> structures)
    {
        ArgumentNullException.ThrowIfNull(structures);
        using var ms = new MemoryStream();
        using (var zip = new ZipArchive(ms, ZipArchiveMode.Create, leaveOpen: true))
        {
            var used = new HashSet<string>(StringComparer.OrdinalIgnoreCase);
            foreach (var s in structures)
            {
                var name = SafeFileName(s.Label);
                var unique = name;
                for (var n = 2; !used.Add(unique); n++) unique = $"{name}-{n}";
                var entry = zip.CreateEntry(unique + ".xyz", CompressionLevel.Optimal);
                entry.LastWriteTime = new DateTimeOffset(2000, 1, 1, 0, 0, 0, TimeSpan.Zero);
                using var w = new StreamWriter(entry.Open(), new UTF8Encoding(false));
                XyzWriter.WriteExtended(w, s.Geometry, s.ElectronicEnergyHartree,
                [
                    new("label", s.Label),
                    new("role", s.Role),
                    new("level_of_theory", s.LevelOfTheory),
                ]);
            }
        }
        return ms.ToArray();
    }

    /// <summary>Letters, digits, '-', '_', '.' kept; everything else becomes '_'.</summary>
    public static string SafeFileName(string label)
    {
        var s = new string([.. label.Select(c => char.IsAsciiLetterOrDigit(c) || c is '-' or '_' or '.' ? c : '_')]).Trim('.');
        return s.Length == 0 ? "structure" : s;
    }

    private static string Opt(double? v, int decimals) => v is { } x && double.IsFinite(x) ? F(x, decimals) : "not available";

    private static string F(double v, int decimals) => v.ToString("F" + decimals.ToString(CultureInfo.InvariantCulture), CultureInfo.InvariantCulture);
}
