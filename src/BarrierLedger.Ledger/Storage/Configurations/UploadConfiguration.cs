using BarrierLedger.Ledger.Records;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Metadata.Builders;

namespace BarrierLedger.Ledger.Storage.Configurations;

internal sealed class UploadConfiguration : IEntityTypeConfiguration<Upload>
{
    public void Configure(EntityTypeBuilder<Upload> b)
    {
        b.ToTable("Uploads");
        b.Property(e => e.Key).HasMaxLength(100).IsRequired();
        b.HasIndex(e => e.Key).IsUnique();
        b.HasOne<Study>().WithMany().HasForeignKey(e => e.StudyId).OnDelete(DeleteBehavior.Restrict);
    }
}
