namespace BarrierLedger.Ledger.Storage;

/// <summary>Settings under the "BarrierLedger" configuration section.</summary>
public sealed class LedgerOptions
{
    public const string SectionName = "BarrierLedger";

    /// <summary>Folder holding the database file and backups. Relative paths are taken from the current directory.</summary>
    public string DataDirectory { get; set; } = "data";

    /// <summary>Database file name inside <see cref="DataDirectory"/> (SQLite only).</summary>
    public string DatabaseFileName { get; set; } = "barrierledger.db";

    /// <summary>Which database engine holds the ledger ("BarrierLedger:Database:Provider", "BarrierLedger:Database:ConnectionString").</summary>
    public DatabaseOptions Database { get; set; } = new();

    /// <summary>"BarrierLedger:Uploads": how many uploads are read at once.</summary>
    public Uploads.UploadReadOptions Uploads { get; set; } = new();

    public bool IsPostgreSql => Database.Provider == StoreProvider.PostgreSQL;

    public string ResolvedDataDirectory => Path.GetFullPath(DataDirectory);

    public string DatabasePath => Path.Combine(ResolvedDataDirectory, DatabaseFileName);

    public string SqliteConnectionString =>
        $"Data Source={DatabasePath};Foreign Keys=True;Default Timeout=30;Pooling=True";
}

/// <summary>The database engine of the ledger.</summary>
public enum StoreProvider
{
    /// <summary>One SQLite file in the data directory (the default; one machine).</summary>
    Sqlite,

    /// <summary>A PostgreSQL database named by <see cref="DatabaseOptions.ConnectionString"/> (several app instances).</summary>
    PostgreSQL,
}

/// <summary>"BarrierLedger:Database": the engine and, for PostgreSQL, the Npgsql connection string.</summary>
public sealed class DatabaseOptions
{
    public StoreProvider Provider { get; set; } = StoreProvider.Sqlite;

    /// <summary>Npgsql connection string (Host=...;Port=...;Database=...;Username=...;Password=...). Unused for SQLite,
    /// which always uses the file <see cref="LedgerOptions.DatabasePath"/>.</summary>
    public string? ConnectionString { get; set; }
}
