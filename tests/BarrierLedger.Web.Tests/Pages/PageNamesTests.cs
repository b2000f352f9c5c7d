using System.Reflection;
using Microsoft.AspNetCore.Components;

namespace BarrierLedger.Web.Tests.Pages;

/// <summary>
/// One suffix for routable pages (DEVELOPERS.md): every component with a route ends in "Page", and nothing without a route
/// does, so a newcomer can tell a screen from a piece of one by its name.
/// </summary>
public sealed class PageNamesTests
{
    private static readonly Type[] Components = typeof(Program).Assembly.GetTypes()
        .Where(t => typeof(IComponent).IsAssignableFrom(t) && !t.IsAbstract && t.Namespace?.StartsWith("BarrierLedger.Web", StringComparison.Ordinal) == true)
        .ToArray();

    [Fact]
    public void RoutableComponents_AllEndInPage()
    {
        var routed = Components.Where(t => t.GetCustomAttributes<RouteAttribute>().Any()).ToList();
        Assert.NotEmpty(routed);
        var wrong = routed.Where(t => !t.Name.EndsWith("Page", StringComparison.Ordinal)).Select(t => t.FullName).ToList();
        Assert.True(wrong.Count == 0, "routable components not named *Page: " + string.Join(", ", wrong));
    }

    [Fact]
    public void ComponentsWithoutARoute_DoNotEndInPage()
    {
        var wrong = Components.Where(t => t.Name.EndsWith("Page", StringComparison.Ordinal) && !t.GetCustomAttributes<RouteAttribute>().Any())
            .Select(t => t.FullName).ToList();
        Assert.True(wrong.Count == 0, "components named *Page without a route: " + string.Join(", ", wrong));
    }
}
