using System.CommandLine;
using System.Globalization;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.Symmetry;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Core.Units;
using BarrierLedger.Core.Vibrations;

namespace BarrierLedger.Cli.Commands;

/// <summary>
/// <c>barrierledger thermo FILE</c>: ideal-gas RRHO (or quasi-RRHO) thermal corrections of one calculation at a temperature and standard state.
/// </summary>
internal static class ThermoCommand
{
    public static Command Create(CliContext ctx)
    {
        var input = new CalculationArguments();
        var json = CommonOptions.Json();
        var temperature = new Option<double>("--temperature") { Description = "Temperature in K", DefaultValueFactory = _ => 298.15 };
        var pressure = new Option<string?>("--pressure") { Description = "Gas pressure with the 1atm standard state: a number in atm, or with a unit (101325Pa, 1bar, 1atm)" };
        var standardState = new Option<string>("--standard-state") { Description = "1atm (gas), 1bar (gas) or 1M (solution, 1 mol/L)", DefaultValueFactory = _ => "1atm" };
        standardState.AcceptOnlyFromAmong("1atm", "1bar", "1M");
        var lowModes = new Option<string>("--low-modes")
        {
            Description = "Treatment of low vibrational modes, the energy model's choices: harmonic (RRHO), entropy (low-mode entropy interpolated towards a free rotor; Grimme 2012) or entropy-enthalpy (low-mode entropy and enthalpy interpolated; Grimme 2012; Li et al. 2015)",
            DefaultValueFactory = _ => "harmonic",
        };
        lowModes.AcceptOnlyFromAmong([.. LowModeNames.All]);
        var cutoff = new Option<double>("--low-mode-cutoff") { Description = "Cut-off ω₀ of the low-mode treatment in cm-1", DefaultValueFactory = _ => 100.0 };
        var sigma = new Option<int?>("--symmetry-number") { Description = "Rotational symmetry number σ; by default it follows from the point group found in the geometry" };
        var tolerance = new Option<double>("--symmetry-tolerance")
        {
            Description = "How far (Å) an atom may lie from its symmetric position for the point group", DefaultValueFactory = _ => PointGroups.DefaultToleranceAngstrom,
        };
        var command = new Command("thermo", "Thermal corrections (ZPE, enthalpy, entropy, Gibbs energy) of a calculation from its frequencies.");
        input.AddTo(command);
        foreach (var o in new Option[] { temperature, pressure, standardState, lowModes, cutoff, sigma, tolerance, json }) command.Options.Add(o);
        command.SetAction(pr =>
        {
            var t = pr.GetValue(temperature);
            if (!(t > 0) || !double.IsFinite(t)) throw new UsageException($"--temperature must be above 0 K, got {t}");
            if (pr.GetValue(sigma) is < 1) throw new UsageException($"--symmetry-number must be 1 or more, got {pr.GetValue(sigma)}");
            if (!(pr.GetValue(cutoff) > 0) || !double.IsFinite(pr.GetValue(cutoff))) throw new UsageException($"--low-mode-cutoff must be above 0 cm-1, got {pr.GetValue(cutoff)}");
            if (!(pr.GetValue(tolerance) > 0) || !double.IsFinite(pr.GetValue(tolerance))) throw new UsageException($"--symmetry-tolerance must be above 0 Å, got {pr.GetValue(tolerance)}");
            var state = pr.GetValue(standardState) switch { "1bar" => StandardState.Gas1Bar, "1M" => StandardState.Solution1Molar, _ => StandardState.Gas1Atm };
            var pressurePa = PhysicalConstants.StandardAtmospherePascal;
            if (pr.GetValue(pressure) is { } ptext)
            {
                if (!TryParsePressure(ptext, out pressurePa)) throw new UsageException($"--pressure '{ptext}' is not a pressure; expected e.g. 1, 1atm, 1bar or 101325Pa");
                if (state != StandardState.Gas1Atm) throw new UsageException("--pressure applies to the gas standard state --standard-state 1atm only");
            }
            var data = input.Load(pr, ctx);
            if (data is null) return ExitCodes.Unreadable;
            if (!data.HasVibrations)
            {
                ctx.Err.WriteLine($"barrierledger: {data.Source} ({data.Label}) has no Hessian, normal modes or frequencies to compute thermochemistry from");
                return ExitCodes.Unreadable;
            }
            VibrationalAnalysis analysis;
            try { analysis = data.Analyse()!; }
            catch (HessianException ex)
            {
                ctx.Err.WriteLine($"barrierledger: {data.Source}: the Hessian cannot be analysed: {ex.Message}");
                return ExitCodes.Unreadable;
            }
            var symmetry = PointGroups.Detect(analysis.Molecule, pr.GetValue(tolerance));
            var given = pr.GetValue(sigma);
            var options = new ThermoOptions(t, pressurePa, given ?? symmetry.SymmetryNumber, LowModeNames.Parse(pr.GetValue(lowModes)!), pr.GetValue(cutoff), state);
            var r = IdealGasThermo.Compute(analysis, options);
            if (pr.GetValue(json)) ctx.WriteJson(ToJson(data, analysis, r, symmetry, given is not null));
            else WriteTable(ctx.Out, data, analysis, r, symmetry, given is not null);
            return ExitCodes.Ok;
        });
        return command;
    }

    /// <summary>"1" (atm), "1atm", "1 bar", "101325Pa", "100kPa".</summary>
    internal static bool TryParsePressure(string text, out double pascal)
    {
        var t = text.Trim().ToLowerInvariant().Replace(" ", "");
        var units = new (string Suffix, double Factor)[] { ("kpa", 1000), ("pa", 1), ("atm", PhysicalConstants.StandardAtmospherePascal), ("bar", PhysicalConstants.BarPascal) };
        var factor = PhysicalConstants.StandardAtmospherePascal;
        foreach (var (suffix, f) in units)
            if (t.EndsWith(suffix, StringComparison.Ordinal)) { t = t[..^suffix.Length]; factor = f; break; }
        var ok = double.TryParse(t, NumberStyles.Float, CultureInfo.InvariantCulture, out var v) && v > 0 && double.IsFinite(v);
        pascal = ok ? v * factor : double.NaN;
        return ok;
    }

    private static object ToJson(CalculationData data, VibrationalAnalysis a, ThermoResult r, PointGroupResult symmetry, bool sigmaGiven) => new
    {
        file = data.Source,
        calculation = data.Label,
        formula = StructureChecks.FormulaOf(a.Molecule),
        level_of_theory = data.LevelOfTheory?.ToString(),
        temperature_k = r.Options.TemperatureKelvin,
        standard_state = r.Options.StandardState switch { StandardState.Gas1Bar => "1bar", StandardState.Solution1Molar => "1M", _ => "1atm" },
        reference_pressure_pa = r.ReferencePressurePascal,
        point_group = symmetry.Group.Name,
        point_group_tolerance_angstrom = symmetry.ToleranceAngstrom,
        point_group_note = symmetry.Note.Length == 0 ? null : symmetry.Note,
        symmetry_number = r.Options.SymmetryNumber,
        symmetry_number_source = sigmaGiven ? "given" : "point group",
        low_modes = LowModeNames.Name(r.Options.Treatment),
        low_mode_cutoff_cm1 = r.Options.Treatment == ThermoTreatment.Rrho ? (double?)null : r.Options.QuasiRrhoCutoffCm1,
        frequencies_cm1 = a.FrequenciesCm1,
        imaginary_count = a.ImaginaryModes.Length,
        zpe_hartree = r.ZeroPointEnergy.Hartree,
        thermal_energy_hartree = r.ThermalEnergyCorrection.Hartree,
        enthalpy_hartree = r.EnthalpyCorrection.Hartree,
        entropy_j_per_mol_k = r.EntropyJoulePerMoleKelvin,
        gibbs_hartree = r.GibbsCorrection.Hartree,
        electronic_energy_hartree = data.EnergyHartree,
        total_enthalpy_hartree = data.EnergyHartree + r.EnthalpyCorrection.Hartree,
        total_gibbs_hartree = data.EnergyHartree + r.GibbsCorrection.Hartree,
        excluded_imaginary_frequencies_cm1 = r.ExcludedImaginaryFrequenciesCm1,
        notes = r.Notes,
    };

    /// <summary>The standard state in words ("1 mol/L", "1 atm", "1 bar"); a gas at a pressure given with --pressure says so.</summary>
    private static string StateWords(ThermoOptions opt) =>
        opt.StandardState == StandardState.Gas1Atm && Math.Abs(opt.PressurePascal - PhysicalConstants.StandardAtmospherePascal) > 1e-6
            ? "ideal gas at the given pressure" : StandardStateNames.Text(opt.StandardState);

    private static void WriteTable(TextWriter o, CalculationData data, VibrationalAnalysis a, ThermoResult r, PointGroupResult symmetry, bool sigmaGiven)
    {
        string F(double v) => v.ToString("F6", CultureInfo.InvariantCulture);
        string K(Energy e) => e.KcalPerMol.ToString("F2", CultureInfo.InvariantCulture);
        var opt = r.Options;
        o.WriteLine($"{data.Source} ({data.Label}): {StructureChecks.FormulaOf(a.Molecule)}, {a.Shape}");
        o.WriteLine(sigmaGiven
            ? $"point group {symmetry.Group.Name}; σ = {opt.SymmetryNumber} as given (the point group alone gives {symmetry.SymmetryNumber})"
            : $"point group {symmetry.Group.Name}, so σ = {opt.SymmetryNumber}");
        if (symmetry.Note.Length > 0) o.WriteLine($"Note: {symmetry.Note}");
        o.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"T = {opt.TemperatureKelvin} K, standard state {StateWords(opt)} (p = {r.ReferencePressurePascal:G6} Pa), low modes {LowModeNames.Name(opt.Treatment)}{(opt.Treatment == ThermoTreatment.Rrho ? "" : $" (cut-off {opt.QuasiRrhoCutoffCm1} cm-1)")}"));
        o.WriteLine();
        o.WriteLine("  correction                      hartree     kcal/mol");
        o.WriteLine($"  zero-point energy         {F(r.ZeroPointEnergy.Hartree),13} {K(r.ZeroPointEnergy),12}");
        o.WriteLine($"  thermal energy (incl. ZPE){F(r.ThermalEnergyCorrection.Hartree),13} {K(r.ThermalEnergyCorrection),12}");
        o.WriteLine($"  enthalpy                  {F(r.EnthalpyCorrection.Hartree),13} {K(r.EnthalpyCorrection),12}");
        o.WriteLine($"  Gibbs energy              {F(r.GibbsCorrection.Hartree),13} {K(r.GibbsCorrection),12}");
        o.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  entropy                   {r.EntropyJoulePerMoleKelvin,13:F3} J/(mol K)"));
        if (data.EnergyHartree is { } e)
        {
            o.WriteLine();
            o.WriteLine($"  E(el) {F(e)}   H = {F(e + r.EnthalpyCorrection.Hartree)}   G = {F(e + r.GibbsCorrection.Hartree)} Eh");
        }
        foreach (var n in r.Notes) o.WriteLine($"Note: {n}");
    }
}
