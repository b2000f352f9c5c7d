using System.CommandLine;
using BarrierLedger.Core.Formats;

namespace BarrierLedger.Cli.Commands;

/// <summary>Options several subcommands share, defined once so they read the same everywhere.</summary>
internal static class CommonOptions
{
    /// <summary>A file argument swallows any token; one that looks like an option and is no file is reported as an unknown option.</summary>
    public static void RejectUnknownOptions<T>(Argument<T> files)
    {
        files.Validators.Add(result =>
        {
            foreach (var token in result.Tokens)
                if (token.Value.StartsWith('-') && token.Value.Length > 1 && !File.Exists(token.Value))
                    result.AddError($"unknown option '{token.Value}'");
        });
    }

    public static Option<bool> Json() => new("--json") { Description = "Print one JSON document (keys in docs/formats.md) instead of tables" };
}

internal static class FormatNames
{
    public static string Of(FileFormat f) => f switch
    {
        FileFormat.Xyz => "xyz",
        FileFormat.CsvScan => "csv-scan",
        FileFormat.QcSchema => "qcschema",
        FileFormat.Bundle => "bundle",
        FileFormat.BundleZip => "bundle-zip",
        _ => "unknown",
    };
}
