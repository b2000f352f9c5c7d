using BarrierLedger.Core.Formats;

namespace BarrierLedger.Ledger.Uploads;

/// <summary>Maps a BarrierLedger bundle (manifest or zip) read by the Core bundle reader into an <see cref="UploadDraft"/>.</summary>
internal static class BundleImport
{
    public static void Read(UploadFile file, IReadOnlyList<UploadFile> all, ReaderLimits? limits, UploadDraft draft)
    {
        _ = all;
        _ = limits;
        draft.Issues.Add(new UploadIssue(file.FileName, null, null, "bundle files cannot be read by this build yet"));
    }
}
