using System.CommandLine;
using System.Globalization;
using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Vibrations;

namespace BarrierLedger.Cli.Commands;

/// <summary>
/// <c>barrierledger vibrations FILE</c>: vibrational analysis of one calculation (from its Hessian, modes or frequencies), with
/// reduced masses in Da and force constants in N/m (SI). The saddle-point verdict is printed by <see cref="WriteSaddleCheck"/> when the
/// structure has an imaginary mode or is declared a saddle point. The verb was called <c>freq</c> until this release; that name still
/// works, hidden from the help, with a line on stderr saying it goes away in the next release.
/// </summary>
internal static class VibrationsCommand
{
    public const string Name = "vibrations";
    public const string DeprecatedName = "freq";

    public static Command Create(CliContext ctx) => Create(ctx, Name);

    /// <summary>The old verb: same arguments and output, plus one deprecation line on stderr.</summary>
    public static Command CreateDeprecated(CliContext ctx)
    {
        var command = Create(ctx, DeprecatedName);
        command.Hidden = true;
        return command;
    }

    private static Command Create(CliContext ctx, string name)
    {
        var input = new CalculationArguments();
        var json = CommonOptions.Json();
        var command = new Command(name, "Vibrational analysis of a calculation: wavenumbers (imaginary as negative), reduced masses (Da), force constants (N/m).");
        input.AddTo(command);
        command.Options.Add(json);
        command.SetAction(pr =>
        {
            if (name == DeprecatedName)
                ctx.Err.WriteLine($"barrierledger: '{DeprecatedName}' is deprecated and will be removed in the next release; use '{Name}' (same arguments; the JSON keys are now reduced_mass_da and force_constant_n_per_m)");
            var data = input.Load(pr, ctx);
            if (data is null) return ExitCodes.Unreadable;
            if (!data.HasVibrations)
            {
                ctx.Err.WriteLine($"barrierledger: {data.Source} ({data.Label}) has no Hessian, normal modes or frequencies; " +
                                  "expected a QCSchema result with driver 'hessian' or a bundle calculation with frequencies");
                return ExitCodes.Unreadable;
            }
            VibrationalAnalysis analysis;
            try { analysis = data.Analyse()!; }
            catch (HessianException ex)
            {
                ctx.Err.WriteLine($"barrierledger: {data.Source}: the Hessian cannot be analysed: {ex.Message}");
                return ExitCodes.Unreadable;
            }
            var isSaddle = analysis.ImaginaryModes.Length > 0 || data.Kind == Core.Chemistry.CalculationKind.SaddlePoint;
            var check = isSaddle ? SaddleCheck.Run(new SaddleCheckInput(analysis.Molecule, analysis.Modes, data.ReactionBonds)) : null;
            if (pr.GetValue(json)) ctx.WriteJson(ToJson(data, analysis, isSaddle, check));
            else WriteTable(ctx.Out, data, analysis);
            return WriteSaddleCheck(ctx, check, pr.GetValue(json));
        });
        return command;
    }

    /// <summary>
    /// Prints the saddle-point verdict (<see cref="SaddleCheck"/>) with its reasons and returns the exit code
    /// (<see cref="ExitCodes.ChecksFailed"/> when the check fails). Nothing for a structure that is neither declared a saddle point nor has an imaginary mode.
    /// </summary>
    private static int WriteSaddleCheck(CliContext ctx, SaddleCheckResult? check, bool json)
    {
        if (check is null) return ExitCodes.Ok;
        if (!json) VerdictOutput.Write(ctx.Out, "Saddle-point check", check.Verdict, check.Reasons);
        return VerdictOutput.ExitCode(check.Verdict);
    }

    internal static object ToJson(CalculationData data, VibrationalAnalysis a, bool isSaddle, SaddleCheckResult? check = null) => new
    {
        saddle_check = check is null ? null : VerdictOutput.Json(check.Verdict, check.Reasons),
        file = data.Source,
        calculation = data.Label,
        formula = StructureChecks.FormulaOf(a.Molecule),
        atom_count = a.Molecule.AtomCount,
        charge = a.Molecule.Charge,
        multiplicity = a.Molecule.Multiplicity,
        level_of_theory = data.LevelOfTheory?.ToString(),
        energy_hartree = data.EnergyHartree,
        shape = a.Shape.ToString(),
        removed_mode_count = a.RemovedModeCount,
        eigensolver = a.EigenSolver,
        frequencies_cm1 = a.FrequenciesCm1,
        imaginary_count = a.ImaginaryModes.Length,
        is_saddle_point = isSaddle,
        modes = a.Modes.Select(m => new
        {
            frequency_cm1 = m.FrequencyCm1,
            reduced_mass_da = Finite(m.ReducedMassDalton),
            force_constant_n_per_m = Finite(m.ForceConstantNewtonPerMetre),
        }),
    };

    private static double? Finite(double v) => double.IsFinite(v) ? v : null;

    private static void WriteTable(TextWriter o, CalculationData data, VibrationalAnalysis a)
    {
        var m = a.Molecule;
        o.WriteLine($"{data.Source} ({data.Label}): {StructureChecks.FormulaOf(m)}, {m.AtomCount} atoms, charge {m.Charge}, multiplicity {m.Multiplicity}");
        if (data.LevelOfTheory is { } l) o.WriteLine($"Level of theory: {l}");
        if (data.EnergyHartree is { } e) o.WriteLine(string.Create(CultureInfo.InvariantCulture, $"Electronic energy: {e:F8} Eh"));
        o.WriteLine($"Shape: {a.Shape}; {a.RemovedModeCount} translations/rotations removed; eigensolver: {a.EigenSolver}");
        o.WriteLine($"Modes: {a.Modes.Length}, of them imaginary: {a.ImaginaryModes.Length}");
        o.WriteLine();
        // One row per mode, lowest wavenumber first; an imaginary mode shows its magnitude with "i" and a negative force constant.
        string[] header = ["#", "ν̃ (cm⁻¹)", "μ (Da)", "k (N/m)"];
        var rows = a.Modes.Select((mode, i) => new[]
        {
            (i + 1).ToString(CultureInfo.InvariantCulture),
            mode.IsImaginary ? (-mode.FrequencyCm1).ToString("F1", CultureInfo.InvariantCulture) + "i" : mode.FrequencyCm1.ToString("F1", CultureInfo.InvariantCulture),
            Num(mode.ReducedMassDalton, "F3"),
            Num(mode.ForceConstantNewtonPerMetre, "F1"),
        }).ToList();
        var widths = Enumerable.Range(0, header.Length).Select(c => rows.Select(r => r[c].Length).Append(header[c].Length).Max()).ToArray();
        string Line(IReadOnlyList<string> cells) => string.Join(" | ", cells.Select((t, c) => t.PadLeft(widths[c]))).TrimEnd();
        o.WriteLine(Line(header));
        o.WriteLine(string.Join("-+-", widths.Select(w => new string('-', w))));
        foreach (var r in rows) o.WriteLine(Line(r));
    }

    private static string Num(double v, string format) => double.IsFinite(v) ? v.ToString(format, CultureInfo.InvariantCulture) : "-";
}
