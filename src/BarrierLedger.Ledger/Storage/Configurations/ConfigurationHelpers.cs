using BarrierLedger.Ledger.Records;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Metadata.Builders;

namespace BarrierLedger.Ledger.Storage.Configurations;

internal static class ConfigurationHelpers
{
    /// <summary>The version column is the optimistic-concurrency token; <see cref="LedgerDbContext"/> increments it on save.</summary>
    public static void HasVersion<T>(this EntityTypeBuilder<T> b) where T : class, IVersioned =>
        b.Property(e => e.Version).IsConcurrencyToken();
}
