using BarrierLedger.Ledger.Records;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Metadata.Builders;

namespace BarrierLedger.Ledger.Storage.Configurations;

internal sealed class StudyConfiguration : IEntityTypeConfiguration<Study>
{
    public void Configure(EntityTypeBuilder<Study> b)
    {
        b.ToTable("Studies");
        b.Property(e => e.Name).HasMaxLength(200).IsRequired();
        b.Property(e => e.Description).HasMaxLength(4000);
        b.HasIndex(e => e.Name);
        b.HasVersion();
    }
}
