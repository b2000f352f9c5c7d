using System.CommandLine;
using System.Globalization;
using System.Net;
using System.Net.Http.Headers;
using System.Security.Cryptography;
using System.Text;
using System.Text.Json;
using Microsoft.Extensions.Http.Resilience;
using Polly;

namespace BarrierLedger.Cli.Commands;

/// <summary>
/// <c>barrierledger push --server URL [--token-file F | env BARRIERLEDGER_TOKEN] FILES...</c>: sends result files to a running
/// BarrierLedger through its HTTP API (POST /api/v1/uploads), one upload per file (or all as one with --together), with a
/// progress line per file and retries with exponential back-off on transient failures. Every upload carries an idempotency
/// key made from the SHA-256 of its files and choices, so a retry or a second push of the same file stores nothing new and says so.
/// Exit codes: 0 every upload stored or already stored; 2 a file is missing or the server rejected an upload (errors listed),
/// or the command line is wrong; 4 not delivered (server unreachable after the retries, token refused, or another HTTP error).
/// </summary>
internal static class PushCommand
{
    public const string TokenEnvironmentVariable = "BARRIERLEDGER_TOKEN";
    /// <summary>The upload did not reach the ledger: server unreachable after retries, token refused, or an unexpected HTTP status.</summary>
    public const int NotDelivered = 4;

    public static Command Create(CliContext ctx)
    {
        var files = new Argument<string[]>("files") { Description = "Files to upload (XYZ, extended XYZ, CSV scan, QCSchema JSON, bundle .json or .zip)", Arity = ArgumentArity.OneOrMore };
        CommonOptions.RejectUnknownOptions(files);
        var server = new Option<string>("--server") { Description = "Base address of the BarrierLedger server, e.g. http://ledger.example:5080", Required = true };
        var tokenFile = new Option<string?>("--token-file") { Description = $"File whose first line is a personal access token (otherwise the {TokenEnvironmentVariable} environment variable)" };
        var study = new Option<string?>("--study") { Description = "Study name (existing or new) for files that do not name one" };
        var species = new Option<string?>("--species") { Description = "Species label for a single structure file" };
        var kind = new Option<string?>("--kind") { Description = "Calculation kind for a single structure file: Minimum, SaddlePoint, SinglePoint, Frequencies, RelaxedScan, ..." };
        var level = new Option<string?>("--level") { Description = "Level of theory for a single structure file, e.g. wB97X-D/def2-TZVP" };
        var charge = new Option<int?>("--charge") { Description = "Total charge (single structure file)" };
        var multiplicity = new Option<int?>("--multiplicity") { Description = "Spin multiplicity (single structure file)" };
        var scanAtoms = new Option<string?>("--scan-atoms") { Description = "For a multi-frame XYZ relaxed scan: the scanned coordinate's atoms, 1-based, e.g. 2,3" };
        var ircOf = new Option<string?>("--irc-of") { Description = "The saddle-point calculation (label) that the XYZ files are an IRC of: one file is the path, two (with --together) the forward and backward ends" };
        var conformer = new Option<string?>("--conformer") { Description = "The conformer of the species a single structure file is (e.g. c2); a multi-frame single-point XYZ is one conformer per frame" };
        var conformerPerFile = new Option<bool>("--conformer-per-file") { Description = "Each structure file is one conformer of the species, named by its file name" };
        var together = new Option<bool>("--together") { Description = "Send all files as one upload (a bundle manifest with the files it names); default: one upload per file" };
        var retries = new Option<int>("--retries") { Description = "Retries after a transient failure (connection lost, 408, 429, 5xx)", DefaultValueFactory = _ => 5 };
        var retryDelay = new Option<double>("--retry-delay") { Description = "First back-off delay in seconds; it doubles with each retry (with jitter, at most 60 s)", DefaultValueFactory = _ => 2.0 };
        var timeout = new Option<double>("--timeout") { Description = "Seconds one attempt may take before it counts as failed", DefaultValueFactory = _ => 300.0 };

        var command = new Command("push", "Upload result files to a running BarrierLedger server with a personal access token.")
        {
            files, server, tokenFile, study, species, kind, level, charge, multiplicity, scanAtoms, ircOf, conformer, conformerPerFile, together, retries, retryDelay, timeout,
        };
        command.SetAction(pr =>
        {
            var settings = new PushSettings(
                pr.GetValue(server)!, ReadToken(pr.GetValue(tokenFile)), pr.GetValue(retries), pr.GetValue(retryDelay), pr.GetValue(timeout),
                Fields(pr.GetValue(study), pr.GetValue(species), pr.GetValue(kind), pr.GetValue(level), pr.GetValue(charge), pr.GetValue(multiplicity), pr.GetValue(scanAtoms), pr.GetValue(ircOf),
                    pr.GetValue(conformer), pr.GetValue(conformerPerFile)));
            var paths = pr.GetValue(files)!;
            var missing = paths.Where(p => !File.Exists(p)).ToList();
            foreach (var m in missing) ctx.Err.WriteLine($"{m}: error: file not found");
            if (missing.Count > 0) return ExitCodes.Unreadable;
            var groups = pr.GetValue(together) ? [paths] : paths.Select(p => new[] { p }).ToArray();
            return RunAsync(ctx, settings, groups).GetAwaiter().GetResult();
        });
        return command;
    }

    private sealed record PushSettings(string Server, string Token, int Retries, double RetryDelaySeconds, double TimeoutSeconds, IReadOnlyList<(string Name, string Value)> Fields);

    private static string ReadToken(string? tokenFile)
    {
        string? token;
        if (tokenFile is not null)
        {
            if (!File.Exists(tokenFile)) throw new UsageException($"token file '{tokenFile}' not found");
            token = File.ReadLines(tokenFile).FirstOrDefault()?.Trim();
            if (string.IsNullOrEmpty(token)) throw new UsageException($"token file '{tokenFile}' is empty");
        }
        else
        {
            token = Environment.GetEnvironmentVariable(TokenEnvironmentVariable)?.Trim();
            if (string.IsNullOrEmpty(token)) throw new UsageException($"no token: give --token-file or set {TokenEnvironmentVariable} (create a token on your profile page)");
        }
        return token;
    }

    private static List<(string, string)> Fields(string? study, string? species, string? kind, string? level, int? charge, int? multiplicity, string? scanAtoms, string? ircOf,
        string? conformer, bool conformerPerFile)
    {
        var fields = new List<(string, string)>();
        void Add(string name, string? value) { if (!string.IsNullOrWhiteSpace(value)) fields.Add((name, value.Trim())); }
        Add("study", study);
        Add("species", species);
        Add("kind", kind);
        Add("level", level);
        Add("charge", charge?.ToString(CultureInfo.InvariantCulture));
        Add("multiplicity", multiplicity?.ToString(CultureInfo.InvariantCulture));
        Add("scanAtoms", scanAtoms);
        Add("ircOf", ircOf);
        Add("conformer", conformer);
        if (conformerPerFile) Add("conformerPerFile", "true");
        return fields;
    }

    private static async Task<int> RunAsync(CliContext ctx, PushSettings settings, IReadOnlyList<string[]> uploads)
    {
        if (!Uri.TryCreate(settings.Server.TrimEnd('/') + "/", UriKind.Absolute, out var baseUri) || (baseUri.Scheme != "http" && baseUri.Scheme != "https"))
            throw new UsageException($"--server '{settings.Server}' is not an http(s) address");
        using var client = CreateClient(ctx, settings, baseUri);

        var worst = ExitCodes.Ok;
        for (var i = 0; i < uploads.Count; i++)
        {
            var paths = uploads[i];
            var files = paths.Select(p => (Name: Path.GetFileName(p), Bytes: File.ReadAllBytes(p))).ToList();
            var shas = files.Select(f => Convert.ToHexStringLower(SHA256.HashData(f.Bytes))).ToList();
            var title = string.Join(", ", files.Select((f, k) => $"{f.Name} ({Size(f.Bytes.LongLength)}, sha256 {shas[k][..12]})"));
            ctx.Out.WriteLine($"[{i + 1}/{uploads.Count}] {title}: sending");
            ctx.Out.Flush();
            var code = await SendAsync(ctx, client, files, UploadKey(shas, settings.Fields), settings);
            ctx.Out.Flush();
            if (code == NotDelivered && worst != NotDelivered) worst = NotDelivered;
            else if (code != ExitCodes.Ok && worst == ExitCodes.Ok) worst = code;
        }
        return worst;
    }

    /// <summary>"push-" and the SHA-256 of the files' SHA-256s and the choices: the same files with the same choices give the same key.</summary>
    internal static string UploadKey(IReadOnlyList<string> fileSha256, IReadOnlyList<(string Name, string Value)> fields)
    {
        var text = new StringBuilder();
        foreach (var s in fileSha256) text.Append("file:").Append(s).Append('\n');
        foreach (var (n, v) in fields.OrderBy(f => f.Name, StringComparer.Ordinal)) text.Append(n).Append('=').Append(v).Append('\n');
        return "push-" + Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(text.ToString())));
    }

    private static HttpClient CreateClient(CliContext ctx, PushSettings settings, Uri baseUri)
    {
        var retry = new HttpRetryStrategyOptions
        {
            MaxRetryAttempts = Math.Max(1, settings.Retries),
            Delay = TimeSpan.FromSeconds(Math.Max(0.01, settings.RetryDelaySeconds)),
            MaxDelay = TimeSpan.FromSeconds(60),
            BackoffType = DelayBackoffType.Exponential,
            UseJitter = true,
            ShouldRetryAfterHeader = true,
            OnRetry = args =>
            {
                var why = args.Outcome.Exception is { } e ? Describe(e) : $"HTTP {(int)args.Outcome.Result!.StatusCode} {args.Outcome.Result.ReasonPhrase}";
                ctx.Out.WriteLine($"      {why}; retry {args.AttemptNumber + 1} of {settings.Retries} in {args.RetryDelay.TotalSeconds:F1} s");
                ctx.Out.Flush();
                return ValueTask.CompletedTask;
            },
        };
        var builder = new ResiliencePipelineBuilder<HttpResponseMessage>();
        if (settings.Retries > 0) builder.AddRetry(retry);
        var pipeline = builder.AddTimeout(TimeSpan.FromSeconds(Math.Max(1, settings.TimeoutSeconds))).Build();
        var handler = new ResilienceHandler(pipeline) { InnerHandler = new SocketsHttpHandler { PooledConnectionLifetime = TimeSpan.FromMinutes(1) } };
        var client = new HttpClient(handler) { BaseAddress = baseUri, Timeout = Timeout.InfiniteTimeSpan };
        client.DefaultRequestHeaders.Authorization = new AuthenticationHeaderValue("Bearer", settings.Token);
        client.DefaultRequestHeaders.UserAgent.Add(new ProductInfoHeaderValue("barrierledger-push", "1"));
        return client;
    }

    private static async Task<int> SendAsync(CliContext ctx, HttpClient client, IReadOnlyList<(string Name, byte[] Bytes)> files, string key, PushSettings settings)
    {
        using var form = new MultipartFormDataContent();
        foreach (var (name, bytes) in files)
        {
            var part = new ByteArrayContent(bytes);
            part.Headers.ContentType = new MediaTypeHeaderValue("application/octet-stream");
            form.Add(part, "files", name);
        }
        foreach (var (name, value) in settings.Fields) form.Add(new StringContent(value), name);
        using var request = new HttpRequestMessage(HttpMethod.Post, "api/v1/uploads") { Content = form };
        request.Headers.Add("Idempotency-Key", key);

        HttpResponseMessage response;
        try
        {
            response = await client.SendAsync(request);
        }
        catch (Exception e) when (e is HttpRequestException or Polly.Timeout.TimeoutRejectedException or TaskCanceledException)
        {
            ctx.Err.WriteLine($"      not delivered: {Describe(e)} (after {settings.Retries} retries)");
            return NotDelivered;
        }
        using (response)
        {
            var text = await response.Content.ReadAsStringAsync();
            JsonElement json = default;
            try { json = JsonDocument.Parse(text).RootElement; } catch (JsonException) { }
            if (response.StatusCode is HttpStatusCode.Created or HttpStatusCode.OK && json.ValueKind == JsonValueKind.Object)
            {
                var again = json.GetProperty("alreadyStored").GetBoolean();
                var calcs = json.GetProperty("calculationIds").GetArrayLength();
                var reactions = json.GetProperty("reactionIds").GetArrayLength();
                var scans = json.GetProperty("scanIds").GetArrayLength();
                if (again)
                    ctx.Out.WriteLine($"      already stored (upload {json.GetProperty("uploadId")}): nothing new was stored");
                else
                    ctx.Out.WriteLine($"      stored: upload {json.GetProperty("uploadId")} in study {json.GetProperty("studyId")}: {calcs} calculation(s), {reactions} reaction(s), {scans} scan(s)");
                foreach (var d in json.GetProperty("duplicates").EnumerateArray().Where(d => !again)) ctx.Out.WriteLine($"      not stored again: {d.GetString()}");
                foreach (var w in json.GetProperty("warnings").EnumerateArray()) ctx.Out.WriteLine("      " + Issue(w));
                // Duplicates and mirror images among the conformers the upload gave a species (issue 21), as the upload page says them.
                if (json.TryGetProperty("conformers", out var conformers))
                    foreach (var c in conformers.EnumerateArray()) ctx.Out.WriteLine("      conformers: " + c.GetString());
                return ExitCodes.Ok;
            }
            var detail = json.ValueKind == JsonValueKind.Object && json.TryGetProperty("detail", out var d2) ? d2.GetString() : text.Length > 300 ? text[..300] : text;
            ctx.Err.WriteLine($"      {(int)response.StatusCode} {response.ReasonPhrase}: {detail}");
            if (response.StatusCode == HttpStatusCode.UnprocessableEntity && json.TryGetProperty("errors", out var errors))
            {
                foreach (var e in errors.EnumerateArray()) ctx.Err.WriteLine("      " + Issue(e));
                return ExitCodes.Unreadable;
            }
            return response.StatusCode is HttpStatusCode.BadRequest or HttpStatusCode.RequestEntityTooLarge ? ExitCodes.Unreadable : NotDelivered;
        }
    }

    private static string Issue(JsonElement e)
    {
        var where = e.GetProperty("file").GetString();
        if (e.TryGetProperty("line", out var l) && l.ValueKind == JsonValueKind.Number) where += $":{l.GetInt32()}";
        if (e.TryGetProperty("jsonPath", out var p) && p.ValueKind == JsonValueKind.String) where += $" {p.GetString()}";
        return $"{where}: {e.GetProperty("severity").GetString()}: {e.GetProperty("message").GetString()}";
    }

    private static string Describe(Exception e)
    {
        var inner = e;
        while (inner.InnerException is not null) inner = inner.InnerException;
        return e is Polly.Timeout.TimeoutRejectedException ? "attempt timed out" : inner == e ? e.Message : $"{e.Message} ({inner.Message})";
    }

    private static string Size(long bytes) => bytes < 1024 ? $"{bytes} B" : bytes < 1024 * 1024 ? $"{bytes / 1024.0:F1} KiB" : $"{bytes / (1024.0 * 1024):F1} MiB";
}
