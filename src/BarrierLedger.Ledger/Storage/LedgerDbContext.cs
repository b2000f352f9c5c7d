using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Coordination;
using BarrierLedger.Ledger.Records;
using Microsoft.AspNetCore.DataProtection.EntityFrameworkCore;
using Microsoft.AspNetCore.Identity.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore;

namespace BarrierLedger.Ledger.Storage;

/// <summary>
/// The ledger's database: accounts (ASP.NET Core Identity) and the group's records, in one SQLite file by default. This type is
/// the SQLite context (its migrations are in Migrations/Sqlite); <see cref="PostgreSqlLedgerDbContext"/> is the same model on
/// PostgreSQL. Create either through <see cref="LedgerDatabase"/> or the registered <see cref="LedgerDbContextFactory"/>.
/// Every save increments the version of each changed <see cref="IVersioned"/> record; the version is the concurrency
/// token, so saving over someone else's change throws <see cref="DbUpdateConcurrencyException"/>.
/// It also holds what several app instances on one database share: the data-protection keys (so a sign-in cookie issued
/// by one instance is accepted by another) and the leases on background work.
/// </summary>
public class LedgerDbContext(DbContextOptions<LedgerDbContext> options) : IdentityDbContext<LedgerUser>(options), IDataProtectionKeyContext
{
    public DbSet<Study> Studies => Set<Study>();
    public DbSet<Species> Species => Set<Species>();
    public DbSet<Calculation> Calculations => Set<Calculation>();
    public DbSet<Upload> Uploads => Set<Upload>();
    public DbSet<Reaction> Reactions => Set<Reaction>();
    public DbSet<ReactionState> ReactionStates => Set<ReactionState>();
    public DbSet<ReactionStateTerm> ReactionStateTerms => Set<ReactionStateTerm>();
    public DbSet<ReactionCoordinatePair> ReactionCoordinatePairs => Set<ReactionCoordinatePair>();
    public DbSet<Scan> Scans => Set<Scan>();
    public DbSet<ScanPointRecord> ScanPoints => Set<ScanPointRecord>();
    public DbSet<Irc> Ircs => Set<Irc>();
    public DbSet<IrcFrameRecord> IrcFrames => Set<IrcFrameRecord>();
    public DbSet<FrequencyCheck> FrequencyChecks => Set<FrequencyCheck>();
    public DbSet<Review> Reviews => Set<Review>();
    public DbSet<EnergyModel> EnergyModels => Set<EnergyModel>();
    public DbSet<StoredFile> StoredFiles => Set<StoredFile>();
    public DbSet<AuditEvent> AuditEvents => Set<AuditEvent>();
    public DbSet<ReactionDerivation> ReactionDerivations => Set<ReactionDerivation>();
    public DbSet<IsotopologueSet> IsotopologueSets => Set<IsotopologueSet>();
    public DbSet<WorkLease> WorkLeases => Set<WorkLease>();
    public DbSet<DataProtectionKey> DataProtectionKeys => Set<DataProtectionKey>();

    /// <summary>Saves rows with the versions they carry (a store transfer copies them as they are); off for every ordinary save.</summary>
    public bool KeepVersionsAsGiven { get; set; }

    protected override void OnModelCreating(ModelBuilder builder)
    {
        if (GetType() == typeof(LedgerDbContext) && Database.ProviderName?.StartsWith("Npgsql", StringComparison.Ordinal) == true)
            throw new InvalidOperationException("LedgerDbContext is the SQLite context; on PostgreSQL create a PostgreSqlLedgerDbContext "
                + "(LedgerDatabase.CreateContext or the registered factory), or the SQLite migrations would be applied to PostgreSQL.");
        base.OnModelCreating(builder);
        builder.ApplyConfigurationsFromAssembly(typeof(LedgerDbContext).Assembly);
    }

    public override int SaveChanges(bool acceptAllChangesOnSuccess)
    {
        BumpVersions();
        return base.SaveChanges(acceptAllChangesOnSuccess);
    }

    public override Task<int> SaveChangesAsync(bool acceptAllChangesOnSuccess, CancellationToken cancellationToken = default)
    {
        BumpVersions();
        return base.SaveChangesAsync(acceptAllChangesOnSuccess, cancellationToken);
    }

    private void BumpVersions()
    {
        if (KeepVersionsAsGiven) return;
        foreach (var entry in ChangeTracker.Entries<IVersioned>())
        {
            if (entry.State == EntityState.Modified) entry.Entity.Version++;
            else if (entry.State == EntityState.Added && entry.Entity.Version == 0) entry.Entity.Version = 1;
        }
    }
}
