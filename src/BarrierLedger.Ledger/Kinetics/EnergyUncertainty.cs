using System.Globalization;
using BarrierLedger.Core.Kinetics;
using BarrierLedger.Ledger.Derivation;

namespace BarrierLedger.Ledger.Kinetics;

/// <summary>
/// The group's energy uncertainties, set in the energy model: σ (kcal/mol, one standard deviation of a barrier or reaction
/// energy computed at a level of theory) for named levels, and one σ for every level not named. A rate constant, t½, product
/// ratio or conversion time derived from energies at a level carries that level's σ (see <see cref="RateUncertainty"/>).
/// </summary>
/// <param name="DefaultKcalPerMol">σ for levels not listed; null or 0 means no uncertainty set for them.</param>
/// <param name="PerLevel">σ of named levels, in the order given.</param>
public sealed record EnergyUncertainty(double? DefaultKcalPerMol, IReadOnlyList<LevelSigma> PerLevel)
{
    /// <summary>
    /// σ = 2 kcal/mol per barrier, the value a new energy model starts with: computed barriers are commonly quoted as good to
    /// about 1–3 kcal/mol (common practice, no source).
    /// </summary>
    public const double CommonPracticeKcalPerMol = 2.0;

    /// <summary>How the common-practice default is labelled wherever it is shown.</summary>
    public const string CommonPracticeNote = "common practice, no source";

    /// <summary>Largest σ accepted (kcal/mol); beyond it an interval spans so many decades that it says nothing.</summary>
    public const double MaximumKcalPerMol = 10.0;

    /// <summary>No uncertainty set for any level.</summary>
    public static EnergyUncertainty None { get; } = new(null, []);

    /// <summary>Reads the settings' default σ and per-level lines; throws <see cref="ArgumentException"/> with every problem.</summary>
    public static EnergyUncertainty From(ModelSettings settings)
    {
        ArgumentNullException.ThrowIfNull(settings);
        var errors = Problems(settings.UncertaintyKcalPerMol, settings.UncertaintyByLevel, out var levels);
        if (errors.Count > 0) throw new ArgumentException(string.Join("; ", errors), nameof(settings));
        return new EnergyUncertainty(settings.UncertaintyKcalPerMol, levels);
    }

    /// <summary>
    /// Problems with a default σ and the per-level text (one "level = σ" per line, σ in kcal/mol; blank lines and lines starting
    /// with # are ignored), each naming the line; empty when both can be used.
    /// </summary>
    public static List<string> Problems(double? defaultKcalPerMol, string? perLevelText, out List<LevelSigma> levels)
    {
        var errors = new List<string>();
        levels = [];
        if (defaultKcalPerMol is { } d && !(d >= 0 && d <= MaximumKcalPerMol))
            errors.Add($"the uncertainty for every level must lie between 0 and {MaximumKcalPerMol:0} kcal/mol (got {d.ToString(CultureInfo.InvariantCulture)})");
        var lines = (perLevelText ?? "").Replace("\r", "").Split('\n');
        var seen = new HashSet<string>(StringComparer.Ordinal);
        for (var i = 0; i < lines.Length; i++)
        {
            var line = lines[i].Trim();
            if (line.Length == 0 || line.StartsWith('#')) continue;
            var eq = line.LastIndexOf('=');
            if (eq <= 0)
            {
                errors.Add($"uncertainty line {i + 1} (\"{line}\") should read \"level of theory = σ in kcal/mol\"");
                continue;
            }
            var level = line[..eq].Trim();
            var text = line[(eq + 1)..].Trim();
            if (!double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out var sigma) || !(sigma >= 0 && sigma <= MaximumKcalPerMol))
            {
                errors.Add($"uncertainty line {i + 1}: \"{text}\" is not a σ between 0 and {MaximumKcalPerMol:0} kcal/mol");
                continue;
            }
            if (!seen.Add(EnergyLevels.Key(level)))
            {
                errors.Add($"uncertainty line {i + 1}: level \"{level}\" is listed twice");
                continue;
            }
            levels.Add(new LevelSigma(level, sigma));
        }
        return errors;
    }

    /// <summary>
    /// σ of numbers computed at <paramref name="levelOfTheory"/> (as the derivation stores it: "single point // geometry", several
    /// joined by "; " when mixed). A level is found by its whole text, else by its single-point part; a mixed set takes the
    /// largest σ of its parts; a level not listed takes the default. 0 means no uncertainty set.
    /// </summary>
    public double SigmaFor(string? levelOfTheory)
    {
        var parts = (levelOfTheory ?? "").Split("; ", StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
        if (parts.Length == 0) return DefaultKcalPerMol ?? 0.0;
        return parts.Max(One);
    }

    private double One(string level)
    {
        var key = EnergyLevels.Key(level);
        var singlePoint = EnergyLevels.Key(level.Split("//")[0]);
        var hit = PerLevel.FirstOrDefault(l => EnergyLevels.Key(l.Level) == key) ?? PerLevel.FirstOrDefault(l => EnergyLevels.Key(l.Level) == singlePoint);
        return hit?.SigmaKcalPerMol ?? DefaultKcalPerMol ?? 0.0;
    }

    /// <summary>
    /// Where σ comes from, in words: "σ = 2 kcal/mol per barrier (the default for every level; common practice, no source)",
    /// "σ = 1 kcal/mol per barrier (set for DLPNO-CCSD(T)/def2-TZVP)" or "no uncertainty set".
    /// </summary>
    public string Describe(string? levelOfTheory)
    {
        var sigma = SigmaFor(levelOfTheory);
        if (!(sigma > 0)) return UncertainValue.NotSet;
        var named = (levelOfTheory ?? "").Split("; ", StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries)
            .Select(p => PerLevel.FirstOrDefault(l => EnergyLevels.Key(l.Level) == EnergyLevels.Key(p) || EnergyLevels.Key(l.Level) == EnergyLevels.Key(p.Split("//")[0])))
            .FirstOrDefault(l => l is not null && l.SigmaKcalPerMol == sigma);
        var source = named is not null ? $"set for {named.Level}"
            : DefaultKcalPerMol == CommonPracticeKcalPerMol ? $"the default for every level; {CommonPracticeNote}" : "the group's value for every level";
        return $"σ = {sigma.ToString("0.0##", CultureInfo.InvariantCulture)} kcal/mol per barrier ({source})";
    }

    /// <summary>The settings' text form of the per-level list (what the settings screen edits).</summary>
    public static string Text(IEnumerable<LevelSigma> levels) =>
        string.Join("\n", levels.Select(l => $"{l.Level} = {l.SigmaKcalPerMol.ToString("0.###", CultureInfo.InvariantCulture)}"));

    /// <summary>Interval of a rate constant at <paramref name="temperatureKelvin"/> from the σ of its level (95 % unless asked).</summary>
    public UncertainValue RateConstant(double rateConstant, string? levelOfTheory, double temperatureKelvin, double confidenceLevel = 0.95) =>
        RateUncertainty.RateConstant(rateConstant, SigmaFor(levelOfTheory), temperatureKelvin, confidenceLevel);

    /// <summary>Interval of a time inversely proportional to k (t½) from the σ of its level.</summary>
    public UncertainValue Time(double seconds, string? levelOfTheory, double temperatureKelvin, double confidenceLevel = 0.95) =>
        RateUncertainty.Time(seconds, SigmaFor(levelOfTheory), temperatureKelvin, confidenceLevel);
}

/// <summary>σ (kcal/mol) of energies at one level of theory.</summary>
public sealed record LevelSigma(string Level, double SigmaKcalPerMol);
