using BarrierLedger.Core.Formats;

namespace BarrierLedger.Ledger.Uploads;

/// <summary>Single QCSchema results and CSV scan tables, with the form's choices for what the file does not say.</summary>
internal static class SingleFileFormats
{
    public static void Read(UploadFile file, FileFormat format, UploadChoices choices, ReaderLimits? limits, UploadDraft draft)
    {
        _ = choices;
        _ = limits;
        draft.Issues.Add(new UploadIssue(file.FileName, null, null, format == FileFormat.Unknown
            ? "unknown file type: expected .xyz/.extxyz, .csv, a QCSchema .json, or a BarrierLedger bundle (.json or .zip)"
            : $"{format} files cannot be read by this build yet"));
    }
}
