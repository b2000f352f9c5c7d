using BarrierLedger.Web.Components.Account;
using BarrierLedger.Web.Components.Layout;

namespace BarrierLedger.Web.Tests.Layout;

public class NavMenuTests
{
    [Fact]
    public void Member_SeesNeitherReviewQueueNorAccounts()
    {
        using var ctx = new BunitContext();
        ctx.AddAuthorization().SetAuthorized("mira");
        var menu = ctx.Render<NavMenu>();
        Assert.Contains("Ledger", menu.Markup);
        Assert.DoesNotContain("Review queue", menu.Markup);
        Assert.DoesNotContain("Accounts", menu.Markup);
    }

    [Fact]
    public void Reviewer_SeesReviewQueue_Admin_SeesAccounts()
    {
        using var reviewerCtx = new BunitContext();
        reviewerCtx.AddAuthorization().SetAuthorized("pi").SetPolicies(Policies.Reviewer);
        var reviewerMenu = reviewerCtx.Render<NavMenu>();
        Assert.Contains("Review queue", reviewerMenu.Markup);
        Assert.DoesNotContain("Accounts", reviewerMenu.Markup);

        using var adminCtx = new BunitContext();
        adminCtx.AddAuthorization().SetAuthorized("admin").SetPolicies(Policies.Reviewer, Policies.Admin);
        Assert.Contains("Accounts", adminCtx.Render<NavMenu>().Markup);
    }
}
