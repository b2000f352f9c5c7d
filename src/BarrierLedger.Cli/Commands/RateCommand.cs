using System.CommandLine;
using System.Globalization;
using BarrierLedger.Core.Kinetics;
using BarrierLedger.Core.Units;

namespace BarrierLedger.Cli.Commands;

/// <summary><c>barrierledger rate --barrier V --unit U --temperature T</c>: first-order Eyring rate constant and half-life, optionally with tunnelling.</summary>
internal static class RateCommand
{
    public static Command Create(CliContext ctx)
    {
        var barrier = new Option<double>("--barrier") { Description = "Gibbs energy of activation ΔG‡", Required = true };
        var unit = new Option<string>("--unit") { Description = "Unit of the barriers: kcal/mol, kJ/mol, hartree or eV", DefaultValueFactory = _ => "kcal/mol" };
        var temperature = new Option<double>("--temperature") { Description = "Temperature in K", DefaultValueFactory = _ => 298.15 };
        var tunnelling = new Option<string>("--tunnelling") { Description = "Tunnelling correction: none, wigner or skodje-truhlar", DefaultValueFactory = _ => "none" };
        tunnelling.AcceptOnlyFromAmong("none", "wigner", "skodje-truhlar");
        var nu = new Option<double?>("--imaginary-frequency") { Description = "Imaginary frequency of the saddle point in cm-1 (magnitude; 1500 or -1500)" };
        var forward = new Option<double?>("--forward-barrier") { Description = "Skodje–Truhlar: zero-point-corrected forward barrier ΔV‡ (default: --barrier)" };
        var reverse = new Option<double?>("--reverse-barrier") { Description = "Skodje–Truhlar: zero-point-corrected reverse barrier (required for skodje-truhlar)" };
        var json = CommonOptions.Json();
        var command = new Command("rate", "Eyring rate constant k = κ (k_B T/h) exp(−ΔG‡/RT) and half-life of a first-order step.");
        foreach (var o in new Option[] { barrier, unit, temperature, tunnelling, nu, forward, reverse, json }) command.Options.Add(o);
        command.SetAction(pr =>
        {
            var unitText = pr.GetValue(unit)!;
            if (!BarrierUnits.TryParse(unitText, out var u, out var why)) throw new UsageException($"--unit: {why}");
            var t = pr.GetValue(temperature);
            if (!(t > 0) || !double.IsFinite(t)) throw new UsageException($"--temperature must be above 0 K, got {t}");
            var dg = Energy.From(pr.GetValue(barrier), u);
            if (!double.IsFinite(dg.Hartree)) throw new UsageException("--barrier must be a finite number");
            var kind = pr.GetValue(tunnelling)!;
            var kappa = 1.0;
            double? nuCm1 = pr.GetValue(nu) is { } n ? Math.Abs(n) : null;
            if (kind != "none" && nuCm1 is not > 0) throw new UsageException($"--tunnelling {kind} needs --imaginary-frequency (cm-1, non-zero)");
            if (kind == "wigner") kappa = Tunnelling.Wigner(nuCm1!.Value, t);
            else if (kind == "skodje-truhlar")
            {
                if (pr.GetValue(reverse) is not { } rev) throw new UsageException("--tunnelling skodje-truhlar needs --reverse-barrier (same unit as --barrier)");
                var fwd = Energy.From(pr.GetValue(forward) ?? pr.GetValue(barrier), u);
                if (!(fwd.Hartree > 0) || !(rev > 0)) throw new UsageException("Skodje–Truhlar needs positive forward and reverse barriers");
                kappa = Tunnelling.SkodjeTruhlar(nuCm1!.Value, fwd, Energy.From(rev, u), t);
            }
            var k = Eyring.RateConstant(dg, t, kappa);
            var half = k > 0 ? Eyring.HalfLifeSeconds(k) : double.PositiveInfinity;
            if (pr.GetValue(json))
            {
                ctx.WriteJson(new
                {
                    barrier_kcal_per_mol = dg.KcalPerMol,
                    barrier_hartree = dg.Hartree,
                    temperature_k = t,
                    tunnelling = kind,
                    imaginary_frequency_cm1 = nuCm1,
                    kappa,
                    rate_constant_per_s = k,
                    half_life_s = half,
                });
            }
            else
            {
                var o = ctx.Out;
                o.WriteLine(string.Create(CultureInfo.InvariantCulture, $"ΔG‡ = {dg.KcalPerMol:F3} kcal/mol = {dg.KJPerMol:F3} kJ/mol at T = {t} K"));
                o.WriteLine(string.Create(CultureInfo.InvariantCulture, $"κ ({kind}) = {kappa:F4}"));
                o.WriteLine(string.Create(CultureInfo.InvariantCulture, $"k = {k:E4} s^-1"));
                o.WriteLine(string.Create(CultureInfo.InvariantCulture, $"t½ = {half:E4} s ({HumanTime(half)})"));
            }
            return ExitCodes.Ok;
        });
        return command;
    }

    internal static string HumanTime(double seconds) => seconds switch
    {
        double.PositiveInfinity => "never",
        < 1e-3 => string.Create(CultureInfo.InvariantCulture, $"{seconds * 1e6:G3} µs"),
        < 1 => string.Create(CultureInfo.InvariantCulture, $"{seconds * 1e3:G3} ms"),
        < 120 => string.Create(CultureInfo.InvariantCulture, $"{seconds:G3} s"),
        < 7200 => string.Create(CultureInfo.InvariantCulture, $"{seconds / 60:G3} min"),
        < 172800 => string.Create(CultureInfo.InvariantCulture, $"{seconds / 3600:G3} h"),
        < 3.156e7 * 2 => string.Create(CultureInfo.InvariantCulture, $"{seconds / 86400:G3} days"),
        _ => string.Create(CultureInfo.InvariantCulture, $"{seconds / 3.15576e7:G3} years"),
    };
}
