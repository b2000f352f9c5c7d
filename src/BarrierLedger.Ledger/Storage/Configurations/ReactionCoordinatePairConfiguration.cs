using BarrierLedger.Ledger.Records;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Metadata.Builders;

namespace BarrierLedger.Ledger.Storage.Configurations;

internal sealed class ReactionCoordinatePairConfiguration : IEntityTypeConfiguration<ReactionCoordinatePair>
{
    public void Configure(EntityTypeBuilder<ReactionCoordinatePair> b) => b.ToTable("ReactionCoordinatePairs");
}
