using System.Globalization;
using System.Security.Claims;
using System.Security.Cryptography;
using BarrierLedger.Core.Chemistry;
using BarrierLedger.Ledger.Uploads;
using Microsoft.AspNetCore.Http.Features;
using Microsoft.AspNetCore.Mvc;

namespace BarrierLedger.Web.Endpoints;

/// <summary>A file the API received: its name, size and SHA-256 (so a client can match it with what it sent).</summary>
public sealed record ApiFileReceipt(string Name, long SizeBytes, string Sha256);

/// <summary>
/// A stored upload. <see cref="AlreadyStored"/>: an upload with the same key was stored before and nothing new was written.
/// <see cref="Duplicates"/>: records that were already in the ledger from the same file and were not stored again.
/// <see cref="Conformers"/>: for each species the upload gave conformers to, their count, duplicates and mirror images.
/// </summary>
public sealed record UploadResponse(bool Stored, bool AlreadyStored, int? UploadId, int? StudyId, IReadOnlyList<int> CalculationIds,
    IReadOnlyList<int> ReactionIds, IReadOnlyList<int> ScanIds, IReadOnlyList<string> Duplicates, IReadOnlyList<ApiIssue> Warnings,
    IReadOnlyList<ApiFileReceipt> Files)
{
    /// <summary>The IRCs written.</summary>
    public IReadOnlyList<int> IrcIds { get; init; } = [];

    /// <summary>For each species the upload gave conformers to: their count, duplicates and mirror-image pairs.</summary>
    public IReadOnlyList<string> Conformers { get; init; } = [];
}

/// <summary>POST /api/v1/uploads (store) and POST /api/v1/uploads/preview (check only): the browser upload's workflow over HTTP.</summary>
internal static class UploadEndpoints
{
    public const string IdempotencyHeader = "Idempotency-Key";

    public static void Map(RouteGroupBuilder api, ApiOptions options)
    {
        api.MapPost("/uploads", StoreAsync)
            .RequireApi(ApiPolicies.Upload)
            .WithMetadata(new RequestSizeLimitAttribute(options.MaxUploadBytes))
            .DisableAntiforgery()
            .Accepts<IFormFileCollection>("multipart/form-data")
            .Produces<UploadResponse>(StatusCodes.Status201Created)
            .Produces<UploadResponse>(StatusCodes.Status200OK)
            .ProducesProblem(StatusCodes.Status400BadRequest)
            .ProducesProblem(StatusCodes.Status409Conflict)
            .ProducesProblem(StatusCodes.Status413PayloadTooLarge)
            .ProducesProblem(StatusCodes.Status422UnprocessableEntity)
            .ProducesProblem(StatusCodes.Status503ServiceUnavailable)
            .WithName("StoreUpload")
            .WithSummary("Store files as one upload (all or nothing)")
            .WithDescription("multipart/form-data: one or more file parts (any field name; a bundle manifest may be sent as field 'manifest'), " +
                "and optional fields study, studyId, species, kind, level, charge, multiplicity, scanAtoms (e.g. '2,3'), attachToState, " +
                "ircOf (the saddle-point calculation label that the XYZ files are an IRC of: one file = path, two = forward/backward ends), uploadKey. " +
                "The Idempotency-Key header (or uploadKey) makes a retried upload store nothing twice; a key belongs to its user, and the same key " +
                "with other files or choices is refused with 409 (idempotency-key-reused). An upload that would take the user past the storage quota " +
                "(BarrierLedger:Uploads:UserQuotaMiB) is refused with 413 (storage-quota-exceeded, with quotaBytes, usedBytes and uploadBytes).");

        api.MapPost("/uploads/preview", PreviewAsync)
            .RequireApi(ApiPolicies.Read)
            .WithMetadata(new RequestSizeLimitAttribute(options.MaxUploadBytes))
            .DisableAntiforgery()
            .Accepts<IFormFileCollection>("multipart/form-data")
            .Produces<UploadPreview>()
            .ProducesProblem(StatusCodes.Status413PayloadTooLarge)
            .ProducesProblem(StatusCodes.Status503ServiceUnavailable)
            .WithName("PreviewUpload")
            .WithSummary("Read and check files against the ledger without storing anything");
    }

    private static async Task<IResult> StoreAsync(HttpRequest request, UploadService uploads, ApiOptions options, ClaimsPrincipal user, CancellationToken ct)
    {
        var (received, problem) = await ReadAsync(request, options, ct);
        if (problem is not null) return problem;
        var userId = user.FindFirstValue(ClaimTypes.NameIdentifier)!;
        UploadOutcome outcome;
        try { outcome = await uploads.StoreAsync(received!.Files, received.Choices, userId, ct); }
        catch (UploadsBusyException busy) { return Busy(request, busy); }
        if (outcome.KeyConflict is { } clash)
            return ApiProblems.Problem(StatusCodes.Status409Conflict, "idempotency-key-reused", "Upload key already used for other content", clash);
        if (outcome.QuotaRefusal is { } quota)
            return ApiProblems.Problem(StatusCodes.Status413PayloadTooLarge, "storage-quota-exceeded", "Storage quota reached", quota.Message,
                new Dictionary<string, object?> { ["quotaBytes"] = quota.QuotaBytes, ["usedBytes"] = quota.UsedBytes, ["uploadBytes"] = quota.UploadBytes });
        if (!outcome.Stored) return ApiProblems.UploadRejected(outcome.Issues);
        var again = outcome.AlreadyStored;
        var body = new UploadResponse(true, again, outcome.UploadId, outcome.StudyId, outcome.CalculationIds, outcome.ReactionIds, outcome.ScanIds,
            outcome.Duplicates, [.. outcome.Issues.Where(i => !i.IsError).Select(ApiIssue.From)], received.Receipts) { IrcIds = outcome.IrcIds, Conformers = outcome.ConformerNotes };
        return Results.Json(body, statusCode: again ? StatusCodes.Status200OK : StatusCodes.Status201Created);
    }

    private static async Task<IResult> PreviewAsync(HttpRequest request, UploadService uploads, ApiOptions options, CancellationToken ct)
    {
        var (received, problem) = await ReadAsync(request, options, ct);
        if (problem is not null) return problem;
        try { return Results.Ok(await uploads.PreviewAsync(received!.Files, received.Choices, ct)); }
        catch (UploadsBusyException busy) { return Busy(request, busy); }
    }

    /// <summary>503 with Retry-After: the server reads a bounded number of uploads at once (issue 19, finding 7).</summary>
    private static IResult Busy(HttpRequest request, UploadsBusyException busy)
    {
        request.HttpContext.Response.Headers.RetryAfter = ((int)busy.RetryAfter.TotalSeconds).ToString(CultureInfo.InvariantCulture);
        return ApiProblems.Problem(StatusCodes.Status503ServiceUnavailable, "uploads-busy", "Busy, try again", busy.Message);
    }

    private sealed record Received(IReadOnlyList<UploadFile> Files, UploadChoices Choices, IReadOnlyList<ApiFileReceipt> Receipts);

    /// <summary>Reads the whole multipart body within the size limit; a body over the limit is a 413 before anything is stored.</summary>
    private static async Task<(Received?, IResult?)> ReadAsync(HttpRequest request, ApiOptions options, CancellationToken ct)
    {
        var limit = options.MaxUploadBytes;
        if (request.ContentLength > limit) return (null, ApiProblems.TooLarge(limit));
        if (!request.HasFormContentType || !(request.ContentType ?? "").StartsWith("multipart/form-data", StringComparison.OrdinalIgnoreCase))
            return (null, ApiProblems.Problem(StatusCodes.Status415UnsupportedMediaType, "multipart-required", "Unsupported media type",
                "Send the files as multipart/form-data (one part per file)."));
        if (request.HttpContext.Features.Get<IHttpMaxRequestBodySizeFeature>() is { IsReadOnly: false } size) size.MaxRequestBodySize = limit;
        request.HttpContext.Features.Set<IFormFeature>(new FormFeature(request, new FormOptions { MultipartBodyLengthLimit = limit }));

        IFormCollection form;
        var files = new List<UploadFile>();
        var receipts = new List<ApiFileReceipt>();
        try
        {
            form = await request.ReadFormAsync(ct);
            foreach (var f in form.Files)
            {
                // One copy of each file in memory (the form keeps large parts in temporary files until read here).
                var bytes = new byte[f.Length];
                await using (var part = f.OpenReadStream()) await part.ReadExactlyAsync(bytes, ct);
                var name = f.FileName.Replace('\\', '/');
                files.Add(new UploadFile(name, bytes));
                receipts.Add(new ApiFileReceipt(name, bytes.LongLength, Convert.ToHexStringLower(SHA256.HashData(bytes))));
            }
        }
        catch (BadHttpRequestException e) when (e.StatusCode == StatusCodes.Status413PayloadTooLarge)
        {
            return (null, ApiProblems.TooLarge(limit));
        }
        catch (InvalidDataException e) when (e.Message.Contains("limit", StringComparison.OrdinalIgnoreCase))
        {
            return (null, ApiProblems.TooLarge(limit));
        }
        catch (InvalidDataException e)
        {
            return (null, ApiProblems.BadRequest("The multipart body could not be read: " + e.Message));
        }
        if (files.Count == 0) return (null, ApiProblems.BadRequest("The request holds no file part; send at least one file."));

        var errors = new List<string>();
        string? Text(string field) => form[field].ToString() is { Length: > 0 } v ? v.Trim() : null;
        int? Int(string field)
        {
            if (Text(field) is not { } v) return null;
            if (int.TryParse(v, NumberStyles.Integer, CultureInfo.InvariantCulture, out var n)) return n;
            errors.Add($"field '{field}': '{v}' is not a whole number");
            return null;
        }
        bool Bool(string field)
        {
            if (Text(field) is not { } v) return false;
            if (bool.TryParse(v, out var b)) return b;
            errors.Add($"field '{field}': '{v}' is not true or false");
            return false;
        }
        CalculationKind? kind = null;
        if (Text("kind") is { } k)
        {
            if (Enum.TryParse<CalculationKind>(k.Replace("-", "").Replace("_", ""), ignoreCase: true, out var parsed) && Enum.IsDefined(parsed)) kind = parsed;
            else errors.Add($"field 'kind': '{k}' is not one of {string.Join(", ", Enum.GetNames<CalculationKind>())}");
        }
        List<int>? scanAtoms = null;
        if (Text("scanAtoms") is { } atoms)
        {
            scanAtoms = [];
            foreach (var part in atoms.Split(',', StringSplitOptions.TrimEntries | StringSplitOptions.RemoveEmptyEntries))
                if (int.TryParse(part, NumberStyles.Integer, CultureInfo.InvariantCulture, out var a)) scanAtoms.Add(a);
                else errors.Add($"field 'scanAtoms': '{part}' is not an atom number");
        }
        var key = request.Headers[IdempotencyHeader].ToString() is { Length: > 0 } h ? h.Trim() : Text("uploadKey");
        if (key is { Length: > 100 }) errors.Add($"upload key is {key.Length} characters; at most 100");
        var choices = new UploadChoices
        {
            NewStudyName = Text("study"), StudyId = Int("studyId"), SpeciesLabel = Text("species"), Kind = kind, LevelOfTheory = Text("level"),
            Charge = Int("charge"), Multiplicity = Int("multiplicity"), ScanAtoms = scanAtoms, AttachToStateId = Int("attachToState"), IrcOf = Text("ircOf"), UploadKey = key,
            Conformer = Text("conformer"), ConformerPerFile = Bool("conformerPerFile"),
        };
        if (errors.Count > 0) return (null, ApiProblems.BadRequest(string.Join("; ", errors) + "."));
        return (new Received(files, choices, receipts), null);
    }
}
