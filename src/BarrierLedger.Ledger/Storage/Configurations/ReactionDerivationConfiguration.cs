using BarrierLedger.Ledger.Records;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Metadata.Builders;

namespace BarrierLedger.Ledger.Storage.Configurations;

internal sealed class ReactionDerivationConfiguration : IEntityTypeConfiguration<ReactionDerivation>
{
    public void Configure(EntityTypeBuilder<ReactionDerivation> b)
    {
        b.ToTable("ReactionDerivations");
        b.HasIndex(e => e.ReactionId).IsUnique();
    }
}
