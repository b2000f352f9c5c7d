using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Web.Components.Account;
using BarrierLedger.Web.Components.Pages.Settings;
using BarrierLedger.Web.Tests.Endpoints;
using BarrierLedger.Web.Tests.Support;
using Microsoft.AspNetCore.Identity;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.Web.Tests.Security;

/// <summary>
/// Issue 19, finding 1, on an already open page: the circuit's sign-in still says Reviewer, the store no longer does (the role was
/// removed after the page opened). Saving must ask the store, not the page's copy of the sign-in.
/// </summary>
public sealed class OpenPagePrivilegeTests
{
    [Fact]
    public async Task SettingsSave_ByAFormerReviewerWithTheOpenPage_IsRefusedAndNothingChanges()
    {
        using var ledger = await BunitLedger.CreateAsync(Policies.Reviewer); // the cookie's roles; the store holds no Reviewer role for this user
        var cut = ledger.Context.Render<SettingsPage>();
        cut.WaitForAssertion(() => Assert.NotEmpty(cut.FindAll("form.model-form")), TimeSpan.FromSeconds(30));

        cut.Find("#m-t").Change("310");
        await cut.Find("form.model-form").SubmitAsync();

        cut.WaitForAssertion(() => Assert.Contains("Reviewer", cut.Find("[role=alert]").TextContent), TimeSpan.FromSeconds(30));
        Assert.Contains("Not saved", cut.Find("[role=alert]").TextContent);
        var stored = await ledger.Get<EnergyModelService>().GetGroupDefaultAsync();
        Assert.Equal(0, stored.Version);
        Assert.Equal(ModelSettings.Default.TemperatureKelvin, stored.Settings.TemperatureKelvin);
    }

    [Fact]
    public async Task AccountsPageActions_ByAFormerAdmin_AreRefused_AndGrantNothing()
    {
        await using var host = new ApiTestHost();
        var ada = await CookieSession.CreateUserAsync(host, "ada", Roles.Member, Roles.Admin);
        var accounts = host.Get<UserAdminService>();
        Assert.True((await accounts.SetRoleAsync(ada.Id, ada.Id, Roles.Reviewer, true)).Ok); // still admin: works
        await using (var scope = host.Services.CreateAsyncScope())
        {
            var users = scope.ServiceProvider.GetRequiredService<UserManager<LedgerUser>>();
            await users.RemoveFromRoleAsync((await users.FindByIdAsync(ada.Id))!, Roles.Admin);
        }

        // Her Accounts page is still open; she ticks Admin for herself and tries to create an account.
        var regrant = await accounts.SetRoleAsync(ada.Id, ada.Id, Roles.Admin, true);
        var create = await accounts.CreateAsync(ada.Id, "sock-puppet", "Sock Puppet");

        Assert.False(regrant.Ok);
        Assert.Equal(UserAdminService.NotAdminMessage, regrant.Message);
        Assert.False(create.Ok);
        Assert.Null(create.OneTimePassword);
        Assert.DoesNotContain(Roles.Admin, (await host.Get<AccountAccess>().GetAsync(ada.Id)).Roles);
        Assert.DoesNotContain((await accounts.ListAsync()), r => r.UserName == "sock-puppet");
    }
}
