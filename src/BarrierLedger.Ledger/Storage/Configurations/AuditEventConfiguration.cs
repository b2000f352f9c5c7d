using BarrierLedger.Ledger.Records;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Metadata.Builders;

namespace BarrierLedger.Ledger.Storage.Configurations;

internal sealed class AuditEventConfiguration : IEntityTypeConfiguration<AuditEvent>
{
    public void Configure(EntityTypeBuilder<AuditEvent> b)
    {
        b.ToTable("AuditEvents");
        b.Property(e => e.Action).HasMaxLength(60);
        b.Property(e => e.EntityType).HasMaxLength(60);
        b.Property(e => e.EntityId).HasMaxLength(60);
        b.HasIndex(e => new { e.EntityType, e.EntityId });
    }
}
