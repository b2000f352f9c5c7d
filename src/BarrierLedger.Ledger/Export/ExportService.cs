using System.Text;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Ledger.Export;

/// <summary>Table file formats.</summary>
public enum TableFormat
{
    Csv,
    Xlsx,
    Latex,
    Markdown,
}

/// <summary>A file ready to download or write: name, media type, bytes.</summary>
public sealed record ExportFile(string FileName, string ContentType, byte[] Content);

/// <summary>
/// Produces export files from the ledger: barrier tables in four formats, energy diagrams as SVG and PNG, supporting-information
/// coordinates as text and as a zip of XYZ files. The Export screen, the download endpoints and <c>barrierledger export</c> all
/// go through here, so they give the same bytes.
/// </summary>
public sealed class ExportService(ExportQueryService query)
{
    private static readonly UTF8Encoding s_utf8 = new(false);

    public async Task<ExportFile> TableAsync(int studyId, IReadOnlyCollection<int>? reactionIds, TableFormat format, TableOptions options, CancellationToken ct = default)
    {
        var source = await query.GetTableSourceAsync(studyId, reactionIds, ct);
        return Table(BarrierTable.Build(source, options), format, "barriers-" + SupportingInfoWriter.SafeFileName(source.StudyName));
    }

    /// <summary>Writes a built table in one format.</summary>
    public static ExportFile Table(BarrierTable table, TableFormat format, string baseName) => format switch
    {
        TableFormat.Csv => new(baseName + ".csv", "text/csv; charset=utf-8", CsvTableWriter.ToBytes(table)),
        TableFormat.Xlsx => new(baseName + ".xlsx", "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet", XlsxTableWriter.ToBytes(table)),
        TableFormat.Latex => new(baseName + ".tex", "application/x-tex; charset=utf-8", s_utf8.GetBytes(LatexTableWriter.Write(table))),
        TableFormat.Markdown => new(baseName + ".md", "text/markdown; charset=utf-8", s_utf8.GetBytes(MarkdownTableWriter.Write(table))),
        _ => throw new ArgumentOutOfRangeException(nameof(format), format, "Unknown table format."),
    };

    /// <summary>The reaction's diagram as SVG and PNG (both from one scene).</summary>
    public async Task<(ExportFile Svg, ExportFile Png)> DiagramAsync(int reactionId, string quantity, EnergyUnit unit, int decimals, CancellationToken ct = default)
    {
        var source = await query.GetDiagramSourceAsync(reactionId, quantity, ct);
        var files = DiagramExport.Build(source, unit, decimals);
        var name = "diagram-" + SupportingInfoWriter.SafeFileName(source.Reaction);
        return (new(name + ".svg", "image/svg+xml", s_utf8.GetBytes(files.Svg)), new(name + ".png", "image/png", files.Png));
    }

    public async Task<ExportFile> SupportingInfoTextAsync(int studyId, CancellationToken ct = default)
    {
        var (study, model, structures) = await query.GetSupportingInfoAsync(studyId, ct);
        return new("coordinates-" + SupportingInfoWriter.SafeFileName(study) + ".txt", "text/plain; charset=utf-8",
            s_utf8.GetBytes(SupportingInfoWriter.WriteText(study, model, structures)));
    }

    public async Task<ExportFile> SupportingInfoZipAsync(int studyId, CancellationToken ct = default)
    {
        var (study, _, structures) = await query.GetSupportingInfoAsync(studyId, ct);
        return new("structures-" + SupportingInfoWriter.SafeFileName(study) + ".zip", "application/zip", SupportingInfoWriter.WriteXyzZip(structures));
    }
}
