using BarrierLedger.Ledger.Records;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Metadata.Builders;

namespace BarrierLedger.Ledger.Storage.Configurations;

internal sealed class IrcFrameConfiguration : IEntityTypeConfiguration<IrcFrameRecord>
{
    public void Configure(EntityTypeBuilder<IrcFrameRecord> b)
    {
        b.ToTable("IrcFrames");
        b.Property(e => e.Role).HasConversion<string>().HasMaxLength(20);
        b.HasIndex(e => new { e.IrcId, e.Index }).IsUnique();
    }
}
