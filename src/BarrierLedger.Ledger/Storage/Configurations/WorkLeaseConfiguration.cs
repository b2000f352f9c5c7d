using BarrierLedger.Ledger.Coordination;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Metadata.Builders;

namespace BarrierLedger.Ledger.Storage.Configurations;

internal sealed class WorkLeaseConfiguration : IEntityTypeConfiguration<WorkLease>
{
    public void Configure(EntityTypeBuilder<WorkLease> b)
    {
        b.ToTable("WorkLeases");
        b.HasKey(l => l.Name);
        b.Property(l => l.Name).HasMaxLength(64);
        b.Property(l => l.Holder).HasMaxLength(200);
        b.Property(l => l.Phase).HasMaxLength(200);
        b.Property(l => l.Error).HasMaxLength(2000);
    }
}
