using System.Text.RegularExpressions;

namespace BarrierLedger.Ledger.Export;

/// <summary>
/// The one rule every CSV writer applies to every cell, against spreadsheet formula injection (OWASP "CSV injection"):
/// a cell that starts with <c>=</c>, <c>+</c>, <c>-</c>, <c>@</c>, a tab or a carriage return is written with a leading
/// apostrophe (<c>'=1+2</c>), which spreadsheets show as text and never run. Numbers stay numbers: a cell that is entirely a
/// decimal number in invariant notation (<c>-12.5</c>, <c>+4.0</c>, <c>-1.23E-05</c>) is written unchanged, so negative
/// barriers and reaction energies still sort and sum. Quoting (RFC 4180) is applied after neutralising.
/// </summary>
public static partial class CsvCells
{
    public static string Neutralise(string cell)
    {
        ArgumentNullException.ThrowIfNull(cell);
        if (cell.Length == 0 || cell[0] is not ('=' or '+' or '-' or '@' or '\t' or '\r')) return cell;
        return PlainNumber().IsMatch(cell) ? cell : "'" + cell;
    }

    /// <summary>Neutralised, then quoted when it holds a comma, quote or line break (RFC 4180).</summary>
    public static string Field(string cell)
    {
        var s = Neutralise(cell);
        return s.IndexOfAny([',', '"', '\n', '\r']) >= 0 ? "\"" + s.Replace("\"", "\"\"", StringComparison.Ordinal) + "\"" : s;
    }

    [GeneratedRegex(@"^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$", RegexOptions.CultureInvariant)]
    private static partial Regex PlainNumber();
}
