using System.CommandLine;
using System.Collections.Immutable;
using System.Globalization;
using BarrierLedger.Core.Formats;
using BarrierLedger.Core.IsotopeEffects;
using BarrierLedger.Core.Thermochemistry;
using BarrierLedger.Core.Units;
using BarrierLedger.Core.Vibrations;

namespace BarrierLedger.Cli.Commands;

/// <summary>
/// <c>barrierledger kie SADDLE REACTANT... --substitute "4=D"</c>: the kinetic isotope effect of one step from the Hessians of a saddle
/// point and its reactant species (QCSchema results with the hessian driver, or calculations of a bundle written FILE#LABEL), with the
/// Bigeleisen–Mayer factors. The reactant-side atoms are found by atom order (the saddle point lists the reactants' atoms one species
/// after the other) unless given with --reactant-substitute, once per reactant in the order given.
/// </summary>
internal static class KieCommand
{
    public static Command Create(CliContext ctx)
    {
        var saddle = new Argument<string>("saddle") { Description = "Saddle point: QCSchema result (hessian driver), or BUNDLE#LABEL for a calculation of a bundle" };
        var reactants = new Argument<string[]>("reactants") { Description = "Reactant species with substituted atoms, the same way", Arity = ArgumentArity.OneOrMore };
        var substitute = new Option<string>("--substitute") { Description = "Saddle-point atoms (1-based) and isotopes, e.g. \"4=D\" or \"H4=D, C1=13C\"", Required = true };
        var reactantSubstitute = new Option<string[]>("--reactant-substitute")
        { Description = "The same atoms in each reactant, in the order given (\"4=D\"; \"-\" for none); default: by atom order", AllowMultipleArgumentsPerToken = false };
        var temperature = new Option<double>("--temperature") { Description = "Temperature in K", DefaultValueFactory = _ => 298.15 };
        var treatment = new Option<string>("--low-modes")
        {
            Description = "Treatment of low vibrational modes, as in thermo and the energy model: harmonic, entropy or entropy-enthalpy",
            DefaultValueFactory = _ => "harmonic",
        };
        treatment.AcceptOnlyFromAmong([.. LowModeNames.All]);
        var cutoff = new Option<double>("--low-mode-cutoff") { Description = "Cut-off ω₀ of the low-mode treatment in cm-1", DefaultValueFactory = _ => 100.0 };
        var tunnelling = new Option<string>("--tunnelling") { Description = "Correction in the KIE: none, wigner, bell or skodje-truhlar", DefaultValueFactory = _ => "none" };
        tunnelling.AcceptOnlyFromAmong("none", "wigner", "bell", "skodje-truhlar");
        var barrier = new Option<double?>("--barrier") { Description = "Zero-point-corrected forward barrier of the parent, for bell and skodje-truhlar" };
        var reverse = new Option<double?>("--reverse-barrier") { Description = "Zero-point-corrected reverse barrier, for skodje-truhlar's endoergic case" };
        var unit = new Option<string>("--unit") { Description = "Unit of the barriers: kcal/mol, kJ/mol, hartree or eV", DefaultValueFactory = _ => "kcal/mol" };
        var bellTerms = new Option<int>("--bell-terms") { Description = "Terms of Bell's series kept", DefaultValueFactory = _ => Core.Kinetics.Tunnelling.BellDefaultTerms };
        var json = CommonOptions.Json();
        var command = new Command("kie", "Kinetic isotope effect k(parent)/k(isotopologue) of one step from stored Hessians, with its Bigeleisen–Mayer factors.");
        CommonOptions.RejectUnknownOptions(saddle);
        command.Arguments.Add(saddle);
        command.Arguments.Add(reactants);
        foreach (var o in new Option[] { substitute, reactantSubstitute, temperature, treatment, cutoff, tunnelling, barrier, reverse, unit, bellTerms, json })
            command.Options.Add(o);
        command.SetAction(pr =>
        {
            var t = pr.GetValue(temperature);
            if (!(t > 0) || !double.IsFinite(t)) throw new UsageException($"--temperature must be above 0 K, got {t}");
            if (!IsotopeSubstitution.TryParseList(pr.GetValue(substitute)!, out var saddleSubs, out var subError)) throw new UsageException($"--substitute: {subError}");
            var ts = Load(pr.GetValue(saddle)!, ctx);
            if (ts is null) return ExitCodes.Unreadable;
            var rs = new List<CalculationData>();
            foreach (var r in pr.GetValue(reactants)!)
            {
                var d = Load(r, ctx);
                if (d is null) return ExitCodes.Unreadable;
                rs.Add(d);
            }
            foreach (var d in rs.Prepend(ts).Where(d => d.HessianHartreePerBohr2 is null))
            {
                ctx.Err.WriteLine(d.HasVibrations
                    ? $"barrierledger: {d.Source} ({d.Label}) has frequencies but no Cartesian Hessian: another isotopologue's frequencies cannot be recomputed from them, so no KIE is computed"
                    : $"barrierledger: {d.Source} ({d.Label}) has no Hessian; expected a QCSchema result with driver 'hessian' or a bundle calculation with a Hessian");
                return ExitCodes.Unreadable;
            }

            ImmutableArray<ImmutableArray<IsotopeSubstitution>> perReactant;
            var given = pr.GetValue(reactantSubstitute) ?? [];
            if (given.Length == 0)
            {
                if (IsotopeAtomMapping.ByAtomOrder(ts.Molecule, [.. rs.Select(r => r.Molecule)], saddleSubs, out var why) is not { } mapped)
                    throw new UsageException($"the substituted atoms cannot be found in the reactants by atom order: {why} Give --reactant-substitute once per reactant.");
                perReactant = mapped;
            }
            else
            {
                if (given.Length != rs.Count) throw new UsageException($"--reactant-substitute given {given.Length} time(s) for {rs.Count} reactant(s); give it once per reactant (\"-\" for none)");
                var list = new List<ImmutableArray<IsotopeSubstitution>>();
                foreach (var g in given)
                {
                    if (g.Trim() == "-") { list.Add([]); continue; }
                    if (!IsotopeSubstitution.TryParseList(g, out var s, out var e)) throw new UsageException($"--reactant-substitute '{g}': {e}");
                    list.Add(s);
                }
                perReactant = [.. list];
            }

            var unitText = pr.GetValue(unit)!;
            if (!BarrierUnits.TryParse(unitText, out var u, out var unitProblem)) throw new UsageException($"--unit: {unitProblem}");
            var kind = pr.GetValue(tunnelling) switch
            {
                "wigner" => KieTunnelling.Wigner,
                "bell" => KieTunnelling.Bell,
                "skodje-truhlar" => KieTunnelling.SkodjeTruhlar,
                _ => KieTunnelling.None,
            };
            Energy? v0 = pr.GetValue(barrier) is { } b ? Energy.From(b, u) : null;
            Energy? v1 = pr.GetValue(reverse) is { } rb ? Energy.From(rb, u) : null;
            if (kind == KieTunnelling.SkodjeTruhlar && v0 is null) throw new UsageException("--tunnelling skodje-truhlar needs --barrier (zero-point-corrected)");
            if (!(pr.GetValue(cutoff) > 0) || !double.IsFinite(pr.GetValue(cutoff))) throw new UsageException($"--low-mode-cutoff must be above 0 cm-1, got {pr.GetValue(cutoff)}");
            var options = new KieOptions(t, LowModeNames.Parse(pr.GetValue(treatment)!), pr.GetValue(cutoff), kind, v0, v1, pr.GetValue(bellTerms));

            KieResult result;
            try
            {
                result = KineticIsotopeEffect.Compute(new KieStructure(ts.Label, ts.Molecule, ts.HessianHartreePerBohr2!, saddleSubs),
                    [.. rs.Select((r, i) => new KieStructure(r.Label, r.Molecule, r.HessianHartreePerBohr2!, perReactant[i])).Where(x => x.Substitutions.Length > 0)],
                    options);
            }
            catch (HessianException ex) { ctx.Err.WriteLine($"barrierledger: a Hessian cannot be analysed: {ex.Message}"); return ExitCodes.Unreadable; }
            catch (ArgumentException ex) { throw new UsageException(ex.Message.Split(" (Parameter")[0]); }
            if (pr.GetValue(json)) ctx.WriteJson(ToJson(result, saddleSubs));
            else Write(ctx.Out, result, saddleSubs);
            return ExitCodes.Ok;
        });
        return command;
    }

    /// <summary>FILE or BUNDLE#LABEL.</summary>
    private static CalculationData? Load(string spec, CliContext ctx)
    {
        var hash = spec.LastIndexOf('#');
        var (path, label) = hash > 0 ? (spec[..hash], spec[(hash + 1)..]) : (spec, null);
        var loaded = InputLoader.Load(path);
        ctx.WriteIssues(loaded.Issues);
        if (!loaded.Succeeded)
        {
            ctx.Err.WriteLine($"barrierledger: {path} could not be read ({loaded.Issues.Count(i => i.IsError)} error(s) above)");
            return null;
        }
        var data = CalculationSource.Pick(loaded, label, out var error);
        if (data is null) ctx.Err.WriteLine($"barrierledger: {error}");
        return data;
    }

    private static string F(double x) => x.ToString(Math.Abs(x) >= 100 ? "F1" : "F4", CultureInfo.InvariantCulture);

    private static void Write(TextWriter o, KieResult r, ImmutableArray<IsotopeSubstitution> subs)
    {
        o.WriteLine($"Kinetic isotope effect k(parent)/k(isotopologue), {string.Join(", ", subs.Select(s => s.Describe()))}");
        o.WriteLine($"  temperature {r.Options.TemperatureKelvin.ToString("0.##", CultureInfo.InvariantCulture)} K, low modes {LowModeNames.Name(r.Options.Treatment)}, tunnelling {r.Options.Tunnelling}");
        o.WriteLine();
        o.WriteLine("  factor   value");
        foreach (var (name, value) in new[] { ("SYM", r.SymmetryFactor), ("MMI", r.MassMomentFactor), ("ZPE", r.ZeroPointFactor), ("EXC", r.ExcitationFactor),
                     ("LOW", r.LowModeFactor), ("TUN", r.TunnellingFactor) })
            o.WriteLine($"  {name,-6} {F(value),10}");
        o.WriteLine($"  KIE    {F(r.Kie),10}   (without tunnelling {F(r.KieWithoutTunnelling)})");
        o.WriteLine();
        o.WriteLine($"  imaginary frequency {r.ImaginaryParentCm1:F1}i / {r.ImaginarySubstitutedCm1:F1}i cm-1; MMI = {F(r.ImaginaryFrequencyRatio)} (ν‡ ratio) × {F(r.VibrationalProductFactor)} (VP)");
        foreach (var t in r.TunnellingFactors)
            o.WriteLine($"  {t.Description}: {(t.Ratio is { } x ? F(x) : "—")}{(t.Note is null ? "" : $" ({t.Note})")}");
        o.WriteLine($"  Redlich–Teller residual {r.ProductRuleWorstDeviation.ToString("G2", CultureInfo.InvariantCulture)}");
        foreach (var n in r.Notes) o.WriteLine($"  note: {n}");
    }

    private static object ToJson(KieResult r, ImmutableArray<IsotopeSubstitution> subs) => new
    {
        substitutions = subs.Select(s => s.ToString()),
        temperature_k = r.Options.TemperatureKelvin,
        low_modes = LowModeNames.Name(r.Options.Treatment),
        tunnelling = r.Options.Tunnelling.ToString(),
        kie = r.Kie,
        kie_without_tunnelling = r.KieWithoutTunnelling,
        factors = new
        {
            sym = r.SymmetryFactor, mmi = r.MassMomentFactor, zpe = r.ZeroPointFactor, exc = r.ExcitationFactor, low = r.LowModeFactor, tun = r.TunnellingFactor,
            imaginary_frequency_ratio = r.ImaginaryFrequencyRatio, vp = r.VibrationalProductFactor,
        },
        imaginary_frequency_cm1 = new { parent = r.ImaginaryParentCm1, isotopologue = r.ImaginarySubstitutedCm1 },
        tunnelling_factors = r.TunnellingFactors.Select(t => new { correction = t.Correction.ToString(), t.Description, kappa_parent = t.KappaParent, kappa_isotopologue = t.KappaSubstituted, ratio = t.Ratio, note = t.Note }),
        product_rule_residual = r.ProductRuleWorstDeviation,
        notes = r.Notes,
    };
}
