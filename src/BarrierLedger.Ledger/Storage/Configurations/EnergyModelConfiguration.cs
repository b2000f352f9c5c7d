using BarrierLedger.Ledger.Records;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Metadata.Builders;

namespace BarrierLedger.Ledger.Storage.Configurations;

internal sealed class EnergyModelConfiguration : IEntityTypeConfiguration<EnergyModel>
{
    public void Configure(EntityTypeBuilder<EnergyModel> b)
    {
        b.ToTable("EnergyModels");
        b.Property(e => e.StandardState).HasConversion<string>().HasMaxLength(30);
        b.Property(e => e.Treatment).HasConversion<string>().HasMaxLength(40);
        b.Property(e => e.Tunnelling).HasConversion<string>().HasMaxLength(20);
        b.Property(e => e.DisplayUnit).HasConversion<string>().HasMaxLength(20);
        // One group default (StudyId null) and at most one override per study.
        b.HasIndex(e => e.StudyId).IsUnique();
        b.HasOne<Study>().WithMany().HasForeignKey(e => e.StudyId).OnDelete(DeleteBehavior.Restrict);
        b.HasVersion();
    }
}
