using System.Diagnostics;
using System.Net;
using System.Text.Json.Nodes;
using System.Text.RegularExpressions;

namespace BarrierLedger.LoadHarness;

/// <summary>A page as the server rendered it, with what the browser's script would take from it to start a circuit.</summary>
internal sealed record RenderedPage(string Url, string Html, TimeSpan Elapsed)
{
    /// <summary>The interactive-server component markers (start markers, with their protected descriptors), in page order.</summary>
    public IReadOnlyList<JsonObject> ComponentMarkers => SiteUser.Markers(Html);

    /// <summary>Prerendered component state the page carries for its circuit ("" when none).</summary>
    public string ApplicationState => SiteUser.State(Html);
}

/// <summary>
/// One person's browser as seen by the server: a cookie jar and HTTP connection of its own, signing in through the real
/// sign-in form (with its antiforgery token) and loading pages.
/// </summary>
internal sealed partial class SiteUser : IDisposable
{
    private readonly HttpClient _http;

    public SiteUser(string baseUrl)
    {
        BaseUrl = baseUrl.TrimEnd('/');
        Cookies = new CookieContainer();
        _http = new HttpClient(new SocketsHttpHandler { CookieContainer = Cookies, UseCookies = true, AllowAutoRedirect = true })
        {
            BaseAddress = new Uri(BaseUrl + "/"),
            Timeout = TimeSpan.FromSeconds(60),
        };
    }

    public string BaseUrl { get; }
    public CookieContainer Cookies { get; }

    /// <summary>Fills and posts the sign-in form; throws with the reason when the server does not sign the user in.</summary>
    public async Task<TimeSpan> SignInAsync(string userName, string password)
    {
        var clock = Stopwatch.StartNew();
        var form = await _http.GetStringAsync("Account/Login");
        var input = AntiforgeryInput().Match(form);
        var token = ValueAttribute().Match(input.Value);
        if (!input.Success || !token.Success) throw new InvalidOperationException("The sign-in page has no antiforgery token.");
        using var body = new FormUrlEncodedContent(new Dictionary<string, string>
        {
            ["_handler"] = "signin",
            ["__RequestVerificationToken"] = WebUtility.HtmlDecode(token.Groups[1].Value),
            ["Input.UserName"] = userName,
            ["Input.Password"] = password,
        });
        using var response = await _http.PostAsync("Account/Login", body);
        var html = await response.Content.ReadAsStringAsync();
        var landed = response.RequestMessage?.RequestUri?.AbsolutePath ?? "";
        if (!response.IsSuccessStatusCode || landed.StartsWith("/Account/", StringComparison.OrdinalIgnoreCase))
            throw new InvalidOperationException($"Sign-in as {userName} failed: HTTP {(int)response.StatusCode} at {landed}" +
                (html.Contains("wrong", StringComparison.Ordinal) ? " (user name or password is wrong)" : ""));
        return clock.Elapsed;
    }

    /// <summary>
    /// GETs a page and reads the whole body. What is timed: from sending the request until the last byte of the prerendered
    /// HTML has arrived over loopback, i.e. the server's render of the page (queries included) plus loopback transfer.
    /// </summary>
    public async Task<RenderedPage> GetAsync(string path, string mustContain)
    {
        var clock = Stopwatch.StartNew();
        using var response = await _http.GetAsync(path.TrimStart('/'), HttpCompletionOption.ResponseContentRead);
        var html = await response.Content.ReadAsStringAsync();
        var elapsed = clock.Elapsed;
        var url = response.RequestMessage?.RequestUri?.ToString() ?? BaseUrl + path;
        if (!response.IsSuccessStatusCode) throw new HarnessException($"GET {path}: HTTP {(int)response.StatusCode}");
        if (!html.Contains(mustContain, StringComparison.Ordinal)) throw new HarnessException($"GET {path} (landed on {url}): the page lacks \"{mustContain}\"");
        return new RenderedPage(url, html, elapsed);
    }

    internal static IReadOnlyList<JsonObject> Markers(string html) =>
        [.. MarkerComment().Matches(html).Select(m => JsonNode.Parse(m.Groups[1].Value)!.AsObject()).Where(o => o["descriptor"] is not null)];

    internal static string State(string html) => StateComment().Match(html) is { Success: true } m ? m.Groups[1].Value : "";

    /// <summary>Study ids and their reaction counts from the ledger's study picker ("Name (25)").</summary>
    public static IReadOnlyList<(int Id, int Reactions)> Studies(string ledgerHtml) =>
        [.. StudyOption().Matches(ledgerHtml).Select(m => (int.Parse(m.Groups[1].Value), int.Parse(m.Groups[2].Value)))];

    /// <summary>Reaction ids linked from a page.</summary>
    public static IReadOnlyList<int> ReactionLinks(string html) =>
        [.. ReactionLink().Matches(html).Select(m => int.Parse(m.Groups[1].Value)).Distinct()];

    [GeneratedRegex("""<input[^>]*name="__RequestVerificationToken"[^>]*>""")]
    private static partial Regex AntiforgeryInput();

    [GeneratedRegex("""value="([^"]*)"?""")]
    private static partial Regex ValueAttribute();

    [GeneratedRegex("""<!--Blazor:(\{.*?\})-->""", RegexOptions.Singleline)]
    private static partial Regex MarkerComment();

    [GeneratedRegex("""<!--Blazor-Server-Component-State:([^-]*?)-->""")]
    private static partial Regex StateComment();

    [GeneratedRegex("""<option value="(\d+)"[^>]*>[^<]*\((\d+)\)</option>""")]
    private static partial Regex StudyOption();

    [GeneratedRegex("""href="reactions/(\d+)"?""")]
    private static partial Regex ReactionLink();

    public void Dispose() => _http.Dispose();
}

/// <summary>A failed step of a simulated user (counted as an error, the run goes on).</summary>
internal sealed class HarnessException(string message) : Exception(message);
