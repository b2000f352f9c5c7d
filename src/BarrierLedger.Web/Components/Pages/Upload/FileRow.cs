using System.Text.RegularExpressions;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Ledger.Uploads;

namespace BarrierLedger.Web.Components.Pages.Upload;

/// <summary>One loose file's row on the upload page: the guess it started from and what the member made of it.</summary>
public sealed partial class FileRow(FileSuggestion suggestion)
{
    public FileSuggestion Suggestion { get; } = suggestion;
    public string FileName => Suggestion.FileName;
    public string Species { get; set; } = suggestion.SpeciesLabel;
    /// <summary>A <see cref="CalculationKind"/> name, or "" for none chosen.</summary>
    public string Kind { get; set; } = suggestion.Kind?.ToString() ?? "";
    public string Level { get; set; } = suggestion.LevelOfTheory ?? "";
    public int Charge { get; set; } = suggestion.Charge;
    public int Multiplicity { get; set; } = suggestion.Multiplicity;
    /// <summary>The scanned coordinate's atoms as typed: "1 6", "1,6" or "C1–C6" all give atoms 1 and 6.</summary>
    public string ScanAtoms { get; set; } = "";
    /// <summary>The conformer of its species this file is ("" = the species' only conformer, or its file name when each file is a conformer).</summary>
    public string Conformer { get; set; } = "";

    public bool IsScan => Kind == nameof(CalculationKind.RelaxedScan);

    public FileChoices ToChoices() => new(Species.Trim(), Enum.TryParse<CalculationKind>(Kind, out var k) ? k : null, Level.Trim(), Charge, Multiplicity,
        IsScan ? [.. Digits().Matches(ScanAtoms).Select(m => int.Parse(m.Value, System.Globalization.CultureInfo.InvariantCulture))] : null,
        string.IsNullOrWhiteSpace(Conformer) ? null : Conformer.Trim());

    [GeneratedRegex(@"\d{1,6}")]
    private static partial Regex Digits();
}
