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
        b.Property(e => e.ContentSha256).HasMaxLength(64);
        b.HasIndex(e => new { e.UploaderUserId, e.Key }).IsUnique();
        b.HasOne<Study>().WithMany().HasForeignKey(e => e.StudyId).OnDelete(DeleteBehavior.Restrict);
    }
}
