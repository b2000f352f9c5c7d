using System.Security.Claims;
using Microsoft.AspNetCore.Components.Authorization;

namespace BarrierLedger.Web.Components.Shared;

/// <summary>The signed-in person's user id, as every edit records it.</summary>
public static class CurrentUser
{
    public static async Task<string> IdAsync(Task<AuthenticationState> state) =>
        (await state).User.FindFirstValue(ClaimTypes.NameIdentifier) ?? throw new InvalidOperationException("Not signed in.");
}
