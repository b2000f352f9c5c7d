using BarrierLedger.Ledger.Storage;

namespace BarrierLedger.Ledger.Tests.Support;

/// <summary>
/// The engines every Ledger integration test runs on: <c>[SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]</c>
/// with a <see cref="StoreProvider"/> parameter passed to <see cref="TempLedger.CreateAsync(StoreProvider, string?)"/>.
/// </summary>
public static class Stores
{
    public static TheoryData<StoreProvider> Both => new() { StoreProvider.Sqlite, StoreProvider.PostgreSQL };
}
