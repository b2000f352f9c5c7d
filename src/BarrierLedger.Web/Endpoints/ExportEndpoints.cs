using System.Globalization;
using System.Security.Claims;
using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Auditing;
using BarrierLedger.Ledger.Backups;
using BarrierLedger.Ledger.Export;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Storage;
using BarrierLedger.Ledger.Uploads;
using BarrierLedger.Web.Components.Account;
using Microsoft.AspNetCore.Authorization;
using Microsoft.AspNetCore.Identity;

namespace BarrierLedger.Web.Endpoints;

/// <summary>
/// Downloads behind the Export screen (and for scripts with an access token): barrier tables, diagrams, supporting-information
/// coordinates, original uploaded files byte for byte, and for admins the whole-ledger backup. Bad choices give 400 with the reason; unknown ids 404.
/// </summary>
public static class ExportEndpoints
{
    public const string Prefix = "/export/download";

    /// <summary>Signed in with the app's cookie, or with an access token.</summary>
    private static readonly AuthorizationPolicy s_signedIn = new AuthorizationPolicyBuilder(IdentityConstants.ApplicationScheme, AccessTokenAuthenticationHandler.SchemeName)
        .RequireAuthenticatedUser().Build();

    public static IEndpointRouteBuilder MapExportEndpoints(this IEndpointRouteBuilder endpoints)
    {
        var group = endpoints.MapGroup(Prefix).RequireAuthorization(s_signedIn).RequireRateLimiting(Hosting.RequestLimits.DownloadPolicy).ExcludeFromDescription();
        group.MapGet("/table", TableAsync);
        group.MapGet("/diagram/{reactionId:int}.{format}", DiagramAsync);
        group.MapGet("/coordinates", (int study, string? format, ExportService export, CancellationToken ct) => Guard(async () =>
        {
            var file = format == "zip" ? await export.SupportingInfoZipAsync(study, ct) : await export.SupportingInfoTextAsync(study, ct);
            return File(file);
        }));
        group.MapGet("/file/{fileId:int}", async (int fileId, WorkspaceQueryService files, CancellationToken ct) =>
            await files.GetStoredFileAsync(fileId, ct) is { } f
                ? Results.File(f.Content, "application/octet-stream", Path.GetFileName(f.FileName.Replace('!', '/')))
                : ApiProblems.NotFound($"There is no stored file {fileId}."));
        group.MapGet("/bundle/{reactionId:int}", (int reactionId, BarrierLedger.Ledger.Reactions.ReactionBundleService bundles, HttpContext http, CancellationToken ct) =>
            ReactionEndpoints.BundleAsync(reactionId, bundles, http, ct));
        group.MapGet("/isotope-effects/{reactionId:int}", (int reactionId, string? format, BarrierLedger.Ledger.IsotopeEffects.IsotopeEffectService service, CancellationToken ct) =>
            IsotopeEffectEndpoints.GetAsync(reactionId, format ?? "csv", service, ct));
        endpoints.MapGet(Prefix + "/backup", BackupAsync).RequireAuthorization(Policies.Admin).RequireRateLimiting(Hosting.RequestLimits.DownloadPolicy).ExcludeFromDescription();
        return endpoints;
    }

    /// <summary>The URL of a table download, as the Export screen builds it.</summary>
    public static string TableUrl(int studyId, TableFormat format, IEnumerable<int>? reactionIds, IEnumerable<ExportColumn> columns, EnergyUnit unit, int decimals)
    {
        var q = new List<string> { $"study={studyId}", $"format={format.ToString().ToLowerInvariant()}", $"columns={string.Join(",", columns)}", $"unit={unit}", $"decimals={decimals}" };
        if (reactionIds is not null) q.Add($"reactions={string.Join(",", reactionIds)}");
        return $"{Prefix}/table?{string.Join("&", q)}";
    }

    private static Task<IResult> TableAsync(int study, string? format, string? reactions, string? columns, string? unit, int? decimals, ExportService export, CancellationToken ct) => Guard(async () =>
    {
        if (!Enum.TryParse<TableFormat>(format ?? "csv", true, out var f)) return ApiProblems.BadRequest($"format must be csv, xlsx, latex or markdown, not '{format}'.");
        var cols = new List<ExportColumn>();
        foreach (var c in (columns ?? "").Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
        {
            if (!Enum.TryParse<ExportColumn>(c, true, out var col) || !Enum.IsDefined(col)) return ApiProblems.BadRequest($"unknown column '{c}'; columns are {string.Join(", ", Enum.GetNames<ExportColumn>())}.");
            cols.Add(col);
        }
        var ids = new List<int>();
        foreach (var r in (reactions ?? "").Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
        {
            if (!int.TryParse(r, NumberStyles.Integer, CultureInfo.InvariantCulture, out var id)) return ApiProblems.BadRequest($"reaction id '{r}' is not a number.");
            ids.Add(id);
        }
        if (!BarrierUnits.TryParse(unit, out var u, out var why)) return ApiProblems.BadRequest($"unit: {why}");
        var options = new TableOptions(cols.Count == 0 ? TableOptions.DefaultColumns : cols, u, decimals ?? 1);
        return File(await export.TableAsync(study, reactions is null ? null : ids, f, options, ct));
    });

    private static Task<IResult> DiagramAsync(int reactionId, string format, string? quantity, string? unit, int? decimals, ExportService export, CancellationToken ct) => Guard(async () =>
    {
        if (format is not ("svg" or "png")) return ApiProblems.BadRequest($"a diagram is svg or png, not '{format}'.");
        if (quantity is not (null or "G" or "H" or "E")) return ApiProblems.BadRequest($"quantity must be G, H or E, not '{quantity}'.");
        if (!BarrierUnits.TryParse(unit, out var u, out var why)) return ApiProblems.BadRequest($"unit: {why}");
        var (svg, png) = await export.DiagramAsync(reactionId, "Δ" + (quantity ?? "G"), u, decimals ?? 1, ct);
        return File(format == "svg" ? svg : png);
    });

    /// <summary>The admin's backup download; each one is audited (who, when, the archive's size), since a backup holds the whole ledger.</summary>
    private static async Task<IResult> BackupAsync(BackupService backup, AuditService audit, HttpContext http, CancellationToken ct)
    {
        var ms = new MemoryStream();
        BackupManifest manifest;
        try
        {
            manifest = await backup.CreateArchiveAsync(ms, ct);
        }
        catch (NotSupportedException ex) // a PostgreSQL ledger: backed up with pg_dump, not as this archive
        {
            return ApiProblems.Problem(StatusCodes.Status409Conflict, "not-exportable", "Cannot export", ex.Message);
        }
        var name = $"barrierledger-backup-{manifest.CreatedAt.UtcDateTime:yyyyMMdd-HHmmss}.zip";
        var user = http.User.FindFirstValue(ClaimTypes.NameIdentifier)!;
        await audit.RecordAsync(user, BackupDownloaded, "Backup", name,
            $"Backup {name} downloaded: {ms.Length.ToString(CultureInfo.InvariantCulture)} bytes ({StorageQuota.Format(ms.Length)}), the database and {manifest.Files.Count} stored file(s).", ct);
        ms.Position = 0;
        return Results.File(ms, "application/zip", name);
    }

    /// <summary>The audit action of a backup download.</summary>
    public const string BackupDownloaded = "backup.downloaded";

    private static IResult File(ExportFile f) => Results.File(f.Content, f.ContentType, f.FileName);

    private static async Task<IResult> Guard(Func<Task<IResult>> action)
    {
        try
        {
            return await action();
        }
        catch (ArgumentException ex)
        {
            return ex.Message.StartsWith("There is no", StringComparison.Ordinal) ? ApiProblems.NotFound(ex.Message) : ApiProblems.BadRequest(ex.Message);
        }
        catch (InvalidOperationException ex)
        {
            return ApiProblems.Problem(StatusCodes.Status409Conflict, "not-exportable", "Cannot export", ex.Message);
        }
    }
}
