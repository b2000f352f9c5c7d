using System.Collections.Immutable;
using System.Text;
using BarrierLedger.Core.Scans;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Formats;

/// <summary>A scan table as read: points in file order with energies in hartree.</summary>
/// <param name="Points">Coordinate, energy (converted to hartree), converged flag (true when the table has no such column).</param>
/// <param name="SourceUnit">The unit the energies were written in.</param>
/// <param name="CoordinateHeader">Header of the coordinate column; null without a header row.</param>
/// <param name="EnergyHeader">Header of the energy column; null without a header row.</param>
/// <param name="HasConvergedColumn">Whether a converged column was present.</param>
public sealed record ScanTable(
    ImmutableArray<ScanPoint> Points,
    EnergyUnit SourceUnit,
    string? CoordinateHeader,
    string? EnergyHeader,
    bool HasConvergedColumn);

/// <summary>
/// Reads a scan table (rules in docs/formats.md): comma, semicolon or tab separated, decimal point, optional header row,
/// columns coordinate, energy and an optional converged flag. With a header, columns are found by name ("energy",
/// "conv…"), else by position. The energy unit comes from the header ("energy (kcal/mol)", "E [kJ/mol]"), or from
/// the <c>energyUnit</c> argument, else hartree. Lines starting with # are comments.
/// </summary>
public static class ScanTableReader
{
    public static ReadResult<ScanTable> Read(Stream stream, string fileName, EnergyUnit? energyUnit = null, ReaderLimits? limits = null)
    {
        limits ??= ReaderLimits.Default;
        var issues = new IssueCollector(fileName, limits.MaxIssues);
        var text = TextInput.ReadText(stream, limits, issues);
        if (text is null) return issues.Result<ScanTable>(null);
        return issues.Result(Parse(TextInput.SplitLines(text), issues, energyUnit, limits));
    }

    private static ScanTable? Parse(string[] lines, IssueCollector issues, EnergyUnit? optionUnit, ReaderLimits limits)
    {
        var first = Array.FindIndex(lines, l => !string.IsNullOrWhiteSpace(l) && !l.TrimStart().StartsWith('#'));
        if (first < 0) { issues.Error(1, "no rows found: the file is empty; expected a coordinate and an energy per row"); return null; }
        var delimiter = lines[first].Contains('\t') ? '\t' : lines[first].Contains(';') ? ';' : lines[first].Contains(',') ? ',' : '\0';
        if (delimiter == '\0')
        {
            issues.Error(first + 1, $"found no comma, semicolon or tab in {TextInput.Quote(lines[first].Trim())}; expected at least two columns (coordinate and energy)");
            return null;
        }
        var delimiterName = delimiter switch { '\t' => "tab", ';' => "semicolon", _ => "comma" };

        var header = Split(lines[first], delimiter);
        var hasHeader = header.Count < 2 || !Numbers.TryParseDouble(header[0].Trim(), out _) || !Numbers.TryParseDouble(header[1].Trim(), out _);
        int coordCol = 0, energyCol = 1, convCol = -1;
        var unit = optionUnit ?? EnergyUnit.Hartree;
        string? coordHeader = null, energyHeader = null;
        var columnCount = header.Count;
        if (hasHeader)
        {
            var names = header.Select(h => h.Trim()).ToList();
            var e = names.FindIndex(n => n.Contains("energy", StringComparison.OrdinalIgnoreCase));
            if (e >= 0) energyCol = e;
            convCol = names.FindIndex(n => n.StartsWith("conv", StringComparison.OrdinalIgnoreCase));
            coordCol = Enumerable.Range(0, names.Count).FirstOrDefault(i => i != energyCol && i != convCol, -1);
            if (e < 0 && convCol < 0 && names.Count >= 3) convCol = 2;
            if (coordCol < 0 || energyCol >= names.Count || coordCol == energyCol)
            {
                issues.Error(first + 1, $"header {TextInput.Quote(lines[first].Trim(), 60)} has no separate coordinate and energy columns");
                return null;
            }
            coordHeader = names[coordCol];
            energyHeader = names[energyCol];
            if (UnitInHeader(energyHeader) is { } unitText)
            {
                if (!Energy.TryParseUnit(unitText, out var headerUnit))
                {
                    issues.Error(first + 1, $"unit {TextInput.Quote(unitText)} in header {TextInput.Quote(energyHeader)} is not known; expected hartree, kcal/mol, kJ/mol, eV or cm-1");
                    return null;
                }
                if (optionUnit is { } o && o != headerUnit)
                {
                    issues.Error(first + 1, $"the header says energies are in {Energy.Symbol(headerUnit)} but the unit option says {Energy.Symbol(o)}");
                    return null;
                }
                unit = headerUnit;
            }
            foreach (var (n, i) in names.Select((n, i) => (n, i)))
                if (i != coordCol && i != energyCol && i != convCol)
                    issues.Warning(first + 1, $"column {i + 1} {TextInput.Quote(n)} is ignored (expected coordinate, energy and an optional converged column)");
        }
        else if (columnCount >= 3) convCol = 2;

        var points = new List<ScanPoint>();
        for (var li = hasHeader ? first + 1 : first; li < lines.Length; li++)
        {
            var raw = lines[li];
            if (string.IsNullOrWhiteSpace(raw) || raw.TrimStart().StartsWith('#')) continue;
            var lineNo = li + 1;
            if (points.Count >= limits.MaxFrames) { issues.Error(lineNo, $"more than {limits.MaxFrames} rows (ReaderLimits.MaxFrames)"); break; }
            var fields = Split(raw, delimiter);
            var needed = Math.Max(coordCol, energyCol) + 1;
            if (fields.Count < needed)
            {
                issues.Error(lineNo, $"expected at least {needed} {delimiterName}-separated columns, found {fields.Count}: {TextInput.Quote(raw.Trim())}");
                continue;
            }
            if (delimiter != ',' && fields.FirstOrDefault(f => IsDecimalComma(f.Trim())) is { } dc)
            {
                issues.Error(lineNo, $"found {TextInput.Quote(dc.Trim())}, a number with a decimal comma; expected a decimal point (1.5, not 1,5)");
                return null;
            }
            var okRow = true;
            var x = Cell(fields[coordCol], lineNo, "coordinate", delimiter, issues, ref okRow);
            var y = Cell(fields[energyCol], lineNo, "energy", delimiter, issues, ref okRow);
            var converged = true;
            if (convCol >= 0 && convCol < fields.Count && fields[convCol].Trim().Length > 0)
            {
                switch (fields[convCol].Trim().ToLowerInvariant())
                {
                    case "true" or "yes" or "y" or "t" or "1": converged = true; break;
                    case "false" or "no" or "n" or "f" or "0": converged = false; break;
                    default:
                        issues.Error(lineNo, $"converged flag {TextInput.Quote(fields[convCol].Trim())} is not yes/no, true/false or 1/0");
                        okRow = false;
                        break;
                }
            }
            if (okRow) points.Add(new ScanPoint(x, Energy.From(y, unit).Hartree, converged));
        }
        if (issues.HasErrors) return null;
        if (points.Count < 2)
        {
            issues.Error(first + 1, $"found {points.Count} data row(s); a scan needs at least 2 points");
            return null;
        }
        var dup = points.GroupBy(p => p.Coordinate).FirstOrDefault(g => g.Count() > 1);
        if (dup is not null) issues.Warning(null, $"coordinate value {Numbers.Format(dup.Key)} appears {dup.Count()} times");
        if (unit == EnergyUnit.Hartree && points.Any(p => p.EnergyHartree > 0) && points.Any(p => p.EnergyHartree < -1))
            issues.Warning(null, "energies mix positive values and values below -1 hartree: absolute and relative energies in one column?");
        return new ScanTable([.. points], unit, coordHeader, energyHeader, convCol >= 0);
    }

    private static double Cell(string field, int line, string what, char delimiter, IssueCollector issues, ref bool ok)
    {
        var t = field.Trim();
        if (Numbers.TryParseDouble(t, out var v))
        {
            if (double.IsFinite(v)) return v;
            issues.Error(line, $"{what} is {t}, expected a finite number");
        }
        else
        {
            var hint = delimiter != ',' && t.Contains(',') ? " (decimal comma? write numbers with a decimal point)" : "";
            issues.Error(line, $"{what} {TextInput.Quote(t)} is not a number{hint}");
        }
        ok = false;
        return double.NaN;
    }

    private static bool IsDecimalComma(string t)
    {
        var c = t.IndexOf(',');
        return c > 0 && c < t.Length - 1 && t.IndexOf(',', c + 1) < 0 && Numbers.TryParseDouble(t.Replace(',', '.'), out _);
    }

    /// <summary>The text inside the last (...) or [...] of a header, e.g. "kcal/mol" from "energy (kcal/mol)".</summary>
    internal static string? UnitInHeader(string header)
    {
        foreach (var (open, close) in new[] { ('(', ')'), ('[', ']') })
        {
            var o = header.LastIndexOf(open);
            var c = header.LastIndexOf(close);
            if (o >= 0 && c > o) return header[(o + 1)..c].Trim();
        }
        return null;
    }

    /// <summary>Splits one line on the delimiter; double-quoted fields may contain the delimiter and "" for a quote.</summary>
    internal static List<string> Split(string line, char delimiter)
    {
        var fields = new List<string>();
        var sb = new StringBuilder();
        var quoted = false;
        for (var i = 0; i < line.Length; i++)
        {
            var c = line[i];
            if (quoted)
            {
                if (c == '"')
                {
                    if (i + 1 < line.Length && line[i + 1] == '"') { sb.Append('"'); i++; }
                    else quoted = false;
                }
                else sb.Append(c);
            }
            else if (c == '"' && sb.ToString().Trim().Length == 0) { quoted = true; sb.Clear(); }
            else if (c == delimiter) { fields.Add(sb.ToString()); sb.Clear(); }
            else sb.Append(c);
        }
        fields.Add(sb.ToString());
        return fields;
    }
}
