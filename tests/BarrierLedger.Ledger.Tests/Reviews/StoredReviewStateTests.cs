using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Records;
using BarrierLedger.Ledger.Reviews;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Tests.Export;
using BarrierLedger.Ledger.Tests.Support;
using Microsoft.EntityFrameworkCore;
using Microsoft.EntityFrameworkCore.Infrastructure;
using Microsoft.EntityFrameworkCore.Migrations;

namespace BarrierLedger.Ledger.Tests.Reviews;

/// <summary>
/// Each calculation's stored review state (what the review queue reads) equals the state its history leads to
/// (<see cref="ReviewStates.After"/> of the newest entry) after every kind of entry, and a ledger migrated from before the
/// column existed gets it from its history.
/// </summary>
public sealed class StoredReviewStateTests
{
    private static async Task AssertStoredEqualsHistoryAsync(TempLedger ledger)
    {
        await using var db = await ledger.DbAsync();
        var stored = await db.Calculations.AsNoTracking().Select(c => new { c.Id, c.ReviewState }).ToListAsync();
        var latest = (await db.Reviews.AsNoTracking().Select(v => new { v.Id, v.CalculationId, v.Outcome }).ToListAsync())
            .GroupBy(v => v.CalculationId).ToDictionary(g => g.Key, g => g.MaxBy(v => v.Id)!.Outcome);
        foreach (var c in stored)
            Assert.Equal(ReviewStates.After(latest.TryGetValue(c.Id, out var o) ? o : null), c.ReviewState);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Verify_return_and_reopen_keep_the_stored_state_without_bumping_the_version(StoreProvider store)
    {
        var (ledger, _) = await DemoLedger.CreateAsync(store);
        await using var _l = ledger;
        var reviews = ledger.Get<ReviewService>();
        var reviewer = await ledger.AddUserAsync("pi", Roles.Reviewer);
        var calcs = (await reviews.QueueAsync()).Select(i => i.CalculationId).Distinct().ToList();
        var (a, b) = (calcs[0], calcs[1]);
        long VersionOf(LedgerDbContext db, int id) => db.Calculations.AsNoTracking().Single(c => c.Id == id).Version;
        long versionA;
        await using (var db = await ledger.DbAsync()) versionA = VersionOf(db, a);

        await reviews.VerifyAsync(a, reviewer, "one clean reaction mode");
        await reviews.ReturnAsync(b, reviewer, "the imaginary mode is a methyl rotation");
        await AssertStoredEqualsHistoryAsync(ledger);
        await using (var db = await ledger.DbAsync())
        {
            Assert.Equal(ReviewState.Verified, db.Calculations.AsNoTracking().Single(c => c.Id == a).ReviewState);
            Assert.Equal(ReviewState.Returned, db.Calculations.AsNoTracking().Single(c => c.Id == b).ReviewState);
            Assert.Equal(versionA, VersionOf(db, a));
            await using var tx = await db.Database.BeginTransactionAsync();
            Assert.Equal(ReviewOutcome.Verified, await ReviewStates.ReopenIfDecidedAsync(db, a, reviewer, DateTimeOffset.UtcNow, "an IRC was added", default));
            await db.SaveChangesAsync();
            await tx.CommitAsync();
        }
        await AssertStoredEqualsHistoryAsync(ledger);
        await using (var db = await ledger.DbAsync())
        {
            Assert.Equal(ReviewState.Reopened, db.Calculations.AsNoTracking().Single(c => c.Id == a).ReviewState);
            Assert.Equal(versionA, VersionOf(db, a));
        }
        var waiting = (await reviews.QueueAsync()).Select(i => i.CalculationId).ToList();
        Assert.Contains(a, waiting);
        Assert.DoesNotContain(b, waiting);
    }

    [SkippableTheory, MemberData(nameof(Stores.Both), MemberType = typeof(Stores))]
    public async Task Migrating_a_ledger_from_before_the_column_fills_it_from_the_history(StoreProvider store)
    {
        var (ledger, _) = await DemoLedger.CreateAsync(store);
        await using var _l = ledger;
        var reviews = ledger.Get<ReviewService>();
        var reviewer = await ledger.AddUserAsync("pi", Roles.Reviewer);
        var queue = (await reviews.QueueAsync()).Select(i => i.CalculationId).Distinct().ToList();
        Assert.True(queue.Count >= 4, $"the demo study has several saddle points waiting; found {queue.Count}");
        await reviews.VerifyAsync(queue[0], reviewer, "one clean reaction mode");
        await reviews.ReturnAsync(queue[1], reviewer, "wrong bond");
        await reviews.VerifyAsync(queue[2], reviewer, "fine");
        await using (var db = await ledger.DbAsync())
        {
            await using var tx = await db.Database.BeginTransactionAsync();
            await ReviewStates.ReopenIfDecidedAsync(db, queue[2], reviewer, DateTimeOffset.UtcNow, "a new scan", default);
            await db.SaveChangesAsync();
            await tx.CommitAsync();
        }

        await using (var db = await ledger.DbAsync())
        {
            var migrations = db.Database.GetMigrations().ToList();
            var mine = migrations.FindIndex(m => m.EndsWith("_CalculationReviewState", StringComparison.Ordinal));
            Assert.True(mine > 0, "the migration that adds the stored review state exists");
            var migrator = db.GetService<IMigrator>();
            await migrator.MigrateAsync(migrations[mine - 1]); // the column is gone
            await migrator.MigrateAsync(); // and added again, filled from the history
        }
        await AssertStoredEqualsHistoryAsync(ledger);
        await using (var db = await ledger.DbAsync())
        {
            var four = queue.Take(4).ToList();
            var states = await db.Calculations.AsNoTracking().Where(c => four.Contains(c.Id)).ToDictionaryAsync(c => c.Id, c => c.ReviewState);
            Assert.Equal(ReviewState.Verified, states[queue[0]]);
            Assert.Equal(ReviewState.Returned, states[queue[1]]);
            Assert.Equal(ReviewState.Reopened, states[queue[2]]);
            Assert.Equal(ReviewState.AwaitingReview, states[queue[3]]);
        }
    }
}
