namespace BarrierLedger.Web.Components.Shared.Charts;

/// <summary>
/// Text a person typed (state, species, reaction and IRC labels, levels of theory) on its way into a Plotly chart. Plotly reads
/// chart text as a small HTML dialect (links, bold, line breaks), so a label holding &lt;a href=…&gt; would become a link
/// in the chart; escaped, it shows as the characters it holds. Every chart builder passes user text through <see cref="Plain"/>.
/// </summary>
public static class ChartText
{
    /// <summary>Escapes the three characters Plotly's text dialect acts on; every other character (Δ, ‡, é) stays as it is.</summary>
    public static string Plain(string? text) => (text ?? "").Replace("&", "&amp;").Replace("<", "&lt;").Replace(">", "&gt;");
}
