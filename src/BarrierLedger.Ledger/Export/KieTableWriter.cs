using System.Globalization;
using System.Text;
using BarrierLedger.Ledger.IsotopeEffects;

namespace BarrierLedger.Ledger.Export;

/// <summary>
/// The kinetic-isotope-effect table of a reaction as CSV or Markdown: a header with the reaction, the energy model in force and what
/// the numbers are, one row per isotopologue set with its factors (or why there is none), every caution of the row, and the export
/// caution. Numbers as <see cref="IsotopeEffectService"/> computed them; nothing is derived here.
/// </summary>
public static class KieTableWriter
{
    private static readonly string[] s_columns =
    [
        "set", "saddle point", "substitutions (saddle point ⇔ reactants)", "atoms matched", "KIE", "KIE without tunnelling", "SYM", "MMI", "ZPE", "EXC",
        "LOW", "TUN", "tunnelling used", "nu_imag parent (cm-1)", "nu_imag isotopologue (cm-1)", "Wigner ratio", "Bell ratio", "Skodje-Truhlar ratio",
        "Redlich-Teller residual", "notes",
    ];

    /// <summary>Header lines: reaction, model, definition.</summary>
    public static IReadOnlyList<string> Header(IsotopeEffectsReport report) =>
    [
        $"Kinetic isotope effects of {report.ReactionLabel} ({report.StudyName})",
        $"Energy model: {report.Model.Describe()}",
        "KIE = k(parent)/k(isotopologue) = SYM × MMI × ZPE × EXC × LOW × TUN: transition-state theory, ideal-gas RRHO partition functions from the " +
        "stored Hessians re-analysed with the isotope masses; LOW is the model's low-mode treatment against RRHO, TUN the model's tunnelling correction.",
    ];

    public static ExportFile Csv(IsotopeEffectsReport report)
    {
        var sb = new StringBuilder();
        foreach (var h in Header(report)) sb.Append("# ").Append(h).Append('\n');
        sb.Append("# ").Append(ExportCaution.Text).Append('\n');
        sb.Append(string.Join(",", s_columns.Select(Quote))).Append('\n');
        foreach (var row in Rows(report)) sb.Append(string.Join(",", row.Select(Quote))).Append('\n');
        return new ExportFile($"{Slug(report.ReactionLabel)}-isotope-effects.csv", "text/csv; charset=utf-8", Encoding.UTF8.GetBytes(sb.ToString()));
    }

    public static ExportFile Markdown(IsotopeEffectsReport report)
    {
        var sb = new StringBuilder();
        var header = Header(report);
        sb.Append("## ").Append(header[0]).Append("\n\n");
        foreach (var h in header.Skip(1)) sb.Append(h).Append("\n\n");
        sb.Append("| ").Append(string.Join(" | ", s_columns)).Append(" |\n|");
        sb.Append(string.Concat(s_columns.Select(_ => "---|"))).Append('\n');
        foreach (var row in Rows(report)) sb.Append("| ").Append(string.Join(" | ", row.Select(c => c.Replace("|", "\\|", StringComparison.Ordinal)))).Append(" |\n");
        sb.Append('\n').Append(ExportCaution.Text).Append('\n');
        return new ExportFile($"{Slug(report.ReactionLabel)}-isotope-effects.md", "text/markdown; charset=utf-8", Encoding.UTF8.GetBytes(sb.ToString()));
    }

    private static IEnumerable<string[]> Rows(IsotopeEffectsReport report)
    {
        foreach (var e in report.Effects)
        {
            var notes = e.Cautions.Concat(e.Result?.Notes ?? []).ToList();
            var common = new[] { e.Set.Name, e.Set.SaddleLabel, e.Set.Describe(), e.Set.Mapping == Records.IsotopeMapping.SameAtomOrder ? "by atom order" : "confirmed by a member" };
            if (e.Result is not { } r)
            {
                yield return [.. common, .. Enumerable.Repeat("", s_columns.Length - common.Length - 1), string.Join(" ", notes.Prepend($"No KIE: {e.Unavailable}"))];
                continue;
            }
            string Ratio(Core.IsotopeEffects.KieTunnelling k) => r.TunnellingFactors.Single(t => t.Correction == k) is { Ratio: { } x } ? N(x) : "";
            yield return
            [
                .. common, N(r.Kie), N(r.KieWithoutTunnelling), N(r.SymmetryFactor), N(r.MassMomentFactor), N(r.ZeroPointFactor), N(r.ExcitationFactor),
                N(r.LowModeFactor), N(r.TunnellingFactor), r.Options.Tunnelling.ToString(), N(r.ImaginaryParentCm1), N(r.ImaginarySubstitutedCm1),
                Ratio(Core.IsotopeEffects.KieTunnelling.Wigner), Ratio(Core.IsotopeEffects.KieTunnelling.Bell), Ratio(Core.IsotopeEffects.KieTunnelling.SkodjeTruhlar),
                r.ProductRuleWorstDeviation.ToString("G2", CultureInfo.InvariantCulture), string.Join(" ", notes),
            ];
        }
    }

    private static string N(double x) => x.ToString("G6", CultureInfo.InvariantCulture);

    private static string Quote(string s) => CsvCells.Field(s);

    private static string Slug(string s) => string.Concat(s.Select(c => char.IsAsciiLetterOrDigit(c) ? char.ToLowerInvariant(c) : '-')).Trim('-');
}
