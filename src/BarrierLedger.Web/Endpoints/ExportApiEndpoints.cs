using BarrierLedger.Core.Units;
using BarrierLedger.Ledger.Export;

namespace BarrierLedger.Web.Endpoints;

/// <summary>The export downloads over the API, through the same <see cref="ExportService"/> as the Export screen (same bytes).</summary>
internal static class ExportApiEndpoints
{
    public static void Map(RouteGroupBuilder api)
    {
        api.MapGet("/studies/{studyId:int}/exports/table", async (int studyId, string? format, string? unit, int? decimals, ExportService exports, CancellationToken ct) =>
            {
                if (!TryEnum(format ?? "csv", out TableFormat f)) return ApiProblems.BadRequest($"format '{format}' is not one of {string.Join(", ", Enum.GetNames<TableFormat>())}.");
                if (!BarrierUnits.TryParse(unit, out var u, out var why)) return ApiProblems.BadRequest($"unit: {why}");
                if (decimals is < 0 or > 6) return ApiProblems.BadRequest("decimals must be between 0 and 6.");
                return await FileAsync(() => exports.TableAsync(studyId, null, f, TableOptions.Default with { Unit = u, Decimals = decimals ?? 1 }, ct));
            })
            .RequireApi(ApiPolicies.Read).WithName("ExportTable")
            .WithSummary("Barrier table of a study: ?format=Csv|Xlsx|Latex|Markdown, &unit=kcal/mol|kJ/mol|eV|hartree (or KcalPerMol|KJPerMol|ElectronVolt|Hartree; not a wavenumber), &decimals=1");

        api.MapGet("/reactions/{reactionId:int}/exports/diagram", async (int reactionId, string? format, string? quantity, string? unit, int? decimals, ExportService exports, CancellationToken ct) =>
            {
                var q = (quantity ?? "G").ToUpperInvariant() switch { "G" => "ΔG", "H" => "ΔH", "E" => "ΔE", _ => null };
                if (q is null) return ApiProblems.BadRequest($"quantity '{quantity}' is not one of G, H, E.");
                if (!BarrierUnits.TryParse(unit, out var u, out var why)) return ApiProblems.BadRequest($"unit: {why}");
                var png = string.Equals(format, "png", StringComparison.OrdinalIgnoreCase);
                if (!png && format is not null && !string.Equals(format, "svg", StringComparison.OrdinalIgnoreCase)) return ApiProblems.BadRequest($"format '{format}' is not one of svg, png.");
                return await FileAsync(async () =>
                {
                    var (svg, pngFile) = await exports.DiagramAsync(reactionId, q, u, decimals ?? 1, ct);
                    return png ? pngFile : svg;
                });
            })
            .RequireApi(ApiPolicies.Read).WithName("ExportDiagram")
            .WithSummary("Energy diagram of a reaction: ?format=svg|png, &quantity=G|H|E, &unit=KcalPerMol|…, &decimals=1");

        api.MapGet("/studies/{studyId:int}/exports/coordinates", async (int studyId, string? format, ExportService exports, CancellationToken ct) =>
            {
                var zip = string.Equals(format, "zip", StringComparison.OrdinalIgnoreCase);
                if (!zip && format is not null && !string.Equals(format, "txt", StringComparison.OrdinalIgnoreCase)) return ApiProblems.BadRequest($"format '{format}' is not one of txt, zip.");
                return await FileAsync(() => zip ? exports.SupportingInfoZipAsync(studyId, ct) : exports.SupportingInfoTextAsync(studyId, ct));
            })
            .RequireApi(ApiPolicies.Read).WithName("ExportCoordinates")
            .WithSummary("Supporting-information coordinates of a study: ?format=txt (one text file) or zip (one XYZ per structure)");
    }

    private static bool TryEnum<T>(string text, out T value) where T : struct, Enum =>
        Enum.TryParse(text.Replace("-", "").Replace("/", "Per"), ignoreCase: true, out value) && Enum.IsDefined(value);

    private static async Task<IResult> FileAsync(Func<Task<ExportFile>> make)
    {
        try
        {
            var f = await make();
            return Results.File(f.Content, f.ContentType, f.FileName);
        }
        catch (ArgumentException e) when (e.Message.StartsWith("There is no", StringComparison.Ordinal))
        {
            return ApiProblems.NotFound(e.Message);
        }
        catch (ArgumentException e)
        {
            return ApiProblems.BadRequest(e.Message);
        }
        catch (InvalidOperationException e)
        {
            return ApiProblems.Problem(StatusCodes.Status409Conflict, "nothing-to-export", "Nothing to export", e.Message);
        }
    }
}
