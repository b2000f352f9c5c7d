using BarrierLedger.Ledger;
using BarrierLedger.Ledger.Export;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Web.Components;
using BarrierLedger.Web.Components.Account;
using BarrierLedger.Web.Endpoints;
using BarrierLedger.Web.Hosting;

var builder = WebApplication.CreateBuilder(new WebApplicationOptions
{
    Args = args.Where(a => a != "--no-demo").ToArray(),
    WebRootPath = WebRootLocator.Find(),
});
builder.WebHost.UseBarrierLedgerDefaultAddress(builder.Configuration);
builder.WebHost.UseStaticWebAssets();

builder.Services.AddRazorComponents().AddInteractiveServerComponents();
builder.Services.AddLedger(builder.Configuration);
builder.Services.AddBarrierLedgerAuth();
builder.Services.AddBarrierLedgerDataProtection(builder.Configuration);
builder.Services.AddBarrierLedgerDemo(builder.Configuration, args);
builder.Services.AddBarrierLedgerApi(builder.Configuration);
builder.Services.AddLedgerExports();
builder.Services.AddBarrierLedgerTransportSecurity(builder.Configuration);
builder.Services.AddBarrierLedgerRequestLimits(builder.Configuration);

var app = builder.Build();

await app.PrepareStoreAsync();

app.UseBarrierLedgerTransportSecurity();
if (!app.Environment.IsDevelopment())
{
    app.UseExceptionHandler("/Error", createScopeForErrors: true);
}
app.UseStatusCodePagesWithReExecute("/not-found", createScopeForStatusCodePages: true);
app.UseStaticFiles();
app.UseRouting();
app.UseAuthentication();
app.UseBarrierLedgerRequestLimits();
app.UseAuthorization();
app.UseMustChangePassword();
app.UseAntiforgery();

app.MapStaticAssets().AllowAnonymous();
app.MapRazorComponents<App>().AddInteractiveServerRenderMode();
app.MapAccountEndpoints();
app.MapBarrierLedgerApi();
app.MapExportEndpoints();
app.MapGet("/health", () => Results.Ok(new { status = "ok" })).AllowAnonymous();

app.Run();

/// <summary>Entry point type, visible to the test projects.</summary>
public partial class Program;
