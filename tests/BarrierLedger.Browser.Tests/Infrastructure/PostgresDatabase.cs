using BarrierLedger.Ledger.Tests.Support;

namespace BarrierLedger.Browser.Tests.Infrastructure;

/// <summary>
/// A fresh, empty database on the test PostgreSQL server (the Ledger tests' <see cref="PostgresServer"/>: the server named by
/// BARRIERLEDGER_TEST_POSTGRES or a throwaway cluster), dropped afterwards. Skips the test when PostgreSQL is not installed,
/// except under CI=true, where that is a failure.
/// </summary>
public sealed class PostgresDatabase : IAsyncDisposable
{
    private readonly PostgresServer _server;

    private PostgresDatabase(PostgresServer server, string connectionString)
    {
        _server = server;
        ConnectionString = connectionString;
    }

    public string ConnectionString { get; }

    public static async Task<PostgresDatabase> CreateAsync()
    {
        if (PostgresServer.Unavailable() is { } why)
        {
            if (PostgresServer.InCi) throw new InvalidOperationException("CI=true and the PostgreSQL browser test cannot run: " + why);
            Skip.If(true, why);
        }
        var server = await PostgresServer.GetAsync();
        return new PostgresDatabase(server, await server.CreateDatabaseAsync());
    }

    public async ValueTask DisposeAsync() => await _server.DropDatabaseAsync(ConnectionString);
}
