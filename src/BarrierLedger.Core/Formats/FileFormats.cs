using System.Text;

namespace BarrierLedger.Core.Formats;

/// <summary>The input formats BarrierLedger reads.</summary>
public enum FileFormat
{
    Unknown,
    /// <summary>XYZ or extended XYZ, one or more frames.</summary>
    Xyz,
    /// <summary>A CSV (comma, semicolon or tab) scan table.</summary>
    CsvScan,
    /// <summary>A MolSSI QCSchema AtomicResult (schema_name qcschema_output).</summary>
    QcSchema,
    /// <summary>A BarrierLedger bundle manifest (.json).</summary>
    Bundle,
    /// <summary>A BarrierLedger bundle zip: manifest plus the files it names.</summary>
    BundleZip,
}

/// <summary>Tells the format of an upload from its name and first bytes.</summary>
public static class FileFormats
{
    /// <summary>A zip archive's first bytes: a local file header (PK 3 4) or, for an archive with no entries, the end record (PK 5 6).</summary>
    public static bool HasZipSignature(ReadOnlySpan<byte> head) =>
        head.Length >= 4 && head[0] == 'P' && head[1] == 'K' && ((head[2] == 3 && head[3] == 4) || (head[2] == 5 && head[3] == 6));

    /// <summary>
    /// Zip by its signature; JSON by a leading '{' (QCSchema when it mentions "schema_name", else a bundle);
    /// otherwise by extension: .xyz/.extxyz, .csv/.tsv/.txt/.dat.
    /// </summary>
    public static FileFormat Detect(string fileName, ReadOnlySpan<byte> head)
    {
        if (HasZipSignature(head)) return FileFormat.BundleZip;
        var ext = Path.GetExtension(fileName).ToLowerInvariant();
        var text = Encoding.UTF8.GetString(head).TrimStart('\uFEFF', ' ', '\t', '\r', '\n');
        if (text.StartsWith('{') || ext == ".json")
        {
            if (text.Contains("\"schema_name\"", StringComparison.Ordinal) || text.Contains("qcschema", StringComparison.OrdinalIgnoreCase))
                return FileFormat.QcSchema;
            return FileFormat.Bundle;
        }
        return ext switch
        {
            ".xyz" or ".extxyz" => FileFormat.Xyz,
            ".csv" or ".tsv" or ".txt" or ".dat" => FileFormat.CsvScan,
            ".zip" => FileFormat.BundleZip,
            _ => FileFormat.Unknown,
        };
    }
}
