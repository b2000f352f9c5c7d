using System.Security.Claims;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Reactions;

namespace BarrierLedger.Web.Endpoints;

/// <summary>A reaction saved through the API: its id and the version a later edit must name.</summary>
public sealed record ApiReactionSaved(int ReactionId, long Version);

/// <summary>An edit: the new definition and the version it was made on (from GET …/definition or the last save).</summary>
public sealed record ApiReactionEdit(ReactionDefinition Definition, long ExpectedVersion);

/// <summary>
/// Build and edit reactions from stored results over the API, through the same <see cref="ReactionBuilderService"/> as the browser's
/// builder (same rules, same audit, same derivation), the study workspace a script needs for the ids, and a reaction as a bundle zip.
/// </summary>
internal static class ReactionEndpoints
{
    public static void Map(RouteGroupBuilder api)
    {
        api.MapGet("/studies/{studyId:int}/workspace", async (int studyId, WorkspaceQueryService q, CancellationToken ct) =>
                await q.GetWorkspaceAsync(studyId, ct) is { } w ? Results.Ok(w) : ApiProblems.NotFound($"There is no study {studyId}."))
            .RequireApi(ApiPolicies.Read).Produces<StudyWorkspace>().ProducesProblem(StatusCodes.Status404NotFound)
            .WithName("GetWorkspace").WithSummary("A study's species with their calculations, its scans and reactions: the ids a reaction definition names");

        api.MapPost("/studies/{studyId:int}/reactions/preview", async (int studyId, ReactionDefinition definition, WorkspaceQueryService q, ReactionBuilderService builder, CancellationToken ct) =>
                await q.GetWorkspaceAsync(studyId, ct) is null ? ApiProblems.NotFound($"There is no study {studyId}.")
                    : Results.Ok(await builder.PreviewAsync(studyId, definition, null, ct)))
            .RequireApi(ApiPolicies.Read).Produces<ReactionPreview>().ProducesProblem(StatusCodes.Status404NotFound)
            .WithName("PreviewReaction").WithSummary("What saving this definition would give (problems, balance, derived numbers, checks); stores nothing");

        api.MapPost("/studies/{studyId:int}/reactions", async (int studyId, ReactionDefinition definition, WorkspaceQueryService q, ReactionBuilderService builder,
                ClaimsPrincipal user, CancellationToken ct) =>
            {
                if (await q.GetWorkspaceAsync(studyId, ct) is not { } w) return ApiProblems.NotFound($"There is no study {studyId}.");
                if (w.Retired) return ApiProblems.BadRequest($"Study '{w.Name}' is retired; restore it before adding reactions to it.");
                var result = await builder.CreateAsync(studyId, definition, user.FindFirstValue(ClaimTypes.NameIdentifier)!, ct);
                return Saved(result, created: true);
            })
            .RequireApi(ApiPolicies.Upload).Produces<ApiReactionSaved>(StatusCodes.Status201Created)
            .ProducesProblem(StatusCodes.Status404NotFound).ProducesProblem(StatusCodes.Status422UnprocessableEntity)
            .WithName("CreateReaction").WithSummary("Build a reaction from stored results (upload scope); derived like an uploaded one");

        api.MapGet("/reactions/{reactionId:int}/definition", async (int reactionId, ReactionBuilderService builder, CancellationToken ct) =>
                await builder.GetDefinitionAsync(reactionId, ct) is { } d ? Results.Ok(d) : ApiProblems.NotFound($"There is no reaction {reactionId}."))
            .RequireApi(ApiPolicies.Read).Produces<StoredDefinition>().ProducesProblem(StatusCodes.Status404NotFound)
            .WithName("GetReactionDefinition").WithSummary("A reaction's definition and the version an edit must name");

        api.MapPut("/reactions/{reactionId:int}", async (int reactionId, ApiReactionEdit edit, ReactionBuilderService builder, ClaimsPrincipal user, CancellationToken ct) =>
            {
                if (await builder.GetDefinitionAsync(reactionId, ct) is null) return ApiProblems.NotFound($"There is no reaction {reactionId}.");
                var result = await builder.UpdateAsync(reactionId, edit.Definition, edit.ExpectedVersion, user.FindFirstValue(ClaimTypes.NameIdentifier)!, ct);
                return Saved(result, created: false);
            })
            .RequireApi(ApiPolicies.Upload).Produces<ApiReactionSaved>()
            .ProducesProblem(StatusCodes.Status404NotFound).ProducesProblem(StatusCodes.Status409Conflict).ProducesProblem(StatusCodes.Status422UnprocessableEntity)
            .WithName("EditReaction").WithSummary("Save a new version of a reaction (upload scope); 409 when someone saved it since the version named");

        api.MapGet("/reactions/{reactionId:int}/bundle", (int reactionId, ReactionBundleService bundles, HttpContext http, CancellationToken ct) => BundleAsync(reactionId, bundles, http, ct))
            .RequireApi(ApiPolicies.Read).Produces(StatusCodes.Status200OK, contentType: "application/zip").ProducesProblem(StatusCodes.Status404NotFound)
            .WithName("GetReactionBundle").WithSummary("The reaction as a BarrierLedger bundle zip (manifest + original files) that uploads again to the same reaction");
    }

    /// <summary>The bundle zip; what the format cannot carry is named in the X-BarrierLedger-Not-Carried header.</summary>
    internal static async Task<IResult> BundleAsync(int reactionId, ReactionBundleService bundles, HttpContext http, CancellationToken ct)
    {
        if (await bundles.ExportAsync(reactionId, ct) is not { } file) return ApiProblems.NotFound($"There is no reaction {reactionId}.");
        if (file.NotCarried.Count > 0) http.Response.Headers["X-BarrierLedger-Not-Carried"] = string.Join(" | ", file.NotCarried);
        return Results.File(file.Zip, "application/zip", file.FileName);
    }

    private static IResult Saved(ReactionSaveResult result, bool created)
    {
        if (result.Conflict is { } conflict) return ApiProblems.Problem(StatusCodes.Status409Conflict, "version-conflict", "Saved by someone else", conflict);
        if (!result.Saved)
            return ApiProblems.Problem(StatusCodes.Status422UnprocessableEntity, "reaction-invalid", "Nothing was saved",
                $"The reaction has {result.Problems.Count} problem(s); nothing was saved.",
                new Dictionary<string, object?> { ["problems"] = result.Problems });
        var body = new ApiReactionSaved(result.ReactionId!.Value, result.Version);
        return created ? Results.Created($"{ApiExtensions.Prefix}/reactions/{body.ReactionId}", body) : Results.Ok(body);
    }
}
