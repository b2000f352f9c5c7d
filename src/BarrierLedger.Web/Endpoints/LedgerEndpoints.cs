using BarrierLedger.Core.Checks;
using System.Globalization;
using System.Security.Claims;
using System.Text;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Queries;
using BarrierLedger.Ledger.Reviews;

namespace BarrierLedger.Web.Endpoints;

/// <summary>One ledger row over the API: energies per molecule in hartree and kcal/mol, rate constant and half-life at the model temperature.</summary>
public sealed record ApiLedgerRow(int ReactionId, string Label, string Description, string Owner,
    double? BarrierGibbsHartree, double? BarrierGibbsKcalPerMol, double? ReactionGibbsHartree, double? ReactionGibbsKcalPerMol,
    double? BarrierElectronicHartree, double? BarrierElectronicKcalPerMol, double? RateConstantPerSecond, double? HalfLifeSeconds, double? TemperatureKelvin,
    string? Verdict, string? ReviewStatus, int SaddlePointCount, string LevelOfTheory, bool Consistent, IReadOnlyList<CheckReason> ConsistencyReasons,
    bool Derived, bool Stale, bool Retired,
    double? RateConstantLower95 = null, double? RateConstantUpper95 = null, double? HalfLifeLower95 = null, double? HalfLifeUpper95 = null,
    string Uncertainty = "");

public sealed record ApiLedger(int StudyId, string StudyName, ModelSettings Model, int StaleCount, IReadOnlyList<ApiLedgerRow> Rows);

public sealed record ApiState(int Id, int Position, string Label, string Kind, string Species, int? SaddleCalculationId,
    IReadOnlyList<int[]> ReactionCoordinate, IReadOnlyList<string> ReactionCoordinateLabels, string? ReviewStatus);

public sealed record ApiSaddleCheck(int StateId, int CalculationId, string CalculationLabel, string LevelOfTheory, string? Verdict,
    IReadOnlyList<CheckReason> Reasons, bool CheckStale);

public sealed record ApiScan(int Id, string Label, string Species, string LevelOfTheory, int PointCount);

/// <summary>A reaction over the API (the reaction screen's values without geometries and modes).</summary>
public sealed record ApiReaction(int Id, string Label, string Description, int StudyId, string StudyName, string Owner, bool Retired,
    ModelSettings Model, bool Derived, bool Stale, double? BarrierGibbsHartree, double? BarrierGibbsKcalPerMol, double? ReactionGibbsHartree,
    double? ReactionGibbsKcalPerMol, double? RateConstantPerSecond, double? HalfLifeSeconds, string LevelOfTheory, bool Consistent,
    IReadOnlyList<CheckReason> ConsistencyReasons, IReadOnlyList<ApiState> States, IReadOnlyList<DerivedState> StateEnergies,
    IReadOnlyList<DerivedStep> Steps, IReadOnlyList<ApiSaddleCheck> SaddleChecks, IReadOnlyList<ApiScan> Scans);

/// <param name="Comment">Why (required to return, and to verify a saddle point that failed its check or that you uploaded yourself).</param>
/// <param name="BasedOnReviewId">The latest review id you saw; without it the saddle point must still be waiting. Decided meanwhile: 409.</param>
public sealed record ApiReviewRequest(string? Comment, int? BasedOnReviewId = null);

/// <summary>Studies, ledger rows (JSON or CSV), reaction detail, and a reviewer's verify/return.</summary>
internal static class LedgerEndpoints
{
    public static void Map(RouteGroupBuilder api)
    {
        api.MapGet("/studies", async (LedgerQueryService q, CancellationToken ct) => TypedResults.Ok(await q.GetStudiesAsync(false, ct)))
            .RequireApi(ApiPolicies.Read).WithName("ListStudies").WithSummary("Live studies with their reaction counts");

        api.MapGet("/studies/{studyId:int}/ledger", LedgerAsync)
            .RequireApi(ApiPolicies.Read).Produces<ApiLedger>().Produces(StatusCodes.Status200OK, contentType: "text/csv").ProducesProblem(StatusCodes.Status404NotFound)
            .WithName("GetLedger").WithSummary("Every live reaction of a study with barrier, rate, check and review status; ?format=csv for CSV");

        api.MapGet("/reactions/{reactionId:int}", ReactionAsync)
            .RequireApi(ApiPolicies.Read).Produces<ApiReaction>().ProducesProblem(StatusCodes.Status404NotFound)
            .WithName("GetReaction").WithSummary("One reaction: states, energies, steps, saddle-point checks and scans");

        api.MapPost("/reviews/{calculationId:int}/verify", (int calculationId, ApiReviewRequest? body, ReviewService reviews, ClaimsPrincipal user, CancellationToken ct) =>
                DecideAsync(() => reviews.VerifyAsync(calculationId, user.FindFirstValue(ClaimTypes.NameIdentifier)!, body?.Comment, Basis(body), ct)))
            .RequireApi(ApiPolicies.Review).ProducesProblem(StatusCodes.Status403Forbidden).WithName("VerifySaddlePoint")
            .WithSummary("Sign off a saddle-point calculation (Reviewer role, upload scope)");

        api.MapPost("/reviews/{calculationId:int}/return", (int calculationId, ApiReviewRequest body, ReviewService reviews, ClaimsPrincipal user, CancellationToken ct) =>
                DecideAsync(() => reviews.ReturnAsync(calculationId, user.FindFirstValue(ClaimTypes.NameIdentifier)!, body.Comment ?? "", Basis(body), ct)))
            .RequireApi(ApiPolicies.Review).ProducesProblem(StatusCodes.Status403Forbidden).WithName("ReturnSaddlePoint")
            .WithSummary("Return a saddle-point calculation to its owner with a comment (Reviewer role, upload scope)");
    }

    private static ReviewBasis Basis(ApiReviewRequest? body) =>
        body?.BasedOnReviewId is { } id ? ReviewBasis.Seen(id) : ReviewBasis.Waiting;

    private static async Task<IResult> DecideAsync(Func<Task<ReviewEntry>> decide)
    {
        try
        {
            return TypedResults.Ok(await decide());
        }
        catch (ReviewConflictException e)
        {
            return ApiProblems.Problem(StatusCodes.Status409Conflict, "review-conflict", "Decided meanwhile", e.Message);
        }
        catch (ReviewerRequiredException e)
        {
            return ApiProblems.Problem(StatusCodes.Status403Forbidden, "role-required", "Forbidden", e.Message);
        }
        catch (ArgumentException e)
        {
            return e.Message.Contains("does not exist", StringComparison.Ordinal) ? ApiProblems.NotFound(e.Message) : ApiProblems.BadRequest(e.Message);
        }
    }

    private static async Task<IResult> LedgerAsync(int studyId, string? format, HttpRequest request, LedgerQueryService q, CancellationToken ct)
    {
        if ((await q.GetStudiesAsync(true, ct)).All(s => s.Id != studyId)) return ApiProblems.NotFound($"There is no study {studyId}.");
        var page = await q.GetLedgerRowsAsync(studyId, null, ct);
        var rows = page.Rows.Select(r => new ApiLedgerRow(r.ReactionId, r.Label, r.Description, r.OwnerName,
            r.BarrierGibbs?.Hartree, r.BarrierGibbs?.KcalPerMol, r.ReactionGibbs?.Hartree, r.ReactionGibbs?.KcalPerMol,
            r.BarrierElectronic?.Hartree, r.BarrierElectronic?.KcalPerMol, r.RateConstantPerSecond, r.HalfLifeSeconds, r.TemperatureKelvin,
            r.Verdict?.ToString(), r.ReviewStatus?.ToString(), r.SaddlePointCount, r.LevelOfTheory, r.Consistent, r.ConsistencyReasons,
            r.Derived, r.Stale, r.Retired) with
        {
            // The 95 % intervals from the energy model's σ for the row's level of theory; null bounds and "no uncertainty set" when none.
            RateConstantLower95 = Bound(page.Model.Settings, r.RateConstantPerSecond, r, false, lower: true),
            RateConstantUpper95 = Bound(page.Model.Settings, r.RateConstantPerSecond, r, false, lower: false),
            HalfLifeLower95 = Bound(page.Model.Settings, r.HalfLifeSeconds, r, true, lower: true),
            HalfLifeUpper95 = Bound(page.Model.Settings, r.HalfLifeSeconds, r, true, lower: false),
            Uncertainty = page.Model.Settings.Uncertainty.Describe(r.LevelOfTheory),
        }).ToList();
        var csv = string.Equals(format, "csv", StringComparison.OrdinalIgnoreCase)
            || (format is null && request.Headers.Accept.ToString().Contains("text/csv", StringComparison.OrdinalIgnoreCase));
        if (format is not null && !csv && !string.Equals(format, "json", StringComparison.OrdinalIgnoreCase))
            return ApiProblems.BadRequest($"format '{format}' is not one of json, csv.");
        if (!csv) return TypedResults.Ok(new ApiLedger(page.StudyId, page.StudyName, page.Model.Settings, page.StaleCount, rows));
        return Results.Text(Csv(rows), "text/csv; charset=utf-8", Encoding.UTF8);
    }

    private static double? Bound(ModelSettings model, double? value, LedgerRow r, bool time, bool lower)
    {
        if (value is not { } v || !(v > 0) || !double.IsFinite(v) || r.TemperatureKelvin is not { } t) return null;
        var u = model.Uncertainty;
        var interval = time ? u.Time(v, r.LevelOfTheory, t) : u.RateConstant(v, r.LevelOfTheory, t);
        return !interval.IsSet ? null : lower ? interval.Lower : interval.Upper;
    }

    /// <summary>RFC 4180 CSV, invariant culture, energies in kcal/mol; a stale or inconsistent row says so in its own columns; text cells neutralised (<see cref="BarrierLedger.Ledger.Export.CsvCells"/>).</summary>
    internal static string Csv(IReadOnlyList<ApiLedgerRow> rows)
    {
        static string F(double? v) => v?.ToString("R", CultureInfo.InvariantCulture) ?? "";
        static string Q(string s) => BarrierLedger.Ledger.Export.CsvCells.Field(s);
        var sb = new StringBuilder("reaction_id,label,barrier_gibbs_kcal_mol,reaction_gibbs_kcal_mol,barrier_electronic_kcal_mol,rate_constant_per_s,half_life_s,temperature_k,verdict,review_status,level_of_theory,consistent,stale,reasons,rate_constant_lower_95,rate_constant_upper_95,half_life_lower_95_s,half_life_upper_95_s,uncertainty\r\n");
        foreach (var r in rows)
            sb.Append(string.Join(',', r.ReactionId.ToString(CultureInfo.InvariantCulture), Q(r.Label), F(r.BarrierGibbsKcalPerMol), F(r.ReactionGibbsKcalPerMol),
                F(r.BarrierElectronicKcalPerMol), F(r.RateConstantPerSecond), F(r.HalfLifeSeconds), F(r.TemperatureKelvin), Q(r.Verdict ?? ""), Q(r.ReviewStatus ?? ""),
                Q(r.LevelOfTheory), r.Consistent ? "yes" : "no", r.Stale ? "yes" : "no", Q(string.Join("; ", r.ConsistencyReasons.Select(c => c.Message))),
                F(r.RateConstantLower95), F(r.RateConstantUpper95), F(r.HalfLifeLower95), F(r.HalfLifeUpper95), Q(r.Uncertainty))).Append("\r\n");
        return sb.ToString();
    }

    private static async Task<IResult> ReactionAsync(int reactionId, ReactionQueryService q, CancellationToken ct)
    {
        if (await q.GetReactionAsync(reactionId, ct) is not { } r) return ApiProblems.NotFound($"There is no reaction {reactionId}.");
        return TypedResults.Ok(new ApiReaction(r.Id, r.Label, r.Description, r.StudyId, r.StudyName, r.OwnerName, r.Retired, r.Model.Settings,
            r.Derived, r.Stale, r.BarrierGibbs?.Hartree, r.BarrierGibbs?.KcalPerMol, r.ReactionGibbs?.Hartree, r.ReactionGibbs?.KcalPerMol,
            r.RateConstantPerSecond, r.HalfLifeSeconds, r.LevelOfTheory, r.Consistent, r.ConsistencyReasons,
            [.. r.States.Select(s => new ApiState(s.Id, s.Position, s.Label, s.Kind.ToString(),
                string.Join(" + ", s.Terms.Select(t => t.Coefficient == 1 ? t.SpeciesLabel : $"{t.Coefficient} {t.SpeciesLabel}")), s.SaddleCalculationId,
                [.. s.CoordinatePairs.Select(p => new[] { p.A, p.B })], s.CoordinateLabels, s.ReviewStatus?.ToString()))],
            r.StateEnergies, r.Steps,
            [.. r.SaddleChecks.Select(c => new ApiSaddleCheck(c.StateId, c.CalculationId, c.CalculationLabel, c.LevelOfTheory, c.Verdict?.ToString(), c.Reasons, c.CheckStale))],
            [.. r.Scans.Select(s => new ApiScan(s.Id, s.Label, s.SpeciesLabel, s.LevelOfTheory, s.Points.Count))]));
    }
}
