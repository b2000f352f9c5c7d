using BarrierLedger.Ledger;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Uploads;
using BarrierLedger.Web.Components.Account;
using BarrierLedger.Web.Components.Pages.Review;
using BarrierLedger.Web.Tests.Endpoints;
using Microsoft.Data.Sqlite;
using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.Configuration;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.Web.Tests.Review;

/// <summary>The review queue on a real SQLite ledger in a temporary folder, filled through the upload workflow.</summary>
public sealed class ReviewQueuePageTests : IDisposable
{
    private readonly string _dataDirectory = Path.Combine(Path.GetTempPath(), "bl-review-" + Guid.NewGuid().ToString("N")[..10]);
    private readonly BunitContext _ctx = new();

    /// <summary>Stores <paramref name="saddlePoints"/> studies of one H-exchange pathway each (one saddle point awaiting review apiece).</summary>
    private async Task<IRenderedComponent<ReviewQueuePage>> RenderQueueAsync(int saddlePoints, params string[] policies)
    {
        var config = new ConfigurationBuilder()
            .AddInMemoryCollection(new Dictionary<string, string?> { ["BarrierLedger:DataDirectory"] = _dataDirectory }).Build();
        _ctx.Services.AddLedger(config);
        _ctx.AddAuthorization().SetAuthorized("mira").SetPolicies(policies);
        await LedgerDatabase.PrepareAsync(_ctx.Services.GetRequiredService<LedgerOptions>(), _ctx.Services.GetRequiredService<IDbContextFactory<LedgerDbContext>>());
        var uploads = _ctx.Services.GetRequiredService<UploadService>();
        for (var i = 1; i <= saddlePoints; i++)
        {
            var stored = await uploads.StoreAsync([new UploadFile("bundle.json", ApiFiles.ExchangeBundle($"Study {i:00}"))], new UploadChoices(), "uploader-1");
            Assert.True(stored.Stored, string.Join("; ", stored.Errors));
        }
        var cut = _ctx.Render<ReviewQueuePage>();
        cut.WaitForAssertion(() => Assert.NotEmpty(cut.FindAll("article")), TimeSpan.FromSeconds(30));
        return cut;
    }

    [Fact]
    public async Task Member_SeesTheEvidence_ButNoVerifyOrReturnButtons()
    {
        var cut = await RenderQueueAsync(1);
        Assert.Contains("TS in H exchange", cut.Find("article h2").TextContent);
        Assert.Empty(cut.FindAll("button"));
        Assert.Empty(cut.FindAll("textarea"));
    }

    [Fact]
    public async Task Reviewer_GetsVerifyAndReturnForEachSaddlePoint()
    {
        var cut = await RenderQueueAsync(1, Policies.Reviewer);
        Assert.Equal(["Verify", "Return to owner"], cut.FindAll("article button").Select(b => b.TextContent));
        Assert.Single(cut.FindAll("article textarea"));
    }

    [Fact]
    public async Task ALongQueue_IsShownAPageAtATime()
    {
        var total = ReviewQueuePage.PageSize + 3;
        var cut = await RenderQueueAsync(total, Policies.Reviewer);

        Assert.Equal(ReviewQueuePage.PageSize, cut.FindAll("article").Count);
        Assert.Equal($"Saddle points 1–{ReviewQueuePage.PageSize} of {total} awaiting sign-off.", cut.Find("p[role=status]").TextContent);
        Assert.True(cut.Find("nav.paginator button:first-child").HasAttribute("disabled"));

        cut.FindAll("nav.paginator button").Single(b => b.TextContent == "Next").Click();
        cut.WaitForAssertion(() => Assert.Equal(3, cut.FindAll("article").Count), TimeSpan.FromSeconds(30)); // the next page is queried afresh
        Assert.Equal($"Saddle points {ReviewQueuePage.PageSize + 1}–{total} of {total} awaiting sign-off.", cut.Find("p[role=status]").TextContent);
        Assert.Contains("Page 2 of 2", cut.Find("nav.paginator").TextContent);
        Assert.True(cut.FindAll("nav.paginator button").Single(b => b.TextContent == "Next").HasAttribute("disabled"));

        // Back to where the first page started (the pages are found by key, not by skipping rows).
        cut.FindAll("nav.paginator button").Single(b => b.TextContent == "Previous").Click();
        cut.WaitForAssertion(() => Assert.Equal(ReviewQueuePage.PageSize, cut.FindAll("article").Count), TimeSpan.FromSeconds(30));
        Assert.Equal($"Saddle points 1–{ReviewQueuePage.PageSize} of {total} awaiting sign-off.", cut.Find("p[role=status]").TextContent);
        Assert.Contains("Page 1 of 2", cut.Find("nav.paginator").TextContent);
    }

    public void Dispose()
    {
        _ctx.Dispose();
        SqliteConnection.ClearAllPools();
        try { Directory.Delete(_dataDirectory, recursive: true); } catch (IOException) { }
    }
}
