using BarrierLedger.Ledger.Records;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Metadata.Builders;

namespace BarrierLedger.Ledger.Storage.Configurations;

internal sealed class StoredFileConfiguration : IEntityTypeConfiguration<StoredFile>
{
    public void Configure(EntityTypeBuilder<StoredFile> b)
    {
        b.ToTable("StoredFiles");
        b.Property(e => e.Sha256).HasMaxLength(64).IsRequired();
        b.Property(e => e.FileName).HasMaxLength(400);
        b.HasIndex(e => e.Sha256).IsUnique();
        // Covers the storage quota's sum per user: without it SQLite reads past every file's content to reach the uploader.
        b.HasIndex(e => new { e.UploadedByUserId, e.SizeBytes });
    }
}
