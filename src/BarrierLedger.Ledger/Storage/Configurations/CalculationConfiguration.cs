using BarrierLedger.Ledger.Records;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Metadata.Builders;

namespace BarrierLedger.Ledger.Storage.Configurations;

internal sealed class CalculationConfiguration : IEntityTypeConfiguration<Calculation>
{
    public void Configure(EntityTypeBuilder<Calculation> b)
    {
        b.ToTable("Calculations");
        b.Property(e => e.Kind).HasConversion<string>().HasMaxLength(20);
        b.Property(e => e.ReviewState).HasConversion<string>().HasMaxLength(20);
        b.Property(e => e.Label).HasMaxLength(200);
        b.Property(e => e.Conformer).HasMaxLength(Calculation.MaxConformerLength);
        b.Property(e => e.LevelOfTheory).HasMaxLength(400);
        b.Property(e => e.EnergyLevelKey).HasMaxLength(400);
        b.Property(e => e.SourceSha256).HasMaxLength(64);
        b.HasIndex(e => new { e.SpeciesId, e.Kind });
        b.HasIndex(e => new { e.SpeciesId, e.SourceSha256, e.Label });
        b.HasIndex(e => e.UploadId);
        b.HasOne(e => e.Species).WithMany(s => s.Calculations).HasForeignKey(e => e.SpeciesId).OnDelete(DeleteBehavior.Restrict);
        b.HasOne(e => e.Upload).WithMany().HasForeignKey(e => e.UploadId).OnDelete(DeleteBehavior.Restrict);
        b.HasOne(e => e.StoredFile).WithMany().HasForeignKey(e => e.StoredFileId).OnDelete(DeleteBehavior.Restrict);
        b.HasVersion();
    }
}
