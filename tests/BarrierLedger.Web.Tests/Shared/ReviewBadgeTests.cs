using BarrierLedger.Ledger.Reviews;
using BarrierLedger.Web.Components.Shared;

namespace BarrierLedger.Web.Tests.Shared;

public class ReviewBadgeTests
{
    [Theory]
    [InlineData(ReviewState.Verified, "badge-ok", "✔", "Verified")]
    [InlineData(ReviewState.Returned, "badge-bad", "↩", "Returned")]
    [InlineData(ReviewState.AwaitingReview, "badge-warn", "…", "Awaiting review")]
    [InlineData(ReviewState.Reopened, "badge-warn", "↻", "Reopened, awaiting review")]
    public void Status_ShownByWordAndIcon_NotColourAlone(ReviewState status, string css, string icon, string word)
    {
        using var ctx = new BunitContext();
        var badge = ctx.Render<ReviewBadge>(p => p.Add(c => c.Status, status)).Find("span.badge");
        Assert.Contains(css, badge.ClassList);
        Assert.Equal(icon, badge.QuerySelector("[aria-hidden=true]")!.TextContent);
        Assert.Equal($"{icon} {word}", badge.TextContent.Trim());
    }

    [Fact]
    public void NoStatus_SaysWhetherThereIsASaddlePointToReview()
    {
        using var ctx = new BunitContext();
        var none = ctx.Render<ReviewBadge>(p => p.Add(c => c.Status, null).Add(c => c.SaddlePointCount, 0)).Find("span.badge");
        Assert.EndsWith("No saddle point", none.TextContent.Trim());
        Assert.Contains("badge-none", none.ClassList);

        var unreviewed = ctx.Render<ReviewBadge>(p => p.Add(c => c.Status, null).Add(c => c.SaddlePointCount, 2)).Find("span.badge");
        Assert.EndsWith("Not reviewed", unreviewed.TextContent.Trim());
    }

    [Fact]
    public void Verified_TitleSaysEverySaddlePointIsSignedOff()
    {
        using var ctx = new BunitContext();
        var badge = ctx.Render<ReviewBadge>(p => p.Add(c => c.Status, ReviewState.Verified)).Find("span.badge");
        Assert.Equal("Every saddle point of this reaction is signed off by a reviewer.", badge.GetAttribute("title"));
    }
}
