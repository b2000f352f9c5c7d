using BarrierLedger.Ledger.Records;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Metadata.Builders;

namespace BarrierLedger.Ledger.Storage.Configurations;

internal sealed class ReactionConfiguration : IEntityTypeConfiguration<Reaction>
{
    public void Configure(EntityTypeBuilder<Reaction> b)
    {
        b.ToTable("Reactions");
        b.Property(e => e.Label).HasMaxLength(200).IsRequired();
        b.HasIndex(e => new { e.StudyId, e.Label });
        b.Property(e => e.CheckVerdict).HasConversion<string>().HasMaxLength(20);
        b.Property(e => e.ReviewStatus).HasConversion<string>().HasMaxLength(20);
        b.HasOne(e => e.Study).WithMany(s => s.Reactions).HasForeignKey(e => e.StudyId).OnDelete(DeleteBehavior.Restrict);
        b.HasMany(e => e.States).WithOne(s => s.Reaction).HasForeignKey(s => s.ReactionId).OnDelete(DeleteBehavior.Cascade);
        b.HasOne(e => e.Derivation).WithOne(d => d.Reaction).HasForeignKey<ReactionDerivation>(d => d.ReactionId).OnDelete(DeleteBehavior.Cascade);
        b.HasVersion();
    }
}
