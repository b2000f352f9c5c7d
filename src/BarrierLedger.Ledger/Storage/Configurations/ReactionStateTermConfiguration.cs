using BarrierLedger.Ledger.Records;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Metadata.Builders;

namespace BarrierLedger.Ledger.Storage.Configurations;

internal sealed class ReactionStateTermConfiguration : IEntityTypeConfiguration<ReactionStateTerm>
{
    public void Configure(EntityTypeBuilder<ReactionStateTerm> b)
    {
        b.ToTable("ReactionStateTerms");
        b.HasIndex(e => e.SpeciesId);
        b.HasOne(e => e.Species).WithMany().HasForeignKey(e => e.SpeciesId).OnDelete(DeleteBehavior.Restrict);
    }
}
