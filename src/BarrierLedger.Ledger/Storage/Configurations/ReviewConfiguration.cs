using BarrierLedger.Ledger.Records;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Metadata.Builders;

namespace BarrierLedger.Ledger.Storage.Configurations;

internal sealed class ReviewConfiguration : IEntityTypeConfiguration<Review>
{
    public void Configure(EntityTypeBuilder<Review> b)
    {
        b.ToTable("Reviews");
        b.Property(e => e.Outcome).HasConversion<string>().HasMaxLength(20);
        b.Property(e => e.Comment).HasMaxLength(4000);
        b.HasIndex(e => new { e.CalculationId, e.Id });
        b.HasOne(e => e.Calculation).WithMany().HasForeignKey(e => e.CalculationId).OnDelete(DeleteBehavior.Restrict);
    }
}
