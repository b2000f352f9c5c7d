using BarrierLedger.Core.IsotopeEffects;
using BarrierLedger.Ledger.Derivation;
using BarrierLedger.Ledger.Export;
using BarrierLedger.Ledger.IsotopeEffects;

namespace BarrierLedger.Web.Endpoints;

/// <summary>A tunnelling correction's κ ratio over the API (null when it does not apply, with the reason).</summary>
public sealed record ApiKieTunnelling(string Correction, string Description, double? KappaParent, double? KappaIsotopologue, double? Ratio, string? Note);

/// <summary>One isotopologue set and its kinetic isotope effect over the API; <see cref="Unavailable"/> says why there is no number.</summary>
public sealed record ApiIsotopeEffect(int SetId, string Name, int SaddlePosition, string SaddlePoint, IReadOnlyList<string> SaddleSubstitutions,
    IReadOnlyDictionary<string, IReadOnlyList<string>> ReactantSubstitutions, string Mapping, bool Retired,
    double? Kie, double? KieWithoutTunnelling, double? Sym, double? Mmi, double? Zpe, double? Exc, double? Low, double? Tun,
    double? ImaginaryFrequencyRatio, double? VibrationalProduct, double? ImaginaryParentCm1, double? ImaginaryIsotopologueCm1, string? TunnellingUsed,
    IReadOnlyList<ApiKieTunnelling> TunnellingFactors, double? ProductRuleResidual, string? Unavailable, IReadOnlyList<string> Cautions,
    IReadOnlyList<string> Notes, IReadOnlyList<string> PrimaryAtoms);

public sealed record ApiIsotopeEffects(int ReactionId, string Reaction, string Study, ModelSettings Model, string Caution, IReadOnlyList<ApiIsotopeEffect> Effects);

/// <summary>Kinetic isotope effects of a reaction's isotopologue sets (JSON, or the KIE table as CSV or Markdown).</summary>
internal static class IsotopeEffectEndpoints
{
    public static void Map(RouteGroupBuilder api) =>
        api.MapGet("/reactions/{reactionId:int}/isotope-effects", GetAsync)
            .RequireApi(ApiPolicies.Read).Produces<ApiIsotopeEffects>().Produces(StatusCodes.Status200OK, contentType: "text/csv")
            .ProducesProblem(StatusCodes.Status404NotFound).ProducesProblem(StatusCodes.Status400BadRequest)
            .WithName("GetIsotopeEffects")
            .WithSummary("Kinetic isotope effects of the reaction's isotopologue sets with their factors under the model in force; ?format=csv or markdown for the table");

    internal static async Task<IResult> GetAsync(int reactionId, string? format, IsotopeEffectService service, CancellationToken ct)
    {
        var report = await service.GetForReactionAsync(reactionId, false, ct);
        if (report is null) return ApiProblems.NotFound($"There is no reaction {reactionId}.");
        switch ((format ?? "json").ToLowerInvariant())
        {
            case "json":
                return TypedResults.Ok(ToApi(report));
            case "csv":
                var csv = KieTableWriter.Csv(report);
                return Results.File(csv.Content, csv.ContentType, csv.FileName);
            case "markdown":
            case "md":
                var md = KieTableWriter.Markdown(report);
                return Results.File(md.Content, md.ContentType, md.FileName);
            default:
                return ApiProblems.BadRequest($"format must be json, csv or markdown, not '{format}'.");
        }
    }

    private static ApiIsotopeEffects ToApi(IsotopeEffectsReport report) => new(report.ReactionId, report.ReactionLabel, report.StudyName, report.Model,
        ExportCaution.Text, [.. report.Effects.Select(e =>
        {
            var r = e.Result;
            return new ApiIsotopeEffect(e.Set.Id, e.Set.Name, e.Set.SaddlePosition, e.Set.SaddleLabel, [.. e.Set.SaddleSubstitutions.Select(s => s.ToString())],
                e.Set.Reactants.ToDictionary(x => x.SpeciesLabel, x => (IReadOnlyList<string>)[.. x.Substitutions.Select(s => s.ToString())]),
                e.Set.Mapping.ToString(), e.Set.Retired, r?.Kie, r?.KieWithoutTunnelling, r?.SymmetryFactor, r?.MassMomentFactor, r?.ZeroPointFactor,
                r?.ExcitationFactor, r?.LowModeFactor, r?.TunnellingFactor, r?.ImaginaryFrequencyRatio, r?.VibrationalProductFactor, r?.ImaginaryParentCm1,
                r?.ImaginarySubstitutedCm1, r?.Options.Tunnelling.ToString(),
                r is null ? [] : [.. r.TunnellingFactors.Select(t => new ApiKieTunnelling(t.Correction.ToString(), t.Description, t.KappaParent, t.KappaSubstituted, t.Ratio, t.Note))],
                r is null ? null : Finite(r.ProductRuleWorstDeviation), e.Unavailable, e.Cautions, r is null ? [] : [.. r.Notes], e.PrimaryAtoms);
        })]);

    private static double? Finite(double x) => double.IsFinite(x) ? x : null;
}
