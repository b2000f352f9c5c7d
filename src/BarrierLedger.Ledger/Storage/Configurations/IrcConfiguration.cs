using BarrierLedger.Ledger.Records;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Metadata.Builders;

namespace BarrierLedger.Ledger.Storage.Configurations;

internal sealed class IrcConfiguration : IEntityTypeConfiguration<Irc>
{
    public void Configure(EntityTypeBuilder<Irc> b)
    {
        b.ToTable("Ircs");
        b.Property(e => e.Form).HasConversion<string>().HasMaxLength(20);
        b.Property(e => e.Label).HasMaxLength(200);
        b.Property(e => e.LevelOfTheory).HasMaxLength(400);
        b.Property(e => e.SourceSha256).HasMaxLength(64);
        b.HasIndex(e => e.SaddleCalculationId);
        b.HasIndex(e => e.UploadId);
        b.HasOne(e => e.SaddleCalculation).WithMany().HasForeignKey(e => e.SaddleCalculationId).OnDelete(DeleteBehavior.Restrict);
        b.HasOne<Upload>().WithMany().HasForeignKey(e => e.UploadId).OnDelete(DeleteBehavior.Restrict);
        b.HasOne<StoredFile>().WithMany().HasForeignKey(e => e.StoredFileId).OnDelete(DeleteBehavior.Restrict);
        b.HasOne<StoredFile>().WithMany().HasForeignKey(e => e.BackwardStoredFileId).OnDelete(DeleteBehavior.Restrict);
        b.HasMany(e => e.Frames).WithOne().HasForeignKey(f => f.IrcId).OnDelete(DeleteBehavior.Cascade);
        b.HasVersion();
    }
}
