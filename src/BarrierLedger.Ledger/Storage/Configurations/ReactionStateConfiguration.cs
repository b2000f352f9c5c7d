using BarrierLedger.Ledger.Records;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Metadata.Builders;

namespace BarrierLedger.Ledger.Storage.Configurations;

internal sealed class ReactionStateConfiguration : IEntityTypeConfiguration<ReactionState>
{
    public void Configure(EntityTypeBuilder<ReactionState> b)
    {
        b.ToTable("ReactionStates");
        b.Property(e => e.Label).HasMaxLength(200);
        b.Property(e => e.Kind).HasConversion<string>().HasMaxLength(20);
        b.HasIndex(e => new { e.ReactionId, e.Position }).IsUnique();
        // The review queue walks saddle points in this order (keyset paging): (calculation, state) pairs straight from the index.
        b.HasIndex(e => new { e.SaddleCalculationId, e.Id });
        b.HasOne(e => e.SaddleCalculation).WithMany().HasForeignKey(e => e.SaddleCalculationId).OnDelete(DeleteBehavior.Restrict);
        b.HasMany(e => e.Terms).WithOne().HasForeignKey(t => t.ReactionStateId).OnDelete(DeleteBehavior.Cascade);
        b.HasMany(e => e.CoordinatePairs).WithOne().HasForeignKey(t => t.ReactionStateId).OnDelete(DeleteBehavior.Cascade);
    }
}
