using BarrierLedger.Ledger.Records;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Metadata.Builders;

namespace BarrierLedger.Ledger.Storage.Configurations;

internal sealed class FrequencyCheckConfiguration : IEntityTypeConfiguration<FrequencyCheck>
{
    public void Configure(EntityTypeBuilder<FrequencyCheck> b)
    {
        b.ToTable("FrequencyChecks");
        b.Property(e => e.Verdict).HasConversion<string>().HasMaxLength(20);
        b.HasIndex(e => e.CalculationId).IsUnique();
        b.HasOne(e => e.Calculation).WithMany().HasForeignKey(e => e.CalculationId).OnDelete(DeleteBehavior.Restrict);
    }
}
