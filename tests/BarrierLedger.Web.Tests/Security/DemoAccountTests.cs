using BarrierLedger.Ledger.Accounts;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Web.Hosting;
using BarrierLedger.Web.Tests.Endpoints;
using Microsoft.AspNetCore.Identity;
using Microsoft.Extensions.DependencyInjection;

namespace BarrierLedger.Web.Tests.Security;

/// <summary>
/// Issue 19, finding 3: demo accounts with public passwords (one a Reviewer) only where they cannot hurt — the newcomer's first
/// local start on the embedded store — and an admin can remove them.
/// </summary>
public sealed class DemoAccountTests
{
    public static TheoryData<bool?, StoreProvider, string, bool, bool> Cases => new()
    {
        // explicit setting, store, --urls, production flag, demo loaded
        { null, StoreProvider.Sqlite, "http://127.0.0.1:5080", false, true },           // the README's first start
        { null, StoreProvider.Sqlite, "http://localhost:5080;http://[::1]:5080", false, true },
        { null, StoreProvider.Sqlite, "http://0.0.0.0:5080", false, false },            // the campus network
        { null, StoreProvider.Sqlite, "http://127.0.0.1:5080;http://*:5081", false, false },
        { null, StoreProvider.Sqlite, "http://lab-server.example:5080", false, false },
        { null, StoreProvider.PostgreSQL, "http://127.0.0.1:5080", false, false },      // a shared store
        { null, StoreProvider.Sqlite, "http://127.0.0.1:5080", true, false },           // the production flag
        { true, StoreProvider.PostgreSQL, "http://0.0.0.0:5080", true, true },          // asked for explicitly
        { false, StoreProvider.Sqlite, "http://127.0.0.1:5080", false, false },         // --no-demo
    };

    [Theory, MemberData(nameof(Cases))]
    public void DemoPolicy_LoadsUnaskedOnlyOnTheFirstLocalStartOnTheEmbeddedStore(bool? explicitSetting, StoreProvider store, string urls, bool production, bool loads)
    {
        var decision = DemoPolicy.Decide(explicitSetting, store, urls.Split(';'), production);
        Assert.Equal(loads, decision.Load);
        Assert.False(string.IsNullOrWhiteSpace(decision.Reason));
    }

    [Theory]
    [InlineData("BarrierLedger:Production", "true")]
    [InlineData("urls", "http://127.0.0.1:0;http://0.0.0.0:0")]
    public async Task FirstStart_OnANetworkAddressOrWithTheProductionFlag_CreatesNoDemoAccounts(string key, string value)
    {
        await using var host = new ApiTestHost(new Dictionary<string, string?> { ["BarrierLedger:LoadDemo"] = null, [key] = value });
        await using var scope = host.Services.CreateAsyncScope();
        var users = scope.ServiceProvider.GetRequiredService<UserManager<LedgerUser>>();

        Assert.Null(await users.FindByNameAsync(DemoAccounts.ReviewerUserName));
        Assert.Null(await users.FindByNameAsync(DemoAccounts.MemberUserName));
        Assert.Equal(0, (await host.CountsAsync()).Studies);
        using var anonymous = host.Client();
        Assert.DoesNotContain(DemoAccounts.ReviewerPassword, await anonymous.GetStringAsync("/Account/Login"));
    }
}
