using BarrierLedger.Ledger.Records;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Metadata.Builders;

namespace BarrierLedger.Ledger.Storage.Configurations;

internal sealed class ScanPointConfiguration : IEntityTypeConfiguration<ScanPointRecord>
{
    public void Configure(EntityTypeBuilder<ScanPointRecord> b)
    {
        b.ToTable("ScanPoints");
        b.HasIndex(e => new { e.ScanId, e.Index }).IsUnique();
    }
}
