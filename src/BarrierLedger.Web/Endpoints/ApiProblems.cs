using BarrierLedger.Ledger.Uploads;

namespace BarrierLedger.Web.Endpoints;

/// <summary>Every API error is an RFC 9457 problem document (application/problem+json) with a stable "code" extension.</summary>
internal static class ApiProblems
{
    public static IResult Problem(int status, string code, string title, string detail, IDictionary<string, object?>? extra = null)
    {
        var extensions = new Dictionary<string, object?>(extra ?? new Dictionary<string, object?>()) { ["code"] = code };
        return TypedResults.Problem(detail: detail, statusCode: status, title: title, type: $"https://barrierledger.invalid/problems/{code}", extensions: extensions);
    }

    public static Task WriteAsync(HttpContext context, int status, string code, string title, string detail) =>
        Problem(status, code, title, detail).ExecuteAsync(context);

    public static IResult NotFound(string what) => Problem(StatusCodes.Status404NotFound, "not-found", "Not found", what);

    public static IResult BadRequest(string detail) => Problem(StatusCodes.Status400BadRequest, "bad-request", "Bad request", detail);

    public static IResult TooLarge(long limit) => Problem(StatusCodes.Status413PayloadTooLarge, "upload-too-large", "Upload too large",
        $"The upload is larger than the limit of {limit} bytes ({limit / (1024.0 * 1024):F1} MiB); nothing was stored.",
        new Dictionary<string, object?> { ["limitBytes"] = limit });

    public static IResult UploadRejected(IEnumerable<UploadIssue> issues)
    {
        var list = issues.ToList();
        return Problem(StatusCodes.Status422UnprocessableEntity, "upload-rejected", "Nothing was stored",
            $"The upload has {list.Count(i => i.IsError)} error(s); nothing was stored. Each error names its file and line or JSON path.",
            new Dictionary<string, object?> { ["errors"] = list.Where(i => i.IsError).Select(ApiIssue.From).ToList(), ["warnings"] = list.Where(i => !i.IsError).Select(ApiIssue.From).ToList() });
    }
}

/// <summary>An upload issue as the API reports it.</summary>
public sealed record ApiIssue(string File, int? Line, string? JsonPath, string Message, string Severity)
{
    public static ApiIssue From(UploadIssue i) => new(i.FileName, i.Line, i.JsonPath, i.Message, i.IsError ? "error" : "warning");
}
