using System.CommandLine;
using System.Globalization;
using BarrierLedger.Core.Checks;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Vibrations;

namespace BarrierLedger.Cli.Commands;

/// <summary>
/// <c>barrierledger freq FILE</c>: vibrational analysis of one calculation (from its Hessian, modes or frequencies).
/// The saddle-point verdict is printed by <see cref="WriteSaddleCheck"/> when the structure has an imaginary mode or is declared a saddle point.
/// </summary>
internal static class FreqCommand
{
    public static Command Create(CliContext ctx)
    {
        var input = new CalculationArguments();
        var json = CommonOptions.Json();
        var command = new Command("freq", "Vibrational analysis of a calculation: frequencies (imaginary as negative), reduced masses, force constants.");
        input.AddTo(command);
        command.Options.Add(json);
        command.SetAction(pr =>
        {
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
            reduced_mass_amu = Finite(m.ReducedMassAmu),
            force_constant_mdyn_per_angstrom = Finite(m.ForceConstantMdynPerAngstrom),
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
        o.WriteLine();
        o.WriteLine("  mode   wavenumber/cm-1   reduced mass/amu   force const./(mdyn/Å)");
        for (var i = 0; i < a.Modes.Length; i++)
        {
            var mode = a.Modes[i];
            var freq = mode.IsImaginary ? $"{-mode.FrequencyCm1:F2}i" : $"{mode.FrequencyCm1:F2} ";
            o.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"  {i + 1,4}   {freq,15}   {Num(mode.ReducedMassAmu, "F4"),16}   {Num(mode.ForceConstantMdynPerAngstrom, "F4"),21}"));
        }
        o.WriteLine();
        o.WriteLine($"Imaginary modes: {a.ImaginaryModes.Length}");
    }

    private static string Num(double v, string format) => double.IsFinite(v) ? v.ToString(format, CultureInfo.InvariantCulture) : "-";
}
