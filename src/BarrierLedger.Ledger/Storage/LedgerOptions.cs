namespace BarrierLedger.Ledger.Storage;

/// <summary>Settings under the "BarrierLedger" configuration section.</summary>
public sealed class LedgerOptions
{
    public const string SectionName = "BarrierLedger";

    /// <summary>Folder holding the database file and backups. Relative paths are taken from the current directory.</summary>
    public string DataDirectory { get; set; } = "data";

    /// <summary>Database file name inside <see cref="DataDirectory"/>.</summary>
    public string DatabaseFileName { get; set; } = "barrierledger.db";

    public string ResolvedDataDirectory => Path.GetFullPath(DataDirectory);

    public string DatabasePath => Path.Combine(ResolvedDataDirectory, DatabaseFileName);

    public string SqliteConnectionString =>
        $"Data Source={DatabasePath};Foreign Keys=True;Default Timeout=30;Pooling=True";
}
