using Microsoft.AspNetCore.Components;

namespace BarrierLedger.Web.Components.Account;

/// <summary>Redirects from static server-rendered account pages, refusing open redirects.</summary>
internal sealed class IdentityRedirectManager(NavigationManager navigationManager)
{
    public const string StatusCookieName = "BarrierLedger.StatusMessage";

    private static readonly CookieBuilder s_statusCookie = new()
    {
        SameSite = SameSiteMode.Strict,
        HttpOnly = true,
        IsEssential = true,
        MaxAge = TimeSpan.FromSeconds(5),
    };

    public void RedirectTo(string? uri)
    {
        uri ??= "";
        if (!Uri.IsWellFormedUriString(uri, UriKind.Relative) || uri.StartsWith("//", StringComparison.Ordinal))
            uri = navigationManager.ToBaseRelativePath(uri);
        navigationManager.NavigateTo(uri);
    }

    public void RedirectToWithStatus(string uri, string message, HttpContext context)
    {
        context.Response.Cookies.Append(StatusCookieName, message, s_statusCookie.Build(context));
        RedirectTo(uri);
    }
}
