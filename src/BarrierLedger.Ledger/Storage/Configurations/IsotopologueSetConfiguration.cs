using BarrierLedger.Ledger.Records;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Metadata.Builders;

namespace BarrierLedger.Ledger.Storage.Configurations;

internal sealed class IsotopologueSetConfiguration : IEntityTypeConfiguration<IsotopologueSet>
{
    public void Configure(EntityTypeBuilder<IsotopologueSet> b)
    {
        b.ToTable("IsotopologueSets");
        b.Property(e => e.Name).HasMaxLength(200);
        b.Property(e => e.SaddleSubstitutions).HasMaxLength(4000);
        b.Property(e => e.ReactantSubstitutions).HasMaxLength(8000);
        b.Property(e => e.Mapping).HasConversion<string>().HasMaxLength(20);
        b.HasIndex(e => e.ReactionId);
        b.HasOne(e => e.Reaction).WithMany().HasForeignKey(e => e.ReactionId).OnDelete(DeleteBehavior.Restrict);
        b.HasVersion();
    }
}
