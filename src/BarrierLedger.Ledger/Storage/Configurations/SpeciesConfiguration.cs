using BarrierLedger.Ledger.Records;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Metadata.Builders;

namespace BarrierLedger.Ledger.Storage.Configurations;

internal sealed class SpeciesConfiguration : IEntityTypeConfiguration<Species>
{
    public void Configure(EntityTypeBuilder<Species> b)
    {
        b.ToTable("Species");
        b.Property(e => e.Label).HasMaxLength(200).IsRequired();
        b.Property(e => e.Formula).HasMaxLength(200);
        b.Property(e => e.Description).HasMaxLength(4000);
        b.Property(e => e.PointGroup).HasMaxLength(20);
        b.Property(e => e.SymmetryNote).HasMaxLength(1000);
        b.HasIndex(e => new { e.StudyId, e.Label }).IsUnique();
        b.HasOne(e => e.Study).WithMany(s => s.Species).HasForeignKey(e => e.StudyId).OnDelete(DeleteBehavior.Restrict);
        b.HasVersion();
    }
}
