using BarrierLedger.Ledger.Records;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Metadata.Builders;

namespace BarrierLedger.Ledger.Storage.Configurations;

internal sealed class ScanConfiguration : IEntityTypeConfiguration<Scan>
{
    public void Configure(EntityTypeBuilder<Scan> b)
    {
        b.ToTable("Scans");
        b.Property(e => e.CoordinateKind).HasConversion<string>().HasMaxLength(20);
        b.HasIndex(e => e.SpeciesId);
        b.HasIndex(e => e.UploadId);
        b.HasOne(e => e.Species).WithMany().HasForeignKey(e => e.SpeciesId).OnDelete(DeleteBehavior.Restrict);
        b.HasOne<Upload>().WithMany().HasForeignKey(e => e.UploadId).OnDelete(DeleteBehavior.Restrict);
        b.HasOne<StoredFile>().WithMany().HasForeignKey(e => e.StoredFileId).OnDelete(DeleteBehavior.Restrict);
        b.HasMany(e => e.Points).WithOne().HasForeignKey(p => p.ScanId).OnDelete(DeleteBehavior.Cascade);
        b.HasVersion();
    }
}
